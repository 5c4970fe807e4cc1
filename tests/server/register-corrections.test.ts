/**
 * Correcting the register over the API: a site's regime changed with its history kept, and a test
 * marked as recorded in error, which stays in the log book and in the audit trail but no longer
 * counts towards the luminaire's state. Rules: docs/method.md, "Regimes as versioned profiles" and
 * "Log book state".
 */
import crypto from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { addDays } from '../../shared/engine/due'
import { luminaireIn } from '../helpers/register-fixtures'
import { pdfText } from '../helpers/pdf-text'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'

let built: BuiltApp
let team: TestTeam
let technician: Client
let designer: Client
let viewer: Client
const today = new Date().toISOString().slice(0, 10)

beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Register corrections team')
  technician = await signIn(built.app, team.users.technician.email)
  designer = await signIn(built.app, team.users.designer.email)
  viewer = await signIn(built.app, team.users.viewer.email)
})
afterAll(closeTestApp)

async function newSite(regime = 'en50172') {
  const res = await designer.post('/api/sites', { name: `Corrections ${crypto.randomBytes(3).toString('hex')}`, regime, ceilingTemperatureC: 24 })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id as string
}

describe("a site's regime", () => {
  it('changes to each of the four regimes, and the history keeps every step with the profile version and the reason', async () => {
    const id = await newSite('en50172')
    for (const [regime, reason] of [
      ['nfpa101', 'Building is in the United States'],
      ['ca-nfc', 'Moved to the Canadian office'],
      ['asnzs2293', 'Moved again'],
    ] as const) {
      const res = await designer.patch(`/api/sites/${id}`, { regime, regimeChangeReason: reason })
      expect(res.status, JSON.stringify(res.body)).toBe(200)
      expect(res.body.regime).toBe(regime)
    }
    const history = await viewer.get(`/api/sites/${id}/regime-history`)
    expect(history.status).toBe(200)
    expect(history.body.changes.map((c: { fromRegime: string | null; toRegime: string; reason: string }) => [c.fromRegime, c.toRegime, c.reason])).toEqual([
      [null, 'en50172', ''],
      ['en50172', 'nfpa101', 'Building is in the United States'],
      ['nfpa101', 'ca-nfc', 'Moved to the Canadian office'],
      ['ca-nfc', 'asnzs2293', 'Moved again'],
    ])
    expect(history.body.changes.every((c: { profileVersion: string }) => /^\d{4}\.\d+$/.test(c.profileVersion))).toBe(true)
    const status = await viewer.get(`/api/sites/${id}`)
    expect(status.body.profile).toMatchObject({ id: 'asnzs2293', longTest: { interval: { unit: 'month', count: 6 }, length: { hours: 1.5 } } })
    expect(status.body.regimeHistory).toHaveLength(4)
  })

  it('a change of other fields adds no history; an unknown regime or a reason without a regime is refused by field', async () => {
    const id = await newSite('nfpa101')
    expect((await designer.patch(`/api/sites/${id}`, { ceilingTemperatureC: 27 })).status).toBe(200)
    expect((await designer.patch(`/api/sites/${id}`, { regime: 'nfpa101' })).status).toBe(200)
    expect((await viewer.get(`/api/sites/${id}/regime-history`)).body.changes).toHaveLength(1)
    const unknown = await designer.patch(`/api/sites/${id}`, { regime: 'bs5266-1999' })
    expect(unknown.status).toBe(400)
    expect(JSON.stringify(unknown.body)).toContain('regime')
    const stray = await designer.patch(`/api/sites/${id}`, { regimeChangeReason: 'no regime given' })
    expect(stray.status).toBe(400)
    expect(JSON.stringify(stray.body)).toContain('regimeChangeReason')
    expect((await technician.patch(`/api/sites/${id}`, { regime: 'en50172' })).status).toBe(403)
  })

  it("the site's due dates follow the new regime: a yearly test passed 7 months ago is overdue under AS/NZS 2293.2", async () => {
    const id = await newSite('en50172')
    const l = await luminaireIn(team.workspaceId, id, { packFittedOn: addDays(today, -900) })
    const rec = await technician.post('/api/tests', {
      records: [{ clientId: crypto.randomUUID(), luminaireId: l.id, kind: 'duration', testedOn: addDays(today, -213), passed: true, achievedDurationH: 3.2 }],
    })
    expect(rec.status).toBe(201)
    expect((await viewer.get(`/api/luminaires/${l.id}`)).body.luminaire.due.duration.state).toBe('scheduled')
    await designer.patch(`/api/sites/${id}`, { regime: 'asnzs2293' })
    expect((await viewer.get(`/api/luminaires/${l.id}`)).body.luminaire.due.duration.state).toBe('overdue')
  })
})

describe('a test recorded in error', () => {
  it('stays in the log book marked with the reason, leaves the state, and is kept in the audit trail', async () => {
    const id = await newSite()
    const l = await luminaireIn(team.workspaceId, id, { packFittedOn: addDays(today, -900) })
    await technician.post('/api/tests', {
      records: [{ clientId: crypto.randomUUID(), luminaireId: l.id, kind: 'duration', testedOn: addDays(today, -100), passed: true, achievedDurationH: 3.1 }],
    })
    const wrong = await technician.post('/api/tests', {
      records: [{ clientId: crypto.randomUUID(), luminaireId: l.id, kind: 'functional', testedOn: addDays(today, -3), passed: false, faults: 'Lamp out' }],
    })
    const wrongId = wrong.body.records[0].id
    expect((await viewer.get(`/api/luminaires/${l.id}`)).body.luminaire.due.state).toBe('failed')

    const marked = await technician.post(`/api/tests/${wrongId}/recorded-in-error`, { reason: 'Entered against the wrong luminaire' })
    expect(marked.status, JSON.stringify(marked.body)).toBe(200)
    expect(marked.body).toMatchObject({ id: wrongId, recordedInErrorReason: 'Entered against the wrong luminaire', passed: false })
    expect(marked.body.recordedInErrorAt).toBeTruthy()

    expect((await viewer.get(`/api/luminaires/${l.id}`)).body.luminaire.due.state).not.toBe('failed')
    const book = await viewer.get(`/api/sites/${id}/tests`)
    const row = book.body.tests.find((t: { id: string }) => t.id === wrongId)
    expect(row).toMatchObject({ recordedInErrorReason: 'Entered against the wrong luminaire' })
    expect(book.body.tests).toHaveLength(2)

    // The exports keep it, marked: the CSV's last column gives the reason, the PDF reads "Void" (not "FAIL").
    const csv = await viewer.get(`/api/sites/${id}/export/logbook.csv?as=json`)
    const wrongLine = csv.body.content.split('\r\n').find((line: string) => line.includes('Lamp out'))
    expect(wrongLine).toMatch(/,Entered against the wrong luminaire$/)
    const pdf = await viewer.get(`/api/sites/${id}/export/logbook.pdf?as=json`)
    const text = pdfText(Buffer.from(pdf.body.content, 'base64')).replace(/\n/g, ' ')
    expect(text).toMatch(/Void/)
    // A narrow cell wraps, and wrapped lines of neighbouring cells interleave: look for the words.
    expect(text).toMatch(/Recorded in/)
    expect(text).toMatch(/wrong/)
    expect(text).not.toMatch(/FAIL/)

    const again = await technician.post(`/api/tests/${wrongId}/recorded-in-error`, { reason: 'Second try' })
    expect(again.status).toBe(409)
    const audit: Array<{ action: string }> = await dataSource.query(`SELECT action FROM audit_events WHERE entity_id = $1 ORDER BY at`, [wrongId])
    expect(audit.map((a) => a.action)).toEqual(['test.recorded', 'test.recorded-in-error'])
  })

  it('needs a reason, and a viewer may not mark one', async () => {
    const id = await newSite()
    const l = await luminaireIn(team.workspaceId, id)
    const rec = await technician.post('/api/tests', {
      records: [{ clientId: crypto.randomUUID(), luminaireId: l.id, kind: 'functional', testedOn: today, passed: true }],
    })
    const testId = rec.body.records[0].id
    const empty = await technician.post(`/api/tests/${testId}/recorded-in-error`, { reason: '' })
    expect(empty.status).toBe(400)
    expect(JSON.stringify(empty.body)).toContain('reason')
    expect((await viewer.post(`/api/tests/${testId}/recorded-in-error`, { reason: 'Not mine to mark' })).status).toBe(403)
  })
})

describe('pack changes in the log book', () => {
  it('a pack fitted in the field and a corrected pack detail appear with their notes, newest first', async () => {
    const id = await newSite()
    const l = await luminaireIn(team.workspaceId, id, { tag: 'PK-1', packFittedOn: '2021-04-01', capacityAh: 1.6 })
    const fitted = await technician.post(`/api/luminaires/${l.id}/pack`, {
      packFittedOn: addDays(today, -10),
      capacityAh: 2.2,
      note: 'Swollen cells found on the monthly test',
    })
    expect(fitted.status).toBe(200)
    const corrected = await designer.patch(`/api/luminaires/${l.id}`, { cellsInSeries: 4 })
    expect(corrected.status).toBe(200)
    const book = await viewer.get(`/api/sites/${id}/tests`)
    expect(book.status).toBe(200)
    expect(book.body.packChanges).toHaveLength(2)
    const [correction, field] = book.body.packChanges
    expect(field).toMatchObject({
      tag: 'PK-1',
      changedOn: addDays(today, -10),
      note: 'Swollen cells found on the monthly test',
      before: { capacityAh: 1.6, packFittedOn: '2021-04-01' },
      after: { capacityAh: 2.2 },
    })
    expect(correction).toMatchObject({ tag: 'PK-1', before: { cellsInSeries: 3 }, after: { cellsInSeries: 4 } })
    // Another site's log book does not show them.
    const other = await newSite()
    expect((await viewer.get(`/api/sites/${other}/tests`)).body.packChanges).toEqual([])
  })
})
