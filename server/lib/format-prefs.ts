/**
 * The reader's way of writing dates and numbers for documents the server makes (PDFs, e-mails):
 * the locale their browser asks for, so a PDF reads like the screens that offered it.
 */
import type { Request } from 'express'
import { localeFromAcceptLanguage, paperForLocale, resolvePrefs, type FormatPrefs, type PaperSize } from '../../shared/format'

export function formatPrefsOf(req: Request): FormatPrefs {
  const prefs = resolvePrefs({ locale: localeFromAcceptLanguage(req.get('accept-language')), timeZone: 'UTC' })
  return { ...prefs, paper: paperOf(req, prefs.locale), units: unitsOf(req, prefs.locale) }
}

/**
 * The signed-in reader's units; someone signed out (a shared link) reads US customary only when
 * their browser asks for the United States, metric everywhere else (Canada included).
 */
function unitsOf(req: Request, locale: string): 'si' | 'us' {
  const user = req.user as { units?: string } | undefined
  if (user?.units === 'us' || user?.units === 'si') return user.units
  return /^[a-z]{2,3}(?:-[A-Za-z]{4})?-US\b/.test(locale) ? 'us' : 'si'
}

/**
 * The signed-in reader's paper: Letter for US customary units, A4 for metric; someone signed out
 * (a shared link) gets the usual paper of their browser's region.
 */
function paperOf(req: Request, locale: string): PaperSize {
  const user = req.user as { units?: string } | undefined
  if (user?.units === 'us') return 'letter'
  if (user?.units === 'si') return 'a4'
  return paperForLocale(locale)
}
