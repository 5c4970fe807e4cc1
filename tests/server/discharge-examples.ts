/** Route examples for discharge logs (merged into route-examples.ts). */
import { COMMA_MAPPING, FAILING, logText, NICD_3H, PASSING, savedLogIn, stagedIn } from '../helpers/discharge-fixtures'
import type { Example, ExampleContext } from './route-examples'

type ExampleFn = (ctx: ExampleContext) => Promise<Example>

export const dischargeRouteExamples: Record<string, ExampleFn> = {
  // The JSON form of the upload (the browser sends multipart; both are tested in discharge.test.ts).
  'post /api/discharge/uploads': async () => ({ path: '/api/discharge/uploads', body: { name: 'example.csv', text: logText(PASSING) } }),
  'post /api/discharge/logs': async ({ team }) => {
    const up = await stagedIn(team)
    return { path: '/api/discharge/logs', body: { uploadId: up.uploadId, title: 'Example log', mapping: COMMA_MAPPING, options: NICD_3H } }
  },
  'get /api/discharge/logs': async () => ({ path: '/api/discharge/logs' }),
  'get /api/discharge/logs/:id': async ({ team, other }) => ({
    path: `/api/discharge/logs/${(await savedLogIn(team)).id}`,
    foreignPath: `/api/discharge/logs/${(await savedLogIn(other)).id}`,
  }),
  'delete /api/discharge/logs/:id': async ({ team, other }) => ({
    path: `/api/discharge/logs/${(await savedLogIn(team)).id}`,
    foreignPath: `/api/discharge/logs/${(await savedLogIn(other)).id}`,
  }),
  'get /api/discharge/compare': async ({ team, other }) => {
    const [a, b] = [await savedLogIn(team, PASSING), await savedLogIn(team, FAILING)]
    const [x, y] = [await savedLogIn(other, PASSING), await savedLogIn(other, FAILING)]
    return { path: `/api/discharge/compare?a=${a.id}&b=${b.id}`, foreignPath: `/api/discharge/compare?a=${x.id}&b=${y.id}` }
  },
}
