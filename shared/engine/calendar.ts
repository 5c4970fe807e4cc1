/**
 * Calendar arithmetic on ISO days ("YYYY-MM-DD"), counted in UTC so that no time zone or
 * daylight-saving shift moves a date. Pure; used by the test calendar and the pack forecast.
 */

/** A calendar day, "YYYY-MM-DD". */
export type IsoDate = string

/** A test interval: calendar months, or days. */
export interface TestInterval {
  unit: 'month' | 'day'
  count: number
}

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
