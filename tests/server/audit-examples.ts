/** Route examples for /api/audits (merged into route-examples.ts). */
import { auditBody, auditIn } from '../helpers/audits'
import { sheetIn } from '../helpers/sheets'
import type { Example, ExampleContext } from './route-examples'

type ExampleFn = (ctx: ExampleContext) => Promise<Example>

export const auditRouteExamples: Record<string, ExampleFn> = {
  'get /api/audits': async () => ({ path: '/api/audits?limit=5' }),
  'post /api/audits': async () => ({ path: '/api/audits', body: auditBody() }),
  'get /api/audits/:id': async ({ team, other }) => ({
    path: `/api/audits/${(await auditIn(team)).id}`,
    foreignPath: `/api/audits/${(await auditIn(other)).id}`,
  }),
  'delete /api/audits/:id': async ({ team, other }) => ({
    path: `/api/audits/${(await auditIn(team)).id}`,
    foreignPath: `/api/audits/${(await auditIn(other)).id}`,
  }),
  'post /api/audits/:id/attach': async ({ team, other }) => ({
    path: `/api/audits/${(await auditIn(team)).id}/attach`,
    body: { specSheetId: (await sheetIn(team)).id },
    foreignPath: `/api/audits/${(await auditIn(other)).id}/attach`,
  }),
}
