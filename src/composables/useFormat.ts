/**
 * Dates and numbers for the signed-in reader (or a visitor): their browser's locale and time zone,
 * written by shared/format exactly as the PDFs the server makes for them.
 */
import { formatCount, formatDate, formatDateTime, formatHours, formatNumber, resolvePrefs, type FormatPrefs, type NumberOptions } from '@shared/format'

let prefs: FormatPrefs | null = null

/** The reader's preferences, read once from the browser. */
export function readerPrefs(): FormatPrefs {
  if (!prefs) {
    const nav = typeof navigator !== 'undefined' ? navigator.language : undefined
    const zone = Intl.DateTimeFormat().resolvedOptions().timeZone
    prefs = resolvePrefs({ locale: nav, timeZone: zone })
  }
  return prefs
}

export function useFormat() {
  const p = readerPrefs()
  return {
    prefs: p,
    date: (v: Date | string | number | null | undefined, empty?: string) => formatDate(v, p, empty),
    dateTime: (v: Date | string | number | null | undefined, empty?: string) => formatDateTime(v, p, empty),
    number: (v: unknown, opts: NumberOptions = {}) => formatNumber(v, opts, p),
    hours: (h: number) => formatHours(h, p),
    count: (n: number, singular: string, plural?: string) => formatCount(n, singular, plural, p),
  }
}
