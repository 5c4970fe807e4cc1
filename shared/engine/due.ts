/**
 * What is due: the routine-test calendar of an emergency luminaire and the battery replacement
 * forecast. Pure: `today` is always an input, dates are ISO calendar days ("YYYY-MM-DD") counted
 * in UTC so that no time zone or daylight-saving shift moves a due date.
 *
 * Choices (also shown on the register screens):
 * - The next test falls due one interval after the last test actually done. A test done early
 *   therefore pulls the calendar forward: the gap between two tests never exceeds the interval.
 * - A full-duration test also switches the luminaire to emergency mode, so it counts as that
 *   month's functional test too.
 * - Intervals and windows come from the site's regime profile (regimes.ts). "Monthly" and "annual"
 *   are calendar intervals clamped to the end of a shorter month (31 Jan → 28/29 Feb); NFPA 101's
 *   monthly test is counted in days (30, overdue after its 5-week window).
 * - A luminaire never tested has its functional test due one interval after its pack was fitted (or
 *   after it joined the register): no record of a test means the test is not proven.
 * - Failures stay open until put right, per kind of test (see `openFailuresOf`): the retest is due at
 *   once and overdue after the workspace's repair window (14 days unless it sets another).
 * - A luminaire with no full-duration test passed since its pack was fitted (a new luminaire, or a
 *   new pack) has a commissioning test due now, overdue after the same window: a new pack is not
 *   proven until it has carried its rated duration once.
 */
import { chemistryServiceLifeYears } from './battery-models'
import { getChemistry, type ChemistryId } from './chemistries'
import { REGIME_LABELS } from '../labels'
import { REGIME_IDS, REGIME_PROFILES, shortTestMinimumS, type RegimeId, type RegimeProfile, type RoutineTestKind, type TestWindow } from './regimes'
import type { Reference } from './types'
import { addDays, addInterval, addMonthsClamped, daysBetween, parseIsoDate, type IsoDate, type TestInterval } from './calendar'

// The calendar arithmetic lives in ./calendar; these names stay importable from here.
export {
  addDays,
  addInterval,
  addMonthsClamped,
  daysBetween,
  daysInMonth,
  isIsoDate,
  isLeapYear,
  parseIsoDate,
  type IsoDate,
  type TestInterval,
} from './calendar'

export type TestRegime = RegimeId
export type TestKind = RoutineTestKind

/** The calendar's view of a regime profile (regimes.ts holds the full profile with its sources). */
export interface RegimeRules {
  id: TestRegime
  label: string
  functional: TestInterval
  duration: TestInterval
  /** Shortest functional test the regime asks for, seconds (0 = "long enough to check every lamp"). */
  functionalMinimumS: number
  /** Length of the long test: the luminaire's rated duration, or a fixed time in hours. */
  durationTest: 'rated' | { hours: number }
  references: Reference[]
}

function rulesOf(p: RegimeProfile): RegimeRules {
  const long = p.longTest.length
  return {
    id: p.id,
    label: REGIME_LABELS[p.id],
    functional: p.shortTest.interval,
    duration: p.longTest.interval,
    functionalMinimumS: shortTestMinimumS(p.id),
    durationTest: 'hours' in long ? { hours: long.hours } : 'rated',
    references: [p.shortTest.reference, p.longTest.reference, ...p.references],
  }
}

export const REGIMES: Readonly<Record<TestRegime, RegimeRules>> = Object.fromEntries(REGIME_IDS.map((id) => [id, rulesOf(REGIME_PROFILES[id])])) as Record<
  TestRegime,
  RegimeRules
>

const laterOf = (a: IsoDate, b: IsoDate) => (a >= b ? a : b)
const earlierOf = (a: IsoDate, b: IsoDate) => (a <= b ? a : b)

// ---------------------------------------------------------------- test calendar of one luminaire

export interface TestEvent {
  kind: TestKind
  testedOn: IsoDate
  passed: boolean
  /** What was wrong (a failed test must say). */
  faults?: string
  /** What was done or is to be done about it. */
  remedialAction?: string
}

export interface LuminaireDueInput {
  regime: TestRegime
  /** Start of the calendar when there is no test yet: pack fitted, or joined the register. */
  since: IsoDate
  /**
   * Day the pack now in the luminaire was fitted. A full-duration test before it proves nothing
   * about this pack, so with none passed since, a commissioning test is due. Defaults to `since`.
   */
  packFittedOn?: IsoDate
  /** Day the luminaire joined the register; a commissioning test is not overdue before this day plus the repair window. */
  registeredOn?: IsoDate
  tests: readonly TestEvent[]
}

/**
 * - scheduled: due later than the "soon" horizon
 * - due-soon: routine test due within the horizon (the due day itself included)
 * - due-now: a retest after a failure, or a commissioning test, still within the repair window
 * - overdue: past its due day (routine) or past the repair window (retest, commissioning)
 */
export type DueState = 'overdue' | 'due-now' | 'due-soon' | 'scheduled'
/** Why a test is due: the routine calendar, a retest after a failure, or a first test of a new luminaire or pack. */
export type DueReason = 'interval' | 'retest' | 'commissioning'

export interface DueItem {
  kind: TestKind
  lastTestedOn: IsoDate | null
  /** The day the test falls due (for a retest: the day of the failure). */
  nextDueOn: IsoDate
  /** Last day on which it is not yet overdue (the due day for a routine test; the end of the repair window otherwise). */
  overdueAfter: IsoDate
  /** Days until it is overdue: negative when overdue; 0 on the last day. */
  daysUntilDue: number
  state: DueState
  reason: DueReason
}

/** A failed test not yet put right by a later passing test that clears it. */
export interface OpenFailure {
  kind: TestKind
  testedOn: IsoDate
  faults: string
  remedialAction: string
  /** The retest is due at once and overdue after this day (the failure plus the repair window). */
  retestBy: IsoDate
  retestOverdue: boolean
}

export interface LuminaireDue {
  functional: DueItem
  duration: DueItem
  /** A failure is open: a failed test that no later passing test has cleared. */
  failed: boolean
  /** The open failure to show first (a failed full-duration test before a failed functional test), or null. */
  lastFailure: OpenFailure | null
  /** Every open failure, full-duration first. */
  openFailures: OpenFailure[]
  /** No full-duration test has passed since the pack now fitted (or the luminaire) was installed. */
  commissioning: boolean
  /** The worst of the above: failed, then overdue, then due now, then due soon. */
  state: 'failed' | 'overdue' | 'due-now' | 'due-soon' | 'ok'
}

/** Days ahead that count as "due soon" unless the caller says otherwise. */
export const DEFAULT_SOON_DAYS = 14
/** Days a workspace allows, unless it sets its own, between a failure (or a new pack) and its retest before the retest is overdue. Common practice. */
export const DEFAULT_REPAIR_WINDOW_DAYS = 14

export interface DueOptions {
  soonDays?: number
  repairWindowDays?: number
}

function routineItem(
  kind: TestKind,
  last: IsoDate | null,
  since: IsoDate,
  interval: TestInterval,
  window: TestWindow | null,
  today: IsoDate,
  soonDays: number,
): DueItem {
  const from = last ?? since
  const nextDueOn = addInterval(from, interval)
  // A stated tolerance (NFPA's 3 to 5 weeks) moves the overdue day; without one the test is overdue the day after it falls due.
  const overdueAfter = window ? laterOf(nextDueOn, addDays(from, window.latestDays)) : nextDueOn
  const daysUntilDue = daysBetween(today, overdueAfter)
  const state: DueState = daysUntilDue < 0 ? 'overdue' : daysBetween(today, nextDueOn) <= soonDays ? 'due-soon' : 'scheduled'
  return { kind, lastTestedOn: last, nextDueOn, overdueAfter, daysUntilDue, state, reason: 'interval' }
}

/**
 * The window of the next routine test after one done on `lastTestedOn`: the first day a test counts
 * as the next one, the day it falls due, and the last day before it is overdue.
 */
export function testWindow(regime: TestRegime, kind: TestKind, lastTestedOn: IsoDate): { opensOn: IsoDate; dueOn: IsoDate; overdueAfter: IsoDate } {
  const test = kind === 'functional' ? REGIME_PROFILES[regime].shortTest : REGIME_PROFILES[regime].longTest
  const dueOn = addInterval(lastTestedOn, test.interval)
  if (!test.window) return { opensOn: addDays(lastTestedOn, 1), dueOn, overdueAfter: dueOn }
  return { opensOn: addDays(lastTestedOn, test.window.earliestDays), dueOn, overdueAfter: laterOf(dueOn, addDays(lastTestedOn, test.window.latestDays)) }
}

function urgentItem(kind: TestKind, last: IsoDate | null, dueOn: IsoDate, overdueAfter: IsoDate, today: IsoDate, reason: DueReason): DueItem {
  const daysUntilDue = daysBetween(today, overdueAfter)
  return { kind, lastTestedOn: last, nextDueOn: dueOn, overdueAfter, daysUntilDue, state: daysUntilDue < 0 ? 'overdue' : 'due-now', reason }
}

/** Tests in the order they happened; tests on the same day keep the order they were given in. */
function chronological(tests: readonly TestEvent[]): TestEvent[] {
  return tests
    .map((t, i) => ({ t, i }))
    .sort((a, b) => (a.t.testedOn < b.t.testedOn ? -1 : a.t.testedOn > b.t.testedOn ? 1 : a.i - b.i))
    .map(({ t }) => t)
}

/**
 * Open failures per kind of test, from the history alone:
 * - a failed full-duration test stays open until a later full-duration test passes (a functional
 *   pass only shows the lamps light, not that the pack lasts its rated duration);
 * - a failed functional test stays open until a later functional or full-duration test passes.
 */
export function openFailuresOf(tests: readonly TestEvent[]): { duration: TestEvent | null; functional: TestEvent | null } {
  let duration: TestEvent | null = null
  let functional: TestEvent | null = null
  for (const t of chronological(tests)) {
    if (t.kind === 'duration') {
      if (t.passed) {
        duration = null
        functional = null
      } else duration = t
    } else if (t.passed) functional = null
    else functional = t
  }
  return { duration, functional }
}

export function luminaireDue(input: LuminaireDueInput, today: IsoDate, options: number | DueOptions = {}): LuminaireDue {
  parseIsoDate(today)
  const opts = typeof options === 'number' ? { soonDays: options } : options
  const soonDays = opts.soonDays ?? DEFAULT_SOON_DAYS
  const windowDays = opts.repairWindowDays ?? DEFAULT_REPAIR_WINDOW_DAYS
  const profile = REGIME_PROFILES[input.regime]
  if (!profile) throw new Error(`"${input.regime}" is not a testing regime`)
  const packFittedOn = input.packFittedOn ?? input.since
  // Tests dated after `today` (a clock set wrong on a phone) are not allowed to push the calendar on.
  const tests = chronological(input.tests.filter((t) => t.testedOn <= today))
  let lastAny: IsoDate | null = null
  let lastDuration: IsoDate | null = null
  let durationPassedSincePack = false
  for (const t of tests) {
    parseIsoDate(t.testedOn)
    lastAny = lastAny ? laterOf(lastAny, t.testedOn) : t.testedOn
    if (t.kind === 'duration') {
      lastDuration = lastDuration ? laterOf(lastDuration, t.testedOn) : t.testedOn
      if (t.passed && t.testedOn >= packFittedOn) durationPassedSincePack = true
    }
  }
  const open = openFailuresOf(tests)
  const toOpen = (t: TestEvent): OpenFailure => {
    const retestBy = addDays(t.testedOn, windowDays)
    return { kind: t.kind, testedOn: t.testedOn, faults: t.faults ?? '', remedialAction: t.remedialAction ?? '', retestBy, retestOverdue: today > retestBy }
  }
  const openFailures = [open.duration, open.functional].filter((t): t is TestEvent => t !== null).map(toOpen)

  const functional = open.functional
    ? urgentItem('functional', lastAny, open.functional.testedOn, addDays(open.functional.testedOn, windowDays), today, 'retest')
    : routineItem('functional', lastAny, input.since, profile.shortTest.interval, profile.shortTest.window, today, soonDays)
  const commissioning = !durationPassedSincePack
  let duration: DueItem
  if (open.duration) duration = urgentItem('duration', lastDuration, open.duration.testedOn, addDays(open.duration.testedOn, windowDays), today, 'retest')
  else if (commissioning) {
    // Due from the day the pack went in; a luminaire entered in the register later gets the window from that day.
    const from = input.registeredOn ? laterOf(packFittedOn, input.registeredOn) : packFittedOn
    duration = urgentItem('duration', lastDuration, packFittedOn, addDays(from, windowDays), today, 'commissioning')
  } else duration = routineItem('duration', lastDuration, input.since, profile.longTest.interval, profile.longTest.window, today, soonDays)

  const items = [functional, duration]
  const state = openFailures.length
    ? 'failed'
    : items.some((i) => i.state === 'overdue')
      ? 'overdue'
      : items.some((i) => i.state === 'due-now')
        ? 'due-now'
        : items.some((i) => i.state === 'due-soon')
          ? 'due-soon'
          : 'ok'
  return { functional, duration, failed: openFailures.length > 0, lastFailure: openFailures[0] ?? null, openFailures, commissioning, state }
}

export interface DueCounts {
  luminaires: number
  failed: number
  overdue: number
  dueNow: number
  dueSoon: number
  ok: number
  /** Failed luminaires whose retest is past the repair window (also counted in `failed`). */
  retestOverdue: number
}

export function countDue(items: readonly LuminaireDue[]): DueCounts {
  const counts: DueCounts = { luminaires: items.length, failed: 0, overdue: 0, dueNow: 0, dueSoon: 0, ok: 0, retestOverdue: 0 }
  for (const d of items) {
    if (d.state === 'failed') {
      counts.failed++
      if (d.openFailures.some((f) => f.retestOverdue)) counts.retestOverdue++
    } else if (d.state === 'overdue') counts.overdue++
    else if (d.state === 'due-now') counts.dueNow++
    else if (d.state === 'due-soon') counts.dueSoon++
    else counts.ok++
  }
  return counts
}

/** Routine test dates that fall due from `today` up to `today + days` (both included), earliest first; overdue tests, retests and commissioning tests are listed elsewhere. */
export function dueWithin<T extends { due: LuminaireDue }>(items: readonly T[], today: IsoDate, days: number): Array<{ item: T; test: DueItem }> {
  const until = addDays(today, days)
  const out: Array<{ item: T; test: DueItem }> = []
  for (const item of items) {
    for (const test of [item.due.functional, item.due.duration]) {
      if (test.reason === 'interval' && test.nextDueOn >= today && test.nextDueOn <= until) out.push({ item, test })
    }
  }
  return out.sort((a, b) => (a.test.nextDueOn < b.test.nextDueOn ? -1 : a.test.nextDueOn > b.test.nextDueOn ? 1 : 0))
}

/** What needs attention now: tests due now or overdue, worst first (overdue before due now, then oldest). */
export function needingAttention<T extends { due: LuminaireDue }>(items: readonly T[]): Array<{ item: T; test: DueItem }> {
  const out: Array<{ item: T; test: DueItem }> = []
  for (const item of items)
    for (const test of [item.due.duration, item.due.functional]) if (test.state === 'overdue' || test.state === 'due-now') out.push({ item, test })
  const rank = (t: DueItem) => (t.state === 'overdue' ? 0 : 1)
  return out.sort((a, b) => rank(a.test) - rank(b.test) || a.test.daysUntilDue - b.test.daysUntilDue)
}

// ---------------------------------------------------------------- battery replacement forecast

export interface MeasuredDuration {
  testedOn: IsoDate
  /** Hours the luminaire stayed lit on the full-duration test. */
  achievedH: number
}

export interface PackForecastInput {
  chemistry: ChemistryId
  fittedOn: IsoDate
  /** Ambient around the pack, °C: the site's typical ceiling temperature. */
  ambientC: number
  ratedDurationH: number
  durations: readonly MeasuredDuration[]
}

export interface DurationTrend {
  /** Points used (full-duration tests since this pack was fitted). */
  points: number
  /** Change of the achieved duration per year, hours/year (negative when fading). */
  slopeHPerYear: number
  /** Fitted achieved duration today, hours (never below 0). */
  fittedTodayH: number
  /** Day the fitted line crosses the rated duration, when it is falling and does so within 50 years. */
  belowRatedOn: IsoDate | null
}

export interface PackForecast {
  serviceLifeYears: number
  ageYears: number
  /** Share of the service life used, 0 … (above 1 = past its life). */
  lifeUsed: number
  endOfLifeOn: IsoDate
  trend: DurationTrend | null
  /** Full-duration tests of this pack with a measured time. */
  durationTests: number
  /** "used", or why the trend was left out (the life model alone then gives the date). */
  trendStatus: 'used' | 'not-enough-tests'
  /** Latest measured full-duration test of this pack, if any. */
  latestTestOn: IsoDate | null
  /** The earlier of the end of service life and the day the duration trend falls below rated, never before the latest test. */
  replaceBy: IsoDate
  reason: 'service-life' | 'duration-trend' | 'latest-test'
  state: 'replace-now' | 'replace-soon' | 'ok'
}

const DAYS_PER_YEAR = 365.25
/** Within this many days of the replacement date the pack is listed as "replace soon". */
export const REPLACE_SOON_DAYS = 180
const TREND_HORIZON_DAYS = Math.round(50 * DAYS_PER_YEAR)

/** Ordinary least squares y = a + b·x; null with fewer than two distinct x. */
export function linearFit(points: ReadonlyArray<readonly [number, number]>): { intercept: number; slope: number } | null {
  const n = points.length
  if (n < 2) return null
  const meanX = points.reduce((s, p) => s + p[0], 0) / n
  const meanY = points.reduce((s, p) => s + p[1], 0) / n
  let sxx = 0
  let sxy = 0
  for (const [x, y] of points) {
    sxx += (x - meanX) * (x - meanX)
    sxy += (x - meanX) * (y - meanY)
  }
  if (sxx === 0) return null
  const slope = sxy / sxx
  return { intercept: meanY - slope * meanX, slope }
}

/** A trend needs at least this many full-duration tests of the pack … (common practice: two points always make a line, three show whether it bends) */
export const TREND_MIN_TESTS = 3
/** … spread over at least this many months, so seasonal and test-to-test scatter does not pass for ageing (common practice). */
export const TREND_MIN_SPAN_MONTHS = 6

/** The measured durations of this pack (since it was fitted, up to today), oldest first. */
function packDurations(input: Pick<PackForecastInput, 'fittedOn' | 'durations'>, today: IsoDate): MeasuredDuration[] {
  return input.durations
    .filter((d) => d.testedOn >= input.fittedOn && d.testedOn <= today && Number.isFinite(d.achievedH))
    .sort((a, b) => (a.testedOn < b.testedOn ? -1 : a.testedOn > b.testedOn ? 1 : 0))
}

/** Enough tests for a trend: at least TREND_MIN_TESTS, the first and the last TREND_MIN_SPAN_MONTHS apart. */
export function trendHasEnoughTests(tests: readonly MeasuredDuration[]): boolean {
  if (tests.length < TREND_MIN_TESTS) return false
  const dates = tests.map((t) => t.testedOn).sort()
  return addMonthsClamped(dates[0], TREND_MIN_SPAN_MONTHS) <= dates[dates.length - 1]
}

export function durationTrend(input: Pick<PackForecastInput, 'fittedOn' | 'ratedDurationH' | 'durations'>, today: IsoDate): DurationTrend | null {
  // Only this pack's tests: a new pack starts a new trend.
  const tests = packDurations(input, today)
  if (!trendHasEnoughTests(tests)) return null
  const pts = tests.map((d) => [daysBetween(input.fittedOn, d.testedOn), d.achievedH] as const)
  const fit = linearFit(pts)
  if (!fit) return null
  const todayX = daysBetween(input.fittedOn, today)
  let belowRatedOn: IsoDate | null = null
  if (fit.slope < 0) {
    const crossX = (input.ratedDurationH - fit.intercept) / fit.slope
    if (crossX <= TREND_HORIZON_DAYS) belowRatedOn = addDays(input.fittedOn, Math.max(0, Math.floor(crossX + 1e-6))) // the tolerance absorbs rounding of an exact crossing
  }
  return {
    points: pts.length,
    slopeHPerYear: fit.slope * DAYS_PER_YEAR,
    fittedTodayH: Math.max(0, fit.intercept + fit.slope * todayX),
    belowRatedOn,
  }
}

/** When to replace a pack: the chemistry's service life at the site's temperature (engine life model) and the measured trend. */
export function forecastPack(input: PackForecastInput, today: IsoDate): PackForecast {
  const serviceLifeYears = chemistryServiceLifeYears(getChemistry(input.chemistry), input.ambientC)
  const ageDays = Math.max(0, daysBetween(input.fittedOn, today))
  const ageYears = ageDays / DAYS_PER_YEAR
  const endOfLifeOn = addDays(input.fittedOn, Math.floor(serviceLifeYears * DAYS_PER_YEAR))
  const tests = packDurations(input, today)
  const trend = durationTrend(input, today)
  const byTrend = trend?.belowRatedOn ?? null
  const modelled = byTrend ? earlierOf(byTrend, endOfLifeOn) : endOfLifeOn
  let reason: PackForecast['reason'] = byTrend && byTrend < endOfLifeOn ? 'duration-trend' : 'service-life'
  // A test the pack passed or failed is a fact on that day: a forecast never dates the replacement before it.
  const latestTestOn = tests.length ? tests[tests.length - 1].testedOn : null
  let replaceBy = modelled
  if (latestTestOn && latestTestOn > modelled) {
    replaceBy = latestTestOn
    reason = 'latest-test'
  }
  const left = daysBetween(today, replaceBy)
  return {
    serviceLifeYears,
    ageYears,
    lifeUsed: ageYears / serviceLifeYears,
    endOfLifeOn,
    trend,
    durationTests: tests.length,
    trendStatus: trend ? 'used' : 'not-enough-tests',
    latestTestOn,
    replaceBy,
    reason,
    state: left <= 0 ? 'replace-now' : left <= REPLACE_SOON_DAYS ? 'replace-soon' : 'ok',
  }
}
