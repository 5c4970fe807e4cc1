/** Handover packs for API tests and route examples: a site with a luminaire, a type and a route. */
import { makePack, createLink } from '../../server/modules/handover/handover.service'
import { HandoverRequestSchema } from '../../shared/schemas/handover.schema'
import { ROUTE_EXAMPLE, typeIn } from './photometry'
import { luminaireIn, siteIn, testIn } from './register-fixtures'
import type { TestTeam } from './test-app'

/** A request body: signed by an invented engineer, one corridor with the given type. */
export function handoverBody(typeId: string, over: Record<string, unknown> = {}) {
  return {
    signedByName: 'Robin Testwell',
    signedOn: '2026-01-20',
    extent: 'Ground floor corridors and stairs',
    deviations: '',
    routes: [{ name: 'Ground floor corridor', typeId, route: ROUTE_EXAMPLE }],
    ...over,
  }
}

/** A site with one luminaire of a catalogue type, its first full-duration test, and a pack made of it. */
export async function packIn(team: TestTeam) {
  const type = await typeIn(team)
  const site = await siteIn(team.workspaceId)
  const luminaire = await luminaireIn(team.workspaceId, site.id, { luminaireTypeId: type.id, packFittedOn: '2025-06-01' })
  await testIn(team.workspaceId, luminaire.id, { kind: 'duration', testedOn: '2025-06-10', achievedDurationH: 3.2 })
  const pack = await makePack(team.workspaceId, team.users.designer.id, site.id, HandoverRequestSchema.parse(handoverBody(type.id)))
  return { type, site, luminaire, pack }
}

export async function handoverLinkIn(team: TestTeam) {
  const { site, pack } = await packIn(team)
  return createLink(team.workspaceId, team.users.designer.id, site.id, pack.number, null)
}
