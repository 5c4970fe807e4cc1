/** Answers of /api/audits: saved wattage audits and where they are attached. */
import { z } from 'zod'
import type { EngineWarning } from '../../engine/types'
import { PersonSchema, StoredJson, storedAs, Timestamp } from './common'

export const SavedAuditAnswer = z.object({
  id: z.string(),
  title: z.string(),
  luminaire: z.string(),
  inputs: StoredJson,
  /** The engine's audit result as saved (lists leave out `working`). */
  results: storedAs<Record<string, unknown> & { warnings: EngineWarning[] }>("The engine's audit result as saved"),
  claimedPowerW: z.number(),
  engineVersion: z.string(),
  author: PersonSchema.nullable(),
  specSheetId: z.string().nullable(),
  luminaireId: z.string().nullable(),
  specSheet: z.object({ id: z.string(), title: z.string() }).nullable(),
  luminaireLink: z.object({ id: z.string(), tag: z.string(), siteId: z.string(), siteName: z.string() }).nullable(),
  createdAt: Timestamp,
  updatedAt: Timestamp,
})

export const AuditListAnswer = z.object({ items: z.array(SavedAuditAnswer), total: z.number().int() })
