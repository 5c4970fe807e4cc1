/** The daily reminder: once per site per day, even run twice or by two workers at once. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { runReminders } from '../../server/modules/register/reminders.service'
import { addDays } from '../../shared/engine/due'
import { closeTestApp, getTestApp, mailTo, makeTeam, type TestTeam } from '../helpers/test-app'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'

let team: TestTeam
beforeAll(async () => {
  await getTestApp()
  team = await makeTeam('Reminder team')
})
afterAll(closeTestApp)

describe('daily reminders', () => {
  it('sends one mail per site and day to the responsible person, the technicians and the owner (the default), listing the right luminaires', async () => {
    // A fixed day: the job takes the day as input, so the test does not depend on the clock.
    const day = '2025-06-16'
    const responsible = `keeper-${Date.now()}@example.test`
    const site = await siteIn(team.workspaceId, { name: 'Reminder library', responsibleEmail: responsible, regime: 'en50172' })
    const quiet = await siteIn(team.workspaceId, { name: 'Quiet depot', responsibleEmail: `quiet-${Date.now()}@example.test` })
    const fitted = '2024-01-10'
    // OVERDUE: last functional test 2025-04-20 → due 2025-05-20.
    const overdue = await luminaireIn(team.workspaceId, site.id, { tag: 'OVR-1', packFittedOn: fitted })
    await testIn(team.workspaceId, overdue.id, { kind: 'duration', testedOn: '2025-01-20' })
    await testIn(team.workspaceId, overdue.id, { kind: 'functional', testedOn: '2025-04-20' })
    // DUE SOON: functional on 2025-05-25 → due 2025-06-25 (9 days).
    const soon = await luminaireIn(team.workspaceId, site.id, { tag: 'SOON-1', packFittedOn: fitted })
    await testIn(team.workspaceId, soon.id, { kind: 'duration', testedOn: '2025-01-20' })
    await testIn(team.workspaceId, soon.id, { kind: 'functional', testedOn: '2025-05-25' })
    // ANNUAL DUE SOON: full-duration test 2024-06-20 → due 2025-06-20, functional fine.
    const annual = await luminaireIn(team.workspaceId, site.id, { tag: 'ANN-1', packFittedOn: fitted })
    await testIn(team.workspaceId, annual.id, { kind: 'duration', testedOn: '2024-06-20' })
    await testIn(team.workspaceId, annual.id, { kind: 'functional', testedOn: '2025-06-10' })
    // FINE: functional 2025-06-10 (due 2025-07-10, 24 days), duration 2025-01-20.
    const fine = await luminaireIn(team.workspaceId, site.id, { tag: 'FINE-1', packFittedOn: fitted })
    await testIn(team.workspaceId, fine.id, { kind: 'duration', testedOn: '2025-01-20' })
    await testIn(team.workspaceId, fine.id, { kind: 'functional', testedOn: '2025-06-10' })
    // The quiet site has nothing due: no mail.
    const q = await luminaireIn(team.workspaceId, quiet.id, { tag: 'Q-1', packFittedOn: fitted })
    await testIn(team.workspaceId, q.id, { kind: 'duration', testedOn: '2025-01-20' })
    await testIn(team.workspaceId, q.id, { kind: 'functional', testedOn: '2025-06-12' })

    // Two workers at once, then a third run the same day.
    const [a, b] = await Promise.all([runReminders(day, { workspaceId: team.workspaceId }), runReminders(day, { workspaceId: team.workspaceId })])
    const c = await runReminders(day, { workspaceId: team.workspaceId })
    expect(a.sent.length + b.sent.length).toBe(1)
    expect([...a.alreadySent, ...b.alreadySent]).toEqual([site.id])
    expect(c.sent).toEqual([])
    expect(c.alreadySent).toEqual([site.id])
    expect([...a.failed, ...b.failed, ...c.failed]).toEqual([])

    const mails = mailTo(responsible)
    expect(mails).toHaveLength(1)
    expect(mailTo(team.users.technician.email).filter((m) => m.subject.includes('Reminder library'))).toHaveLength(1)
    expect(mails[0].to.sort()).toEqual([responsible, team.users.technician.email, team.users.owner.email].sort())
    expect(mailTo(team.users.viewer.email)).toHaveLength(0)
    const text = mails[0].text
    expect(text).toMatch(/OVR-1 \(Corridor\): functional test overdue \(was due by 2025-05-20, 27 days ago\)/)
    expect(text).toMatch(/SOON-1 \(Corridor\): functional test due 2025-06-25 \(in 9 days\)/)
    expect(text).toMatch(/ANN-1 \(Corridor\): full-duration test due 2025-06-20 \(in 4 days\)/)
    expect(text).not.toMatch(/FINE-1/)
    expect(mailTo(quiet.responsibleEmail)).toHaveLength(0)
    const claims = await dataSource.query('SELECT day::text AS day, luminaire_count FROM reminder_sends WHERE site_id = $1', [site.id])
    expect(claims).toEqual([{ day, luminaire_count: 3 }])

    // The next day is a new day: one more mail.
    const next = await runReminders(addDays(day, 1), { workspaceId: team.workspaceId })
    expect(next.sent.map((s) => s.siteId)).toEqual([site.id])
    expect(mailTo(responsible)).toHaveLength(2)
  })

  it('a failed send releases the claim so a later run can send', async () => {
    const t = await makeTeam('Unreachable team')
    const site = await siteIn(t.workspaceId, { name: 'Unreachable hall', responsibleEmail: 'not a valid address@@' })
    await luminaireIn(t.workspaceId, site.id, { tag: 'U-1', packFittedOn: '2020-01-01' })
    // Only the unreachable address is left to receive it: no technicians, no owners.
    await dataSource.query(`DELETE FROM memberships WHERE workspace_id = $1 AND role IN ('technician', 'owner')`, [t.workspaceId])
    const run = await runReminders('2025-06-16', { workspaceId: t.workspaceId })
    expect(run.sent).toEqual([])
    expect(run.failed.map((f) => f.siteId)).toEqual([site.id])
    expect(await dataSource.query('SELECT 1 FROM reminder_sends WHERE site_id = $1', [site.id])).toHaveLength(0)
  })
})
