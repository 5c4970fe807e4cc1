/** Route examples for /api/photometry, /api/luminaire-types and /api/route-spacing (merged into route-examples.ts). */
import { corridorLm63, photometryIn, ROUTE_EXAMPLE, typeBody, typeIn } from '../helpers/photometry'
import type { Example, ExampleContext } from './route-examples'

type ExampleFn = (ctx: ExampleContext) => Promise<Example>

export const photometryRouteExamples: Record<string, ExampleFn> = {
  'get /api/photometry': async () => ({ path: '/api/photometry' }),
  'post /api/photometry': async () => ({ path: '/api/photometry', body: { name: 'Uploaded file', text: corridorLm63() } }),
  'get /api/photometry/:id': async ({ team, other }) => ({
    path: `/api/photometry/${(await photometryIn(team)).id}`,
    foreignPath: `/api/photometry/${(await photometryIn(other)).id}`,
  }),
  'delete /api/photometry/:id': async ({ team, other }) => ({
    path: `/api/photometry/${(await photometryIn(team)).id}`,
    foreignPath: `/api/photometry/${(await photometryIn(other)).id}`,
  }),
  'get /api/luminaire-types': async () => ({ path: '/api/luminaire-types' }),
  'post /api/luminaire-types': async ({ team }) => ({ path: '/api/luminaire-types', body: typeBody((await photometryIn(team)).id) }),
  'get /api/luminaire-types/:id': async ({ team, other }) => ({
    path: `/api/luminaire-types/${(await typeIn(team, false)).id}`,
    foreignPath: `/api/luminaire-types/${(await typeIn(other, false)).id}`,
  }),
  'patch /api/luminaire-types/:id': async ({ team, other }) => ({
    path: `/api/luminaire-types/${(await typeIn(team, false)).id}`,
    body: { notes: 'Changed in a test' },
    foreignPath: `/api/luminaire-types/${(await typeIn(other, false)).id}`,
  }),
  'delete /api/luminaire-types/:id': async ({ team, other }) => ({
    path: `/api/luminaire-types/${(await typeIn(team, false)).id}`,
    foreignPath: `/api/luminaire-types/${(await typeIn(other, false)).id}`,
  }),
  'post /api/route-spacing/select': async ({ team }) => {
    await typeIn(team)
    return { path: '/api/route-spacing/select', body: ROUTE_EXAMPLE }
  },
  'post /api/route-spacing/pick': async ({ team }) => ({ path: '/api/route-spacing/pick', body: { typeId: (await typeIn(team)).id, route: ROUTE_EXAMPLE } }),
}
