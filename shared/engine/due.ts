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
 * - "Monthly" and "annual" are calendar intervals: the same day of the next month (or of the same
 *   month next year), clamped to the last day of a shorter month (31 Jan → 28/29 Feb). NFPA 101
 *   states its functional test as a 30-day interval, so that one is counted in days. Its annual
 *   test is "annual", counted like the European one as 12 calendar months: a 365-day rule would
 *   creep a day earlier after every 29 February for no safety gain.
 * - A luminaire never tested is due one interval after its pack was fitted (or after it joined the
 *   register): no record of a test means the test is not proven.
 */
import { chemistryServiceLifeYears } from './battery-models'
import { getChemistry, type ChemistryId } from './chemistries'
import type { Reference } from './types'

export type TestRegime = 'en50172' | 'nfpa101'
export type TestKind = 'functional' | 'duration'
/** A calendar day, "YYYY-MM-DD". */
export type IsoDate = string

export interface TestInterval {
  unit: 'month' | 'day'
  count: number
}

export interface RegimeRules {
  id: TestRegime
  label: string
  functional: TestInterval
  duration: TestInterval
  /** Shortest functional test the regime asks for, seconds (0 = "long enough to check every lamp"). */
  functionalMinimumS: number
  /** Length of the annual test: the luminaire's rated duration, or a fixed time in hours. */
  durationTest: 'rated' | { hours: number }
  references: Reference[]
}

export const REGIMES: Readonly<Record<TestRegime, RegimeRules>> = {
  en50172: {
    id: 'en50172',
    label: 'EN 50172 / BS 5266-1 (monthly functional, annual full rated duration)',
    functional: { unit: 'month', count: 1 },
    duration: { unit: 'month', count: 12 },
    functionalMinimumS: 0,
    durationTest: 'rated',
    references: [
      {
        source: 'EN 50172:2004 (BS 5266-8), clause 7.2: routine tests',
        basis: 'from memory',
        note: 'Monthly: simulate a supply failure long enough to see each lamp lit, then check the charge indicator. Annual: full rated duration. Results go in the log book. Clause numbering from memory.',
      },
      { source: 'BS 5266-1:2016, routine testing and log book', basis: 'from memory', note: 'Same monthly / annual pattern.' },
    ],
  },
  nfpa101: {
    id: 'nfpa101',
    label: 'NFPA 101 7.9.3 (30-second test every 30 days, 90-minute test every year)',
    functional: { unit: 'day', count: 30 },
    duration: { unit: 'month', count: 12 },
    functionalMinimumS: 30,
    durationTest: { hours: 1.5 },
    references: [
      {
        source: 'NFPA 101 (Life Safety Code), 7.9.3: periodic testing of emergency lighting equipment',
        basis: 'published',
        note: 'Functional test at 30-day intervals for at least 30 s; annual test for the full 1½ h; written records kept for the authority having jurisdiction. Later editions word the first as "monthly, 3 to 5 weeks apart" (from memory); 30 days satisfies both.',
      },
    ],
  },
}

// ---------------------------------------------------------------- calendar arithmetic (UTC days)

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/
const DAY_MS = 86_400_000

/** Splits an ISO day into numbers; throws on anything that is not a real calendar day. */
export function parseIsoDate(date: IsoDate): { year: number; month: number; day: number } {
  const m = ISO_DATE.exec(date)
  if (!m) throw new Error(`"${date}" is not a date in the form YYYY-MM-DD`)
  const year = Number(m[1])
  const month = Number(m[2])
  const day = Number(m[3])
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month)) throw new Error(`"${date}" is not a calendar day`)
  return { year, month, day }
}

export function isIsoDate(value: string): boolean {
  try {
    parseIsoDate(value)
    return true
  } catch {
    return false
  }
}

export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0
}

/** Days in a month (month 1–12) of the proleptic Gregorian calendar. */
export function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate()
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0')
const formatDay = (ms: number): IsoDate => {
  const d = new Date(ms)
  return `${pad(d.getUTCFullYear(), 4)}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}`
}
const dayMs = (date: IsoDate) => {
  const { year, month, day } = parseIsoDate(date)
  return Date.UTC(year, month - 1, day)
}

export function addDays(date: IsoDate, days: number): IsoDate {
  return formatDay(dayMs(date) + Math.round(days) * DAY_MS)
}

/** The same day `months` later, clamped to the end of a shorter month (31 Jan + 1 → 28 or 29 Feb). */
export function addMonthsClamped(date: IsoDate, months: number): IsoDate {
  const { year, month, day } = parseIsoDate(date)
  const index = year * 12 + (month - 1) + Math.round(months)
  const y = Math.floor(index / 12)
  const mo = (index % 12) + 1
  return `${pad(y, 4)}-${pad(mo)}-${pad(Math.min(day, daysInMonth(y, mo)))}`
}

export function addInterval(date: IsoDate, interval: TestInterval): IsoDate {
  return interval.unit === 'day' ? addDays(date, interval.count) : addMonthsClamped(date, interval.count)
}

/** Whole days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: IsoDate, to: IsoDate): number {
  return Math.round((dayMs(to) - dayMs(from)) / DAY_MS)
}

const laterOf = (a: IsoDate, b: IsoDate) => (a >= b ? a : b)
const earlierOf = (a: IsoDate, b: IsoDate) => (a <= b ? a : b)

// ---------------------------------------------------------------- test calendar of one luminaire

export interface TestEvent {
  kind: TestKind
  testedOn: IsoDate
  passed: boolean
}

export interface LuminaireDueInput {
  regime: TestRegime
  /** Start of the calendar when there is no test yet: pack fitted, or joined the register. */
  since: IsoDate
  tests: readonly TestEvent[]
}

export type DueState = 'overdue' | 'due-soon' | 'scheduled'

export interface DueItem {
  kind: TestKind
  lastTestedOn: IsoDate | null
  nextDueOn: IsoDate
  /** Negative when overdue; 0 on the due day itself. */
  daysUntilDue: number
  state: DueState
}

export interface LuminaireDue {
  functional: DueItem
  duration: DueItem
  /** The most recent test failed and no later test has passed. */
  failed: boolean
  lastFailure: TestEvent | null
  /** The worst of the above: failed, then overdue, then due soon. */
  state: 'failed' | 'overdue' | 'due-soon' | 'ok'
}

/** Days ahead that count as "due soon" unless the caller says otherwise. */
export const DEFAULT_SOON_DAYS = 14

function dueItem(kind: TestKind, last: IsoDate | null, since: IsoDate, interval: TestInterval, today: IsoDate, soonDays: number): DueItem {
  const nextDueOn = addInterval(last ?? since, interval)
  const daysUntilDue = daysBetween(today, nextDueOn)
  const state: DueState = daysUntilDue < 0 ? 'overdue' : daysUntilDue <= soonDays ? 'due-soon' : 'scheduled'
  return { kind, lastTestedOn: last, nextDueOn, daysUntilDue, state }
}

/** Tests in the order they happened; tests on the same day keep the order they were given in. */
function chronological(tests: readonly TestEvent[]): TestEvent[] {
  return tests.map((t, i) => ({ t, i })).sort((a, b) => (a.t.testedOn < b.t.testedOn ? -1 : a.t.testedOn > b.t.testedOn ? 1 : a.i - b.i)).map(({ t }) => t)
}

export function luminaireDue(input: LuminaireDueInput, today: IsoDate, soonDays = DEFAULT_SOON_DAYS): LuminaireDue {
  parseIsoDate(today)
  const rules = REGIMES[input.regime]
  // Tests dated after `today` (a clock set wrong on a phone) are not allowed to push the calendar on.
  const tests = chronological(input.tests.filter((t) => t.testedOn <= today))
  let lastAny: IsoDate | null = null
  let lastDuration: IsoDate | null = null
  for (const t of tests) {
    parseIsoDate(t.testedOn)
    lastAny = lastAny ? laterOf(lastAny, t.testedOn) : t.testedOn
    if (t.kind === 'duration') lastDuration = lastDuration ? laterOf(lastDuration, t.testedOn) : t.testedOn
  }
  const latest = tests.length ? tests[tests.length - 1] : null
  const failed = latest !== null && !latest.passed
  const lastFailure = [...tests].reverse().find((t) => !t.passed) ?? null
  const functional = dueItem('functional', lastAny, input.since, rules.functional, today, soonDays)
  const duration = dueItem('duration', lastDuration, input.since, rules.duration, today, soonDays)
  const state = failed
    ? 'failed'
    : functional.state === 'overdue' || duration.state === 'overdue'
      ? 'overdue'
      : functional.state === 'due-soon' || duration.state === 'due-soon'
        ? 'due-soon'
        : 'ok'
  return { functional, duration, failed, lastFailure, state }
}

export interface DueCounts {
  luminaires: number
  failed: number
  overdue: number
  dueSoon: number
  ok: number
}

export function countDue(items: readonly LuminaireDue[]): DueCounts {
  const counts: DueCounts = { luminaires: items.length, failed: 0, overdue: 0, dueSoon: 0, ok: 0 }
  for (const d of items) {
    if (d.state === 'failed') counts.failed++
    else if (d.state === 'overdue') counts.overdue++
    else if (d.state === 'due-soon') counts.dueSoon++
    else counts.ok++
  }
  return counts
}

/** Test dates that fall due from `today` up to `today + days` (both included), earliest first; overdue ones are left out. */
export function dueWithin<T extends { due: LuminaireDue }>(items: readonly T[], today: IsoDate, days: number): Array<{ item: T; test: DueItem }> {
  const until = addDays(today, days)
  const out: Array<{ item: T; test: DueItem }> = []
  for (const item of items) {
    for (const test of [item.due.functional, item.due.duration]) {
      if (test.nextDueOn >= today && test.nextDueOn <= until) out.push({ item, test })
    }
  }
  return out.sort((a, b) => (a.test.nextDueOn < b.test.nextDueOn ? -1 : a.test.nextDueOn > b.test.nextDueOn ? 1 : 0))
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
  /** The earlier of the end of service life and the day the duration trend falls below rated. */
  replaceBy: IsoDate
  reason: 'service-life' | 'duration-trend'
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

export function durationTrend(input: Pick<PackForecastInput, 'fittedOn' | 'ratedDurationH' | 'durations'>, today: IsoDate): DurationTrend | null {
  // Only this pack's tests: a new pack starts a new trend.
  const pts = input.durations
    .filter((d) => d.testedOn >= input.fittedOn && d.testedOn <= today && Number.isFinite(d.achievedH))
    .map((d) => [daysBetween(input.fittedOn, d.testedOn), d.achievedH] as const)
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
  const trend = durationTrend(input, today)
  const byTrend = trend?.belowRatedOn ?? null
  const replaceBy = byTrend ? earlierOf(byTrend, endOfLifeOn) : endOfLifeOn
  const reason = byTrend && byTrend < endOfLifeOn ? 'duration-trend' : 'service-life'
  const left = daysBetween(today, replaceBy)
  return {
    serviceLifeYears,
    ageYears,
    lifeUsed: ageYears / serviceLifeYears,
    endOfLifeOn,
    trend,
    replaceBy,
    reason,
    state: left <= 0 ? 'replace-now' : left <= REPLACE_SOON_DAYS ? 'replace-soon' : 'ok',
  }
}
