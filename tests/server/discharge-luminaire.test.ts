/**
 * A discharge log belongs to a luminaire, and the log book agrees with it: saving a log for a
 * luminaire records its full-duration test from the log (runtime, verdict, day); a log attached to
 * a record updates it; a typed runtime more than a few minutes off the log needs a reason.
 * Runtimes of the synthetic logs are worked out by hand in tests/helpers/discharge-fixtures.ts.
 */
import crypto from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { COMMA_MAPPING, FAILING, logText, NICD_3H, PASSING, savedLogIn } from '../helpers/discharge-fixtures'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'

let built: BuiltApp
let team: TestTeam
let tech: Client
beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Log and record team')
  tech = await signIn(built.app, team.users.technician.email)
})
afterAll(closeTestApp)

async function staged(text: string) {
  const up = await tech.agent.post('/api/discharge/uploads').set('X-CSRF-Token', tech.csrf).attach('file', Buffer.from(text), 'log.csv')
  expect(up.status).toBe(201)
  return up.body.uploadId as string
}
const recordRow = async (id: string) =>
  (
    await dataSource.query(
      'SELECT kind, tested_on::text AS "testedOn", passed, achieved_duration_h AS "achievedDurationH", faults, discharge_log_id AS "dischargeLogId", runtime_note AS "runtimeNote" FROM test_records WHERE id = $1',
      [id],
    )
  )[0]

describe('a discharge log saved for a luminaire', () => {
  it('creates the luminaire’s full-duration record with the log’s runtime, verdict and day', async () => {
    const site = await siteIn(team.workspaceId)
    const l = await luminaireIn(team.workspaceId, site.id, { tag: 'LOG-1' })
    const saved = await tech.post('/api/discharge/logs', {
      uploadId: await staged(logText(PASSING)),
      title: 'Annual test',
      mapping: COMMA_MAPPING,
      options: NICD_3H,
      luminaireId: l.id,
      testedOn: '2026-03-04',
    })
    expect(saved.status, JSON.stringify(saved.body)).toBe(201)
    expect(saved.body.luminaire).toMatchObject({ id: l.id, tag: 'LOG-1', siteId: site.id })
    expect(saved.body.testRecord).toMatchObject({ testedOn: '2026-03-04', luminaireId: l.id })
    const rec = await recordRow(saved.body.testRecord.id)
    // 5.6 V falling 0.5 V/h reaches 4 × 1.0 V at 3.2 h: a pass against 3 h.
    expect(rec).toMatchObject({ kind: 'duration', testedOn: '2026-03-04', passed: true, dischargeLogId: saved.body.id })
    expect(rec.achievedDurationH).toBeCloseTo(3.2, 6)
    // Listed by luminaire directly.
    const byLuminaire = await tech.get(`/api/discharge/logs?luminaireId=${l.id}`)
    expect(byLuminaire.body.items.map((x: { id: string }) => x.id)).toEqual([saved.body.id])

    const failing = await tech.post('/api/discharge/logs', {
      uploadId: await staged(logText(FAILING)),
      title: 'Retest',
      mapping: COMMA_MAPPING,
      options: NICD_3H,
      luminaireId: l.id,
      testedOn: '2026-03-05',
    })
    expect(failing.status, JSON.stringify(failing.body)).toBe(201)
    const bad = await recordRow(failing.body.testRecord.id)
    // 0.6 V/h: (5.6 − 4.0) / 0.6 = 2.67 h, short of 3 h.
    expect(bad.passed).toBe(false)
    expect(bad.achievedDurationH).toBeCloseTo(1.6 / 0.6, 6)
    expect(bad.faults).toMatch(/2\.67 h of the rated 3 h/)
    const due = (await tech.get(`/api/luminaires/${l.id}`)).body.luminaire.due
    expect(due.lastFailure).toMatchObject({ kind: 'duration', testedOn: '2026-03-05' })
  })

  it('updates the record it is attached to; a typed runtime more than five minutes off the log needs a reason', async () => {
    const site = await siteIn(team.workspaceId)
    const l = await luminaireIn(team.workspaceId, site.id, { tag: 'LOG-2' })
    // Typed on the round: 2.94 h. The log says 2.67 h (16 minutes less).
    const record = await testIn(team.workspaceId, l.id, { kind: 'duration', testedOn: '2026-03-01', passed: true, achievedDurationH: 2.94 })
    const uploadId = await staged(logText(FAILING))
    const body = { uploadId, title: 'On the round record', mapping: COMMA_MAPPING, options: NICD_3H, testRecordId: record }
    const refused = await tech.post('/api/discharge/logs', body)
    expect(refused.status).toBe(400)
    expect(refused.body.fields).toEqual([{ path: 'runtimeNote', message: 'the record says 2.94 h, the log 2.67 h (16 min apart): say why they differ' }])
    expect(Number((await dataSource.query('SELECT count(*)::int AS n FROM discharge_logs WHERE test_record_id = $1', [record]))[0].n)).toBe(0)

    const other = await luminaireIn(team.workspaceId, site.id, { tag: 'LOG-3' })
    const wrongLuminaire = await tech.post('/api/discharge/logs', { ...body, luminaireId: other.id })
    expect(wrongLuminaire.status).toBe(400)
    expect(wrongLuminaire.body.fields[0].path).toBe('luminaireId')

    const withReason = await tech.post('/api/discharge/logs', { ...body, runtimeNote: 'Read the stopwatch from the wrong luminaire' })
    expect(withReason.status, JSON.stringify(withReason.body)).toBe(201)
    expect(withReason.body.luminaire.id).toBe(l.id)
    const rec = await recordRow(record)
    expect(rec.achievedDurationH).toBeCloseTo(1.6 / 0.6, 6)
    expect(rec.passed).toBe(false)
    expect(rec.dischargeLogId).toBe(withReason.body.id)
    expect(rec.runtimeNote).toBe('Typed 2.94 h, the log 2.67 h: Read the stopwatch from the wrong luminaire')
    const log = await tech.get(`/api/luminaires/${l.id}/tests`)
    expect(log.body.tests[0]).toMatchObject({ runtimeNote: rec.runtimeNote, dischargeLogId: withReason.body.id })
  })

  it('a record sent with its log and a typed runtime that disagrees is refused until a reason is given', async () => {
    const site = await siteIn(team.workspaceId)
    const l = await luminaireIn(team.workspaceId, site.id, { tag: 'LOG-4' })
    const saved = await savedLogIn(team, PASSING)
    const base = { clientId: crypto.randomUUID(), luminaireId: l.id, kind: 'duration', testedOn: '2026-03-06', passed: true, dischargeLogId: saved.id }
    const close = await tech.post('/api/tests', { records: [{ ...base, achievedDurationH: 3.25 }] })
    expect(close.status, JSON.stringify(close.body)).toBe(201)
    const far = await tech.post('/api/tests', {
      records: [{ ...base, clientId: crypto.randomUUID(), achievedDurationH: 2.5, passed: false, faults: 'Went out early' }],
    })
    expect(far.status).toBe(400)
    expect(far.body.fields).toEqual([{ path: 'records.0.runtimeNote', message: 'the record says 2.5 h, the log 3.2 h (42 min apart): say why they differ' }])
    const noted = await tech.post('/api/tests', {
      records: [
        {
          ...base,
          clientId: crypto.randomUUID(),
          achievedDurationH: 2.5,
          passed: false,
          faults: 'Went out early',
          runtimeNote: 'Lamp went out early; the log ran on a spare pack',
        },
      ],
    })
    expect(noted.status).toBe(201)
    // A pass typed against a runtime short of the rating needs its own reason.
    const override = await tech.post('/api/tests', { records: [{ ...base, clientId: crypto.randomUUID(), dischargeLogId: null, achievedDurationH: 2.5 }] })
    expect(override.body.fields).toEqual([
      { path: 'records.0.verdictOverrideReason', message: '2.5 h against the required 3 h is a fail: give a reason to record a pass' },
    ])
  })
})
