/**
 * The four integrator jobs in docs/examples, run end to end over HTTP against the app with the
 * typed client generated from /api/openapi.json, authenticated with an API token as a contractor's
 * scripts would be: import a schedule for several sites twice, size 500 luminaires in one batch,
 * list what is overdue across sites, archive a month of log book PDFs.
 */
import fs from 'node:fs'
import http from 'node:http'
import type { AddressInfo } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { archiveMonth, monthSpan } from '../../docs/examples/archive-month'
import { batchSize } from '../../docs/examples/batch-size'
import { lampwrightClient, type Lampwright } from '../../docs/examples/client'
import { importSchedules, type SiteSchedule } from '../../docs/examples/import-schedules'
import { overdueTickets } from '../../docs/examples/overdue-morning'
import { API_TYPES_FILE, apiTypesOf } from '../../scripts/api-types'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { addDays } from '../../shared/engine/due'
import { testIn } from '../helpers/register-fixtures'
import { pdfText } from '../helpers/pdf-text'
import { closeTestApp, getTestApp, makeTeam, signIn, type TestTeam } from '../helpers/test-app'

let built: BuiltApp
let server: http.Server
let baseUrl: string
let team: TestTeam
let api: Lampwright
const today = new Date().toISOString().slice(0, 10)
const archiveDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lampwright-archive-'))

beforeAll(async () => {
  built = await getTestApp()
  server = http.createServer(built.app)
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  team = await makeTeam('Integrator team')
  const designer = await signIn(built.app, team.users.designer.email)
  const made = await designer.post('/api/tokens', { name: 'contractor scripts', role: 'designer' })
  expect(made.status).toBe(201)
  api = lampwrightClient(baseUrl, made.body.token)
})
afterAll(async () => {
  await new Promise<void>((resolve) => server.close(() => resolve()))
  fs.rmSync(archiveDir, { recursive: true, force: true })
  await closeTestApp()
})

/** Three sites, 500 luminaires: every third has its previous contractor's last test dates, the rest were never tested here. */
const SITES = [
  { name: 'Quillfeather Depot (test)', count: 200 },
  { name: 'Marrowby Clinic (test)', count: 200 },
  { name: 'Ostrel Lane Offices (test)', count: 100 },
]
const HEADER =
  'external_id,tag,area,location,type,purpose,mode,rated_duration_h,chemistry,cells,capacity_ah,pack_fitted_on,last_functional_test_on,last_duration_test_on'
function schedules(): SiteSchedule[] {
  const fitted = addDays(today, -700)
  return SITES.map((s, si) => ({
    siteName: s.name,
    csv: [
      HEADER,
      ...Array.from({ length: s.count }, (_, i) => {
        const carried = i % 3 === 0
        const type = i % 50 === 49 ? 'Unlisted spot' : i % 2 ? 'Bulkhead 3 h' : 'Exit sign 3 h'
        return [
          `S${si}-${i}`,
          `E-${si}-${String(i).padStart(3, '0')}`,
          `Floor ${i % 4}`,
          'Corridor',
          type,
          i % 2 ? 'escape-route' : 'exit-sign',
          'non-maintained',
          3,
          'nicd',
          3,
          1.6,
          fitted,
          carried ? addDays(today, -5) : '',
          carried ? addDays(today, -60) : '',
        ].join(',')
      }),
    ].join('\n'),
  }))
}

describe('the integrator jobs, on the generated client', () => {
  it('the client is generated from the document this server serves', async () => {
    const served = (await (await fetch(`${baseUrl}/api/openapi.json`)).json()) as Record<string, unknown>
    // docs/examples/api.d.ts is what the jobs are type-checked against; `npm run api:types` writes it.
    const fresh = await apiTypesOf(served)
    expect(
      fresh === fs.readFileSync(API_TYPES_FILE, 'utf8'),
      'docs/examples/api.d.ts is older than the API: run `npm run api:types` (npm test does it first)',
    ).toBe(true)
  })

  it('job 1: imports the schedules of three sites, then again with no change', async () => {
    const first = await importSchedules(api, schedules())
    expect(first.map((r) => [r.siteCreated, r.added, r.updated, r.unchanged])).toEqual(SITES.map((s) => [true, s.count, 0, 0]))
    const second = await importSchedules(api, schedules())
    expect(second.map((r) => [r.siteCreated, r.added, r.updated, r.unchanged])).toEqual(SITES.map((s) => [false, 0, 0, s.count]))
    expect(second.map((r) => r.siteId)).toEqual(first.map((r) => r.siteId))
    const stored = await dataSource.query('SELECT count(*)::int AS n FROM luminaires WHERE workspace_id = $1', [team.workspaceId])
    expect(stored[0].n).toBe(500)
  })

  it('job 2: sizes the 500 luminaires in one request; the ones without a known load come back with their own error', async () => {
    const loads: Record<string, { power: string }> = { 'Bulkhead 3 h': { power: '2.4 W' }, 'Exit sign 3 h': { power: '1.2 W' } }
    const lines = await batchSize(api, (typeLabel) => loads[typeLabel])
    expect(lines).toHaveLength(500)
    const failed = lines.filter((l) => !l.ok)
    expect(failed).toHaveLength(10) // every 50th row is an unlisted type
    expect(failed.every((l) => /(49|99)$/.test(l.tag) && /\/input\/load\/power: /.test(l.problems[0]!))).toBe(true)
    expect(lines.filter((l) => l.ok).every((l) => typeof l.selectedCapacityAh === 'number' && l.selectedCapacityAh > 0)).toBe(true)
  })

  it('job 3: lists what is overdue across the sites, every page', async () => {
    const tickets = await overdueTickets(api, 64)
    // Never tested here and no carried dates: two thirds of each site, rounded up to whole rows.
    const expected = SITES.reduce((n, s) => n + s.count - Math.ceil(s.count / 3), 0)
    expect(tickets).toHaveLength(expected)
    expect(new Set(tickets.map((t) => t.key)).size).toBe(expected)
    expect(tickets[0]!.body).toMatch(/test overdue since \d{4}-\d{2}-\d{2}/)
  })

  it('job 4: archives a month of log book PDFs, one per site that tested, holding only that month', async () => {
    const month = addDays(today, -40).slice(0, 7)
    const { from, to } = monthSpan(month)
    const ids: Array<{ id: string; tag: string }> = await dataSource.query(
      'SELECT id, tag FROM luminaires WHERE workspace_id = $1 AND site_id IN (SELECT id FROM sites WHERE name = $2) ORDER BY tag LIMIT 3',
      [team.workspaceId, SITES[0]!.name],
    )
    await testIn(team.workspaceId, ids[0]!.id, { kind: 'functional', testedOn: from })
    await testIn(team.workspaceId, ids[1]!.id, { kind: 'functional', testedOn: to, passed: false, faults: 'Lamp out' })
    await testIn(team.workspaceId, ids[2]!.id, { kind: 'functional', testedOn: addDays(from, -1) })
    const files = await archiveMonth(api, month, archiveDir)
    expect(files).toHaveLength(1)
    expect(files[0]!.tests).toBe(2)
    const pdf = fs.readFileSync(files[0]!.file)
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-')
    const text = pdfText(pdf)
    expect(text).toContain(ids[0]!.tag)
    expect(text).toContain(ids[1]!.tag)
    expect(text).not.toContain(ids[2]!.tag)
    expect(path.basename(files[0]!.file)).toContain(`${from}-to-${to}`)
  })
})
