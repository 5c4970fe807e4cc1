/**
 * Discharge-test logs through the API, on synthetic files whose answers are worked out by hand
 * (straight-line fall at constant current; see tests/helpers/discharge-fixtures.ts): the same
 * readings written in different dialects give the same result; bad files and bad rows get a
 * message naming the row and column; a refused file leaves nothing stored.
 */
import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { seedDischarge } from '../../server/demo/discharge.demo'
import { stagingDir } from '../../server/modules/discharge/discharge.service'
import { MAX_LOG_BYTES } from '../../shared/schemas/discharge-log.schema'
import { COMMA_MAPPING, FAILING, logText, NICD_3H, PASSING, savedLogIn, type Style } from '../helpers/discharge-fixtures'
import { pdfText } from '../helpers/pdf-text'
import { siteWithLuminaire, testIn } from '../helpers/register-fixtures'
import { sheetIn } from '../helpers/sheets'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'

let built: BuiltApp
let team: TestTeam
let tech: Client
beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Discharge team')
  tech = await signIn(built.app, team.users.technician.email)
})
afterAll(closeTestApp)

async function uploadFile(client: Client, text: string | Buffer, name = 'log.csv') {
  return client.agent
    .post('/api/discharge/uploads')
    .set('X-CSRF-Token', client.csrf)
    .attach('file', Buffer.isBuffer(text) ? text : Buffer.from(text), name)
}

/** Upload, take the server's guesses as the mapping, analyse without storing. */
async function analyseGuessed(text: string, extra: Record<string, unknown> = {}) {
  const up = await uploadFile(tech, text)
  expect(up.status, JSON.stringify(up.body)).toBe(201)
  const g = up.body.guess
  const mapping = {
    delimiter: up.body.delimiter,
    decimal: up.body.decimal,
    header: up.body.header,
    firstLine: up.body.firstLine,
    time: g.time,
    voltage: g.voltage,
    current: g.current,
  }
  const res = await tech.post('/api/discharge/logs', { uploadId: up.body.uploadId, mapping, options: NICD_3H, dryRun: true, ...extra })
  return { up, res, mapping }
}

const count = async (table: 'discharge_files' | 'discharge_logs', workspaceId = team.workspaceId) =>
  Number((await dataSource.query(`SELECT count(*)::int AS n FROM ${table} WHERE workspace_id = $1`, [workspaceId]))[0].n)
const stagedCount = () => fs.readdirSync(stagingDir()).length

describe('reading the same log written different ways', () => {
  it('finds the cut-off of the straight-line log where it was worked out by hand (3.2 h, 1.6 Ah, pass)', async () => {
    const { res } = await analyseGuessed(logText(PASSING, 'comma'))
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const s = res.body.summary
    // Worked example: (5.6 − 4.0) V ÷ 0.5 V/h = 3.2 h; 0.5 A × 3.2 h = 1.6 Ah.
    expect(s.runtimeEnd).toBe('cutoff')
    expect(s.runtimeH).toBeCloseTo(3.2, 9)
    expect(s.deliveredAh).toBeCloseTo(1.6, 9)
    expect(s.pass).toBe(true)
    expect(s.read.rows).toBe(211)
    expect(res.body.curve.tH.length).toBe(211)
    expect(res.body.saved).toBe(false)
  })

  it('reads a semicolon file with decimal commas exactly like its comma-and-dot twin', async () => {
    const comma = await analyseGuessed(logText(PASSING, 'comma'))
    const semi = await analyseGuessed(logText(PASSING, 'semicolon-decimal-comma'))
    expect(semi.up.body.delimiter).toBe(';')
    expect(semi.up.body.decimal).toBe(',')
    expect(semi.res.status, JSON.stringify(semi.res.body)).toBe(200)
    expect(semi.res.body.summary).toEqual(comma.res.body.summary)
    expect(semi.res.body.curve).toEqual(comma.res.body.curve)
  })

  it('reads a tab-separated file with logger notes above the header', async () => {
    const { up, res } = await analyseGuessed(logText(PASSING, 'tab'))
    expect(up.body.delimiter).toBe('\t')
    expect(up.body.firstLine).toBe(3)
    expect(up.body.header).toBe(true)
    expect(res.body.summary.runtimeH).toBeCloseTo(3.2, 9)
  })

  it.each<[Style, string]>([
    ['clock', 'hh:mm:ss'],
    ['iso', 'ISO 8601 timestamps'],
    ['dmy', 'day/month/year date-times with decimal commas'],
    ['millis-minutes', 'minutes, millivolts and milliamps'],
  ])('gives the same runtime from %s time (%s) as from elapsed seconds', async (style) => {
    const base = await analyseGuessed(logText(FAILING, 'comma'))
    const other = await analyseGuessed(logText(FAILING, style))
    expect(other.res.status, JSON.stringify(other.res.body)).toBe(200)
    // Worked example: 1.6 V ÷ 0.6 V/h = 2.6667 h, short of 3 h.
    expect(base.res.body.summary.runtimeH).toBeCloseTo(1.6 / 0.6, 9)
    expect(other.res.body.summary.runtimeH).toBeCloseTo(base.res.body.summary.runtimeH, 6)
    expect(other.res.body.summary.deliveredAh).toBeCloseTo(base.res.body.summary.deliveredAh, 4)
    expect(other.res.body.summary.pass).toBe(false)
  })

  it('guesses the day-first order of 01/03/2026 style date-times', async () => {
    const { up } = await analyseGuessed(logText(PASSING, 'dmy'))
    expect(up.body.guess.time).toMatchObject({ format: 'timestamp', dateOrder: 'dmy' })
    expect(up.body.guess.voltage).toEqual({ column: 1, unit: 'V' })
  })

  it('takes current logged as negative (into the pack positive) as discharge', async () => {
    const text = logText(PASSING).replace(/,0\.5000$/gm, ',-0.5000')
    const { res } = await analyseGuessed(text)
    expect(res.body.summary.deliveredAh).toBeCloseTo(1.6, 9)
    expect(res.body.summary.read.currentInverted).toBe(true)
  })
})

describe('bad files and bad rows', () => {
  it('names the row and the column of text in a numeric cell, and goes on only when asked', async () => {
    const lines = logText(PASSING).split('\n')
    lines[7] = '360,n/a,0.5000' // line 8 of the file
    const { res } = await analyseGuessed(lines.join('\n'))
    expect(res.status).toBe(422)
    expect(res.body.code).toBe('bad_rows')
    expect(res.body.error).toContain('row 8')
    expect(res.body.error).toContain('"Voltage (V)"')
    expect(res.body.fields[0]).toEqual({ path: 'row 8, Voltage (V)', message: '"n/a" is not a number' })
    expect(res.body.badRows.count).toBe(1)

    const again = await analyseGuessed(lines.join('\n'), { acceptBadRows: true })
    expect(again.res.status).toBe(200)
    expect(again.res.body.summary.read.badRows.items).toEqual([{ row: 8, column: 'Voltage (V)', value: 'n/a', reason: 'is not a number' }])
    expect(again.res.body.summary.runtimeH).toBeCloseTo(3.2, 9)
  })

  it('counts all bad rows and lists the first 20 by row', async () => {
    const lines = logText(PASSING).split('\n')
    for (let k = 10; k < 40; k++) lines[k] = lines[k].replace(/,[^,]+$/, ',?')
    const { res } = await analyseGuessed(lines.join('\n'), { acceptBadRows: true })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.summary.read.badRows.count).toBe(30)
    expect(res.body.summary.read.badRows.items).toHaveLength(20)
    expect(res.body.summary.read.badRows.items[0]).toMatchObject({ row: 11, column: 'Current (A)' })
  })

  it('refuses a file where most rows are bad even with bad rows accepted (wrong mapping)', async () => {
    const { res } = await analyseGuessed(logText(PASSING), { acceptBadRows: true, mapping: { ...COMMA_MAPPING, time: { column: 0, format: 'clock' } } })
    expect(res.status).toBe(400)
    expect(res.body.code).toBe('no_readings')
    expect(res.body.error).toMatch(/row 2, column "Elapsed \(s\)": "0" is not a time written h:mm:ss/)
  })

  it('names the row where time runs backwards', async () => {
    const lines = logText(PASSING).split('\n')
    lines[50] = lines[50].replace(/^\d+/, '100')
    const { res } = await analyseGuessed(lines.join('\n'))
    expect(res.status).toBe(422)
    expect(res.body.fields[0].path).toBe('row 51, Elapsed (s)')
    expect(res.body.fields[0].message).toBe('"100" runs backwards (after 2880)')
  })

  it('names a missing column', async () => {
    const res = await tech.post('/api/discharge/logs', {
      uploadId: (await uploadFile(tech, logText(PASSING))).body.uploadId,
      mapping: { ...COMMA_MAPPING, current: { column: 7, unit: 'A' } },
      options: NICD_3H,
      dryRun: true,
    })
    expect(res.status).toBe(400)
    expect(res.body.error).toContain('has 3 cell(s), so no "Column 8"')
  })

  it('refuses an empty file and a binary file at upload, keeping nothing', async () => {
    const before = stagedCount()
    const empty = await uploadFile(tech, '')
    expect(empty.status).toBe(400)
    expect(empty.body.fields[0].path).toBe('file')
    expect(empty.body.error).toMatch(/empty/)
    const binary = await uploadFile(tech, Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00, 0x08, 0x00, 0x00, 0x00]), 'log.xlsx')
    expect(binary.status).toBe(400)
    expect(binary.body.error).toMatch(/not a text file/)
    const oneColumn = await uploadFile(tech, 'voltage\n5.1\n5.0\n')
    expect(oneColumn.status).toBe(400)
    expect(oneColumn.body.error).toMatch(/at least two columns/)
    expect(stagedCount()).toBe(before)
    expect(await count('discharge_files')).toBe(0)
  })

  it('refuses a file over the cap with 413 and a clear message', async () => {
    const before = stagedCount()
    const res = await uploadFile(tech, Buffer.alloc(MAX_LOG_BYTES + 1024, 0x31))
    expect(res.status).toBe(413)
    expect(res.body.error).toMatch(/larger than 50 MB/)
    expect(stagedCount()).toBe(before)
  })

  it('stores nothing when a save is refused for bad rows or a wrong link', async () => {
    const fresh = await makeTeam('Nothing stored')
    const client = await signIn(built.app, fresh.users.technician.email)
    const lines = logText(PASSING).split('\n')
    lines[5] = '240,5.58,abc'
    const up = await uploadFile(client, lines.join('\n'))
    const bad = await client.post('/api/discharge/logs', { uploadId: up.body.uploadId, title: 'Refused', mapping: COMMA_MAPPING, options: NICD_3H })
    expect(bad.status).toBe(422)
    const foreignSheet = await sheetIn(team)
    const wrongLink = await client.post('/api/discharge/logs', {
      uploadId: up.body.uploadId,
      title: 'Refused',
      mapping: COMMA_MAPPING,
      options: NICD_3H,
      acceptBadRows: true,
      specSheetId: foreignSheet.id,
    })
    expect(wrongLink.status).toBe(404)
    expect(wrongLink.body.fields).toEqual([{ path: 'specSheetId', message: 'is not a specification sheet of this workspace' }])
    const badOptions = await client.post('/api/discharge/logs', {
      uploadId: up.body.uploadId,
      title: 'Refused',
      mapping: COMMA_MAPPING,
      options: { ...NICD_3H, ratedDuration: '3 kg' },
    })
    expect(badOptions.status).toBe(400)
    expect(badOptions.body.fields[0].path).toBe('options.ratedDuration')
    expect(await count('discharge_files', fresh.workspaceId)).toBe(0)
    expect(await count('discharge_logs', fresh.workspaceId)).toBe(0)
  })

  it('answers 404 for another workspace’s upload', async () => {
    const other = await makeTeam('Other uploads')
    const outsider = await signIn(built.app, other.users.technician.email)
    const up = await uploadFile(tech, logText(PASSING))
    const res = await outsider.post('/api/discharge/logs', { uploadId: up.body.uploadId, mapping: COMMA_MAPPING, options: NICD_3H, dryRun: true })
    expect(res.status).toBe(404)
  })
})

describe('saving, attaching, comparing', () => {
  it('keeps the raw file once per SHA-256 and attaches logs to a sheet and a duration test', async () => {
    const fresh = await makeTeam('Saving team')
    const client = await signIn(built.app, fresh.users.technician.email)
    const sheet = await sheetIn(fresh, { title: 'Sheet with logs' })
    const { luminaire } = await siteWithLuminaire(fresh.workspaceId)
    const test = await testIn(fresh.workspaceId, luminaire.id, { kind: 'duration', testedOn: '2026-03-01', passed: true, achievedDurationH: 3.2 })
    const functional = await testIn(fresh.workspaceId, luminaire.id, { kind: 'functional', testedOn: '2026-03-02' })

    const first = await uploadFile(client, logText(PASSING), 'a.csv')
    const saved = await client.post('/api/discharge/logs', {
      uploadId: first.body.uploadId,
      title: 'After the new pack',
      mapping: COMMA_MAPPING,
      options: NICD_3H,
      specSheetId: sheet.id,
    })
    expect(saved.status, JSON.stringify(saved.body)).toBe(201)
    expect(saved.body.specSheet).toEqual({ id: sheet.id, title: 'Sheet with logs' })
    // The staged copy is gone once saved; the same bytes uploaded again point at the stored file.
    const second = await uploadFile(client, logText(PASSING), 'a-again.csv')
    expect(second.body.storedFileId).toBe(saved.body.fileId)
    const onFunctional = await client.post('/api/discharge/logs', {
      uploadId: second.body.uploadId,
      title: 'Wrong test',
      mapping: COMMA_MAPPING,
      options: NICD_3H,
      testRecordId: functional,
    })
    expect(onFunctional.status).toBe(400)
    const onTest = await client.post('/api/discharge/logs', {
      uploadId: second.body.uploadId,
      title: 'Same file, on the test',
      mapping: COMMA_MAPPING,
      options: NICD_3H,
      testRecordId: test,
    })
    expect(onTest.status, JSON.stringify(onTest.body)).toBe(201)
    expect(onTest.body.fileId).toBe(saved.body.fileId)
    expect(await count('discharge_files', fresh.workspaceId)).toBe(1)
    expect((await dataSource.query('SELECT discharge_log_id FROM test_records WHERE id = $1', [test]))[0].discharge_log_id).toBe(onTest.body.id)

    const bySheet = await client.get(`/api/discharge/logs?sheetId=${sheet.id}`)
    expect(bySheet.body.items.map((l: { id: string }) => l.id)).toEqual([saved.body.id])
    const byLuminaire = await client.get(`/api/discharge/logs?luminaireId=${luminaire.id}`)
    expect(byLuminaire.body.items.map((l: { id: string }) => l.id)).toEqual([onTest.body.id])
    expect(byLuminaire.body.items[0].testRecord).toMatchObject({ id: test, testedOn: '2026-03-01', luminaireTag: luminaire.tag })

    // Re-analyse the stored file with other options: no new file row.
    const again = await client.post('/api/discharge/logs', {
      fileId: saved.body.fileId,
      mapping: COMMA_MAPPING,
      options: { ...NICD_3H, cutoffPerCell: '1.1 V' },
      dryRun: true,
    })
    expect(again.status).toBe(200)
    // 5.6 − 0.5 h = 4.4 V at h = 2.4.
    expect(again.body.summary.runtimeH).toBeCloseTo(2.4, 9)

    const pdf = await client.agent
      .get(`/api/sheets/${sheet.id}/pdf`)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = []
        res.on('data', (c: Buffer) => chunks.push(c))
        res.on('end', () => cb(null, Buffer.concat(chunks)))
      })
    const text = pdfText(pdf.body as Buffer)
    expect(text).toContain('Discharge logs')
    expect(text).toContain('After the new pack')

    const designer = await signIn(built.app, fresh.users.designer.email)
    expect((await designer.delete(`/api/discharge/logs/${onTest.body.id}`)).status).toBe(204)
    expect((await dataSource.query('SELECT discharge_log_id FROM test_records WHERE id = $1', [test]))[0].discharge_log_id).toBeNull()
    expect(await count('discharge_files', fresh.workspaceId)).toBe(1)
    expect((await designer.delete(`/api/discharge/logs/${saved.body.id}`)).status).toBe(204)
    // The file goes with its last log.
    expect(await count('discharge_files', fresh.workspaceId)).toBe(0)
  })

  it('compares two logs: runtime and charge side by side, with the change', async () => {
    const a = await savedLogIn(team, PASSING, { title: 'Before' })
    const b = await savedLogIn(team, FAILING, { title: 'After' })
    const res = await tech.get(`/api/discharge/compare?a=${a.id}&b=${b.id}`)
    expect(res.status).toBe(200)
    expect(res.body.a.title).toBe('Before')
    expect(res.body.b.curve.tH.length).toBeGreaterThan(100)
    // 2.6667 h − 3.2 h and 1.3333 Ah − 1.6 Ah.
    expect(res.body.change.runtimeH).toBeCloseTo(1.6 / 0.6 - 3.2, 9)
    expect(res.body.change.deliveredAh).toBeCloseTo(0.5 * (1.6 / 0.6) - 1.6, 9)
    const missing = await tech.get(`/api/discharge/compare?a=${a.id}&b=not-an-id`)
    expect(missing.status).toBe(404)
  })

  it('down-samples a long log to at most 2,000 points and never returns NaN', async () => {
    const long = { ...PASSING, every: 2 }
    const { res } = await analyseGuessed(logText(long))
    expect(res.status).toBe(200)
    expect(res.body.summary.read.rows).toBe(6301)
    expect(res.body.curve.tH).toHaveLength(2000)
    expect(JSON.stringify(res.body)).not.toMatch(/NaN|Infinity/)
  })
})

describe('demo logs', () => {
  it('seeds a passing and a failing modelled 3 h test, once however often it runs', async () => {
    const demo = await makeTeam('Demo discharge')
    await sheetIn(demo, { title: 'Demo sheet' })
    const { luminaire } = await siteWithLuminaire(demo.workspaceId)
    const failed = await testIn(demo.workspaceId, luminaire.id, { kind: 'duration', testedOn: '2026-02-01', passed: false, achievedDurationH: 2.5 })
    const ctx = { workspaceId: demo.workspaceId, users: Object.fromEntries(Object.entries(demo.users).map(([role, u]) => [role, u.id])) }
    await dataSource.transaction((m) => seedDischarge(m, ctx))
    await dataSource.transaction((m) => seedDischarge(m, ctx))
    const rows: Array<{ title: string; pass: boolean; runtime: number; spec_sheet_id: string | null; test_record_id: string | null }> = await dataSource.query(
      `SELECT title, (summary->>'pass')::boolean AS pass, (summary->>'runtimeH')::float AS runtime, spec_sheet_id, test_record_id FROM discharge_logs WHERE workspace_id = $1 ORDER BY title`,
      [demo.workspaceId],
    )
    expect(rows).toHaveLength(2)
    const [fails, passes] = rows
    expect(passes.title).toMatch(/passes \(modelled, not measured\)/)
    expect(passes.pass).toBe(true)
    expect(passes.spec_sheet_id).not.toBeNull()
    expect(fails.pass).toBe(false)
    expect(fails.runtime).toBeLessThan(3)
    expect(fails.test_record_id).toBe(failed)
    expect(await count('discharge_files', demo.workspaceId)).toBe(2)
  })
})
