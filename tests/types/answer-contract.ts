/**
 * Compile-time checks of the answer contract, run by `npm run typecheck` (there is nothing to
 * execute). Each `@ts-expect-error` marks a deliberate disagreement between what the server
 * answers and what a client or handler expects: if the types stopped catching it, the directive
 * would be unused and the type check would fail. The lines without it are the real usage, which
 * must compile.
 */
import type { SheetListItem, SheetPage } from '../../src/api/sheets'
import type { ApiTokenInfo } from '../../src/api/tokens'
import type { LuminaireStatus } from '../../src/api/register'
import type { SavedLog } from '../../src/api/discharge'
import { SheetAuthorsAnswer } from '../../shared/schemas/answers/sheets'
import { defineRoute } from '../../server/policy/route'

declare const fromServer: SheetListItem

// The real usage: the client reads what the server declared it sends.
export const capacity: number | null = fromServer.selectedCapacityAh
export const firstTitle = (page: SheetPage): string | undefined => page.items[0]?.title

// A client type that says the capacity is always a number disagrees with a server that may send null.
// @ts-expect-error selectedCapacityAh may be null in the server's answer
export const hand: { selectedCapacityAh: number } = fromServer

// Dates arrive as text: a client expecting a Date object disagrees.
// @ts-expect-error createdAt is ISO text on the client side
export const when: Date = fromServer.createdAt

// The register's answers come from the same schemas: a luminaire outside any area has no area id.
declare const lum: LuminaireStatus
export const areaId: string | null = lum.areaId
// @ts-expect-error areaId is null for a luminaire outside any area
export const areaAlways: string = lum.areaId
// @ts-expect-error a luminaire's due state is one of the engine's states, not any text
export const dueState: LuminaireStatus['due']['state'] = 'late'

// A discharge log without a decided verdict carries pass: null.
declare const log: SavedLog
// @ts-expect-error pass may be null when the log cannot tell
export const passed: boolean = log.summary.pass

// A new token carries its secret once; a listed token never does.
declare const listed: ApiTokenInfo
// @ts-expect-error a listed token has no secret
export const secret: string = listed.token

// A handler must return the declared answer: this one compiles...
export const good = defineRoute({
  method: 'get',
  path: '/api/fixture',
  access: 'public',
  summary: 'fixture',
  response: SheetAuthorsAnswer,
  handler: () => ({ authors: [{ id: 'a', name: 'Tamsin Vale' }] }),
})
// ...and this one, whose answer names the list differently, does not.
export const bad = defineRoute({
  method: 'get',
  path: '/api/fixture',
  access: 'public',
  summary: 'fixture',
  response: SheetAuthorsAnswer,
  // @ts-expect-error the declared answer has `authors`, not `people`
  handler: () => ({ people: [] }),
})
