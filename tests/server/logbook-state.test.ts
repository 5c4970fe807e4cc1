/**
 * The log book's state rules over the API: a luminaire's state comes from its history per kind of
 * test, failures stay open until the test that clears them passes, a retest is due at once and
 * overdue after the workspace's repair window, and a new luminaire or pack has a commissioning
 * full-duration test due. Rules: docs/method.md, "Log book state".
 */
import crypto from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { runReminders } from '../../server/modules/register/reminders.service'
import { addDays, addMonthsClamped } from '../../shared/engine/due'
import { luminaireIn, siteIn } from '../helpers/register-fixtures'
import { closeTestApp, getTestApp, makeTeam, mailTo, signIn, type Client, type TestTeam } from '../helpers/test-app'

let built: BuiltApp
let team: TestTeam
let technician: Client
let designer: Client
let owner: Client
let viewer: Client
const today = new Date().toISOString().slice(0, 10)

beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Log book state team')
  technician = await signIn(built.app, team.users.technician.email)
  designer = await signIn(built.app, team.users.designer.email)
  owner = await signIn(built.app, team.users.owner.email)
  viewer = await signIn(built.app, team.users.viewer.email)
})
afterAll(closeTestApp)

type Rec = { kind: 'functional' | 'duration'; testedOn: string; passed: boolean; achievedDurationH?: number | null; faults?: string; remedialAction?: string }
async function record(luminaireId: string, r: Rec) {
  const res = await technician.post('/api/tests', { records: [{ clientId: crypto.randomUUID(), luminaireId, achievedDurationH: null, ...r }] })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
}
const detail = async (id: string) => {
  const res = await viewer.get(`/api/luminaires/${id}`)
  expect(res.status).toBe(200)
  return res.body.luminaire
}
/** A luminaire whose pack went in long ago and passed its last annual test 300 days ago. */
async function testedLuminaire(siteId: string, tag: string) {
  const l = await luminaireIn(team.workspaceId, siteId, { tag, packFittedOn: addDays(today, -800) })
  await record(l.id, { kind: 'duration', testedOn: addDays(today, -300), passed: true, achievedDurationH: 3.3 })
  return l
}

describe('failures stay open until put right', () => {
  it('a failed full-duration test then a functional pass stays failed, with the fault and the retest due', async () => {
    const site = await siteIn(team.workspaceId)
    const l = await testedLuminaire(site.id, 'S-1')
    const failedOn = addDays(today, -6)
    await record(l.id, {
      kind: 'duration',
      testedOn: failedOn,
      passed: false,
      achievedDurationH: 2.5,
      faults: 'Went out after 2 h 30 min',
      remedialAction: 'Pack to be replaced',
    })
    await record(l.id, { kind: 'functional', testedOn: addDays(today, -2), passed: true })
    const d = (await detail(l.id)).due
    expect(d.state).toBe('failed')
    expect(d.failed).toBe(true)
    expect(d.lastFailure).toMatchObject({
      kind: 'duration',
      testedOn: failedOn,
      faults: 'Went out after 2 h 30 min',
      remedialAction: 'Pack to be replaced',
      retestBy: addDays(failedOn, 14),
      retestOverdue: false,
    })
    // The retest is due at once, not a year on.
    expect(d.duration).toMatchObject({ reason: 'retest', nextDueOn: failedOn, overdueAfter: addDays(failedOn, 14), state: 'due-now' })
  })

  it('a failed full-duration test, a new pack, then a passing full-duration test is ok', async () => {
    const site = await siteIn(team.workspaceId)
    const l = await testedLuminaire(site.id, 'S-2')
    await record(l.id, {
      kind: 'duration',
      testedOn: addDays(today, -20),
      passed: false,
      achievedDurationH: 1.9,
      faults: 'Dark after 1 h 54 min',
      remedialAction: 'New pack',
    })
    const pack = await technician.post(`/api/luminaires/${l.id}/pack`, { packFittedOn: addDays(today, -5), note: 'Replaced after the failed test' })
    expect(pack.status).toBe(200)
    // A new pack alone does not clear the failure.
    expect((await detail(l.id)).due.state).toBe('failed')
    const passedOn = addDays(today, -4)
    await record(l.id, { kind: 'duration', testedOn: passedOn, passed: true, achievedDurationH: 3.2, remedialAction: 'Retest after the new pack' })
    const d = (await detail(l.id)).due
    expect(d.failed).toBe(false)
    expect(d.openFailures).toEqual([])
    expect(d.duration).toMatchObject({ reason: 'interval', nextDueOn: addMonthsClamped(passedOn, 12) })
    expect(d.commissioning).toBe(false)
  })

  it('a failed functional test then a passing full-duration test is ok', async () => {
    const site = await siteIn(team.workspaceId)
    const l = await testedLuminaire(site.id, 'S-3')
    await record(l.id, { kind: 'functional', testedOn: addDays(today, -9), passed: false, faults: 'Lamp did not light', remedialAction: 'Lamp replaced' })
    expect((await detail(l.id)).due.state).toBe('failed')
    await record(l.id, { kind: 'duration', testedOn: addDays(today, -3), passed: true, achievedDurationH: 3.1 })
    const d = (await detail(l.id)).due
    expect(d.failed).toBe(false)
    expect(d.openFailures).toEqual([])
    expect(d.state).toBe('ok')
  })

  it('a failure makes a retest due within the repair window, overdue after it, on the site, sites page, reminder and CSV', async () => {
    const t = await makeTeam('Repair window team')
    const tech = await signIn(built.app, t.users.technician.email)
    const own = await signIn(built.app, t.users.owner.email)
    const site = await siteIn(t.workspaceId, { name: 'Window building', responsibleEmail: `window-${crypto.randomBytes(3).toString('hex')}@example.test` })
    const l = await luminaireIn(t.workspaceId, site.id, { tag: 'W-1', packFittedOn: addDays(today, -800) })
    const failedOn = addDays(today, -20)
    const rec = await tech.post('/api/tests', {
      records: [
        { clientId: crypto.randomUUID(), luminaireId: l.id, kind: 'duration', testedOn: addDays(today, -300), passed: true, achievedDurationH: 3.2 },
        {
          clientId: crypto.randomUUID(),
          luminaireId: l.id,
          kind: 'functional',
          testedOn: failedOn,
          passed: false,
          faults: 'Charge indicator off',
          remedialAction: 'Charger board to be checked',
        },
      ],
    })
    expect(rec.status).toBe(201)

    // Default window: 14 days, so a failure 20 days old has its retest overdue.
    const settings = await own.get('/api/register/settings')
    expect(settings.body).toMatchObject({ repairWindowDays: 14 })
    const siteView = (await own.get(`/api/sites/${site.id}`)).body
    expect(siteView.counts).toMatchObject({ failed: 1, retestOverdue: 1 })
    expect(siteView.luminaires[0].due.functional).toMatchObject({ reason: 'retest', state: 'overdue', overdueAfter: addDays(failedOn, 14) })
    expect(siteView.luminaires[0].due.lastFailure.retestOverdue).toBe(true)

    const overview = (await own.get('/api/sites')).body
    expect(overview.attention.map((a: { tag: string; state: string; kind: string; reason: string }) => `${a.tag} ${a.kind} ${a.reason} ${a.state}`)).toEqual([
      'W-1 functional retest overdue',
    ])
    expect(overview.attention[0]).toMatchObject({ siteName: 'Window building', failedOn, faults: 'Charge indicator off' })

    const csv = await own.get(`/api/sites/${site.id}/export/register.csv?as=json`)
    const [header, row] = csv.body.content.split('\r\n')
    const cells = Object.fromEntries(header.split(',').map((h: string, i: number) => [h, row.split(',')[i]]))
    expect(cells).toMatchObject({
      state: 'failed',
      open_failure: 'functional',
      failed_on: failedOn,
      retest_due_by: addDays(failedOn, 14),
      retest_overdue: 'true',
    })

    await runReminders(today, { workspaceId: t.workspaceId })
    const mail = (await mailTo(site.responsibleEmail)).at(-1)
    expect(mail?.text).toContain(
      `W-1 (Corridor): failed its functional test on ${failedOn} (Charge indicator off); retest overdue (was due by ${addDays(failedOn, 14)})`,
    )

    // A workspace that allows 30 days: the same retest is due, not yet overdue.
    const patched = await own.patch('/api/register/settings', { repairWindowDays: 30 })
    expect(patched.status, JSON.stringify(patched.body)).toBe(200)
    const after = (await own.get(`/api/luminaires/${l.id}`)).body.luminaire.due
    expect(after.functional).toMatchObject({ state: 'due-now', overdueAfter: addDays(failedOn, 30) })
    expect((await own.patch('/api/register/settings', { repairWindowDays: 0 })).body.fields[0].path).toBe('repairWindowDays')
    expect((await tech.patch('/api/register/settings', { repairWindowDays: 20 })).status).toBe(403)
  })

  it('a new luminaire has a commissioning full-duration test due now', async () => {
    const site = await siteIn(team.workspaceId)
    const fitted = addDays(today, -3)
    const created = await designer.post(`/api/sites/${site.id}/luminaires`, {
      tag: 'N-1',
      purpose: 'escape-route',
      mode: 'non-maintained',
      ratedDurationH: 3,
      chemistry: 'nicd',
      cellsInSeries: 3,
      capacityAh: 1.6,
      packFittedOn: fitted,
    })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const d = (await detail(created.body.id)).due
    expect(d.commissioning).toBe(true)
    expect(d.duration).toMatchObject({ reason: 'commissioning', nextDueOn: fitted, state: 'due-now', overdueAfter: addDays(today, 14) })
    expect(d.state).toBe('due-now')
    // A new pack on a luminaire tested before asks for a commissioning test too.
    const old = await testedLuminaire(site.id, 'N-2')
    expect((await detail(old.id)).due.commissioning).toBe(false)
    await technician.post(`/api/luminaires/${old.id}/pack`, { packFittedOn: today })
    expect((await detail(old.id)).due.duration).toMatchObject({ reason: 'commissioning', nextDueOn: today })
    void owner
  })

  it('a round is signed off by name and date and answers with the failures recorded on it', async () => {
    const site = await siteIn(team.workspaceId)
    const l = await testedLuminaire(site.id, 'R-1')
    const round = crypto.randomUUID()
    const rec = await technician.post('/api/tests', {
      records: [
        {
          clientId: crypto.randomUUID(),
          luminaireId: l.id,
          kind: 'duration',
          testedOn: today,
          passed: false,
          achievedDurationH: 2.5,
          faults: 'Dark at 2 h 30 min',
          remedialAction: 'New pack ordered',
          roundClientId: round,
          checklist: { 'lamp-lit': true, 'lit-full-duration': false },
        },
      ],
    })
    expect(rec.status, JSON.stringify(rec.body)).toBe(201)
    const signed = await technician.post(`/api/sites/${site.id}/rounds`, { clientId: round, signedOffByName: 'Invented Tester', signedOffOn: today })
    expect(signed.status, JSON.stringify(signed.body)).toBe(201)
    expect(signed.body).toMatchObject({
      records: 1,
      failures: [{ tag: 'R-1', kind: 'duration', faults: 'Dark at 2 h 30 min', remedialAction: 'New pack ordered' }],
    })
    expect((await technician.post(`/api/sites/${site.id}/rounds`, { clientId: round, signedOffByName: 'Invented Tester', signedOffOn: today })).status).toBe(
      200,
    )
    expect(
      (await technician.post(`/api/sites/${site.id}/rounds`, { clientId: crypto.randomUUID(), signedOffByName: ' ', signedOffOn: today })).body.fields[0].path,
    ).toBe('signedOffByName')
    const stored = (await viewer.get(`/api/luminaires/${l.id}/tests`)).body.tests[0]
    expect(stored.checklist).toEqual({ 'lamp-lit': true, 'lit-full-duration': false })
  })
})
