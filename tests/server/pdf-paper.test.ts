/**
 * Documents come on the reader's paper: Letter (8.5 × 11 in = 612 × 792 pt) for someone who works
 * in US customary units or, signed out, whose browser asks for a Letter region; A4 (210 × 297 mm =
 * 595.28 × 841.89 pt, ISO 216) otherwise. Tables set for A4 must still fit on Letter.
 */
import type { Response } from 'superagent'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { paperForLocale } from '../../shared/format'
import { layoutProblems, pdfLines } from '../helpers/pdf-checks'
import { pdfPages } from '../helpers/pdf-layout'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import { PACK_INPUTS, sheetBody } from '../helpers/sheets'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'

function binary(res: Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = []
  res.on('data', (c: Buffer) => chunks.push(c))
  res.on('end', () => done(null, Buffer.concat(chunks)))
}

let team: TestTeam
let owner: Client
let siteId: string
beforeAll(async () => {
  const built = await getTestApp()
  team = await makeTeam('Paper team')
  owner = await signIn(built.app, team.users.owner.email)
  const site = await siteIn(team.workspaceId, { name: 'Quillbrook annex' })
  siteId = site.id
  for (let i = 0; i < 30; i++) {
    const l = await luminaireIn(team.workspaceId, site.id, { tag: `Q-${i + 1}`, location: `Stair ${i + 1}, landing below the long corridor to the plant room` })
    await testIn(team.workspaceId, l.id, { kind: 'duration', testedOn: '2026-03-02', passed: true, achievedDurationH: 3.25, faults: '' })
  }
})
afterAll(closeTestApp)

async function pageSize(path: string): Promise<{ width: number; height: number; problems: number }> {
  const res = await owner.get(path).buffer(true).parse(binary)
  expect(res.status).toBe(200)
  const pdf = res.body as Buffer
  const pages = pdfPages(pdf)
  // Text in the right margin (36 pt on these landscape documents) is cut off by many printers.
  const offPage = pages.flatMap((p) => p.boxes.filter((b) => b.x + b.width > p.width - 36 + 0.5))
  return {
    width: Math.round(pages[0].width * 100) / 100,
    height: Math.round(pages[0].height * 100) / 100,
    problems: layoutProblems(pdf).length + offPage.length,
  }
}

describe('paper by preference', () => {
  it('A4 for metric units, Letter for US customary: register and log book, with nothing off the page or overlapping', async () => {
    for (const file of ['register.pdf', 'logbook.pdf']) {
      expect(await pageSize(`/api/sites/${siteId}/export/${file}`)).toEqual({ width: 841.89, height: 595.28, problems: 0 })
    }
    expect((await owner.patch('/api/auth/me', { units: 'us' })).status).toBe(200)
    for (const file of ['register.pdf', 'logbook.pdf']) {
      expect(await pageSize(`/api/sites/${siteId}/export/${file}`)).toEqual({ width: 792, height: 612, problems: 0 })
    }
    expect((await owner.patch('/api/auth/me', { units: 'si' })).status).toBe(200)
  })

  it('signed out, the browser region decides (Letter in the US and Canada, A4 in the UK and Germany)', () => {
    expect(['en-US', 'en-CA', 'fr-CA', 'es-MX', 'en-GB', 'de-DE', 'en', 'fr'].map(paperForLocale)).toEqual([
      'letter',
      'letter',
      'letter',
      'letter',
      'a4',
      'a4',
      'a4',
      'a4',
    ])
  })
})

describe("quantities in the reader's units", () => {
  it('a sheet printed for someone in US customary units gives its temperatures in °F; typed inputs stay as typed with °F beside them', async () => {
    const designer = await signIn((await getTestApp()).app, team.users.designer.email)
    const made = await designer.post('/api/sheets', sheetBody({ title: 'Boiler house exit', inputs: { ...PACK_INPUTS, ambientMax: '48 °C' } }))
    expect(made.status).toBe(201)
    const lines = async () => pdfLines((await designer.get(`/api/sheets/${made.body.id}/pdf`).buffer(true).parse(binary)).body as Buffer)
    const metric = (await lines()).join('\n')
    expect(metric).toMatch(/48 °C/)
    expect(metric).not.toMatch(/°F/)
    expect((await designer.patch('/api/auth/me', { units: 'us' })).status).toBe(200)
    const us = (await lines()).join('\n')
    // 48 °C = 118.4 °F (exact: × 9/5 + 32); the input as typed, then the reader's unit.
    expect(us).toMatch(/48 °C \(118\.4 °F\)/)
    // Every other temperature (results, warnings, cautions, references) is in °F: a °C appears only in
    // typed inputs and in the working, whose formulas are SI (and says so).
    const all = us.split('\n')
    const working = [all.indexOf('Working'), all.indexOf('Cautions')]
    expect(working[0]).toBeGreaterThan(0)
    expect(all[working[0] + 1]).toMatch(/SI units its formulas use/)
    const celsius = all.filter((l, i) => (i < working[0] || i > working[1]) && /°C/.test(l) && !/\(\d[\d.,]* °F\)/.test(l))
    expect(celsius).toEqual([])
    expect(us).toMatch(/\d °F/)
    expect((await designer.patch('/api/auth/me', { units: 'si' })).status).toBe(200)
  })
})
