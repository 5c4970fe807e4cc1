/** Answers of the site register: sites, areas, luminaires with due dates and pack forecasts, the log book, imports, rounds. */
import { z } from 'zod'
import { MODES, PURPOSES } from '../luminaire.schema'
import { TEST_REGIMES } from '../site.schema'
import { TEST_KINDS } from '../test-record.schema'
import { IsoDay, ReferenceSchema, StoredJson, Timestamp } from './common'

const TestKind = z.enum(TEST_KINDS)

export const RegisterSettingsAnswer = z.object({
  repairWindowDays: z.number().int(),
  /** The daily reminder lists tests falling due within this many days. */
  reminderDaysAhead: z.number().int(),
  /** Whether each site's responsible person gets the reminder. */
  remindSiteContact: z.boolean(),
  /** Members with these roles get it. */
  remindRoles: z.array(z.enum(['owner', 'designer', 'technician', 'viewer'])),
})

export const SiteAnswer = z.object({
  id: z.string(),
  name: z.string(),
  address: z.string(),
  responsibleName: z.string(),
  responsibleEmail: z.string(),
  regime: z.enum(TEST_REGIMES),
  ceilingTemperatureC: z.number(),
  createdAt: Timestamp,
  updatedAt: Timestamp,
})

export const AreaAnswer = z.object({ id: z.string(), siteId: z.string(), name: z.string(), notes: z.string() })

export const LuminaireAnswer = z.object({
  id: z.string(),
  siteId: z.string(),
  areaId: z.string().nullable(),
  areaName: z.string().nullable(),
  tag: z.string(),
  location: z.string(),
  typeLabel: z.string(),
  purpose: z.enum(PURPOSES),
  mode: z.enum(MODES),
  ratedDurationH: z.number(),
  chemistry: z.string(),
  cellsInSeries: z.number().int(),
  capacityAh: z.number(),
  packFittedOn: IsoDay,
  walkOrder: z.number().int().nullable(),
  circuit: z.string(),
  rechargeH: z.number().nullable(),
  specSheetId: z.string().nullable(),
  luminaireTypeId: z.string().nullable(),
  /** The key an outside schedule knows it by (a second import matches on it). */
  externalId: z.string().nullable(),
  /** The last tests done before this register kept the log book, as a schedule carried them. */
  lastFunctionalTestOn: IsoDay.nullable(),
  lastDurationTestOn: IsoDay.nullable(),
  createdAt: Timestamp,
  updatedAt: Timestamp,
})

/** When one kind of test falls due (shared/engine/due.ts). */
const DueItemAnswer = z.object({
  kind: TestKind,
  lastTestedOn: IsoDay.nullable(),
  nextDueOn: IsoDay,
  overdueAfter: IsoDay,
  daysUntilDue: z.number().int(),
  state: z.enum(['overdue', 'due-now', 'due-soon', 'scheduled']),
  reason: z.enum(['interval', 'retest', 'commissioning']),
})

const OpenFailureAnswer = z.object({
  kind: TestKind,
  testedOn: IsoDay,
  faults: z.string(),
  remedialAction: z.string(),
  retestBy: IsoDay,
  retestOverdue: z.boolean(),
})

export const LuminaireDueAnswer = z.object({
  functional: DueItemAnswer,
  duration: DueItemAnswer,
  failed: z.boolean(),
  lastFailure: OpenFailureAnswer.nullable(),
  openFailures: z.array(OpenFailureAnswer),
  commissioning: z.boolean(),
  state: z.enum(['failed', 'overdue', 'due-now', 'due-soon', 'ok']),
})

export const PackForecastAnswer = z.object({
  serviceLifeYears: z.number(),
  ageYears: z.number(),
  lifeUsed: z.number(),
  endOfLifeOn: IsoDay,
  trend: z.object({ points: z.number().int(), slopeHPerYear: z.number(), fittedTodayH: z.number(), belowRatedOn: IsoDay.nullable() }).nullable(),
  durationTests: z.number().int(),
  trendStatus: z.enum(['used', 'not-enough-tests']),
  latestTestOn: IsoDay.nullable(),
  replaceBy: IsoDay,
  reason: z.enum(['service-life', 'duration-trend', 'latest-test']),
  state: z.enum(['replace-now', 'replace-soon', 'ok']),
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

export const LuminaireStatusAnswer = LuminaireAnswer.extend({ due: LuminaireDueAnswer, forecast: PackForecastAnswer })

/** A site's testing regimes over time, oldest first, each with the profile version that applied. */
export const RegimeChangeAnswer = z.object({
  id: z.string(),
  fromRegime: z.enum(TEST_REGIMES).nullable(),
  toRegime: z.enum(TEST_REGIMES),
  profileVersion: z.string(),
  reason: z.string(),
  changedBy: z.string().nullable(),
  changedByName: z.string().nullable(),
  changedAt: Timestamp,
})
const Interval = z.object({ unit: z.enum(['month', 'day']), count: z.number().int() })
const RegimeTestAnswer = z.object({
  kind: TestKind,
  name: z.string(),
  interval: Interval,
  window: z.object({ earliestDays: z.number().int(), latestDays: z.number().int() }).nullable(),
  length: z.union([z.object({ rated: z.literal(true) }), z.object({ hours: z.number() }), z.object({ minimumS: z.number() })]),
  passRule: z.string(),
  reference: ReferenceSchema,
})
/** The site's regime profile (shared/engine/regimes.ts): tests, intervals, windows, records, retention, edition. */
export const RegimeProfileAnswer = z.object({
  id: z.enum(TEST_REGIMES),
  version: z.string(),
  edition: z.string(),
  jurisdiction: z.string(),
  shortTest: RegimeTestAnswer,
  longTest: RegimeTestAnswer,
  otherChecks: z.array(z.object({ name: z.string(), interval: Interval.nullable(), reference: ReferenceSchema })),
  records: z.array(z.string()),
  retention: z.object({ years: z.number().nullable(), reference: ReferenceSchema }),
  references: z.array(ReferenceSchema),
})

export const SiteStatusAnswer = z.object({
  today: IsoDay,
  site: SiteAnswer,
  regime: z.object({ label: z.string(), references: z.array(ReferenceSchema) }),
  profile: RegimeProfileAnswer,
  regimeHistory: z.array(RegimeChangeAnswer),
  settings: RegisterSettingsAnswer,
  areas: z.array(z.object({ id: z.string(), name: z.string() })),
  counts: DueCountsAnswer,
  luminaires: z.array(LuminaireStatusAnswer),
})

export const UpcomingTestAnswer = z.object({
  siteId: z.string(),
  siteName: z.string(),
  luminaireId: z.string(),
  tag: z.string(),
  kind: TestKind,
  dueOn: IsoDay,
  daysUntilDue: z.number().int(),
})

/** A test due now or overdue across the workspace (retest, commissioning, routine past its day). */
export const AttentionItemAnswer = UpcomingTestAnswer.extend({
  reason: z.enum(['interval', 'retest', 'commissioning']),
  state: z.enum(['overdue', 'due-now']),
  overdueAfter: IsoDay,
  failedOn: IsoDay.nullable(),
  faults: z.string(),
  remedialAction: z.string(),
})

export const SiteSummaryAnswer = SiteAnswer.extend({ counts: DueCountsAnswer, packsToReplace: z.number().int() })

export const RegisterOverviewAnswer = z.object({
  today: IsoDay,
  days: z.number().int(),
  settings: RegisterSettingsAnswer,
  sites: z.array(SiteSummaryAnswer),
  attention: z.array(AttentionItemAnswer),
  upcoming: z.array(UpcomingTestAnswer),
})

export const LuminaireDetailAnswer = z.object({ today: IsoDay, site: SiteAnswer, luminaire: LuminaireStatusAnswer })

export const LogBookEntryAnswer = z.object({
  id: z.string(),
  clientId: z.string(),
  luminaireId: z.string(),
  tag: z.string(),
  siteId: z.string(),
  kind: TestKind,
  testedOn: IsoDay,
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
  recordedAt: Timestamp,
  /** When the test was marked as recorded in error (shown struck through, out of the state), else null. */
  recordedInErrorAt: Timestamp.nullable(),
  recordedInErrorReason: z.string(),
  recordedInErrorByName: z.string().nullable(),
})

/** A pack fitted in the field or its details corrected, from the audit trail, with its note. */
export const PackChangeAnswer = z.object({
  id: z.string(),
  luminaireId: z.string(),
  tag: z.string(),
  changedOn: IsoDay,
  before: StoredJson.nullable(),
  after: StoredJson.nullable(),
  note: z.string(),
  recordedByName: z.string().nullable(),
  recordedAt: Timestamp,
})

export const LogBookAnswer = z.object({ tests: z.array(LogBookEntryAnswer), packChanges: z.array(PackChangeAnswer).optional() })

export const RegimeHistoryAnswer = z.object({ changes: z.array(RegimeChangeAnswer) })

export const TestBatchAnswer = z.object({
  records: z.array(z.object({ clientId: z.string(), id: z.string(), outcome: z.enum(['created', 'updated', 'unchanged']) })),
})

export const ImportPreviewAnswer = z.object({
  columns: z.array(z.string()),
  /** The first rows only, with their values read (null when the row has a problem); totalRows counts them all. */
  rows: z.array(z.object({ row: z.number().int(), values: StoredJson.nullable() })),
  /** The first problems only; errorCount counts them all. */
  errors: z.array(z.object({ row: z.number().int(), column: z.string(), reason: z.string() })),
  errorCount: z.number().int(),
  validRows: z.number().int(),
  totalRows: z.number().int(),
  newAreas: z.array(z.string()),
  /** Valid rows that add a luminaire, change the one they match, or change nothing. */
  creates: z.number().int(),
  updates: z.number().int(),
  unchanged: z.number().int(),
})

/** `imported` counts the luminaires added; `updated` and `unchanged` the rows that matched one (201 when any was added, else 200). */
export const ImportResultAnswer = z.object({
  imported: z.number().int(),
  updated: z.number().int(),
  unchanged: z.number().int(),
  areasCreated: z.number().int(),
  ids: z.array(z.string()),
  updatedIds: z.array(z.string()),
})

/** An export wrapped in JSON (?as=json): text files as UTF-8, PDFs as base64. */
export const ExportAnswer = z.object({ filename: z.string(), mediaType: z.string(), encoding: z.enum(['utf8', 'base64']), content: z.string() })

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
  failures: z.array(z.object({ tag: z.string(), kind: TestKind, faults: z.string(), remedialAction: z.string() })),
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
