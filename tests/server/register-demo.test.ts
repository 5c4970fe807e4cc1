/** The demo register: seeds once, stays the same on a second run, and shows what the demo promises. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { seedDemo } from '../../server/demo/index'
import { DEMO_WORKSPACE } from '../../server/scripts/demo-users'
import { overview, siteStatus } from '../../server/modules/register/register.service'
import { closeTestApp, getTestApp } from '../helpers/test-app'

beforeAll(async () => {
  await getTestApp()
})
afterAll(closeTestApp)

describe('demo register', () => {
  it('is idempotent and holds three buildings, about 60 luminaires, two years of tests, failures and ageing packs', async () => {
    await seedDemo(dataSource)
    const count = async () => (await dataSource.query(`SELECT (SELECT count(*) FROM luminaires)::int AS l, (SELECT count(*) FROM test_records)::int AS t`))[0]
    const first = await count()
    await seedDemo(dataSource)
    expect(await count()).toEqual(first)
    const ws = (await dataSource.query('SELECT id FROM workspaces WHERE name = $1', [DEMO_WORKSPACE]))[0].id
    const o = await overview(ws, 60)
    expect(o.sites.map((s) => s.name)).toHaveLength(3)
    const total = o.sites.reduce((s, x) => s + x.counts.luminaires, 0)
    expect(total).toBeGreaterThanOrEqual(55)
    expect(total).toBeLessThanOrEqual(65)
    const statuses = await Promise.all(o.sites.map((s) => siteStatus(ws, s.id)))
    const all = statuses.flatMap((s) => s.luminaires)
    expect(all.filter((l) => l.due.failed).length).toBeGreaterThanOrEqual(1)
    expect(all.filter((l) => l.forecast.state !== 'ok').length).toBeGreaterThanOrEqual(2)
    expect(all.filter((l) => l.due.state === 'overdue').length).toBeGreaterThanOrEqual(1)
    expect(o.upcoming.length).toBeGreaterThan(0)
    const failures = (await dataSource.query(`SELECT count(*)::int AS n FROM test_records WHERE workspace_id = $1 AND NOT passed`, [ws]))[0].n
    expect(failures).toBeGreaterThanOrEqual(3)
  })
})
