/**
 * Every PDF the app makes, for the demo workspace: sheets (with audits and discharge logs), each
 * site's register, log book (signed in and behind a read-only link) and handover pack. Each must keep its text out of the header and footer bands, never
 * print text over text, number its pages "n of N", and show words instead of codes.
 */
import crypto from 'node:crypto'
import fs from 'node:fs'
import nodePath from 'node:path'
import type { Response } from 'superagent'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { seedDemo } from '../../server/demo/index'
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/scripts/demo-users'
import { codesIn, layoutProblems, pdfLines } from '../helpers/pdf-checks'
import { anonymous, closeTestApp, getTestApp, signIn, type Client } from '../helpers/test-app'

function binary(res: Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = []
  res.on('data', (c: Buffer) => chunks.push(c))
  res.on('end', () => done(null, Buffer.concat(chunks)))
}

let owner: Client
const documents: Array<{ name: string; pdf: Buffer }> = []

beforeAll(async () => {
  const built = await getTestApp()
  await seedDemo(dataSource)
  owner = await signIn(built.app, DEMO_USERS.find((u) => u.role === 'owner')!.email, DEMO_PASSWORD)
  const fetchPdf = async (name: string, path: string) => {
    const res = await owner.get(path).buffer(true).parse(binary)
    expect(res.status, `${name}: ${path}`).toBe(200)
    documents.push({ name, pdf: res.body as Buffer })
    // PDF_OUT_DIR=/tmp/pdfs keeps the documents, to render them (pdftoppm) and look at each page.
    if (process.env.PDF_OUT_DIR)
      fs.writeFileSync(nodePath.join(process.env.PDF_OUT_DIR, `${documents.length}-${name.replace(/[^\w]+/g, '-').slice(0, 50)}.pdf`), res.body as Buffer)
  }
  const sheets = (await owner.get('/api/sheets?pageSize=100')).body.items as Array<{ id: string; title: string }>
  for (const s of sheets) await fetchPdf(`sheet "${s.title}"`, `/api/sheets/${s.id}/pdf`)
  const sites = (await owner.get('/api/sites')).body.sites as Array<{ id: string; name: string }>
  for (const site of sites) {
    await fetchPdf(`register of ${site.name}`, `/api/sites/${site.id}/export/register.pdf`)
    await fetchPdf(`log book of ${site.name}`, `/api/sites/${site.id}/export/logbook.pdf`)
    // The same log book behind a read-only link, opened signed out.
    const link = await owner.post(`/api/sites/${site.id}/logbook-links`, { expiresOn: null })
    expect(link.status, JSON.stringify(link.body)).toBe(201)
    const shared = await anonymous(built.app).get(`/api/logbook-links/${link.body.token}/pdf`).buffer(true).parse(binary)
    expect(shared.status).toBe(200)
    documents.push({ name: `shared log book of ${site.name}`, pdf: shared.body as Buffer })
    if (process.env.PDF_OUT_DIR) fs.writeFileSync(nodePath.join(process.env.PDF_OUT_DIR, `${documents.length}-shared-log-book.pdf`), shared.body as Buffer)
  }
  // A round on the first demo site (a full-duration fail with its checklist among passes), signed off and printed.
  const status = (await owner.get(`/api/sites/${sites[0].id}`)).body as { today: string; luminaires: Array<{ id: string; ratedDurationH: number }> }
  const roundId = crypto.randomUUID()
  const records = status.luminaires.slice(0, 12).map((l, i) => ({
    clientId: crypto.randomUUID(),
    luminaireId: l.id,
    kind: i === 2 ? 'duration' : 'functional',
    testedOn: status.today,
    passed: i !== 2,
    achievedDurationH: i === 2 ? l.ratedDurationH - 0.8 : null,
    faults: i === 2 ? 'Went dark before the end of the rated duration' : '',
    remedialAction: i === 2 ? 'Replacement pack ordered' : '',
    roundClientId: roundId,
    checklist: i === 2 ? { 'lamp-lit': true, 'lit-full-duration': false } : { 'lamp-lit': true, 'charge-indicator': true, 'no-damage': true },
  }))
  expect((await owner.post('/api/tests').send({ records })).status).toBe(201)
  const signed = await owner
    .post(`/api/sites/${sites[0].id}/rounds`)
    .send({ clientId: roundId, signedOffByName: 'Demo technician', signedOffOn: status.today, notes: 'Monthly round' })
  expect(signed.status).toBe(201)
  await fetchPdf(`round record of ${sites[0].name}`, `/api/sites/${sites[0].id}/rounds/${signed.body.id}/record.pdf`)
  // A plan of the full-duration tests of every site, printed as a work order.
  for (const [i, site] of sites.entries()) {
    const plan = await owner
      .post(`/api/sites/${site.id}/test-plans`)
      .send({ grouping: (['alternate', 'area', 'circuit'] as const)[i % 3], firstDay: status.today, windowStart: '19:00', windowEnd: '07:00' })
    expect(plan.status).toBe(201)
    await fetchPdf(`work order of ${site.name}`, `/api/sites/${site.id}/test-plans/${plan.body.id}/work-order.pdf`)
  }
  // A handover pack of each demo site, with a corridor laid out with the first catalogue type.
  const types = (await owner.get('/api/luminaire-types')).body.types as Array<{ id: string }>
  const routes = types.length
    ? [
        {
          name: 'Main corridor',
          typeId: types[0].id,
          route: { routeLength: '24 m', routeWidth: '2 m', mountingHeight: '2.6 m', criteria: 'en1838-route', ratedDuration: '3 h' },
        },
      ]
    : []
  for (const site of sites) {
    const made = await owner.post(`/api/sites/${site.id}/handover-packs`, { signedByName: 'Demo Engineer', signedOn: '2026-01-15', routes })
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    await fetchPdf(`handover pack of ${site.name}`, `/api/sites/${site.id}/handover-packs/${made.body.number}/pdf`)
  }
}, 120_000)
afterAll(closeTestApp)

describe('every PDF of the demo workspace', () => {
  it('is made: sheets, registers, log books and handover packs', () => {
    expect(documents.filter((d) => d.name.startsWith('sheet')).length).toBeGreaterThanOrEqual(3)
    expect(documents.filter((d) => d.name.startsWith('register')).length).toBeGreaterThanOrEqual(3)
    expect(documents.filter((d) => d.name.startsWith('log book')).length).toBeGreaterThanOrEqual(3)
    expect(documents.filter((d) => d.name.startsWith('shared log book')).length).toBeGreaterThanOrEqual(3)
    expect(documents.filter((d) => d.name.startsWith('round record')).length).toBe(1)
    expect(documents.filter((d) => d.name.startsWith('work order')).length).toBeGreaterThanOrEqual(3)
    expect(documents.filter((d) => d.name.startsWith('handover pack')).length).toBeGreaterThanOrEqual(3)
  })

  it('keeps text out of the header and footer bands, never prints text over text, and numbers its pages', () => {
    const problems = documents.flatMap((d) => layoutProblems(d.pdf).map((p) => `${d.name}, page ${p.page}: ${p.problem}`))
    expect(problems).toEqual([])
  })

  it('shows words, never enumeration codes or engine unit names', () => {
    const found = documents.flatMap((d) => codesIn(pdfLines(d.pdf)).map((c) => `${d.name}: ${c}`))
    expect(found).toEqual([])
  })
})
