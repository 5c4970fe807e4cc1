/** The site register over the API: CRUD, roles, other workspaces, the log book, exports. */
import crypto from 'node:crypto'
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { addDays, addMonthsClamped } from '../../shared/engine/due'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import { pdfText } from '../helpers/pdf-text'

let built: BuiltApp
let team: TestTeam
let other: TestTeam
let owner: Client
let designer: Client
let technician: Client
let viewer: Client
let outsider: Client
const today = new Date().toISOString().slice(0, 10)

beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Register team')
  other = await makeTeam('Other register team')
  owner = await signIn(built.app, team.users.owner.email)
  designer = await signIn(built.app, team.users.designer.email)
  technician = await signIn(built.app, team.users.technician.email)
  viewer = await signIn(built.app, team.users.viewer.email)
  outsider = await signIn(built.app, other.users.owner.email)
})
afterAll(closeTestApp)

const luminaire = (over: Record<string, unknown> = {}) => ({
  tag: 'E-01',
  location: 'Stair 1 landing',
  purpose: 'escape-route',
  mode: 'non-maintained',
  ratedDurationH: 3,
  chemistry: 'nicd',
  cellsInSeries: 3,
  capacityAh: 1.6,
  packFittedOn: '2024-04-01',
  ...over,
})
const auditCount = async (entityId: string, action: string) =>
  Number((await dataSource.query('SELECT count(*)::int AS n FROM audit_events WHERE entity_id = $1 AND action = $2', [entityId, action]))[0].n)

describe('sites, areas and luminaires', () => {
  it('a designer builds a site; everyone in the workspace reads it; outsiders get 404', async () => {
    const created = await designer.post('/api/sites', {
      name: 'Test library',
      address: '1 Reading Row',
      responsibleEmail: 'Keeper@Example.test',
      regime: 'en50172',
      ceilingTemperatureC: 24,
    })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body.responsibleEmail).toBe('keeper@example.test')
    const id = created.body.id
    expect(await auditCount(id, 'site.created')).toBe(1)

    const area = await designer.post(`/api/sites/${id}/areas`, { name: 'Ground floor' })
    expect(area.status).toBe(201)
    const dup = await designer.post(`/api/sites/${id}/areas`, { name: 'ground FLOOR' })
    expect(dup.status).toBe(409)
    expect(dup.body.fields[0].path).toBe('name')

    const lum = await designer.post(`/api/sites/${id}/luminaires`, luminaire({ areaId: area.body.id }))
    expect(lum.status, JSON.stringify(lum.body)).toBe(201)
    expect(lum.body.areaName).toBe('Ground floor')
    expect(await auditCount(lum.body.id, 'luminaire.created')).toBe(1)
    const sameTag = await designer.post(`/api/sites/${id}/luminaires`, luminaire({ tag: 'e-01' }))
    expect(sameTag.status).toBe(409)
    expect(sameTag.body.fields).toEqual([{ path: 'tag', message: 'is already used on this site' }])

    const read = await viewer.get(`/api/sites/${id}`)
    expect(read.status).toBe(200)
    expect(read.body.luminaires.map((l: { tag: string }) => l.tag)).toEqual(['E-01'])
    // Never tested, pack fitted 2024-04-01: the engine's rule puts the first functional test a month later.
    expect(read.body.luminaires[0].due.functional.nextDueOn).toBe(addMonthsClamped('2024-04-01', 1))
    expect(read.body.luminaires[0].forecast.serviceLifeYears).toBeGreaterThan(0)

    expect((await outsider.get(`/api/sites/${id}`)).status).toBe(404)
    expect((await outsider.patch(`/api/sites/${id}`, { name: 'Taken over' })).status).toBe(404)
    expect((await outsider.get(`/api/luminaires/${lum.body.id}`)).status).toBe(404)
    expect((await outsider.delete(`/api/areas/${area.body.id}`)).status).toBe(404)
    expect((await designer.get('/api/sites/not-a-uuid')).status).toBe(404)
    expect((await designer.get(`/api/sites/${crypto.randomUUID()}`)).status).toBe(404)
  })

  it('roles: viewers and technicians cannot manage sites or luminaires', async () => {
    const site = await siteIn(team.workspaceId)
    for (const c of [viewer, technician]) {
      expect((await c.post('/api/sites', { name: 'Nope' })).status).toBe(403)
      expect((await c.patch(`/api/sites/${site.id}`, { name: 'Nope' })).status).toBe(403)
      expect((await c.post(`/api/sites/${site.id}/luminaires`, luminaire())).status).toBe(403)
    }
    expect((await owner.patch(`/api/sites/${site.id}`, { regime: 'nfpa101' })).status).toBe(200)
  })

  it('bad input answers 400 with field paths and reasons', async () => {
    const res = await designer.post('/api/sites', { name: '', regime: 'weekly', ceilingTemperatureC: 'warm', responsibleEmail: 'nobody' })
    expect(res.status).toBe(400)
    const paths = res.body.fields.map((f: { path: string }) => f.path).sort()
    expect(paths).toEqual(['ceilingTemperatureC', 'name', 'regime', 'responsibleEmail'])
    const site = await siteIn(team.workspaceId)
    const bad = await designer.post(`/api/sites/${site.id}/luminaires`, luminaire({ chemistry: 'unobtainium', packFittedOn: '2025-02-30', ratedDurationH: -1 }))
    expect(bad.status).toBe(400)
    expect(Object.fromEntries(bad.body.fields.map((f: { path: string; message: string }) => [f.path, f.message]))).toMatchObject({
      chemistry: expect.stringMatching(/must be one of/),
      packFittedOn: expect.stringMatching(/real date/),
      ratedDurationH: expect.stringMatching(/greater than zero|at least/),
    })
    const foreignArea = await designer.post(`/api/sites/${site.id}/luminaires`, luminaire({ areaId: crypto.randomUUID() }))
    expect(foreignArea.status).toBe(404)
    expect(foreignArea.body.fields[0].path).toBe('areaId')
  })

  it('changes to a pack leave audit events, and a technician may record a new pack', async () => {
    const site = await siteIn(team.workspaceId)
    const l = await luminaireIn(team.workspaceId, site.id)
    const patched = await designer.patch(`/api/luminaires/${l.id}`, { capacityAh: 2.2 })
    expect(patched.status).toBe(200)
    expect(await auditCount(l.id, 'luminaire.updated')).toBe(1)
    expect(await auditCount(l.id, 'pack.changed')).toBe(1)
    const replaced = await technician.post(`/api/luminaires/${l.id}/pack`, { packFittedOn: today, chemistry: 'nimh', note: 'Old pack swollen' })
    expect(replaced.status).toBe(200)
    expect(replaced.body).toMatchObject({ chemistry: 'nimh', packFittedOn: today, capacityAh: 2.2 })
    const events = await dataSource.query(`SELECT data FROM audit_events WHERE entity_id = $1 AND action = 'pack.replaced'`, [l.id])
    expect(events[0].data.before.chemistry).toBe('nicd')
    expect(events[0].data.after.chemistry).toBe('nimh')
    expect((await viewer.post(`/api/luminaires/${l.id}/pack`, { packFittedOn: today })).status).toBe(403)
  })

  it('deleting a site removes its luminaires and logs the deletion', async () => {
    const site = await siteIn(team.workspaceId)
    await luminaireIn(team.workspaceId, site.id)
    expect((await designer.delete(`/api/sites/${site.id}`)).status).toBe(204)
    expect((await viewer.get(`/api/sites/${site.id}`)).status).toBe(404)
    expect(Number((await dataSource.query('SELECT count(*)::int AS n FROM luminaires WHERE site_id = $1', [site.id]))[0].n)).toBe(0)
    expect(await auditCount(site.id, 'site.deleted')).toBe(1)
  })
})

describe('test records', () => {
  it('a technician records a round; retrying with the same clientIds adds nothing; viewers may not record', async () => {
    const site = await siteIn(team.workspaceId)
    const a = await luminaireIn(team.workspaceId, site.id, { tag: 'A-1' })
    const b = await luminaireIn(team.workspaceId, site.id, { tag: 'A-2' })
    const records = [
      { clientId: crypto.randomUUID(), luminaireId: a.id, kind: 'functional', testedOn: today, passed: true },
      {
        clientId: crypto.randomUUID(),
        luminaireId: b.id,
        kind: 'duration',
        testedOn: today,
        passed: false,
        achievedDurationH: 2.1,
        faults: 'Went out after 2 h 6 min',
        remedialAction: 'Pack to be replaced',
      },
    ]
    const first = await technician.post('/api/tests', { records })
    expect(first.status, JSON.stringify(first.body)).toBe(201)
    expect(first.body.records.map((r: { outcome: string }) => r.outcome)).toEqual(['created', 'created'])
    const again = await technician.post('/api/tests', { records })
    expect(again.status).toBe(200)
    expect(again.body.records.map((r: { outcome: string }) => r.outcome)).toEqual(['unchanged', 'unchanged'])
    // Two retries racing each other still leave one row per clientId.
    await Promise.all([technician.post('/api/tests', { records }), technician.post('/api/tests', { records })])
    const rows = await dataSource.query('SELECT client_id FROM test_records WHERE luminaire_id = ANY($1::uuid[])', [[a.id, b.id]])
    expect(rows).toHaveLength(2)
    // Other content under the same clientId is a conflict: the log-book entry is never rewritten.
    const changed = await technician.post('/api/tests', { records: [{ ...records[1], remedialAction: 'Pack replaced the same day' }] })
    expect(changed.status).toBe(409)
    expect(changed.body.errors).toEqual([expect.objectContaining({ pointer: '/records/0/clientId', code: 'conflict' })])
    expect(await auditCount(first.body.records[1].id, 'test.updated')).toBe(0)
    expect(await auditCount(first.body.records[0].id, 'test.recorded')).toBe(1)

    const log = await viewer.get(`/api/sites/${site.id}/tests`)
    expect(log.body.tests).toHaveLength(2)
    const status = await viewer.get(`/api/sites/${site.id}`)
    expect(status.body.counts.failed).toBe(1)

    expect((await viewer.post('/api/tests', { records })).status).toBe(403)
    expect((await outsider.post('/api/tests', { records: [{ ...records[0], clientId: crypto.randomUUID() }] })).status).toBe(404)
  })

  it('a failed test needs the fault described; a clientId cannot move to another luminaire', async () => {
    const site = await siteIn(team.workspaceId)
    const a = await luminaireIn(team.workspaceId, site.id)
    const b = await luminaireIn(team.workspaceId, site.id)
    const noFault = await technician.post('/api/tests', {
      records: [{ clientId: crypto.randomUUID(), luminaireId: a.id, kind: 'functional', testedOn: today, passed: false }],
    })
    expect(noFault.status).toBe(400)
    expect(noFault.body.fields[0]).toEqual({ path: 'records.0.faults', message: 'say what failed' })
    const clientId = crypto.randomUUID()
    await technician.post('/api/tests', { records: [{ clientId, luminaireId: a.id, kind: 'functional', testedOn: today, passed: true }] })
    const moved = await technician.post('/api/tests', { records: [{ clientId, luminaireId: b.id, kind: 'functional', testedOn: today, passed: true }] })
    expect(moved.status).toBe(409)
  })

  it('the dashboard lists tests falling due in the next 60 days', async () => {
    const t = await makeTeam('Dashboard team')
    const c = await signIn(built.app, t.users.viewer.email)
    const site = await siteIn(t.workspaceId, { name: 'Dashboard building' })
    const l = await luminaireIn(t.workspaceId, site.id, { tag: 'D-1', packFittedOn: addDays(today, -400) })
    await testIn(t.workspaceId, l.id, { kind: 'duration', testedOn: addDays(today, -340) })
    await testIn(t.workspaceId, l.id, { kind: 'functional', testedOn: addDays(today, -10) })
    const res = await c.get('/api/sites')
    expect(res.status).toBe(200)
    expect(res.body.sites).toHaveLength(1)
    expect(res.body.sites[0].counts.luminaires).toBe(1)
    const upcoming = res.body.upcoming.map((u: { tag: string; kind: string; dueOn: string }) => `${u.tag} ${u.kind} ${u.dueOn}`)
    expect(upcoming).toEqual([`D-1 functional ${addMonthsClamped(addDays(today, -10), 1)}`, `D-1 duration ${addMonthsClamped(addDays(today, -340), 12)}`])
  })
})

describe('exports', () => {
  it('the CSV export neutralises cells that start like a formula', async () => {
    const site = await siteIn(team.workspaceId, { name: 'Export building' })
    const l = await luminaireIn(team.workspaceId, site.id, { tag: '=HYPERLINK("http://x.invalid","go")', location: '+44 stairwell', typeLabel: '@SUM(A1)' })
    await testIn(team.workspaceId, l.id, { kind: 'functional', testedOn: today, passed: false, faults: '-lamp out\n=1+1 on second line' })
    const reg = await viewer
      .get(`/api/sites/${site.id}/export/register.csv`)
      .buffer(true)
      .parse((res, done) => {
        let text = ''
        res.on('data', (c: Buffer) => (text += c.toString('utf8')))
        res.on('end', () => done(null, text))
      })
    expect(reg.status).toBe(200)
    expect(reg.headers['content-type']).toMatch(/text\/csv/)
    expect(reg.headers['content-disposition']).toMatch(/attachment; filename="export-building-register-\d{4}-\d{2}-\d{2}\.csv"/)
    const text = reg.body as string
    expect(text).toContain(`"'=HYPERLINK(""http://x.invalid"",""go"")"`)
    expect(text).toContain(`"'+44 stairwell"`)
    expect(text).toContain(`"'@SUM(A1)"`)
    // No cell begins with a bare formula character (cells parsed, so a line break inside a quoted cell is not a new row).
    const cells = Papa.parse<string[]>(text.trim()).data.flat()
    expect(cells.filter((c) => /^[=+@-]/.test(c))).toEqual([])
    expect(cells).toContain(`'-lamp out\n=1+1 on second line`)

    const log = await viewer.get(`/api/sites/${site.id}/export/logbook.csv?as=json`)
    expect(log.status).toBe(200)
    expect(log.body.content).toContain(`"'-lamp out\n=1+1 on second line"`)
    expect(log.body.content.split('\r\n')[0]).toBe(
      'tested_on,tag,test,result,achieved_duration_h,faults,remedial_action,recorded_by,recorded_at,recorded_in_error',
    )
  })

  it('PDF exports are real PDFs in Source Sans 3 that print names beyond Latin-1', async () => {
    // Invented names with letters from the latin-ext and greek subsets of the font.
    const site = await siteIn(team.workspaceId, { name: 'Zakład Łąkowa PDF building' })
    const l = await luminaireIn(team.workspaceId, site.id, { location: 'Stair Ω, landing' })
    await testIn(team.workspaceId, l.id, { kind: 'duration', testedOn: today, achievedDurationH: 3.2, faults: 'Lens cracked — replaced' })
    for (const file of ['register.pdf', 'logbook.pdf']) {
      const res = await viewer.get(`/api/sites/${site.id}/export/${file}?as=json`)
      expect(res.status).toBe(200)
      expect(res.body.mediaType).toBe('application/pdf')
      const pdf = Buffer.from(res.body.content, 'base64')
      expect(pdf.subarray(0, 5).toString()).toBe('%PDF-')
      expect(pdf.toString('latin1')).toMatch(/SourceSans3/)
      // Each run of one font subset is its own text object (one line in pdfText): join them.
      const text = pdfText(pdf).replace(/\n/g, '')
      expect(text).toContain('Zakład Łąkowa PDF building')
      if (file === 'register.pdf') expect(text).toContain('Stair Ω, landing')
      else expect(text).toContain('Lens cracked — replaced')
    }
    expect((await viewer.get(`/api/sites/${site.id}/export/secrets.txt`)).status).toBe(404)
    expect((await outsider.get(`/api/sites/${site.id}/export/register.csv`)).status).toBe(404)
  })
})
