/** Answers of the handover pack routes: packs listed, one pack with its frozen content, a read-only link. */
import { z } from 'zod'
import { HandoverContentSchema } from '../handover.schema'
import { PersonSchema, Timestamp } from './common'

/** One pack as listed: its number per site, who signed, when it was made. */
export const HandoverPackSummary = z.object({
  id: z.string(),
  siteId: z.string(),
  number: z.number().int(),
  signedByName: z.string(),
  signedOn: z.string(),
  madeBy: PersonSchema.nullable(),
  createdAt: Timestamp,
})

export const HandoverPackAnswer = HandoverPackSummary.extend({ content: HandoverContentSchema })
export const HandoverPackListAnswer = z.object({ packs: z.array(HandoverPackSummary) })
export const HandoverLinkAnswer = z.object({ id: z.string(), url: z.string(), token: z.string(), expiresOn: z.string().nullable() })
/** The read-only page behind a link: the pack, without the workspace's ids. */
export const SharedHandoverAnswer = z.object({
  number: z.number().int(),
  signedByName: z.string(),
  signedOn: z.string(),
  createdAt: Timestamp,
  expiresOn: z.string().nullable(),
  content: HandoverContentSchema,
})
