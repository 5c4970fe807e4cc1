/** Answers of the log book links: a new link (token shown once), the links of a site, and the log book behind a link. */
import { z } from 'zod'
import type { LogBookSummary } from '../../engine/log-book-summary'
import { LINK_STATES } from '../link.schema'
import { TEST_REGIMES } from '../site.schema'
import { TEST_KINDS } from '../test-record.schema'
import { engineShape, IsoDay, PersonSchema, Timestamp } from './common'

const LinkState = z.enum(LINK_STATES)

/** A link just made: the only answer that carries its token and address. */
export const NewLogBookLinkAnswer = z.object({
  id: z.string(),
  url: z.string(),
  token: z.string(),
  expiresOn: IsoDay.nullable(),
  createdAt: Timestamp,
  state: LinkState,
})

/** A link as listed: never its token. */
export const LogBookLinkItem = z.object({
  id: z.string(),
  expiresOn: IsoDay.nullable(),
  createdAt: Timestamp,
  createdBy: PersonSchema.nullable(),
  revokedAt: Timestamp.nullable(),
  state: LinkState,
})
export const LogBookLinkListAnswer = z.object({ links: z.array(LogBookLinkItem) })

/** The summary page of a log book, from the engine (shared/engine/log-book-summary.ts). */
export const LogBookSummaryAnswer = engineShape<LogBookSummary>('The log book summary: counts, every failure with its present state, the next test dates')

/** One entry of a shared log book: no ids of the workspace. */
export const SharedLogBookEntry = z.object({
  testedOn: IsoDay,
  tag: z.string(),
  kind: z.enum(TEST_KINDS),
  passed: z.boolean(),
  achievedDurationH: z.number().nullable(),
  faults: z.string(),
  remedialAction: z.string(),
  recordedByName: z.string().nullable(),
  /** The test was marked as recorded in error: kept in the log book, counted for nothing. */
  recordedInError: z.boolean(),
  recordedInErrorReason: z.string(),
})

/** The read-only page behind a log book link: the site as it stands today, its summary and its entries, newest first. */
export const SharedLogBookAnswer = z.object({
  firm: z.string(),
  site: z.object({ name: z.string(), address: z.string(), responsibleName: z.string(), regime: z.enum(TEST_REGIMES) }),
  repairWindowDays: z.number().int(),
  expiresOn: IsoDay.nullable(),
  summary: LogBookSummaryAnswer,
  entries: z.array(SharedLogBookEntry),
  /** Entries in the log book; the page lists the newest `entries.length` of them, the PDF all. */
  totalEntries: z.number().int(),
})
