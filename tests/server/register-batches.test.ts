/** Batches (sizing, luminaire changes) and the cursor-paged lists across sites. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { sizePack } from '../../shared/engine/size'
import { sizeTool } from '../../shared/engine/size'
import { addDays } from '../../shared/engine/due'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import { SIZE_EXAMPLE } from './route-examples'

let built: BuiltApp
let team: TestTeam
let designer: Client
let viewer: Client
const today = new Date().toISOString().slice(0, 10)

beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Batch team')
  designer = await signIn(built.app, team.users.designer.email)
  viewer = await signIn(built.app, team.users.viewer.email)
})
afterAll(closeTestApp)

describe('sizing many packs in one request', () => {
  it('answers 500 items in one request, each with the same figures as the single tool, and bad items with their own pointer', async () => {
    const items = Array.from({ length: 500 }, (_, i) => ({ ref: `row-${i}`, input: { ...SIZE_EXAMPLE, load: { power: `${1 + (i % 7) * 0.5} W` } } }))
    items[7] = { ref: 'row-7', input: { ...SIZE_EXAMPLE, duration: 3 } as never } // a bare duration is refused (docs/engine.md)
    items[123] = { ref: 'row-123', input: { ...SIZE_EXAMPLE, load: { power: 'lots' } } }
    const res = await viewer.post('/api/calc/size/batch', { items })
    expect(res.status).toBe(200)
    expect(res.body.count).toBe(500)
    expect(res.body.failed).toBe(2)
    const bad7 = res.body.results[7]
    expect(bad7).toMatchObject({ index: 7, ref: 'row-7', ok: false, status: 400 })
    expect(bad7.errors).toEqual([expect.objectContaining({ pointer: '/items/7/input/duration', code: 'invalid_value' })])
    expect(res.body.results[123].errors[0].pointer).toBe('/items/123/input/load/power')
    // A good item carries exactly what the engine gives for that input alone.
    const expected = sizePack(sizeTool.input.parse(items[42].input), { explain: false })
    expect(res.body.results[42]).toMatchObject({ index: 42, ref: 'row-42', ok: true, status: 200 })
    expect(res.body.results[42].result.selectedCapacityAh).toBe(expected.selectedCapacityAh)
    expect(res.body.results[42].result.working).toEqual([])
  })

  it('sizes a register luminaire from its pack, rated duration and site ceiling temperature, the load given in the item', async () => {
    const site = await siteIn(team.workspaceId, { ceilingTemperatureC: 35 })
    const l = await luminaireIn(team.workspaceId, site.id, { chemistry: 'nimh', cellsInSeries: 4, capacityAh: 2.2, ratedDurationH: 1 })
    const res = await viewer.post('/api/calc/size/batch', { items: [{ luminaireId: l.id, input: { load: { power: '2 W' } } }, { luminaireId: l.id }] })
    expect(res.status).toBe(200)
    const byHand = sizePack(
      sizeTool.input.parse({
        chemistry: 'nimh',
        cellsInSeries: 4,
        capacity: '2.2 Ah',
        duration: '1 h',
        mode: 'non-maintained',
        ambientMax: 35,
        load: { power: '2 W' },
      }),
      { explain: false },
    )
    expect(res.body.results[0]).toMatchObject({ ok: true, luminaireId: l.id })
    expect(res.body.results[0].result.selectedCapacityAh).toBe(byHand.selectedCapacityAh)
    // Without a type in the register the load is unknown: that item alone is refused, naming where to add it.
    expect(res.body.results[1]).toMatchObject({ ok: false, status: 400 })
    expect(res.body.results[1].errors[0].pointer).toBe('/items/1/input/load/power')
  })

  it('refuses an empty or oversized batch as a whole', async () => {
    expect((await viewer.post('/api/calc/size/batch', { items: [] })).status).toBe(400)
    const tooMany = Array.from({ length: 1001 }, () => ({ input: SIZE_EXAMPLE }))
    expect((await viewer.post('/api/calc/size/batch', { items: tooMany })).status).toBe(400)
  })
})

describe('changing many luminaires in one request', () => {
  it('answers each item: done, refused with its pointer, or a conflict, and the good ones are stored', async () => {
    const site = await siteIn(team.workspaceId)
    const a = await luminaireIn(team.workspaceId, site.id, { tag: 'B-1' })
    const b = await luminaireIn(team.workspaceId, site.id, { tag: 'B-2' })
    const c = await luminaireIn(team.workspaceId, site.id, { tag: 'B-3' })
    const res = await designer.patch('/api/luminaires', {
      items: [
        { id: a.id, changes: { location: 'Plant room door' } },
        { id: b.id, changes: { ratedDurationH: 99 } },
        { id: c.id, changes: { tag: 'B-1' } },
      ],
    })
    expect(res.status).toBe(200)
    expect(res.body.failed).toBe(2)
    expect(res.body.results[0]).toMatchObject({ index: 0, id: a.id, ok: true, status: 200 })
    expect(res.body.results[0].luminaire.location).toBe('Plant room door')
    expect(res.body.results[1]).toMatchObject({ ok: false, status: 400, errors: [expect.objectContaining({ pointer: '/items/1/changes/ratedDurationH' })] })
    expect(res.body.results[2]).toMatchObject({ ok: false, status: 409, errors: [expect.objectContaining({ pointer: '/items/2/changes/tag' })] })
    expect((await viewer.get(`/api/luminaires/${a.id}`)).body.luminaire.location).toBe('Plant room door')
    expect((await viewer.get(`/api/luminaires/${b.id}`)).body.luminaire.ratedDurationH).toBe(3)
  })

  it('is for designers: a viewer is refused', async () => {
    const site = await siteIn(team.workspaceId)
    const a = await luminaireIn(team.workspaceId, site.id)
    expect((await viewer.patch('/api/luminaires', { items: [{ id: a.id, changes: { location: 'x' } }] })).status).toBe(403)
  })
})

describe('lists across sites', () => {
  it('lists what is overdue and failed across sites, page by page with a Link to the next page', async () => {
    const t = await makeTeam('List team')
    const c = await signIn(built.app, t.users.viewer.email)
    const s1 = await siteIn(t.workspaceId)
    const s2 = await siteIn(t.workspaceId)
    const fitted = addDays(today, -400)
    // Overdue: never tested, pack fitted over a year ago (functional test due a month after it).
    const overdue = await Promise.all([
      luminaireIn(t.workspaceId, s1.id, { packFittedOn: fitted }),
      luminaireIn(t.workspaceId, s2.id, { packFittedOn: fitted }),
      luminaireIn(t.workspaceId, s2.id, { packFittedOn: fitted }),
    ])
    // Failed yesterday: a failure is open (its retest is not yet overdue).
    const failed = await luminaireIn(t.workspaceId, s1.id, { packFittedOn: addDays(today, -200) })
    await testIn(t.workspaceId, failed.id, { kind: 'duration', testedOn: addDays(today, -100), achievedDurationH: 3 })
    await testIn(t.workspaceId, failed.id, { kind: 'functional', testedOn: addDays(today, -1), passed: false, faults: 'Lamp out' })
    // Fine: tested recently, duration test passed since its pack.
    const fine = await luminaireIn(t.workspaceId, s2.id, { packFittedOn: addDays(today, -200) })
    await testIn(t.workspaceId, fine.id, { kind: 'duration', testedOn: addDays(today, -3), achievedDurationH: 3 })

    const all = await c.get('/api/luminaires?state=overdue,failed')
    expect(all.status).toBe(200)
    expect(new Set(all.body.items.map((i: { id: string }) => i.id))).toEqual(new Set([...overdue.map((l) => l.id), failed.id]))
    expect(all.body.items.find((i: { id: string }) => i.id === failed.id).states).toEqual(['failed'])
    expect(new Set(all.body.items.map((i: { siteName: string }) => i.siteName))).toEqual(new Set([s1.name, s2.name]))

    const seen: string[] = []
    let url: string | null = '/api/luminaires?state=overdue&limit=2'
    let pages = 0
    while (url) {
      const page = await c.get(url)
      expect(page.status).toBe(200)
      seen.push(...page.body.items.map((i: { id: string }) => i.id))
      const link = page.headers.link as string | undefined
      if (page.body.nextCursor) expect(link).toBe(`</api/luminaires?state=overdue&limit=2&cursor=${page.body.nextCursor}>; rel="next"`)
      else expect(link).toBeUndefined()
      url = link ? link.slice(1, link.indexOf('>')) : null
      pages++
    }
    expect(pages).toBe(2)
    expect(seen.sort()).toEqual(overdue.map((l) => l.id).sort())
  })

  it('filters by updatedSince and refuses a cursor it did not give', async () => {
    const t = await makeTeam('Since team')
    const c = await signIn(built.app, t.users.viewer.email)
    const s = await siteIn(t.workspaceId)
    await luminaireIn(t.workspaceId, s.id)
    const mark = new Date(Date.now() + 1000).toISOString()
    expect((await c.get(`/api/luminaires?updatedSince=${mark}`)).body.items).toEqual([])
    expect((await c.get('/api/luminaires?updatedSince=2000-01-01T00:00:00Z')).body.items).toHaveLength(1)
    const bad = await c.get('/api/luminaires?cursor=not-ours')
    expect(bad.status).toBe(400)
    expect((await c.get('/api/luminaires?state=late')).status).toBe(400)
    expect((await c.get('/api/luminaires?updatedSince=yesterday')).status).toBe(400)
  })

  it('lists the log book between two days across sites, both days included', async () => {
    const t = await makeTeam('Log team')
    const c = await signIn(built.app, t.users.viewer.email)
    const a = await luminaireIn(t.workspaceId, (await siteIn(t.workspaceId)).id)
    const b = await luminaireIn(t.workspaceId, (await siteIn(t.workspaceId)).id)
    for (const d of ['2026-10-31', '2026-11-01', '2026-11-15', '2026-11-30', '2026-12-01']) {
      await testIn(t.workspaceId, a.id, { kind: 'functional', testedOn: d })
      await testIn(t.workspaceId, b.id, { kind: 'functional', testedOn: d })
    }
    const first = await c.get('/api/tests?from=2026-11-01&to=2026-11-30&limit=4')
    expect(first.status).toBe(200)
    expect(first.body.items).toHaveLength(4)
    const second = await c.get(`/api/tests?from=2026-11-01&to=2026-11-30&limit=4&cursor=${first.body.nextCursor}`)
    expect(second.body.items).toHaveLength(2)
    expect(second.body.nextCursor).toBeNull()
    const days = [...first.body.items, ...second.body.items].map((i: { testedOn: string }) => i.testedOn)
    expect(days).toEqual(['2026-11-01', '2026-11-01', '2026-11-15', '2026-11-15', '2026-11-30', '2026-11-30'])
    expect((await c.get('/api/tests?from=2026-12-01&to=2026-11-01')).status).toBe(400)
  })
})
