/** Route examples for the log book links (merged into route-examples.ts). */
import { createLink } from '../../server/modules/logbook/logbook-links.service'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import type { TestTeam } from '../helpers/test-app'
import type { Example, ExampleContext } from './route-examples'

type ExampleFn = (ctx: ExampleContext) => Promise<Example>

/** A site with one tested luminaire and a link to its log book. */
async function linkIn(team: TestTeam) {
  const site = await siteIn(team.workspaceId)
  const l = await luminaireIn(team.workspaceId, site.id, { packFittedOn: '2025-06-01' })
  await testIn(team.workspaceId, l.id, { kind: 'duration', testedOn: '2025-06-10', achievedDurationH: 3.1 })
  const link = await createLink(team.workspaceId, team.users.designer.id, site.id, null)
  return { site, link }
}

export const logbookRouteExamples: Record<string, ExampleFn> = {
  'post /api/sites/:id/logbook-links': async ({ team, other }) => ({
    path: `/api/sites/${(await siteIn(team.workspaceId)).id}/logbook-links`,
    body: { expiresOn: null },
    foreignPath: `/api/sites/${(await siteIn(other.workspaceId)).id}/logbook-links`,
  }),
  'get /api/sites/:id/logbook-links': async ({ team, other }) => ({
    path: `/api/sites/${(await linkIn(team)).site.id}/logbook-links`,
    foreignPath: `/api/sites/${(await linkIn(other)).site.id}/logbook-links`,
  }),
  'delete /api/sites/:id/logbook-links/:linkId': async ({ team, other }) => {
    const mine = await linkIn(team)
    const theirs = await linkIn(other)
    return { path: `/api/sites/${mine.site.id}/logbook-links/${mine.link.id}`, foreignPath: `/api/sites/${theirs.site.id}/logbook-links/${theirs.link.id}` }
  },
  'get /api/logbook-links/:token': async ({ team }) => ({ path: `/api/logbook-links/${(await linkIn(team)).link.token}` }),
  'get /api/logbook-links/:token/pdf': async ({ team }) => ({ path: `/api/logbook-links/${(await linkIn(team)).link.token}/pdf` }),
}
