/**
 * Photometric files, luminaire types and choosing a type for a route, through the API.
 * Expected spacings and packs come from the engine itself (its own tests check it against the
 * inverse-square cosine law and the size method); here the API must pass them through unchanged.
 */
import crypto from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { computeSpacing, spacingInput } from '../../shared/engine/spacing'
import { sizeInputSchema, sizePack } from '../../shared/engine/size'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'
import { corridorLm63, photometryIn, ROUTE_EXAMPLE, typeBody, typeIn } from '../helpers/photometry'
import { luminaireIn, siteIn } from '../helpers/register-fixtures'

let built: BuiltApp
let team: TestTeam
let other: TestTeam
let designer: Client
let viewer: Client
let technician: Client
let outsider: Client

beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Photometry team')
  other = await makeTeam('Other photometry team')
  designer = await signIn(built.app, team.users.designer.email)
  viewer = await signIn(built.app, team.users.viewer.email)
  technician = await signIn(built.app, team.users.technician.email)
  outsider = await signIn(built.app, other.users.owner.email)
})
afterAll(closeTestApp)

async function fileCount(workspaceId: string): Promise<number> {
  const rows: Array<{ n: string }> = await dataSource.query('SELECT count(*)::text AS n FROM photometric_files WHERE workspace_id = $1', [workspaceId])
  return Number(rows[0].n)
}

/** 1-based line of the first line of `text` matching `pattern`. */
const lineOf = (text: string, pattern: RegExp) => text.split('\n').findIndex((l) => pattern.test(l)) + 1

describe('photometric files', () => {
  it('uploads LM-63 text as JSON, parses it and stores the text with its hash', async () => {
    const text = corridorLm63()
    const res = await designer.post('/api/photometry', { name: 'Corridor test', text })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ name: 'Corridor test', edition: '2019', verticalCount: 19, horizontalCount: 5, absolute: true, inputWatts: 4.5 })
    expect(res.body.sha256).toBe(crypto.createHash('sha256').update(text).digest('hex'))
    const read = await viewer.get(`/api/photometry/${res.body.id}`)
    expect(read.status).toBe(200)
    expect(read.body.rawText).toBe(text)
    expect(read.body.parsed.verticalAngles).toHaveLength(19)
    expect(read.body.parsed.horizontalAngles).toEqual([0, 22.5, 45, 67.5, 90])
    expect(read.body.parsed.candela).toHaveLength(5)
    expect(read.body.parsed.header.keywords.MANUFAC).toBe('Invented for tests')
    const list = await viewer.get('/api/photometry')
    expect(list.body.files.map((f: { id: string }) => f.id)).toContain(res.body.id)
  })

  it('uploads a multipart file (field "file"), naming it after the file when no name is given', async () => {
    const text = corridorLm63()
    const res = await designer.agent
      .post('/api/photometry')
      .set('X-CSRF-Token', designer.csrf)
      .attach('file', Buffer.from(text), { filename: 'hall-unit.ies', contentType: 'application/octet-stream' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body.name).toBe('hall-unit')
    expect((await viewer.get(`/api/photometry/${res.body.id}`)).body.rawText).toBe(text)
  })

  it('refuses the same file twice in a workspace with 409, naming the stored copy', async () => {
    const text = corridorLm63()
    const first = await designer.post('/api/photometry', { text })
    expect(first.status).toBe(201)
    const again = await designer.post('/api/photometry', { text })
    expect(again.status).toBe(409)
    expect(again.body.existingId).toBe(first.body.id)
  })

  describe('a malformed file gets a 400 naming the line, and nothing is stored', () => {
    const cases: Array<{ what: string; make: (good: string) => string; line: (bad: string) => number; says: RegExp }> = [
      {
        what: 'wrong counts (one candela value too many)',
        make: (good) => good.trimEnd() + ' 12\n',
        line: (bad) => bad.trimEnd().split('\n').length,
        says: /left after the candela table/,
      },
      {
        what: 'wrong counts (the header promises more vertical angles than are given)',
        make: (good) => good.replace(/^1 -1 1 19 5 /m, '1 -1 1 20 5 '),
        // The 20th "vertical angle" read is the first horizontal angle (0), which is not ascending.
        line: (bad) => lineOf(bad, /^0 22\.5 45/),
        says: /ascending/,
      },
      {
        what: 'text where a number goes',
        make: (good) => good.replace(/^1 1 4\.5$/m, '1 one 4.5'),
        line: (bad) => lineOf(bad, /^1 one 4\.5$/),
        says: /expected a number .*"one"/,
      },
      {
        what: 'a truncated file',
        make: (good) => good.split('\n').slice(0, -3).join('\n'),
        line: (bad) => bad.split('\n').length,
        says: /file ends early/,
      },
      {
        what: 'no TILT line',
        make: (good) => good.replace('TILT=NONE\n', ''),
        line: (bad) => bad.trimEnd().split('\n').length,
        says: /no TILT= line/,
      },
    ]
    for (const c of cases) {
      it(c.what, async () => {
        const bad = c.make(corridorLm63())
        const before = await fileCount(team.workspaceId)
        const res = await designer.post('/api/photometry', { name: 'Broken', text: bad })
        expect(res.status, JSON.stringify(res.body)).toBe(400)
        const line = c.line(bad)
        expect(res.body.line).toBe(line)
        expect(res.body.error).toContain(`line ${line}:`)
        expect(res.body.error).toMatch(c.says)
        expect(res.body.fields[0]).toMatchObject({ path: 'text' })
        expect(res.body.fields[0].message).toMatch(new RegExp(`^line ${line}: `))
        expect(await fileCount(team.workspaceId)).toBe(before)
      })
    }

    it('a multipart upload names the line on the "file" field', async () => {
      const bad = corridorLm63().replace(/^1 1 4\.5$/m, '1 x 4.5')
      const res = await designer.agent.post('/api/photometry').set('X-CSRF-Token', designer.csrf).attach('file', Buffer.from(bad), 'bad.ies')
      expect(res.status).toBe(400)
      expect(res.body.fields[0].path).toBe('file')
      expect(res.body.fields[0].message).toMatch(/^line \d+: expected a number/)
    })

    it('an empty body names the missing text', async () => {
      const res = await designer.post('/api/photometry', {})
      expect(res.status).toBe(400)
      expect(res.body.fields[0]).toMatchObject({ path: 'text' })
    })
  })

  for (const [type, letter] of [
    [2, 'B'],
    [3, 'A'],
  ] as const) {
    it(`refuses photometric type ${letter} as not supported yet`, async () => {
      const text = corridorLm63().replace(/^1 -1 1 19 5 1 2 /m, `1 -1 1 19 5 ${type} 2 `)
      const before = await fileCount(team.workspaceId)
      const res = await designer.post('/api/photometry', { text })
      expect(res.status).toBe(400)
      expect(res.body.error).toContain(`photometric type ${letter} is not supported yet`)
      expect(res.body.line).toBe(lineOf(text, /^1 -1 1 19 5 /))
      expect(await fileCount(team.workspaceId)).toBe(before)
    })
  }

  it('only designers and owners upload; viewers and technicians read', async () => {
    expect((await technician.post('/api/photometry', { text: corridorLm63() })).status).toBe(403)
    expect((await viewer.post('/api/photometry', { text: corridorLm63() })).status).toBe(403)
    expect((await viewer.get('/api/photometry')).status).toBe(200)
  })

  it("another workspace's file answers 404, as does a malformed id", async () => {
    const mine = await photometryIn(team)
    expect((await outsider.get(`/api/photometry/${mine.id}`)).status).toBe(404)
    expect((await outsider.delete(`/api/photometry/${mine.id}`)).status).toBe(404)
    expect((await viewer.get('/api/photometry/not-a-uuid')).status).toBe(404)
    expect((await viewer.get(`/api/photometry/${mine.id}`)).status).toBe(200)
  })
})

describe('luminaire types', () => {
  it('designers create, read, change and delete types; viewers only read', async () => {
    const file = await photometryIn(team)
    const body = typeBody(file.id, { capacityAh: 1.6, modes: ['maintained', 'non-maintained', 'maintained'] })
    expect((await viewer.post('/api/luminaire-types', body)).status).toBe(403)
    expect((await technician.post('/api/luminaire-types', body)).status).toBe(403)
    const created = await designer.post('/api/luminaire-types', body)
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body).toMatchObject({
      name: body.name,
      photometricFileId: file.id,
      photometricFileName: file.name,
      ratedDurationS: 10800,
      ratedDurationH: 3,
      modes: ['maintained', 'non-maintained'],
      capacityAh: 1.6,
      emergencyPowerW: 1.6,
      inputPowerW: 1.2,
    })

    const list = await viewer.get('/api/luminaire-types')
    expect(list.body.types.map((t: { id: string }) => t.id)).toContain(created.body.id)
    expect((await viewer.get(`/api/luminaire-types/${created.body.id}`)).body.name).toBe(body.name)

    expect((await viewer.patch(`/api/luminaire-types/${created.body.id}`, { notes: 'x' })).status).toBe(403)
    const changed = await designer.patch(`/api/luminaire-types/${created.body.id}`, { ratedDuration: '1 h', emergencyOutputFactor: 0.4 })
    expect(changed.status).toBe(200)
    expect(changed.body).toMatchObject({ ratedDurationS: 3600, emergencyOutputFactor: 0.4, name: body.name })

    expect((await viewer.delete(`/api/luminaire-types/${created.body.id}`)).status).toBe(403)
    expect((await designer.delete(`/api/luminaire-types/${created.body.id}`)).status).toBe(204)
    expect((await viewer.get(`/api/luminaire-types/${created.body.id}`)).status).toBe(404)
  })

  it('takes the rated duration in hours under the name the register and its own answer use, so a value read can be sent back', async () => {
    // The register's luminaire answers ratedDurationH in hours; the same figure creates a type.
    const created = await designer.post('/api/luminaire-types', { ...typeBody(null), ratedDuration: undefined, ratedDurationH: 1.5 })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body).toMatchObject({ ratedDurationS: 5400, ratedDurationH: 1.5 })
    // What a type answers is what it takes back.
    const read = (await viewer.get(`/api/luminaire-types/${created.body.id}`)).body
    const patched = await designer.patch(`/api/luminaire-types/${created.body.id}`, { ratedDurationH: read.ratedDurationH * 2 })
    expect(patched.status).toBe(200)
    expect(patched.body).toMatchObject({ ratedDurationS: 10800, ratedDurationH: 3 })
    // Both names at once could disagree: refused, naming the field.
    const both = await designer.post('/api/luminaire-types', { ...typeBody(null), ratedDuration: '3 h', ratedDurationH: 1 })
    expect(both.status).toBe(400)
    expect(both.body.errors).toEqual([expect.objectContaining({ pointer: '/ratedDurationH' })])
    const neither = await designer.post('/api/luminaire-types', { ...typeBody(null), ratedDuration: undefined })
    expect(neither.status).toBe(400)
    expect(neither.body.errors).toEqual([expect.objectContaining({ pointer: '/ratedDuration' })])
  })

  it('gives field messages for bad input', async () => {
    const res = await designer.post(
      '/api/luminaire-types',
      typeBody(null, { emergencyOutputFactor: 1.5, ratedDuration: '3 kg', modes: [], chemistry: 'unobtainium', name: '' }),
    )
    expect(res.status).toBe(400)
    const paths = res.body.fields.map((f: { path: string }) => f.path)
    expect(paths).toEqual(expect.arrayContaining(['name', 'emergencyOutputFactor', 'ratedDuration', 'modes', 'chemistry']))
    expect(res.body.fields.find((f: { path: string }) => f.path === 'ratedDuration').message).toMatch(/not a time/)
  })

  it('refuses a duplicate name with 409 and a photometric file of another workspace with a field error', async () => {
    const body = typeBody(null)
    expect((await designer.post('/api/luminaire-types', body)).status).toBe(201)
    expect((await designer.post('/api/luminaire-types', { ...body, name: body.name.toUpperCase() })).status).toBe(409)
    const foreignFile = await photometryIn(other)
    const res = await designer.post('/api/luminaire-types', typeBody(foreignFile.id))
    expect(res.status).toBe(404)
    expect(res.body.fields).toEqual([{ path: 'photometricFileId', message: 'is not a photometric file of this workspace' }])
  })

  it("another workspace's type answers 404 to read, change and delete", async () => {
    const t = await typeIn(team, false)
    expect((await outsider.get(`/api/luminaire-types/${t.id}`)).status).toBe(404)
    expect((await outsider.patch(`/api/luminaire-types/${t.id}`, { notes: 'mine now' })).status).toBe(404)
    expect((await outsider.delete(`/api/luminaire-types/${t.id}`)).status).toBe(404)
    expect((await viewer.get(`/api/luminaire-types/${t.id}`)).body.notes).toBe('')
  })

  it('deleting a file leaves its types without photometry; deleting a type unlinks luminaires (foreign key, ON DELETE SET NULL)', async () => {
    const t = await typeIn(team)
    expect((await designer.delete(`/api/photometry/${t.photometricFileId}`)).status).toBe(204)
    expect((await viewer.get(`/api/luminaire-types/${t.id}`)).body.photometricFileId).toBeNull()

    const site = await siteIn(team.workspaceId)
    const lum = await luminaireIn(team.workspaceId, site.id)
    await dataSource.query('UPDATE luminaires SET luminaire_type_id = $1 WHERE id = $2', [t.id, lum.id])
    await expect(dataSource.query('UPDATE luminaires SET luminaire_type_id = $1 WHERE id = $2', [crypto.randomUUID(), lum.id])).rejects.toThrow(/foreign key/)
    expect((await designer.delete(`/api/luminaire-types/${t.id}`)).status).toBe(204)
    const rows: Array<{ luminaire_type_id: string | null }> = await dataSource.query('SELECT luminaire_type_id FROM luminaires WHERE id = $1', [lum.id])
    expect(rows[0].luminaire_type_id).toBeNull()
  })
})

describe('choosing a type for a route', () => {
  it('lists types that meet the route with the count, spacing, standby power and pack the engine gives', async () => {
    const t = await makeTeam('Selector team')
    const c = await signIn(built.app, t.users.viewer.email)
    const good = await typeIn(t)
    const short = await designerCreates(t, { ratedDuration: '1 h' })
    const dark = await designerCreates(t, { photometricFileId: null })

    const res = await c.post('/api/route-spacing/select', ROUTE_EXAMPLE)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const results = res.body.results as Array<Record<string, unknown> & { id: string; pack: Record<string, unknown> | null; reasons: string[] }>
    expect(results.map((r) => r.id)).toEqual(expect.arrayContaining([good.id, short.id, dark.id]))
    expect(results[0].id === good.id || results[0].id === short.id).toBe(true)

    // The engine's own answer for the same route and photometry.
    const file = (await c.get(`/api/photometry/${good.photometricFileId}`)).body
    const spacing = computeSpacing(
      spacingInput.parse({
        photometry: file.rawText,
        mountingHeight: 2.5,
        emergencyOutputFactor: 0.5,
        maintenanceFactor: 0.8,
        criteria: 'en1838-route',
        routeWidth: 2,
        routeLength: 30,
      }),
    )
    const pack = sizePack(
      sizeInputSchema.parse({ chemistry: 'nicd', cellsInSeries: 4, duration: '3 h', driver: 'converter', load: { power: 1.6, mainsPower: 1.2 } }),
      { explain: false },
    )
    const g = results.find((r) => r.id === good.id)!
    expect(g.meets).toBe(true)
    expect(g.reasons).toEqual([])
    expect(g.luminairesNeeded).toBe(spacing.luminairesNeeded)
    expect(g.luminairesNeeded).toBeGreaterThan(1)
    expect(g.maxSpacingM).toBe(spacing.maxSpacingM)
    expect(g.maxEndSpacingM).toBe(spacing.maxEndSpacingM)
    expect(g.totalStandbyPowerW).toBeCloseTo((spacing.luminairesNeeded as number) * 1.2, 6)
    expect(g.pack).toMatchObject({
      chemistry: 'nicd',
      cellsInSeries: 4,
      selectedCapacityAh: pack.selectedCapacityAh,
      fittedCapacityAh: null,
      fittedPackEnough: null,
    })
    expect(g.pack!.requiredCapacityAh).toBeCloseTo(pack.requiredCapacityAh, 3)

    const s = results.find((r) => r.id === short.id)!
    expect(s.meets).toBe(false)
    expect(s.reasons.join(' ')).toMatch(/rated for 1 h, shorter than the 3 h/)
    // Meets the light, not the duration: said up front, with the layout it would have.
    expect(s.verdict).toBe('pack')
    expect(s.summary).toMatch(/^Meets the light with \d+ luminaires .* but not the duration: rated for 1 h/)
    expect(g.verdict).toBe('meets')
    expect(g.layout).toEqual(spacing.layout)
    const d = results.find((r) => r.id === dark.id)!
    expect(d.meets).toBe(false)
    expect(d.reasons).toContain('has no photometric file')
    expect(d.verdict).toBe('light')
    // Types that meet the route come first.
    expect(results.findIndex((r) => r.id === good.id)).toBeLessThan(results.findIndex((r) => r.id === dark.id))
  })

  it('flags a fitted pack smaller than the route needs', async () => {
    const t = await makeTeam('Small pack team')
    const small = await designerCreates(t, { capacityAh: 0.1 })
    const res = await (await signIn(built.app, t.users.viewer.email)).post('/api/route-spacing/select', ROUTE_EXAMPLE)
    const r = res.body.results.find((x: { id: string }) => x.id === small.id)
    expect(r.meets).toBe(false)
    expect(r.pack.fittedPackEnough).toBe(false)
    expect(r.reasons.join(' ')).toMatch(/fitted 0.1 Ah pack is below/)
  })

  it('gives field messages for a bad route', async () => {
    const res = await viewer.post('/api/route-spacing/select', { ...ROUTE_EXAMPLE, routeLength: '-3 m', criteria: 'en1838-high-risk', ratedDuration: 'soon' })
    expect(res.status).toBe(400)
    expect(res.body.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['routeLength', 'ratedDuration', 'normalIlluminance']))
    // A vanishing mounting height is refused rather than handed to the solver.
    const tiny = await viewer.post('/api/route-spacing/select', { ...ROUTE_EXAMPLE, mountingHeight: 6.4e-323 })
    expect(tiny.status).toBe(400)
    expect(tiny.body.fields).toEqual([{ path: 'mountingHeight', message: 'must be at least 0.1 m' }])
  })

  it('picks a type into a new draft sheet, then into a new revision of it', async () => {
    const t = await typeIn(team)
    expect((await viewer.post('/api/route-spacing/pick', { typeId: t.id, route: ROUTE_EXAMPLE })).status).toBe(403)
    const res = await designer.post('/api/route-spacing/pick', { typeId: t.id, route: ROUTE_EXAMPLE })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const sheet = res.body.sheet
    expect(sheet.status).toBe('draft')
    expect(sheet.currentRevision).toBe(1)
    // A non-maintained type: the sheet carries that mode, and no maintained-mode mains power.
    expect(sheet.inputs).toMatchObject({ chemistry: 'nicd', cellsInSeries: 4, duration: '3 h', mode: 'non-maintained', load: { power: '1.6 W' } })
    expect(sheet.inputs.load).not.toHaveProperty('mainsPower')
    expect(sheet.luminaire).toContain(`${res.body.selection.luminairesNeeded} luminaires`)
    expect(sheet.luminaire).toContain(t.name)
    // The sheet says where the output factor came from.
    expect(sheet.luminaire).toContain('emergency output factor 0.5 (taken from the type)')
    expect(sheet.luminaire).toMatch(/luminaires evenly spaced [\d.]+ m apart, [\d.]+ m from each end; over the route minimum [\d.]+ lx, average [\d.]+ lx/)
    expect(sheet.results.selectedCapacityAh).toBe(res.body.selection.pack.selectedCapacityAh)
    const read = await viewer.get(`/api/sheets/${sheet.id}`)
    expect(read.status).toBe(200)

    const again = await designer.post('/api/route-spacing/pick', {
      typeId: t.id,
      route: { ...ROUTE_EXAMPLE, routeLength: 60 },
      sheetId: sheet.id,
      version: sheet.version,
    })
    expect(again.status, JSON.stringify(again.body)).toBe(200)
    expect(again.body.sheet.id).toBe(sheet.id)
    expect(again.body.sheet.currentRevision).toBe(2)
    expect(again.body.sheet.luminaire).toContain('60 m long')
    const typed = await designer.post('/api/route-spacing/pick', { typeId: t.id, route: { ...ROUTE_EXAMPLE, emergencyOutputFactor: 0.7 } })
    expect(typed.status, JSON.stringify(typed.body)).toBe(201)
    expect(typed.body.sheet.luminaire).toContain("emergency output factor 0.7 (typed by the designer over the type's 0.5)")
    expect(typed.body.selection.emergencyOutputFactor).toEqual({ value: 0.7, from: 'typed', typeValue: 0.5 })
    // A 3 h type on a 1 h route: the sheet carries the 1 h it was sized for and says so beside the rating.
    const shorter = await designer.post('/api/route-spacing/pick', { typeId: t.id, route: { ...ROUTE_EXAMPLE, ratedDuration: '1 h' } })
    expect(shorter.status, JSON.stringify(shorter.body)).toBe(201)
    expect(shorter.body.sheet.inputs.duration).toBe('1 h')
    expect(shorter.body.sheet.luminaire).toContain("rated 3 h; the pack on this sheet is sized for the route's 1 h")
    // A stale version is refused like any sheet save.
    const stale = await designer.post('/api/route-spacing/pick', { typeId: t.id, route: ROUTE_EXAMPLE, sheetId: sheet.id, version: sheet.version })
    expect(stale.status).toBe(409)
  })

  it('refuses a type that does not meet the route, and a type or sheet of another workspace with 404', async () => {
    const noFile = await typeIn(team, false)
    const res = await designer.post('/api/route-spacing/pick', { typeId: noFile.id, route: ROUTE_EXAMPLE })
    expect(res.status).toBe(400)
    expect(res.body.fields[0]).toMatchObject({ path: 'typeId' })
    const foreign = await typeIn(other)
    expect((await designer.post('/api/route-spacing/pick', { typeId: foreign.id, route: ROUTE_EXAMPLE })).status).toBe(404)
    const mine = await typeIn(team)
    const theirSheet = (
      await (await signIn(built.app, other.users.designer.email)).post('/api/route-spacing/pick', { typeId: foreign.id, route: ROUTE_EXAMPLE })
    ).body.sheet
    expect(
      (await designer.post('/api/route-spacing/pick', { typeId: mine.id, route: ROUTE_EXAMPLE, sheetId: theirSheet.id, version: theirSheet.version })).status,
    ).toBe(404)
  })
})

async function designerCreates(t: TestTeam, overrides: Record<string, unknown>) {
  const c = await signIn(built.app, t.users.designer.email)
  const file = 'photometricFileId' in overrides ? null : await photometryIn(t)
  const res = await c.post('/api/luminaire-types', typeBody(file?.id ?? null, overrides))
  if (res.status !== 201) throw new Error(JSON.stringify(res.body))
  return res.body as { id: string; photometricFileId: string | null }
}
