/**
 * Planning the full-duration tests of a demo site: groups in which no area has all its luminaires
 * under test at once, each with its start, end and back-to-full-cover times (a 24 h recharge,
 * IEC 60598-2-22, from memory), one after the other, inside the out-of-hours window; the rounds that
 * follow from it, and the work order.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { seedDemo } from '../../server/demo/index'
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/scripts/demo-users'
import { closeTestApp, getTestApp, signIn, type Client } from '../helpers/test-app'
import { pdfLines } from '../helpers/pdf-checks'

let designer: Client
let viewer: Client
let site: { id: string; name: string }
let luminaires: Array<{ id: string; tag: string; areaName: string | null; ratedDurationH: number }>

function binary(res: import('superagent').Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = []
  res.on('data', (c: Buffer) => chunks.push(c))
  res.on('end', () => done(null, Buffer.concat(chunks)))
}

beforeAll(async () => {
  const built = await getTestApp()
  await seedDemo(dataSource)
  designer = await signIn(built.app, DEMO_USERS.find((u) => u.role === 'designer')!.email, DEMO_PASSWORD)
  viewer = await signIn(built.app, DEMO_USERS.find((u) => u.role === 'viewer')!.email, DEMO_PASSWORD)
  const sites = (await designer.get('/api/sites')).body.sites as Array<{ id: string; name: string }>
  site = sites.find((s) => s.name.startsWith('Wrenfield'))!
  luminaires = (await designer.get(`/api/sites/${site.id}`)).body.luminaires
}, 120_000)
afterAll(closeTestApp)

const minutes = (stamp: string) => Date.parse(`${stamp}:00Z`) / 60_000

describe('test planner on the demo library', () => {
  it('alternates luminaires so that no area is ever all under test, and times the groups one after another', async () => {
    const res = await designer.post(`/api/sites/${site.id}/test-plans`, {
      grouping: 'alternate',
      firstDay: '2027-03-01',
      windowStart: '18:00',
      windowEnd: '23:00',
    })
    expect(res.status).toBe(201)
    const { plan, id } = res.body as {
      id: string
      plan: {
        groups: Array<{ luminaireIds: string[]; tags: string[]; startsAt: string; endsAt: string; fullCoverAt: string; testH: number; rechargeH: number }>
        warnings: unknown[]
      }
    }
    expect(id).toMatch(/^[0-9a-f-]{36}$/)
    expect(plan.groups).toHaveLength(2)
    // Every luminaire of the site is in exactly one group.
    expect(plan.groups.flatMap((g) => g.luminaireIds).sort()).toEqual(luminaires.map((l) => l.id).sort())
    // The rule: no area has all its luminaires in one group (checked by hand from the register).
    const areas = new Map<string, string[]>()
    for (const l of luminaires) areas.set(l.areaName ?? '', [...(areas.get(l.areaName ?? '') ?? []), l.id])
    expect(areas.size).toBe(3)
    for (const [area, ids] of areas)
      for (const g of plan.groups)
        expect(
          ids.every((x) => g.luminaireIds.includes(x)),
          `${area} all in one group`,
        ).toBe(false)
    expect(plan.warnings).toEqual([])
    // The library's luminaires are rated 3 h: each test 18:00 to 21:00, full cover 24 h after the end.
    for (const g of plan.groups) {
      expect(g.testH).toBe(3)
      expect(g.startsAt.slice(11)).toBe('18:00')
      expect(g.endsAt.slice(11)).toBe('21:00')
      expect(minutes(g.fullCoverAt) - minutes(g.endsAt)).toBe(24 * 60)
    }
    expect(plan.groups[0].startsAt).toBe('2027-03-01T18:00')
    // The second group waits until the first is back to full cover.
    expect(minutes(plan.groups[1].startsAt)).toBeGreaterThanOrEqual(minutes(plan.groups[0].fullCoverAt))
    expect(plan.groups[1].startsAt).toBe('2027-03-03T18:00')

    // Stored: the rounds of the following days read the same plan.
    const again = await viewer.get(`/api/sites/${site.id}/test-plans/${id}`)
    expect(again.status).toBe(200)
    expect(again.body.plan.groups.map((g: { tags: string[] }) => g.tags)).toEqual(plan.groups.map((g) => g.tags))
    expect((await viewer.get(`/api/sites/${site.id}/test-plans`)).body.plans[0].id).toBe(id)

    // The work order: words, times, the caution and page numbers.
    const pdf = await viewer.get(`/api/sites/${site.id}/test-plans/${id}/work-order.pdf`).buffer(true).parse(binary)
    expect(pdf.status).toBe(200)
    expect(pdf.headers['content-type']).toBe('application/pdf')
    const text = pdfLines(pdf.body as Buffer).join('\n')
    expect(text).toMatch(/Work order: full-duration tests/)
    expect(text).toMatch(/Alternate luminaires in every area/)
    expect(text).toMatch(/without emergency cover until their batteries have recharged/)
    expect(text).toMatch(/restore the normal supply/)
    expect(text).toMatch(/Page 1 of \d/)
  })

  it('by area: flags every area as left dark during its own test', async () => {
    const res = await designer.post(`/api/sites/${site.id}/test-plans`, {
      grouping: 'area',
      firstDay: '2027-03-01',
      windowStart: '22:00',
      windowEnd: '06:00',
      defaultRechargeH: 20,
    })
    expect(res.status).toBe(201)
    expect(res.body.plan.groups).toHaveLength(3)
    expect(res.body.plan.warnings.map((w: { code: string }) => w.code)).toEqual(['area-dark', 'area-dark', 'area-dark'])
    expect(res.body.plan.groups[0]).toMatchObject({ startsAt: '2027-03-01T22:00', endsAt: '2027-03-02T01:00', fullCoverAt: '2027-03-02T21:00' })
  })

  it('follows the circuits and walking order the designer sets on the luminaires', async () => {
    // Two circuits, alternating inside every area: grouping by circuit then leaves no area dark.
    const byArea = new Map<string, typeof luminaires>()
    for (const l of luminaires) byArea.set(l.areaName ?? '', [...(byArea.get(l.areaName ?? '') ?? []), l])
    let place = 0
    for (const members of byArea.values()) {
      for (const [i, l] of members.entries()) {
        const res = await designer.patch(`/api/luminaires/${l.id}`, { circuit: i % 2 ? 'DB1/2' : 'DB1/1', walkOrder: ++place })
        expect(res.status).toBe(200)
        expect(res.body).toMatchObject({ circuit: i % 2 ? 'DB1/2' : 'DB1/1', walkOrder: place })
      }
    }
    const res = await designer.post(`/api/sites/${site.id}/test-plans`, {
      grouping: 'circuit',
      firstDay: '2027-03-01',
      windowStart: '18:00',
      windowEnd: '23:00',
    })
    expect(res.status).toBe(201)
    expect(res.body.plan.groups.map((g: { name: string }) => g.name)).toEqual(['Circuit DB1/1', 'Circuit DB1/2'])
    expect(res.body.plan.groups.every((g: { darkAreas: string[] }) => g.darkAreas.length === 0)).toBe(true)
    expect(res.body.plan.warnings).toEqual([])
    // Each group's round follows the walking order.
    const first = res.body.plan.groups[0] as { luminaireIds: string[] }
    const places = first.luminaireIds.map((id) => luminaires.findIndex((l) => l.id === id))
    expect(places).toEqual([...places].sort((a, b) => a - b))
    // A place that cannot be a place is refused with the field named.
    const bad = await designer.patch(`/api/luminaires/${luminaires[0].id}`, { walkOrder: 0, circuit: 'x'.repeat(41) })
    expect(bad.status).toBe(400)
    expect((bad.body.fields as Array<{ path: string }>).map((f) => f.path).sort()).toEqual(['circuit', 'walkOrder'])
  })

  it('refuses what it cannot read, field by field, and leaves planning to designers', async () => {
    const bad = await designer.post(`/api/sites/${site.id}/test-plans`, {
      grouping: 'rows',
      firstDay: '2027-02-30',
      windowStart: '25:00',
      windowEnd: '06:00',
      extra: 1,
    })
    expect(bad.status).toBe(400)
    const paths = (bad.body.fields as Array<{ path: string }>).map((f) => f.path)
    expect(paths).toEqual(expect.arrayContaining(['grouping', 'firstDay', 'windowStart']))
    expect((await viewer.post(`/api/sites/${site.id}/test-plans`, { firstDay: '2027-03-01', windowStart: '18:00', windowEnd: '23:00' })).status).toBe(403)
    expect((await viewer.get(`/api/sites/${site.id}/test-plans/00000000-0000-4000-8000-000000000000`)).status).toBe(404)
  })
})
