/** Route examples for the handover packs (merged into route-examples.ts). */
import { typeIn } from '../helpers/photometry'
import { handoverBody, handoverLinkIn, packIn } from '../helpers/handover'
import { siteIn } from '../helpers/register-fixtures'
import type { Example, ExampleContext } from './route-examples'

type ExampleFn = (ctx: ExampleContext) => Promise<Example>

export const handoverRouteExamples: Record<string, ExampleFn> = {
  'get /api/sites/:id/handover-packs': async ({ team, other }) => ({
    path: `/api/sites/${(await siteIn(team.workspaceId)).id}/handover-packs`,
    foreignPath: `/api/sites/${(await siteIn(other.workspaceId)).id}/handover-packs`,
  }),
  'post /api/sites/:id/handover-packs': async ({ team, other }) => ({
    path: `/api/sites/${(await siteIn(team.workspaceId)).id}/handover-packs`,
    body: handoverBody((await typeIn(team)).id),
    foreignPath: `/api/sites/${(await siteIn(other.workspaceId)).id}/handover-packs`,
  }),
  'get /api/sites/:id/handover-packs/:n': async ({ team, other }) => {
    const mine = await packIn(team)
    const theirs = await packIn(other)
    return { path: `/api/sites/${mine.site.id}/handover-packs/1`, foreignPath: `/api/sites/${theirs.site.id}/handover-packs/1` }
  },
  'get /api/sites/:id/handover-packs/:n/pdf': async ({ team, other }) => {
    const mine = await packIn(team)
    const theirs = await packIn(other)
    return { path: `/api/sites/${mine.site.id}/handover-packs/1/pdf`, foreignPath: `/api/sites/${theirs.site.id}/handover-packs/1/pdf` }
  },
  'post /api/sites/:id/handover-packs/:n/links': async ({ team, other }) => {
    const mine = await packIn(team)
    const theirs = await packIn(other)
    return {
      path: `/api/sites/${mine.site.id}/handover-packs/1/links`,
      body: { expiresOn: null },
      foreignPath: `/api/sites/${theirs.site.id}/handover-packs/1/links`,
    }
  },
  'get /api/handover-links/:token': async ({ team }) => ({ path: `/api/handover-links/${(await handoverLinkIn(team)).token}` }),
  'get /api/handover-links/:token/pdf': async ({ team }) => ({ path: `/api/handover-links/${(await handoverLinkIn(team)).token}/pdf` }),
}
