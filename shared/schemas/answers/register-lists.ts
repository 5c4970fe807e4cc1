/** Answers of the register's sites and lists across sites (GET/POST /api/sites, GET /api/luminaires, GET /api/tests). */
import { z } from 'zod'
import { ATTENTION_STATES, listAnswer } from '../list.schema'
import { Timestamp } from './common'

const TestKind = z.enum(['functional', 'duration'])

/** One test's place in the calendar (shared/engine/due.ts). */
export const DueItemAnswer = z.object({
  kind: TestKind,
  lastTestedOn: z.string().nullable(),
  nextDueOn: z.string(),
  overdueAfter: z.string(),
  daysUntilDue: z.number().int(),
  state: z.enum(['overdue', 'due-now', 'due-soon', 'scheduled']),
  reason: z.enum(['interval', 'retest', 'commissioning']),
})

export const OpenFailureAnswer = z.object({ kind: TestKind, testedOn: z.string(), faults: z.string(), remedialAction: z.string(), retestBy: z.string(), retestOverdue: z.boolean() })

export const LuminaireDueAnswer = z.object({
  functional: DueItemAnswer,
  duration: DueItemAnswer,
  failed: z.boolean(),
  lastFailure: OpenFailureAnswer.nullable(),
  openFailures: z.array(OpenFailureAnswer),
  commissioning: z.boolean(),
  state: z.enum(['failed', 'overdue', 'due-now', 'due-soon', 'ok']),
})

/** A luminaire of the register as the API answers it; the fields PATCH /api/luminaires/:id takes come back under the same names and units. */
export const LuminaireAnswer = z.object({
  id: z.string(),
  siteId: z.string(),
  areaId: z.string().nullable(),
  areaName: z.string().nullable(),
  tag: z.string(),
  location: z.string(),
  typeLabel: z.string(),
  purpose: z.enum(['escape-route', 'open-area', 'high-risk', 'exit-sign']),
  mode: z.enum(['maintained', 'non-maintained']),
  /** Hours (the name carries the unit). */
  ratedDurationH: z.number(),
  chemistry: z.string(),
  cellsInSeries: z.number().int(),
  /** Ampere-hours (the name carries the unit). */
  capacityAh: z.number(),
  packFittedOn: z.string(),
  walkOrder: z.number().int().nullable(),
  circuit: z.string(),
  rechargeH: z.number().nullable(),
  specSheetId: z.string().nullable(),
  luminaireTypeId: z.string().nullable(),
  externalId: z.string().nullable(),
  lastFunctionalTestOn: z.string().nullable(),
  lastDurationTestOn: z.string().nullable(),
  createdAt: Timestamp,
  updatedAt: Timestamp,
})

export const LuminaireListItemAnswer = LuminaireAnswer.extend({
  siteName: z.string(),
  states: z.array(z.enum(ATTENTION_STATES)),
  due: LuminaireDueAnswer,
  /** The battery pack forecast (shared/engine/due.ts `PackForecast`). */
  forecast: z.unknown(),
})

export const LuminaireListAnswer = listAnswer(LuminaireListItemAnswer)

/** One log-book entry. */
export const LogBookEntryAnswer = z.object({
  id: z.string(),
  clientId: z.string(),
  luminaireId: z.string(),
  tag: z.string(),
  siteId: z.string(),
  kind: TestKind,
  testedOn: z.string(),
  passed: z.boolean(),
  /** Hours (the name carries the unit). */
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
  recordedAt: Timestamp,
})

export const TestListAnswer = listAnswer(LogBookEntryAnswer)

/** A site as the API answers it (POST and PATCH take the same names and units). */
export const SiteAnswer = z.object({
  id: z.string(),
  name: z.string(),
  address: z.string(),
  responsibleName: z.string(),
  responsibleEmail: z.string(),
  regime: z.string(),
  /** °C (the name carries the unit). */
  ceilingTemperatureC: z.number(),
  createdAt: Timestamp,
  updatedAt: Timestamp,
})

export const DueCountsAnswer = z.object({
  luminaires: z.number().int(),
  failed: z.number().int(),
  overdue: z.number().int(),
  dueNow: z.number().int(),
  dueSoon: z.number().int(),
  ok: z.number().int(),
  retestOverdue: z.number().int(),
})

const UpcomingTestAnswer = z.object({ siteId: z.string(), siteName: z.string(), luminaireId: z.string(), tag: z.string(), kind: TestKind, dueOn: z.string(), daysUntilDue: z.number().int() })

/** GET /api/sites: every site with its counts, what needs attention across sites, and what falls due soon. */
export const SiteOverviewAnswer = z.object({
  today: z.string(),
  days: z.number().int(),
  settings: z.object({ repairWindowDays: z.number().int() }),
  sites: z.array(SiteAnswer.extend({ counts: DueCountsAnswer, packsToReplace: z.number().int() })),
  attention: z.array(
    UpcomingTestAnswer.extend({
      reason: z.enum(['interval', 'retest', 'commissioning']),
      state: z.enum(['overdue', 'due-now']),
      overdueAfter: z.string(),
      failedOn: z.string().nullable(),
      faults: z.string(),
      remedialAction: z.string(),
    }),
  ),
  upcoming: z.array(UpcomingTestAnswer),
})

/** POST /api/sites/:id/import: what the schedule did (201 when it added a luminaire, else 200). */
export const ImportAnswer = z.object({
  /** Luminaires added. */
  imported: z.number().int(),
  updated: z.number().int(),
  unchanged: z.number().int(),
  areasCreated: z.number().int(),
  ids: z.array(z.string()),
  updatedIds: z.array(z.string()),
})
