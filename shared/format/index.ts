/**
 * Dates and numbers written one way for each reader: their locale (or the one they chose) decides
 * the order of day and month, the decimal mark and the clock; the app decides everything else
 * (month as a word, so 02/12 can never be misread; three significant digits; a unit after every
 * quantity). Screens, PDFs, e-mails and shared pages all go through these functions.
 */
import { unitLabel } from '../labels'

export type PaperSize = 'a4' | 'letter'

export interface FormatPrefs {
  /** BCP 47 tag such as "en-GB", "de-DE", "en-US". */
  locale: string
  /** IANA zone for times of day; dates of the calendar (YYYY-MM-DD) never shift. */
  timeZone: string
  /** Paper a document is laid out on; A4 unless told. */
  paper?: PaperSize
  /**
   * The reader's units for documents the server makes (metric unless told): `formatForReader` and
   * `textForReader` in shared/engine/units convert by it. Screens convert through useUnits instead.
   */
  units?: 'si' | 'us'
}

/** Letter where it is the usual paper (the United States, Canada, Mexico and a few others), A4 elsewhere. */
export function paperForLocale(locale: string): PaperSize {
  const region = /^[a-z]{2,3}(?:-[A-Za-z]{4})?-([A-Z]{2})\b/.exec(locale)?.[1]
  return region && LETTER_REGIONS.has(region) ? 'letter' : 'a4'
}
const LETTER_REGIONS = new Set(['US', 'CA', 'MX', 'PH', 'CL', 'CO', 'VE', 'GT', 'PR'])

export const DEFAULT_PREFS: FormatPrefs = { locale: 'en-GB', timeZone: 'UTC' }

/** A locale the runtime can format in, else the default; an unknown zone falls back to UTC. */
export function resolvePrefs(p?: Partial<FormatPrefs> | null): FormatPrefs {
  let locale = DEFAULT_PREFS.locale
  try {
    if (p?.locale && Intl.DateTimeFormat.supportedLocalesOf([p.locale]).length) locale = Intl.getCanonicalLocales(p.locale)[0]
  } catch {
    // A malformed tag: keep the default.
  }
  let timeZone = DEFAULT_PREFS.timeZone
  try {
    if (p?.timeZone) {
      new Intl.DateTimeFormat('en', { timeZone: p.timeZone })
      timeZone = p.timeZone
    }
  } catch {
    // An unknown zone: keep UTC.
  }
  return { locale, timeZone }
}

/** The first supported tag of an Accept-Language header ("de-CH,de;q=0.9,en;q=0.8" → "de-CH"). */
export function localeFromAcceptLanguage(header: string | null | undefined): string | undefined {
  if (!header) return undefined
  const tags = header
    .split(',')
    .map((part) => {
      const [tag, ...params] = part.trim().split(';')
      const q = params.map((x) => x.trim()).find((x) => x.startsWith('q='))
      return { tag: tag.trim(), q: q ? Number(q.slice(2)) : 1 }
    })
    .filter((t) => t.tag && t.tag !== '*' && Number.isFinite(t.q) && t.q > 0)
    .sort((a, b) => b.q - a.q)
  for (const t of tags) {
    try {
      if (Intl.DateTimeFormat.supportedLocalesOf([t.tag]).length) return Intl.getCanonicalLocales(t.tag)[0]
    } catch {
      // skip malformed tags
    }
  }
  return undefined
}

const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/

const formatters = new Map<string, Intl.DateTimeFormat | Intl.NumberFormat>()
function cached<T extends Intl.DateTimeFormat | Intl.NumberFormat>(key: string, make: () => T): T {
  let f = formatters.get(key)
  if (!f) {
    f = make()
    formatters.set(key, f)
  }
  return f as T
}

function toDate(value: Date | string | number): { date: Date; calendarDay: boolean } | null {
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? null : { date: value, calendarDay: false }
  if (typeof value === 'string' && ISO_DAY.test(value)) {
    const d = new Date(`${value}T00:00:00Z`)
    return Number.isNaN(d.getTime()) ? null : { date: d, calendarDay: true }
  }
  const d = new Date(value)
  return Number.isNaN(d.getTime()) ? null : { date: d, calendarDay: false }
}

/** "2 Dec 2026" (en-GB), "Dec 2, 2026" (en-US), "2. Dez. 2026" (de-DE); "—" when there is none. */
export function formatDate(value: Date | string | number | null | undefined, prefs: FormatPrefs = DEFAULT_PREFS, empty = '—'): string {
  if (value === null || value === undefined || value === '') return empty
  const d = toDate(value)
  if (!d) return empty
  const zone = d.calendarDay ? 'UTC' : prefs.timeZone
  return cached(
    `d|${prefs.locale}|${zone}`,
    () => new Intl.DateTimeFormat(prefs.locale, { day: 'numeric', month: 'short', year: 'numeric', timeZone: zone }),
  ).format(d.date)
}

/** "2 Dec 2026, 13:08" in the reader's zone (12- or 24-hour clock as their locale writes it). */
export function formatDateTime(value: Date | string | number | null | undefined, prefs: FormatPrefs = DEFAULT_PREFS, empty = '—'): string {
  if (value === null || value === undefined || value === '') return empty
  const d = toDate(value)
  if (!d) return empty
  if (d.calendarDay) return formatDate(value, prefs, empty)
  return cached(
    `dt|${prefs.locale}|${prefs.timeZone}`,
    () =>
      new Intl.DateTimeFormat(prefs.locale, { day: 'numeric', month: 'short', year: 'numeric', hour: 'numeric', minute: '2-digit', timeZone: prefs.timeZone }),
  ).format(d.date)
}

export interface NumberOptions {
  /** Significant digits (3 unless told). */
  digits?: number
  /** Unit written after the number, in its usual symbol ("degC" → "°C"). */
  unit?: string
  /** Whole numbers: never rounded to fewer digits than they have (counts, years). */
  integer?: boolean
}

/** A figure for people: rounded as the screens round it, the reader's decimal mark, its unit; "—" for none. */
export function formatNumber(value: unknown, opts: NumberOptions = {}, prefs: FormatPrefs = DEFAULT_PREFS): string {
  if (value && typeof value === 'object' && 'min' in value && 'max' in value) {
    const r = value as { min: unknown; max: unknown }
    return `${formatNumber(r.min, { ...opts, unit: undefined }, prefs)}–${formatNumber(r.max, opts, prefs)}`
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) return '—'
  const digits = opts.digits ?? 3
  const f = opts.integer
    ? cached(`i|${prefs.locale}`, () => new Intl.NumberFormat(prefs.locale, { maximumFractionDigits: 0 }))
    : cached(
        `n|${prefs.locale}|${digits}`,
        () => new Intl.NumberFormat(prefs.locale, { maximumSignificantDigits: digits, useGrouping: 'min2' as unknown as boolean }),
      )
  // Round first so "-0.0001" is written "0", never "-0".
  const rounded = opts.integer ? Math.round(value) : Number(value.toPrecision(digits))
  const text = f.format(Object.is(rounded, -0) ? 0 : rounded).replace('-', '−')
  if (!opts.unit) return text
  const unit = unitLabel(opts.unit)
  return unit === '%' ? `${text} %` : `${text} ${unit}`
}

/** A fraction (0.77) as a percentage ("77 %"). */
export function formatPercent(fraction: number, prefs: FormatPrefs = DEFAULT_PREFS, digits = 3): string {
  return formatNumber(fraction * 100, { digits, unit: '%' }, prefs)
}

/**
 * A duration as h:mm ("3:00 h", "1:30 h", "0:45 h"), to the minute: the way a stopwatch or a
 * test record writes it, never a decimal hour such as 3.4699999999999998 h. Under a minute it is
 * written in seconds ("30 s"), so a short functional test does not read as "0:01 h".
 */
export function formatHours(hours: number, prefs: FormatPrefs = DEFAULT_PREFS): string {
  if (!Number.isFinite(hours)) return '—'
  return formatDuration(hours * 3600, prefs)
}

/** Seconds written as h:mm (see formatHours); "—" for none. */
export function formatDuration(seconds: number | null | undefined, prefs: FormatPrefs = DEFAULT_PREFS): string {
  if (typeof seconds !== 'number' || !Number.isFinite(seconds)) return '—'
  const sign = seconds < 0 ? '−' : ''
  const abs = Math.abs(seconds)
  if (Math.round(abs) < 60) return `${sign}${formatNumber(Math.round(abs), { integer: true }, prefs)} s`
  const totalMinutes = Math.round(abs / 60)
  const h = Math.floor(totalMinutes / 60)
  const m = totalMinutes % 60
  return `${sign}${formatNumber(h, { integer: true }, prefs)}:${String(m).padStart(2, '0')} h`
}

/** "1 year", "2 years", "0.5 years" — the noun agrees with the number as written. */
export function formatCount(value: number, singular: string, plural = `${singular}s`, prefs: FormatPrefs = DEFAULT_PREFS, digits = 2): string {
  const text = formatNumber(value, { digits }, prefs)
  const one = Number(value.toPrecision(digits)) === 1
  return `${text} ${one ? singular : plural}`
}

/** The decimal mark the locale writes ("." or ","). */
export function decimalMark(locale: string): string {
  const part = new Intl.NumberFormat(locale).formatToParts(1.5).find((p) => p.type === 'decimal')
  return part?.value ?? '.'
}

/**
 * A site's wall-clock time "YYYY-MM-DDTHH:MM" (no zone: a plan made in the building's own time)
 * as the reader writes date and time, without moving it to any time zone.
 */
export function formatWallClock(stamp: string | null | undefined, prefs: FormatPrefs = DEFAULT_PREFS, empty = '—'): string {
  if (!stamp || !/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/.test(stamp)) return empty
  return formatDateTime(new Date(`${stamp}:00Z`), { ...prefs, timeZone: 'UTC' }, empty)
}
