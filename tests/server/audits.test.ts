/** /api/audits: saving wattage audits, listing, attaching to sheets and luminaires, roles, workspaces, the sheet PDF. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { AuditEvent } from '../../server/modules/audit/audit-event.entity'
import { DEMO_AUDITS, seedAudits } from '../../server/demo/audits.demo'
import { listAudits } from '../../server/modules/audits/audits.service'
import { AuditListQuerySchema } from '../../shared/schemas/wattage-audit.schema'
import { ENGINE_VERSION } from '../../shared/engine/version'
import { AUDIT_READINGS, auditBody, auditIn } from '../helpers/audits'
import { pdfText } from '../helpers/pdf-text'
import { siteWithLuminaire } from '../helpers/register-fixtures'
import { sheetIn } from '../helpers/sheets'
import { anonymous, closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'

let built: BuiltApp
let team: TestTeam
let other: TestTeam
let tech: Client
let viewer: Client
let designer: Client
let outsider: Client

beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Audit team')
  other = await makeTeam('Other audit team')
  tech = await signIn(built.app, team.users.technician.email)
  viewer = await signIn(built.app, team.users.viewer.email)
  designer = await signIn(built.app, team.users.designer.email)
  outsider = await signIn(built.app, other.users.owner.email)
})
afterAll(closeTestApp)

/** A PDF answer collected as bytes (supertest leaves binary bodies alone otherwise). */
function pdfOf(client: Client, path: string) {
  return client
    .get(path)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => done(null, Buffer.concat(chunks)))
    })
}

describe('saving an audit', () => {
  it('lets a technician save one; the server runs the engine and keeps the readings as typed', async () => {
    const res = await tech.post('/api/audits', auditBody())
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const a = res.body
    expect(a.inputs.measuredCurrent).toBe('25.7 mA')
    expect(a.engineVersion).toBe(ENGINE_VERSION)
    expect(a.author).toEqual({ id: team.users.technician.id, name: 'technician person' })
    expect(a.claimedPowerW).toBe(4)
    // Apparent power S = V·I (IEEE Std 1459-2010): 230 V × 25.7 mA = 5.911 VA; λ = P/S = 2.6 / 5.911.
    expect(a.results.apparentPowerVA).toBeCloseTo(5.911, 6)
    expect(a.results.powerFactor).toBeCloseTo(2.6 / 5.911, 6)
    // LED power on battery, d.c. P = V·I: 27.1 V × 16 mA = 0.4336 W.
    expect(a.results.ledPowerBatteryW).toBeCloseTo(0.4336, 6)
    expect(a.results.claimVerdict).toBe('below claim')
    expect(a.results.working.map((s: { id: string }) => s.id)).toContain('claimDeviation')
    const events = await dataSource.getRepository(AuditEvent).find({ where: { workspaceId: team.workspaceId, entityId: a.id } })
    expect(events.map((e) => e.action)).toEqual(['wattage-audit.saved'])
    expect(events[0].actorId).toBe(team.users.technician.id)
  })

  it('refuses a viewer (403) and an anonymous caller (401)', async () => {
    expect((await viewer.post('/api/audits', auditBody())).status).toBe(403)
    expect((await anonymous(built.app).post('/api/audits', auditBody())).status).toBe(401)
  })

  it('answers impossible readings with field errors under inputs', async () => {
    const res = await tech.post(
      '/api/audits',
      auditBody({ inputs: { ...AUDIT_READINGS, powerFactor: 1.3, supplyVoltage: '-230 V', ledCurrentMains: undefined, measuredCurrent: '25 kg' } }),
    )
    expect(res.status).toBe(400)
    const paths = (res.body.fields as Array<{ path: string; message: string }>).map((f) => f.path)
    expect(paths).toEqual(expect.arrayContaining(['inputs.powerFactor', 'inputs.supplyVoltage', 'inputs.measuredCurrent']))
    const pf = res.body.fields.find((f: { path: string }) => f.path === 'inputs.powerFactor')
    expect(pf.message).toMatch(/cannot be greater than 1/)
  })

  it('asks for the other half of a pair of readings', async () => {
    const res = await tech.post('/api/audits', auditBody({ inputs: { ...AUDIT_READINGS, ledCurrentMains: undefined } }))
    expect(res.status).toBe(400)
    expect(res.body.fields).toEqual([{ path: 'inputs.ledCurrentMains', message: 'needed together with ledVoltageMains' }])
  })

  it('saves suspicious readings with warnings, not errors', async () => {
    // 2.6 W real at 230 V × 5 mA = 1.15 VA would mean a power factor above 1.
    const res = await tech.post('/api/audits', auditBody({ inputs: { ...AUDIT_READINGS, measuredCurrent: '5 mA' } }))
    expect(res.status).toBe(201)
    expect(res.body.results.warnings[0]).toMatchObject({ code: 'power-current-inconsistent', severity: 'critical' })
  })

  it('refuses a reading the engine does not know (never stores it silently dropped) and rejects a missing title', async () => {
    const res = await tech.post('/api/audits', auditBody({ inputs: { ...AUDIT_READINGS, colour: 'red' } }))
    expect(res.status).toBe(400)
    expect(res.body.errors).toEqual([expect.objectContaining({ pointer: '/inputs/colour', code: 'unknown_field' })])
    const bad = await tech.post('/api/audits', auditBody({ title: '  ' }))
    expect(bad.status).toBe(400)
    expect(bad.body.fields).toEqual([{ path: 'title', message: 'is required' }])
  })
})

describe('listing and reading', () => {
  it('lists the workspace audits newest first without the working, and reads one with it', async () => {
    const t = await makeTeam('List team')
    const first = await auditIn(t, { title: 'Before the driver swap' })
    const second = await auditIn(t, { title: 'After the driver swap' })
    await auditIn(other, { title: 'Not ours' })
    const v = await signIn(built.app, t.users.viewer.email)
    const res = await v.get('/api/audits')
    expect(res.status).toBe(200)
    expect(res.body.total).toBe(2)
    expect(res.body.items.map((a: { id: string }) => a.id)).toEqual([second.id, first.id])
    expect(res.body.items[0].results.working).toBeUndefined()
    expect(res.body.items[0].results.measuredPowerW).toBe(2.6)
    const one = await v.get(`/api/audits/${first.id}`)
    expect(one.status).toBe(200)
    expect(one.body.results.working.length).toBeGreaterThan(3)
    const searched = await v.get('/api/audits?q=after')
    expect(searched.body.items.map((a: { title: string }) => a.title)).toEqual(['After the driver swap'])
  })

  it('returns audits by ids in the order asked, for the side-by-side table', async () => {
    const a = await auditIn(team, { title: 'Trial A' })
    const b = await auditIn(team, { title: 'Trial B', inputs: { ...AUDIT_READINGS, measuredPower: '3.9 W' } })
    const c = await auditIn(team, { title: 'Trial C' })
    const foreign = await auditIn(other)
    const res = await viewer.get(`/api/audits?ids=${[b.id, c.id, a.id, foreign.id].join(',')}`)
    expect(res.status).toBe(200)
    expect(res.body.items.map((x: { title: string }) => x.title)).toEqual(['Trial B', 'Trial C', 'Trial A'])
    expect(res.body.items[0].results.claimVerdict).toBe('within tolerance')
    const tooMany = await viewer.get(`/api/audits?ids=${Array(7).fill(a.id).join(',')}`)
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.fields[0].path).toBe('ids')
  })

  it('answers 404 for another workspace’s audit and for a malformed id', async () => {
    const mine = await auditIn(team)
    expect((await outsider.get(`/api/audits/${mine.id}`)).status).toBe(404)
    expect((await outsider.post(`/api/audits/${mine.id}/attach`, { specSheetId: null })).status).toBe(404)
    expect((await outsider.delete(`/api/audits/${mine.id}`)).status).toBe(404)
    expect((await viewer.get('/api/audits/not-a-uuid')).status).toBe(404)
    expect((await viewer.get('/api/audits/00000000-0000-4000-8000-000000000000')).status).toBe(404)
    // Still there for its own workspace.
    expect((await viewer.get(`/api/audits/${mine.id}`)).status).toBe(200)
  })
})

describe('attaching', () => {
  it('attaches an audit to a sheet and a luminaire, lists it on each, and detaches it', async () => {
    const sheet = await sheetIn(team, { title: 'Stair core with audit' })
    const { luminaire, site } = await siteWithLuminaire(team.workspaceId)
    const a = await auditIn(team, { title: 'Attached audit' })
    const res = await tech.post(`/api/audits/${a.id}/attach`, { specSheetId: sheet.id, luminaireId: luminaire.id })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.specSheet).toEqual({ id: sheet.id, title: 'Stair core with audit' })
    expect(res.body.luminaireLink).toMatchObject({ id: luminaire.id, tag: luminaire.tag, siteId: site.id, siteName: site.name })

    const onSheet = await viewer.get(`/api/audits?sheetId=${sheet.id}`)
    expect(onSheet.body.items.map((x: { id: string }) => x.id)).toEqual([a.id])
    const onLuminaire = await viewer.get(`/api/audits?luminaireId=${luminaire.id}`)
    expect(onLuminaire.body.items.map((x: { id: string }) => x.id)).toEqual([a.id])

    const detached = await tech.post(`/api/audits/${a.id}/attach`, { specSheetId: null })
    expect(detached.body.specSheetId).toBeNull()
    expect(detached.body.luminaireId).toBe(luminaire.id)
    expect((await viewer.get(`/api/audits?sheetId=${sheet.id}`)).body.items).toEqual([])

    const events = await dataSource.getRepository(AuditEvent).find({ where: { entityId: a.id, action: 'wattage-audit.attached' } })
    expect(events).toHaveLength(2)
  })

  it('saves an audit already attached to a sheet', async () => {
    const sheet = await sheetIn(team)
    const res = await tech.post('/api/audits', auditBody({ specSheetId: sheet.id }))
    expect(res.status).toBe(201)
    expect(res.body.specSheetId).toBe(sheet.id)
  })

  it('refuses another workspace’s sheet or luminaire exactly like a missing one', async () => {
    const a = await auditIn(team)
    const foreignSheet = await sheetIn(other)
    const { luminaire: foreignLuminaire } = await siteWithLuminaire(other.workspaceId)
    const foreign = await tech.post(`/api/audits/${a.id}/attach`, { specSheetId: foreignSheet.id, luminaireId: foreignLuminaire.id })
    const missing = await tech.post(`/api/audits/${a.id}/attach`, {
      specSheetId: '00000000-0000-4000-8000-000000000001',
      luminaireId: '00000000-0000-4000-8000-000000000002',
    })
    expect(foreign.status).toBe(404)
    expect(foreign.body).toEqual(missing.body)
    expect(foreign.body.fields.map((f: { path: string }) => f.path)).toEqual(['specSheetId', 'luminaireId'])
    const onCreate = await tech.post('/api/audits', auditBody({ specSheetId: foreignSheet.id }))
    expect(onCreate.status).toBe(404)
  })

  it('needs a target and lets no viewer attach', async () => {
    const a = await auditIn(team)
    const empty = await tech.post(`/api/audits/${a.id}/attach`, {})
    expect(empty.status).toBe(400)
    expect(empty.body.fields[0].path).toBe('specSheetId')
    expect((await viewer.post(`/api/audits/${a.id}/attach`, { specSheetId: null })).status).toBe(403)
  })
})

describe('deleting', () => {
  it('is for designers; the readings stay in the audit trail', async () => {
    const a = await auditIn(team, { title: 'To be removed' })
    expect((await tech.delete(`/api/audits/${a.id}`)).status).toBe(403)
    expect((await designer.delete(`/api/audits/${a.id}`)).status).toBe(204)
    expect((await viewer.get(`/api/audits/${a.id}`)).status).toBe(404)
    const event = await dataSource.getRepository(AuditEvent).findOneOrFail({ where: { entityId: a.id, action: 'wattage-audit.deleted' } })
    expect(event.data).toMatchObject({ title: 'To be removed', inputs: { measuredPower: '2.6 W' } })
  })

  it('leaves the audit in place, unattached, when its sheet goes', async () => {
    const sheet = await sheetIn(team)
    const a = await auditIn(team, { specSheetId: sheet.id })
    await dataSource.query('DELETE FROM spec_sheets WHERE id = $1', [sheet.id])
    const res = await viewer.get(`/api/audits/${a.id}`)
    expect(res.status).toBe(200)
    expect(res.body.specSheetId).toBeNull()
  })
})

describe('the sheet PDF', () => {
  it('carries a "Wattage audits" section with each attached audit', async () => {
    const sheet = await sheetIn(team, { title: 'Sheet with a wattage audit' })
    await auditIn(team, { title: 'Bench audit of the trial bulkhead', specSheetId: sheet.id })
    const res = await pdfOf(viewer, `/api/sheets/${sheet.id}/pdf`)
    expect(res.status).toBe(200)
    const text = pdfText(res.body as Buffer)
    expect(text).toContain('Wattage audits')
    expect(text).toContain('Bench audit of the trial bulkhead')
    expect(text).toMatch(/Claimed power: \s*4 W/)
    expect(text).toMatch(/Verdict: \s*2\.6 W measured: draws less than claimed/)
    // The section sits before the cautions.
    expect(text.indexOf('Wattage audits')).toBeLessThan(text.lastIndexOf('Cautions'))
  })

  it('leaves a sheet without audits as it was', async () => {
    const sheet = await sheetIn(team)
    const res = await pdfOf(viewer, `/api/sheets/${sheet.id}/pdf`)
    expect(pdfText(res.body as Buffer)).not.toContain('Wattage audits')
  })
})

describe('demo audits', () => {
  it('seed once, stay the same on a second run, and tell the "4 W" bulkhead story', async () => {
    const t = await makeTeam('Demo audit team')
    const ctx = { workspaceId: t.workspaceId, users: { technician: t.users.technician.id } }
    await seedAudits(dataSource.manager, ctx)
    await seedAudits(dataSource.manager, ctx)
    const { items } = await listAudits(t.workspaceId, AuditListQuerySchema.parse({}))
    expect(items).toHaveLength(DEMO_AUDITS.length)
    const first = items.find((a) => a.title === DEMO_AUDITS[0].title)!
    expect(first.claimedPowerW).toBe(4)
    expect(first.luminaire).toMatch(/invented model/)
    const r = first.results as Record<string, number>
    expect(r.measuredPowerW).toBe(2.6)
    expect(r.apparentPowerVA).toBeGreaterThan(5.8)
    expect(r.apparentPowerVA).toBeLessThan(6)
    // Much less reaches the LEDs on battery than on mains.
    expect(r.ledPowerBatteryW / r.ledPowerMainsW).toBeLessThan(0.25)
  })
})
