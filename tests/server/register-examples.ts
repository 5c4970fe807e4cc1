/** Route examples for the site register and log book (merged into route-examples.ts). */
import crypto from 'node:crypto'
import { areaIn, CSV_OK, luminaireIn, siteIn, siteWithLuminaire, testIn } from '../helpers/register-fixtures'
import type { Example, ExampleContext } from './route-examples'
import { dataSource } from '../../server/data-source'
import { planDurationTests } from '../../shared/engine/test-plan'

type ExampleFn = (ctx: ExampleContext) => Promise<Example>

const siteBody = () => ({ name: `Example building ${crypto.randomBytes(3).toString('hex')}`, regime: 'en50172', ceilingTemperatureC: 22 })
const luminaireBody = () => ({
  tag: `EX-${crypto.randomBytes(3).toString('hex')}`,
  purpose: 'escape-route',
  mode: 'non-maintained',
  ratedDurationH: 3,
  chemistry: 'nicd',
  cellsInSeries: 3,
  capacityAh: 1.6,
  packFittedOn: '2024-05-01',
})
const siteId = async (workspaceId: string) => (await siteIn(workspaceId)).id
const luminaireId = async (workspaceId: string) => (await siteWithLuminaire(workspaceId)).luminaire.id
const areaId = async (workspaceId: string) => (await areaIn(workspaceId, await siteId(workspaceId))).id
/** A site with a signed-off round of one passed test. */
async function roundIn(workspaceId: string) {
  const { site, luminaire } = await siteWithLuminaire(workspaceId)
  const clientId = crypto.randomUUID()
  await dataSource.query(
    `INSERT INTO test_records (workspace_id, luminaire_id, client_id, kind, tested_on, passed, round_client_id) VALUES ($1, $2, $3, 'functional', '2025-03-01', true, $4)`,
    [workspaceId, luminaire.id, crypto.randomUUID(), clientId],
  )
  const rows: Array<{ id: string }> = await dataSource.query(
    `INSERT INTO test_rounds (workspace_id, site_id, client_id, signed_off_by_name, signed_off_on) VALUES ($1, $2, $3, 'Example Tester', '2025-03-01') RETURNING id`,
    [workspaceId, site.id, clientId],
  )
  return { siteId: site.id, roundId: rows[0].id }
}
/** A site with a stored plan of its full-duration tests. */
async function planIn(workspaceId: string) {
  const { site, luminaire } = await siteWithLuminaire(workspaceId)
  const input = { grouping: 'alternate' as const, firstDay: '2025-03-01', windowStart: '18:00', windowEnd: '23:00', defaultRechargeH: 24 }
  const plan = planDurationTests({
    ...input,
    regime: 'en50172',
    luminaires: [{ id: luminaire.id, tag: luminaire.tag, areaId: null, areaName: null, circuit: '', walkOrder: null, ratedDurationH: 3, rechargeH: null }],
  })
  const rows: Array<{ id: string }> = await dataSource.query(
    `INSERT INTO test_plans (workspace_id, site_id, input, plan) VALUES ($1, $2, $3, $4) RETURNING id`,
    [workspaceId, site.id, JSON.stringify(input), JSON.stringify(plan)],
  )
  return { siteId: site.id, planId: rows[0].id }
}

export const registerRouteExamples: Record<string, ExampleFn> = {
  'get /api/sites': async () => ({ path: '/api/sites?days=30' }),
  'get /api/register/settings': async () => ({ path: '/api/register/settings' }),
  'patch /api/register/settings': async () => ({ path: '/api/register/settings', body: { repairWindowDays: 14 } }),
  'get /api/portfolio': async () => ({ path: '/api/portfolio?state=overdue,failed' }),
  'get /api/portfolio/pack-budget': async () => ({ path: '/api/portfolio/pack-budget' }),
  'get /api/portfolio/pack-prices': async () => ({ path: '/api/portfolio/pack-prices' }),
  'put /api/portfolio/pack-prices': async () => ({
    path: '/api/portfolio/pack-prices',
    body: { prices: [{ typeLabel: 'Bulkhead BK-3', price: 18.5, currency: 'EUR' }] },
  }),
  'post /api/sites': async () => ({ path: '/api/sites', body: siteBody() }),
  'get /api/sites/:id': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}`,
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}`,
  }),
  'patch /api/sites/:id': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}`,
    body: { ceilingTemperatureC: 30 },
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}`,
  }),
  'delete /api/sites/:id': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}`,
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}`,
  }),
  'post /api/sites/:id/areas': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}/areas`,
    body: { name: 'Plant room' },
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}/areas`,
  }),
  'patch /api/areas/:id': async ({ team, other }) => ({
    path: `/api/areas/${await areaId(team.workspaceId)}`,
    body: { name: 'Renamed area' },
    foreignPath: `/api/areas/${await areaId(other.workspaceId)}`,
  }),
  'delete /api/areas/:id': async ({ team, other }) => ({
    path: `/api/areas/${await areaId(team.workspaceId)}`,
    foreignPath: `/api/areas/${await areaId(other.workspaceId)}`,
  }),
  'post /api/sites/:id/luminaires': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}/luminaires`,
    body: luminaireBody(),
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}/luminaires`,
  }),
  'get /api/luminaires/:id': async ({ team, other }) => ({
    path: `/api/luminaires/${await luminaireId(team.workspaceId)}`,
    foreignPath: `/api/luminaires/${await luminaireId(other.workspaceId)}`,
  }),
  'patch /api/luminaires/:id': async ({ team, other }) => ({
    path: `/api/luminaires/${await luminaireId(team.workspaceId)}`,
    body: { location: 'Stair 2 landing' },
    foreignPath: `/api/luminaires/${await luminaireId(other.workspaceId)}`,
  }),
  'delete /api/luminaires/:id': async ({ team, other }) => ({
    path: `/api/luminaires/${await luminaireId(team.workspaceId)}`,
    foreignPath: `/api/luminaires/${await luminaireId(other.workspaceId)}`,
  }),
  'post /api/luminaires/:id/pack': async ({ team, other }) => ({
    path: `/api/luminaires/${await luminaireId(team.workspaceId)}/pack`,
    body: { packFittedOn: '2025-03-01', note: 'New pack' },
    foreignPath: `/api/luminaires/${await luminaireId(other.workspaceId)}/pack`,
  }),
  'get /api/luminaires/:id/tests': async ({ team, other }) => ({
    path: `/api/luminaires/${await luminaireId(team.workspaceId)}/tests`,
    foreignPath: `/api/luminaires/${await luminaireId(other.workspaceId)}/tests`,
  }),
  'post /api/tests': async ({ team }) => ({
    path: '/api/tests',
    body: {
      records: [{ clientId: crypto.randomUUID(), luminaireId: await luminaireId(team.workspaceId), kind: 'functional', testedOn: '2025-03-01', passed: true }],
    },
    // An outsider sending the same body names a luminaire it cannot see: 404.
    foreignPath: '/api/tests',
  }),
  'delete /api/tests/:id': async ({ team, other }) => {
    const mine = await siteWithLuminaire(team.workspaceId)
    const theirs = await siteWithLuminaire(other.workspaceId)
    return {
      path: `/api/tests/${await testIn(team.workspaceId, mine.luminaire.id, { kind: 'functional', testedOn: '2025-01-01' })}`,
      foreignPath: `/api/tests/${await testIn(other.workspaceId, theirs.luminaire.id, { kind: 'functional', testedOn: '2025-01-01' })}`,
    }
  },
  'post /api/tests/:id/recorded-in-error': async ({ team, other }) => {
    const mine = await siteWithLuminaire(team.workspaceId)
    const theirs = await siteWithLuminaire(other.workspaceId)
    return {
      path: `/api/tests/${await testIn(team.workspaceId, mine.luminaire.id, { kind: 'functional', testedOn: '2025-01-01' })}/recorded-in-error`,
      body: { reason: 'Entered against the wrong luminaire' },
      foreignPath: `/api/tests/${await testIn(other.workspaceId, theirs.luminaire.id, { kind: 'functional', testedOn: '2025-01-01' })}/recorded-in-error`,
    }
  },
  'get /api/sites/:id/regime-history': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}/regime-history`,
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}/regime-history`,
  }),
  'post /api/sites/:id/rounds': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}/rounds`,
    body: { clientId: crypto.randomUUID(), signedOffByName: 'Example Tester', signedOffOn: '2025-03-01' },
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}/rounds`,
  }),
  'get /api/sites/:id/tests': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}/tests`,
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}/tests`,
  }),
  'post /api/sites/:id/import/preview': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}/import/preview`,
    body: { csv: CSV_OK },
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}/import/preview`,
  }),
  'post /api/sites/:id/import': async ({ team, other }) => ({
    path: `/api/sites/${await siteId(team.workspaceId)}/import`,
    body: { csv: CSV_OK },
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}/import`,
  }),
  'get /api/sites/:id/export/:file': async ({ team, other }) => {
    const site = await siteIn(team.workspaceId)
    await luminaireIn(team.workspaceId, site.id)
    // ?as=json: the same file wrapped in JSON (the plain download is checked in register.test.ts).
    return { path: `/api/sites/${site.id}/export/register.csv?as=json`, foreignPath: `/api/sites/${await siteId(other.workspaceId)}/export/register.csv` }
  },
  'get /api/sites/:id/rounds/:roundId/record.pdf': async ({ team, other }) => {
    const mine = await roundIn(team.workspaceId)
    const theirs = await roundIn(other.workspaceId)
    return {
      path: `/api/sites/${mine.siteId}/rounds/${mine.roundId}/record.pdf`,
      foreignPath: `/api/sites/${theirs.siteId}/rounds/${theirs.roundId}/record.pdf`,
    }
  },
  'post /api/sites/:id/test-plans': async ({ team, other }) => ({
    path: `/api/sites/${(await siteWithLuminaire(team.workspaceId)).site.id}/test-plans`,
    body: { grouping: 'alternate', firstDay: '2025-03-01', windowStart: '18:00', windowEnd: '23:00' },
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}/test-plans`,
  }),
  'get /api/sites/:id/test-plans': async ({ team, other }) => ({
    path: `/api/sites/${(await planIn(team.workspaceId)).siteId}/test-plans`,
    foreignPath: `/api/sites/${await siteId(other.workspaceId)}/test-plans`,
  }),
  'get /api/sites/:id/test-plans/:planId': async ({ team, other }) => {
    const mine = await planIn(team.workspaceId)
    const theirs = await planIn(other.workspaceId)
    return { path: `/api/sites/${mine.siteId}/test-plans/${mine.planId}`, foreignPath: `/api/sites/${theirs.siteId}/test-plans/${theirs.planId}` }
  },
  'get /api/sites/:id/test-plans/:planId/work-order.pdf': async ({ team, other }) => {
    const mine = await planIn(team.workspaceId)
    const theirs = await planIn(other.workspaceId)
    return {
      path: `/api/sites/${mine.siteId}/test-plans/${mine.planId}/work-order.pdf`,
      foreignPath: `/api/sites/${theirs.siteId}/test-plans/${theirs.planId}/work-order.pdf`,
    }
  },
  // lists across sites and batches
  'get /api/luminaires': async () => ({ path: '/api/luminaires?state=overdue,failed&limit=50' }),
  'get /api/tests': async () => ({ path: '/api/tests?from=2025-01-01&to=2025-12-31' }),
  'post /api/calc/size/batch': async ({ team }) => ({
    path: '/api/calc/size/batch',
    body: { items: [{ luminaireId: await luminaireId(team.workspaceId), input: { load: { power: '2 W' } } }] },
  }),
  'patch /api/luminaires': async ({ team }) => ({
    path: '/api/luminaires',
    body: { items: [{ id: await luminaireId(team.workspaceId), changes: { location: 'Stair 3 landing' } }] },
  }),
}
