/** Importing a schedule again: rows match by external id (else tag) and update; last test dates carry over. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { addDays } from '../../shared/engine/due'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'
import { siteIn } from '../helpers/register-fixtures'

let built: BuiltApp
let team: TestTeam
let designer: Client
const today = new Date().toISOString().slice(0, 10)

beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Re-import team')
  designer = await signIn(built.app, team.users.designer.email)
})
afterAll(closeTestApp)

const HEADER =
  'external_id,tag,area,location,purpose,mode,rated_duration_h,chemistry,cells,capacity_ah,pack_fitted_on,last_functional_test_on,last_duration_test_on'
const row = (ext: string, tag: string, over: { location?: string; fitted?: string; lastF?: string; lastD?: string } = {}) =>
  [
    ext,
    tag,
    'Level 1',
    over.location ?? 'Corridor',
    'escape-route',
    'non-maintained',
    3,
    'nicd',
    3,
    1.6,
    over.fitted ?? '2024-01-10',
    over.lastF ?? '',
    over.lastD ?? '',
  ].join(',')

describe('importing a schedule again', () => {
  it('updates by external id, even when the tag changed, and audits only what changed', async () => {
    const site = await siteIn(team.workspaceId)
    const first = await designer.post(`/api/sites/${site.id}/import`, { csv: [HEADER, row('SCH-1', 'A-1'), row('SCH-2', 'A-2')].join('\n') })
    expect(first.status).toBe(201)
    expect(first.body).toMatchObject({ imported: 2, updated: 0, unchanged: 0 })
    const second = await designer.post(`/api/sites/${site.id}/import/preview`, {
      csv: [HEADER, row('SCH-1', 'A-1b'), row('SCH-2', 'A-2'), row('SCH-3', 'A-3')].join('\n'),
    })
    expect(second.body).toMatchObject({ creates: 1, updates: 1, unchanged: 1, errorCount: 0 })
    const done = await designer.post(`/api/sites/${site.id}/import`, {
      csv: [HEADER, row('SCH-1', 'A-1b'), row('SCH-2', 'A-2'), row('SCH-3', 'A-3')].join('\n'),
    })
    expect(done.status).toBe(201)
    expect(done.body).toMatchObject({ imported: 1, updated: 1, unchanged: 1 })
    const rows = await dataSource.query('SELECT external_id, tag FROM luminaires WHERE site_id = $1 ORDER BY external_id', [site.id])
    expect(rows).toEqual([
      { external_id: 'SCH-1', tag: 'A-1b' },
      { external_id: 'SCH-2', tag: 'A-2' },
      { external_id: 'SCH-3', tag: 'A-3' },
    ])
    const audits = await dataSource.query(`SELECT data FROM audit_events WHERE action = 'luminaire.updated' AND entity_id = $1`, [done.body.updatedIds[0]])
    expect(audits).toHaveLength(1)
    expect(audits[0].data.changes).toEqual({ tag: { from: 'A-1', to: 'A-1b' } })
  })

  it('refuses a row whose tag belongs to a luminaire with another external id, and a repeated external id', async () => {
    const site = await siteIn(team.workspaceId)
    await designer.post(`/api/sites/${site.id}/import`, { csv: [HEADER, row('SCH-1', 'B-1')].join('\n') })
    const clash = await designer.post(`/api/sites/${site.id}/import/preview`, {
      csv: [HEADER, row('SCH-9', 'B-1'), row('SCH-7', 'B-7'), row('SCH-7', 'B-8')].join('\n'),
    })
    expect(clash.body.errors).toEqual([
      { row: 2, column: 'tag', reason: `"B-1" is already in this site's register with another external id (SCH-1)` },
      { row: 4, column: 'external_id', reason: '"SCH-7" repeats the external id of row 3' },
    ])
  })

  it('carries the last test dates so a freshly imported luminaire is not overdue, and refuses a date after today', async () => {
    const site = await siteIn(team.workspaceId)
    const fitted = addDays(today, -500)
    const csv = [HEADER, row('C-1', 'C-1', { fitted, lastF: addDays(today, -10), lastD: addDays(today, -100) }), row('C-2', 'C-2', { fitted })].join('\n')
    const res = await designer.post(`/api/sites/${site.id}/import`, { csv })
    expect(res.status).toBe(201)
    const status = await designer.get(`/api/sites/${site.id}`)
    const byTag = Object.fromEntries(
      status.body.luminaires.map((l: { tag: string; due: { state: string; functional: { lastTestedOn: string | null } } }) => [l.tag, l.due]),
    )
    expect(byTag['C-1'].state).toBe('ok')
    expect(byTag['C-1'].functional.lastTestedOn).toBe(addDays(today, -10))
    expect(byTag['C-2'].state).toBe('overdue')
    // Carried dates are not log-book entries.
    expect((await designer.get(`/api/sites/${site.id}/tests`)).body.tests).toEqual([])
    const future = await designer.post(`/api/sites/${site.id}/import/preview`, { csv: [HEADER, row('C-3', 'C-3', { lastF: addDays(today, 1) })].join('\n') })
    expect(future.body.errors).toEqual([{ row: 2, column: 'last_functional_test_on', reason: expect.stringMatching(/^is after today/) }])
  })

  it('imports its own register export unchanged: the computed columns are read past and nothing changes', async () => {
    const site = await siteIn(team.workspaceId)
    await designer.post(`/api/sites/${site.id}/import`, { csv: [HEADER, row('D-1', 'D-1', { lastF: addDays(today, -3) }), row('D-2', 'D-2')].join('\n') })
    const exported = await designer.get(`/api/sites/${site.id}/export/register.csv`)
    expect(exported.status).toBe(200)
    expect(exported.text.split('\r\n')[0]).toMatch(/,state,.*,external_id,last_functional_test_on,last_duration_test_on$/)
    const again = await designer.post(`/api/sites/${site.id}/import`, { csv: exported.text })
    expect(again.status, JSON.stringify(again.body)).toBe(200)
    expect(again.body).toMatchObject({ imported: 0, updated: 0, unchanged: 2 })
    // An edited cell in the export updates that luminaire only.
    const edited = exported.text.replace(',Corridor,', ',Plant room,')
    const changed = await designer.post(`/api/sites/${site.id}/import`, { csv: edited })
    expect(changed.body).toMatchObject({ imported: 0, updated: 1, unchanged: 1 })
  })
})
