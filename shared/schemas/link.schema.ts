/**
 * A read-only link handed to someone without an account (a handover pack, a site's log book): it
 * opens until the end of its last day, or until withdrawn when it has none.
 */
import { z } from 'zod'
import { IsoDateSchema } from './luminaire.schema'

export const ReadOnlyLinkRequestSchema = z.object({
  /** Last day the link opens ("YYYY-MM-DD", today or later); null: until withdrawn. */
  expiresOn: IsoDateSchema.nullable().default(null),
})
export type ReadOnlyLinkRequest = z.output<typeof ReadOnlyLinkRequestSchema>

/** Whether a link still opens. */
export const LINK_STATES = ['active', 'expired', 'revoked'] as const
