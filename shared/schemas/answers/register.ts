/** Answers of the register's round sign-off and of the workspace's storage use. */
import { z } from 'zod'

/** A round signed off by name and date, with the failures recorded on it. */
export const RoundSignOffAnswer = z.object({
  id: z.string(),
  /** False when the same round id was signed off before (the retry lands on the same row). */
  created: z.boolean(),
  clientId: z.string(),
  signedOffByName: z.string(),
  signedOffOn: z.string(),
  notes: z.string(),
  /** How many test records carry this round. */
  records: z.number().int(),
  failures: z.array(z.object({ tag: z.string(), kind: z.enum(['functional', 'duration']), faults: z.string(), remedialAction: z.string() })),
})

/** The workspace's stored files and unsaved uploads against its quota, in bytes. */
export const StorageUseAnswer = z.object({
  usedBytes: z.number(),
  quotaBytes: z.number(),
  storedLogBytes: z.number(),
  photometricBytes: z.number(),
  stagedBytes: z.number(),
  stagedUploads: z.number().int(),
})
