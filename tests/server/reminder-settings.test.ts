/** Reminders as the workspace sets them: who gets them (the owner among them by default) and how many days ahead they look. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { runReminders } from '../../server/modules/register/reminders.service'
import { closeTestApp, getTestApp, mailTo, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'

let built: BuiltApp
let team: TestTeam
let owner: Client
beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Reminder settings team')
  owner = await signIn(built.app, team.users.owner.email)
})
afterAll(closeTestApp)

/** A site with one luminaire whose functional test falls due 20 days after `day` (2025-07-06). */
async function siteDueIn20Days(name: string) {
  const responsible = `contact-${Date.now()}-${Math.random().toString(36).slice(2, 6)}@example.test`
  const site = await siteIn(team.workspaceId, { name, responsibleEmail: responsible, regime: 'en50172' })
  const l = await luminaireIn(team.workspaceId, site.id, { tag: 'LATER-1', packFittedOn: '2024-01-10' })
  await testIn(team.workspaceId, l.id, { kind: 'duration', testedOn: '2025-01-20' })
  await testIn(team.workspaceId, l.id, { kind: 'functional', testedOn: '2025-06-06' })
  return { site, responsible }
}

describe('reminder settings', () => {
  it('default: 14 days ahead, to the site contact, technicians and owners', async () => {
    const s = await owner.get('/api/register/settings')
    expect(s.body).toMatchObject({ reminderDaysAhead: 14, remindSiteContact: true, remindRoles: ['owner', 'technician'] })
    // Due in 20 days: outside the default 14.
    const { site } = await siteDueIn20Days('Settings default hall')
    const run = await runReminders('2025-06-16', { workspaceId: team.workspaceId })
    expect(run.sent.map((x) => x.siteId)).not.toContain(site.id)
  })

  it('30 days ahead, to the owners and designers only: the test 20 days off is listed, and the contact and technicians get nothing', async () => {
    const set = await owner.patch('/api/register/settings', { reminderDaysAhead: 30, remindSiteContact: false, remindRoles: ['owner', 'designer'] })
    expect(set.status, JSON.stringify(set.body)).toBe(200)
    const { site, responsible } = await siteDueIn20Days('Settings thirty hall')
    const run = await runReminders('2025-06-17', { workspaceId: team.workspaceId })
    const sent = run.sent.find((x) => x.siteId === site.id)
    expect(sent?.to.sort()).toEqual([team.users.designer.email, team.users.owner.email].sort())
    expect(mailTo(responsible)).toHaveLength(0)
    const mail = mailTo(team.users.owner.email).find((m) => m.subject.includes('Settings thirty hall'))!
    expect(mail.text).toMatch(/Due within 30 days:/)
    expect(mail.text).toMatch(/LATER-1 \(Corridor\): functional test due 2025-07-06 \(in 19 days\)/)
  })

  it('refuses a days-ahead out of range and a role that does not exist, naming the field; only an owner may change them', async () => {
    expect((await owner.patch('/api/register/settings', { reminderDaysAhead: 0 })).body.fields[0].path).toBe('reminderDaysAhead')
    expect((await owner.patch('/api/register/settings', { remindRoles: ['manager'] })).body.fields[0].path).toBe('remindRoles.0')
    const tech = await signIn(built.app, team.users.technician.email)
    expect((await tech.patch('/api/register/settings', { reminderDaysAhead: 20 })).status).toBe(403)
  })
})
