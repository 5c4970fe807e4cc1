/** Money for people: the amount in its currency, written the reader's way ("€18.50", "US$64.00"). */
import { DEFAULT_PREFS, type FormatPrefs } from './index'

export function formatMoney(value: { currency: string; amount: number } | null | undefined, prefs: FormatPrefs = DEFAULT_PREFS, empty = '—'): string {
  if (!value || !Number.isFinite(value.amount)) return empty
  try {
    return new Intl.NumberFormat(prefs.locale, { style: 'currency', currency: value.currency }).format(value.amount)
  } catch {
    // A code Intl does not know is written after the figure rather than dropped.
    return `${new Intl.NumberFormat(prefs.locale, { minimumFractionDigits: 2, maximumFractionDigits: 2 }).format(value.amount)} ${value.currency}`
  }
}
