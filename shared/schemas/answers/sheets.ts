/** Answers of /api/sheets and /api/shared. */
import { z } from 'zod'
import { REVISION_STATUSES, SHEET_STATUSES } from '../sheet.schema'
import { PersonSchema, StoredJson, Timestamp } from './common'

const SheetFields = {
  title: z.string(),
  reference: z.string(),
  client: z.string(),
  site: z.string(),
  luminaire: z.string(),
  inputs: StoredJson,
}

export const SheetAnswer = z.object({
  id: z.string(),
  ...SheetFields,
  chemistry: z.string(),
  results: StoredJson,
  engineVersion: z.string(),
  status: z.enum(SHEET_STATUSES),
  currentRevision: z.number(),
  issuedRevision: z.number().nullable(),
  version: z.number(),
  createdBy: PersonSchema.nullable(),
  updatedBy: PersonSchema.nullable(),
  archivedAt: Timestamp.nullable(),
  createdAt: Timestamp,
  updatedAt: Timestamp,
})

export const SheetListItemAnswer = z.object({
  id: z.string(),
  title: z.string(),
  reference: z.string(),
  client: z.string(),
  site: z.string(),
  chemistry: z.string(),
  status: z.enum(SHEET_STATUSES),
  currentRevision: z.number(),
  issuedRevision: z.number().nullable(),
  // Null when the sheet's results hold no sizing (e.g. an empty draft).
  selectedCapacityAh: z.number().nullable(),
  requiredCapacityAh: z.number().nullable(),
  author: PersonSchema.nullable(),
  archivedAt: Timestamp.nullable(),
  createdAt: Timestamp,
  updatedAt: Timestamp,
})

export const SheetPageAnswer = z.object({ items: z.array(SheetListItemAnswer), total: z.number(), page: z.number(), pageSize: z.number() })

export const SheetAuthorsAnswer = z.object({ authors: z.array(PersonSchema) })

export const RevisionSummaryAnswer = z.object({
  number: z.number(),
  status: z.enum(REVISION_STATUSES),
  title: z.string(),
  engineVersion: z.string(),
  author: PersonSchema.nullable(),
  createdAt: Timestamp,
  issuedAt: Timestamp.nullable(),
  issuedBy: PersonSchema.nullable(),
})

export const RevisionListAnswer = z.object({ revisions: z.array(RevisionSummaryAnswer) })

export const RevisionAnswer = RevisionSummaryAnswer.extend({ ...SheetFields, results: StoredJson })

export const SharedSheetAnswer = RevisionAnswer.extend({
  expiresAt: Timestamp.nullable(),
  cautions: z.array(z.object({ id: z.string(), title: z.string(), text: z.string() })),
})

const ShareState = z.enum(['active', 'expired', 'revoked'])

export const ShareLinkAnswer = z.object({
  id: z.string(),
  createdAt: Timestamp,
  createdBy: PersonSchema.nullable(),
  expiresAt: Timestamp.nullable(),
  revokedAt: Timestamp.nullable(),
  state: ShareState,
})

export const ShareListAnswer = z.object({ shares: z.array(ShareLinkAnswer) })

/** A new share link: the token is shown this once. */
export const NewShareAnswer = z.object({
  id: z.string(),
  token: z.string(),
  url: z.string(),
  expiresAt: Timestamp.nullable(),
  createdAt: Timestamp,
  state: ShareState,
})

export const SentAnswer = z.object({ sent: z.boolean() })
