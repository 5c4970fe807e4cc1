/**
 * Dates, numbers and typed input, one way per reader. Expected strings are what the ECMAScript
 * Internationalization API (ECMA-402) writes for each locale with the CLDR data Node ships; the
 * conversions (ft → m, min → s) are checked against mathjs, the general-purpose reference library.
 */
import { describe, expect, it } from 'vitest'
import { convert } from '../../../shared/engine/quantity'
import {
  formatCount,
  formatDate,
  formatDateTime,
  formatDuration,
  formatHours,
  formatNumber,
  localeFromAcceptLanguage,
  resolvePrefs,
} from '../../../shared/format'
import { readNumber, readQuantity } from '../../../shared/format/input'
import { CHEMISTRY_LABELS, ENUMERATIONS, labelOf, tellTaleCodes, unitLabel } from '../../../shared/labels'
import { CHEMISTRIES, CHEMISTRY_IDS } from '../../../shared/engine/chemistries'

const GB = { locale: 'en-GB', timeZone: 'Europe/London' }
const US = { locale: 'en-US', timeZone: 'America/New_York' }
const DE = { locale: 'de-DE', timeZone: 'Europe/Berlin' }

describe('dates', () => {
  it('writes a calendar day with the month as a word, in the reader’s order, never shifted by the zone', () => {
    expect(formatDate('2026-12-02', GB)).toBe('2 Dec 2026')
    expect(formatDate('2026-12-02', US)).toBe('Dec 2, 2026')
    expect(formatDate('2026-12-02', { locale: 'en-US', timeZone: 'Pacific/Honolulu' })).toBe('Dec 2, 2026')
    expect(formatDate(null, GB)).toBe('—')
    expect(formatDate('not a date', GB)).toBe('—')
  })
  it('writes a moment in the reader’s zone without seconds', () => {
    const t = new Date('2026-12-02T13:08:00Z')
    expect(formatDateTime(t, GB)).toBe('2 Dec 2026, 13:08')
    expect(formatDateTime(t, US)).toMatch(/^Dec 2, 2026, 8:08\sAM$/)
  })
  it('falls back to a known locale and zone when given nonsense', () => {
    expect(resolvePrefs({ locale: 'xx-!!', timeZone: 'Mars/Olympus' })).toEqual({ locale: 'en-GB', timeZone: 'UTC' })
    expect(localeFromAcceptLanguage('de-CH,de;q=0.9,en;q=0.8')).toBe('de-CH')
    expect(localeFromAcceptLanguage('*;q=1, en-US;q=0.5')).toBe('en-US')
    expect(localeFromAcceptLanguage('')).toBeUndefined()
  })
})

describe('numbers', () => {
  it('rounds to three significant digits with the reader’s decimal mark and a unit symbol', () => {
    expect(formatNumber(0.76543, { unit: 'Ah' }, GB)).toBe('0.765 Ah')
    expect(formatNumber(0.76543, { unit: 'Ah' }, DE)).toBe('0,765 Ah')
    expect(formatNumber(-10, { unit: 'degC' }, GB)).toBe('−10 °C')
    expect(formatNumber(12345.6, {}, GB)).toBe('12,300')
    expect(formatNumber(1234, {}, GB)).toBe('1230')
    expect(formatNumber(Number.NaN, { unit: 'h' }, GB)).toBe('—')
    expect(formatNumber({ min: 0.1, max: 0.25 }, { unit: 'kg' }, GB)).toBe('0.1–0.25 kg')
    expect(formatNumber(-0.00001, { digits: 2 }, GB)).toBe('−0.00001')
    expect(formatNumber(-0.4, { integer: true }, GB)).toBe('0')
  })
  it('makes the noun agree with the number as written', () => {
    expect(formatCount(1, 'year')).toBe('1 year')
    expect(formatCount(1.004, 'year')).toBe('1 year')
    expect(formatCount(2.5, 'year')).toBe('2.5 years')
  })
  it('writes durations as h:mm, to the minute, with no decimal hours', () => {
    expect(formatHours(3)).toBe('3:00 h')
    expect(formatHours(1.5)).toBe('1:30 h')
    expect(formatHours(0.75)).toBe('0:45 h')
    // A decimal hour with binary residue (3.47 h) is 3 h 28 min 12 s: written to the minute.
    expect(formatHours(3.4699999999999998)).toBe('3:28 h')
    expect(formatHours(2.9999999)).toBe('3:00 h')
    expect(formatHours(Number.NaN)).toBe('—')
    expect(formatDuration(30)).toBe('30 s')
    expect(formatDuration(90 * 60)).toBe('1:30 h')
    expect(formatDuration(59.6)).toBe('0:01 h')
    expect(formatDuration(-600)).toBe('−0:10 h')
    expect(formatDuration(null)).toBe('—')
    expect(formatDuration(1000 * 3600, US)).toBe('1,000:00 h')
  })
})

describe('typed input', () => {
  const ft = convert(10, 'ft', 'm')
  it.each([
    ['10 ft', 'length', undefined, ft],
    ['10ft', 'length', undefined, ft],
    ['3', 'length', 'm', 3],
    ['3h', 'time', 'h', 3 * 3600],
    ['180 min', 'time', 'h', convert(180, 'min', 's')],
    ['2:52', 'time', 'h', 2 * 3600 + 52 * 60],
    ['1:30:15', 'time', 'h', 5415],
    ['3', 'time', 'h', 10800],
    ['-10C', 'temperature', undefined, -10],
    ['−10 °C', 'temperature', undefined, -10],
    ['-10 °C', 'temperature', undefined, -10],
    ['14 °F', 'temperature', undefined, convert(14, 'degF', 'degC')],
    ['25', 'temperature', undefined, 25],
  ] as const)('reads %s as %s', (text, dimension, bareUnit, expected) => {
    const r = readQuantity(text, dimension, { bareUnit, locale: 'en-GB' })
    expect(r.ok).toBe(true)
    if (r.ok) expect(r.value).toBeCloseTo(expected, 9)
  })
  it('reads a decimal comma only where the locale writes one, and says what it expected otherwise', () => {
    expect(readQuantity('2,5 h', 'time', { locale: 'de-DE' })).toEqual({ ok: true, value: 9000 })
    const gb = readQuantity('2,5 h', 'time', { locale: 'en-GB' })
    expect(gb.ok).toBe(false)
    if (!gb.ok) expect(gb.reason).toContain('2.5 h')
    expect(readNumber('0,8', { locale: 'fr-FR' })).toEqual({ ok: true, value: 0.8 })
    expect(readNumber('−5', { locale: 'en-GB' })).toEqual({ ok: true, value: -5 })
  })
  it('refuses what it cannot read, saying what was expected', () => {
    const r = readQuantity('ten feet', 'length', { expected: 'a mounting height such as "3 m" or "10 ft"' })
    expect(r).toEqual({ ok: false, reason: '"ten feet" cannot be read: expected a mounting height such as "3 m" or "10 ft"' })
    const t = readQuantity('3 kg', 'time', { bareUnit: 'h' })
    expect(t.ok).toBe(false)
    if (!t.ok) expect(t.reason).toMatch(/expected a time such as "3 h, 180 min or 2:30"/)
    expect(readQuantity('', 'time').ok).toBe(false)
    expect(readNumber('abc').ok).toBe(false)
  })
})

describe('labels', () => {
  it('names every chemistry the engine knows, with the engine’s own name', () => {
    for (const id of CHEMISTRY_IDS) expect(CHEMISTRY_LABELS[id]).toBe(CHEMISTRIES[id].name)
  })
  it('never shows a raw code, even one not in the map', () => {
    expect(labelOf(ENUMERATIONS.packState, 'replace-now')).toBe('Replace now')
    expect(labelOf(ENUMERATIONS.packState, 'replace-later')).toBe('Replace later')
    expect(labelOf(ENUMERATIONS.packState, null)).toBe('—')
    expect(unitLabel('degC')).toBe('°C')
  })
  it('lists the codes a reader would never write', () => {
    const codes = tellTaleCodes()
    expect(codes).toEqual(expect.arrayContaining(['nicd-ht', 'replace-now', 'degC', 'en1838-route', 'due-soon']))
    expect(codes).not.toContain('draft')
  })
})
