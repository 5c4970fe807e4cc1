/** Answers of the register's round sign-off and of the workspace's storage use. */
import { z } from 'zod'
import { REGIME_IDS } from '../../engine/regimes'

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

/** One test in the log book, as the log-book routes answer it. */
export const LogBookEntryAnswer = z.object({
  id: z.string(),
  clientId: z.string(),
  luminaireId: z.string(),
  tag: z.string(),
  siteId: z.string(),
  kind: z.enum(['functional', 'duration']),
  testedOn: z.string(),
  passed: z.boolean(),
  achievedDurationH: z.number().nullable(),
  faults: z.string(),
  remedialAction: z.string(),
  dischargeLogId: z.string().nullable(),
  checklist: z.record(z.boolean()),
  verdictOverrideReason: z.string(),
  runtimeNote: z.string(),
  roundClientId: z.string().nullable(),
  recordedBy: z.string().nullable(),
  recordedByName: z.string().nullable(),
  recordedAt: z.union([z.string(), z.date()]),
  /** When the test was marked as recorded in error (struck through, out of the state), else null. */
  recordedInErrorAt: z.union([z.string(), z.date()]).nullable(),
  recordedInErrorReason: z.string(),
  recordedInErrorByName: z.string().nullable(),
})

/** A site's testing regimes over time, oldest first, each with the profile version that applied. */
export const RegimeHistoryAnswer = z.object({
  changes: z.array(
    z.object({
      id: z.string(),
      fromRegime: z.enum(REGIME_IDS).nullable(),
      toRegime: z.enum(REGIME_IDS),
      profileVersion: z.string(),
      reason: z.string(),
      changedBy: z.string().nullable(),
      changedByName: z.string().nullable(),
      changedAt: z.string(),
    }),
  ),
})
