/**
 * Handover packs through the API: made from the site as it stands, numbered per site, frozen once
 * made, printed as a PDF whose text reads as a certificate an owner can keep, and opened by a
 * read-only link. Bad input is refused with the field and the reason.
 */
import fs from 'node:fs'
import nodePath from 'node:path'
import type { Response } from 'superagent'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { handoverBody } from '../helpers/handover'
import { codesIn, layoutProblems, pdfLines } from '../helpers/pdf-checks'
import { typeIn } from '../helpers/photometry'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import { anonymous, closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'
import type { Express } from 'express'

function binary(res: Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = []
  res.on('data', (c: Buffer) => chunks.push(c))
  res.on('end', () => done(null, Buffer.concat(chunks)))
}

let app: Express
let team: TestTeam
let designer: Client
let viewer: Client
let siteId: string
let typeId: string

beforeAll(async () => {
  app = (await getTestApp()).app
  team = await makeTeam('Invented Lighting Services')
  designer = await signIn(app, team.users.designer.email)
  viewer = await signIn(app, team.users.viewer.email)
  typeId = (await typeIn(team)).id
  const site = await siteIn(team.workspaceId, {
    name: 'Harbour Yard Offices',
    address: '4 Quay Row\nPortown',
    responsibleName: 'Dana Keeper',
    responsibleEmail: 'dana@example.test',
  })
  siteId = site.id
  const a = await luminaireIn(team.workspaceId, siteId, {
    tag: 'EL-01',
    location: 'Stair A',
    luminaireTypeId: typeId,
    packFittedOn: '2025-06-01',
    chemistry: 'nicd-ht',
  })
  const b = await luminaireIn(team.workspaceId, siteId, { tag: 'EL-02', location: 'Corridor by lift', packFittedOn: '2025-06-01', mode: 'maintained' })
  await luminaireIn(team.workspaceId, siteId, { tag: 'EL-03', location: 'Plant room', purpose: 'high-risk', packFittedOn: '2025-06-01' })
  // An old test from before the pack was fitted is not its first full-duration test.
  await testIn(team.workspaceId, a.id, { kind: 'duration', testedOn: '2025-01-10', achievedDurationH: 2.5, passed: false, faults: 'Old pack flat' })
  await testIn(team.workspaceId, a.id, { kind: 'duration', testedOn: '2025-06-12', achievedDurationH: 3.25 })
  await testIn(team.workspaceId, a.id, { kind: 'duration', testedOn: '2026-01-05', achievedDurationH: 3.1 })
  await testIn(team.workspaceId, b.id, { kind: 'duration', testedOn: '2025-06-12', achievedDurationH: 2.5, passed: false, faults: 'Lamp out after 2 h 30 min' })
  await testIn(team.workspaceId, b.id, { kind: 'functional', testedOn: '2025-07-01' })
}, 60_000)
afterAll(closeTestApp)

const pdfOf = async (c: Client, path: string) => {
  const res = await c.get(path).buffer(true).parse(binary)
  expect(res.status, path).toBe(200)
  expect(res.headers['content-type']).toBe('application/pdf')
  return res.body as Buffer
}

describe('making a handover pack', () => {
  it('freezes the site into pack 1: certificate, register, types, spacing per route, first duration tests, log book', async () => {
    const res = await designer.post(`/api/sites/${siteId}/handover-packs`, handoverBody(typeId))
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const p = res.body
    expect(p.number).toBe(1)
    expect(p.content.certificate).toMatchObject({ signedByName: 'Robin Testwell', signedOn: '2026-01-20' })
    expect(p.content.firm).toBe('Invented Lighting Services')
    expect(p.content.luminaires.map((l: { tag: string }) => l.tag)).toEqual(['EL-01', 'EL-02', 'EL-03'])
    expect(p.content.types).toHaveLength(1)
    expect(p.content.types[0].luminaires).toBe(1)
    expect(p.content.types[0].photometry.peakIntensityCd).toBeGreaterThan(0)
    const [route] = p.content.routes
    expect(route.name).toBe('Ground floor corridor')
    expect(route.meets).toBe(true)
    expect(route.count).toBeGreaterThanOrEqual(2)
    const first = Object.fromEntries(p.content.firstDurationTests.map((t: { tag: string }) => [t.tag, t]))
    expect(first['EL-01']).toMatchObject({ testedOn: '2025-06-12', passed: true, achievedDurationH: 3.25 })
    expect(first['EL-02']).toMatchObject({ testedOn: '2025-06-12', passed: false })
    expect(first['EL-03']).toMatchObject({ testedOn: null, passed: null })
    expect(p.content.logBook.totalEntries).toBe(5)
    expect(p.content.logBook.firstEntries[0].testedOn).toBe('2025-01-10')
  })

  it('numbers the next pack 2, lists newest first, and keeps pack 1 as it was when the register changes', async () => {
    await luminaireIn(team.workspaceId, siteId, { tag: 'EL-04', location: 'Reception', packFittedOn: '2026-01-02' })
    const res = await designer.post(`/api/sites/${siteId}/handover-packs`, handoverBody(typeId, { signedOn: '2026-01-21', routes: [] }))
    expect(res.status).toBe(201)
    expect(res.body.number).toBe(2)
    expect(res.body.content.luminaires).toHaveLength(4)
    const list = await viewer.get(`/api/sites/${siteId}/handover-packs`)
    expect(list.body.packs.map((p: { number: number }) => p.number)).toEqual([2, 1])
    const one = await viewer.get(`/api/sites/${siteId}/handover-packs/1`)
    expect(one.body.content.luminaires).toHaveLength(3)
    expect(one.body.signedOn).toBe('2026-01-20')
  })

  it('refuses a certificate signed on a day still to come, a missing signer, and an unreadable route, naming the field', async () => {
    const future = await designer.post(`/api/sites/${siteId}/handover-packs`, handoverBody(typeId, { signedOn: '2999-01-01' }))
    expect(future.status).toBe(400)
    expect(JSON.stringify(future.body)).toContain('signedOn')
    const unsigned = await designer.post(`/api/sites/${siteId}/handover-packs`, handoverBody(typeId, { signedByName: '  ' }))
    expect(unsigned.status).toBe(400)
    expect(JSON.stringify(unsigned.body)).toContain('signedByName')
    const badRoute = await designer.post(
      `/api/sites/${siteId}/handover-packs`,
      handoverBody(typeId, { routes: [{ name: 'Stairs', typeId, route: { routeLength: 'ten metres' } }] }),
    )
    expect(badRoute.status).toBe(400)
    expect(JSON.stringify(badRoute.body)).toContain('routes')
    const list = await viewer.get(`/api/sites/${siteId}/handover-packs`)
    expect(list.body.packs).toHaveLength(2)
  })

  it("refuses another workspace's luminaire type as not found", async () => {
    const other = await makeTeam('Other firm')
    const foreignType = await typeIn(other)
    const res = await designer.post(`/api/sites/${siteId}/handover-packs`, handoverBody(foreignType.id))
    expect(res.status).toBe(404)
  })

  it('is a viewer-readable list but only a designer makes one', async () => {
    const res = await viewer.post(`/api/sites/${siteId}/handover-packs`, handoverBody(typeId))
    expect(res.status).toBe(403)
  })
})

describe('the handover pack PDF', () => {
  let lines: string[]
  let pdf: Buffer
  beforeAll(async () => {
    pdf = await pdfOf(designer, `/api/sites/${siteId}/handover-packs/1/pdf`)
    lines = pdfLines(pdf)
    // PDF_OUT_DIR=/tmp/pdfs keeps the document, to render its pages (pdftoppm) and look at them.
    if (process.env.PDF_OUT_DIR) fs.writeFileSync(nodePath.join(process.env.PDF_OUT_DIR, 'handover-pack.pdf'), pdf)
  })
  const text = () => lines.join('\n')

  it('opens with the completion certificate, signed off by name and date', () => {
    expect(text()).toContain('Handover pack')
    expect(text()).toContain('1. Completion certificate')
    expect(text()).toContain('Premises: Harbour Yard Offices, 4 Quay Row, Portown')
    expect(text()).toContain('Responsible person: Dana Keeper, dana@example.test')
    expect(text()).toContain('Extent of the installation: Ground floor corridors and stairs')
    expect(text()).toContain('Installed, inspected and tested by')
    expect(text()).toContain('Received for the owner by')
    expect(lines.some((l) => l.includes('Robin Testwell'))).toBe(true)
    // Dates in words, never 2026-01-20 or 1/20/2026.
    expect(text()).toContain('20 Jan 2026')
    expect(text()).not.toMatch(/\b\d{4}-\d{2}-\d{2}\b/)
  })

  it('holds the register, the type with its photometry, the spacing per route and the first duration tests', () => {
    expect(text()).toContain('2. Register of luminaires')
    expect(lines.some((l) => l.startsWith('EL-01') && l.includes('Stair A') && l.includes('NiCd, high-temperature'))).toBe(true)
    expect(text()).toContain('3. Luminaire types and photometry')
    expect(text()).toMatch(/Photometry: .*peak .* cd at C/)
    expect(text()).toContain('4. Spacing on each escape route')
    expect(text()).toContain('Ground floor corridor: meets the route')
    expect(text()).toMatch(/Layout: \d+ luminaires, [\d.]+ m apart/)
    expect(text()).toContain('5. First full-duration tests')
    expect(lines.some((l) => l.startsWith('EL-01') && l.includes('12 Jun 2025') && l.includes('3:15 h') && l.includes('Pass'))).toBe(true)
    expect(lines.some((l) => l.startsWith('EL-02') && l.includes('Fail'))).toBe(true)
    expect(lines.some((l) => l.startsWith('EL-03') && l.includes('Not yet tested'))).toBe(true)
    expect(text()).toContain('6. Log book: opening page')
    expect(text()).toContain('Isolate the mains first')
  })

  it('shows words, not codes, and keeps text out of the bands with "Page n of N" on each page', () => {
    expect(codesIn(lines)).toEqual([])
    expect(text()).not.toContain('en1838')
    expect(layoutProblems(pdf)).toEqual([])
  })
})

describe('a read-only link to a pack', () => {
  it('opens the pack and its PDF without an account, until its last day', async () => {
    const made = await designer.post(`/api/sites/${siteId}/handover-packs/1/links`, { expiresOn: null })
    expect(made.status).toBe(201)
    expect(made.body.url).toMatch(/\/h\//)
    const anon = anonymous(app)
    const page = await anon.get(`/api/handover-links/${made.body.token}`)
    expect(page.status).toBe(200)
    expect(page.body.content.site.name).toBe('Harbour Yard Offices')
    expect(page.body).not.toHaveProperty('siteId')
    const lines = pdfLines(await pdfOf(anon, `/api/handover-links/${made.body.token}/pdf`))
    expect(lines.join('\n')).toContain('1. Completion certificate')
  })

  it('refuses a last day already past, and answers 404 for an unknown token', async () => {
    const past = await designer.post(`/api/sites/${siteId}/handover-packs/1/links`, { expiresOn: '2020-01-01' })
    expect(past.status).toBe(400)
    expect(JSON.stringify(past.body)).toContain('expiresOn')
    const unknown = await anonymous(app).get(`/api/handover-links/${'x'.repeat(43)}`)
    expect(unknown.status).toBe(404)
  })
})
