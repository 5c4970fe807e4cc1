/**
 * The reader's way of writing dates and numbers for documents the server makes (PDFs, e-mails):
 * the locale their browser asks for, so a PDF reads like the screens that offered it.
 */
import type { Request } from 'express'
import { localeFromAcceptLanguage, resolvePrefs, type FormatPrefs } from '../../shared/format'

export function formatPrefsOf(req: Request): FormatPrefs {
  return resolvePrefs({ locale: localeFromAcceptLanguage(req.get('accept-language')), timeZone: 'UTC' })
}
