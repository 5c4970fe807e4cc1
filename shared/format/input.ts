/**
 * What people type into a form, read the way they mean it before the engine sees it: a Unicode
 * minus ("−10 °C"), a degree sign or none ("-10C"), a decimal comma where their locale writes one
 * ("2,5 h" in de-DE), hours and minutes as h:mm ("2:52"), units glued on ("3h", "10ft"). A value
 * that still cannot be read is refused with what was expected; nothing is silently changed.
 */
import { DIMENSIONS, parseQuantity, type Dimension } from '../engine/quantity'
import { decimalMark } from './index'

export type ReadResult = { ok: true; value: number } | { ok: false; reason: string }

export interface ReadOptions {
  /** The reader's locale, for the decimal mark. */
  locale?: string
  /** Unit a bare number is taken in (the field's display unit, e.g. "h", "ft"); the dimension's base unit unless told. */
  bareUnit?: string
  /** Words for the message, e.g. 'a mounting height such as "3 m" or "10 ft"'. */
  expected?: string
}

const MINUS = /[\u2212\u2012\u2013\u2014\uFE63\uFF0D]/g

/** Text with the typographic minus, degree signs and the locale's decimal comma made plain. */
export function normaliseTyped(input: string, locale = 'en-GB'): { text: string } | { reason: string } {
  let text = input.normalize('NFKC').trim().replace(MINUS, '-').replace(/\s+/g, ' ')
  // Degree sign, or a bare C / F straight after a number ("-10C", "50 F"), means a temperature.
  text = text.replace(/\s*[°º˚]\s*([CF])\b/g, ' deg$1').replace(/^([+-]?[\d.,]+)\s*([CF])$/, '$1 deg$2')
  const comma = decimalMark(locale) === ','
  const numberWithComma = /(^|[^\d])(\d+),(\d+)(?![\d,])/
  if (numberWithComma.test(text)) {
    if (!comma) return { reason: `"${input.trim()}": write decimals with a point ("${text.replace(numberWithComma, '$1$2.$3')}") and no thousands separator` }
    text = text.replace(/(\d),(\d)/g, '$1.$2')
  } else if (comma && /\d\.\d{3}(?!\d)/.test(text) && !/\d\.\d{1,2}(?!\d)/.test(text)) {
    // In a decimal-comma locale "1.500" is ambiguous (one and a half, or fifteen hundred).
    return { reason: `"${input.trim()}" is ambiguous here: write the decimal mark as a comma` }
  }
  return { text }
}

const H_MM = /^(\d+):([0-5]\d)(?::([0-5]\d))?$/

/**
 * Reads a typed quantity into the dimension's base unit (s, m, °C…), or says what was expected.
 * A bare number is taken in `bareUnit` (so "3" in an hours field is three hours).
 */
export function readQuantity(input: unknown, dimension: Dimension, opts: ReadOptions = {}): ReadResult {
  const spec = DIMENSIONS[dimension]
  const expected = opts.expected ?? `${spec.noun} such as "${exampleFor(dimension, opts.bareUnit)}"`
  if (typeof input === 'number') return Number.isFinite(input) ? fromBare(input, dimension, opts.bareUnit) : { ok: false, reason: `expected ${expected}` }
  if (typeof input !== 'string' || input.trim() === '') return { ok: false, reason: `is required: ${expected}` }
  const norm = normaliseTyped(input, opts.locale)
  if ('reason' in norm) return { ok: false, reason: norm.reason }
  const text = norm.text
  if (dimension === 'time') {
    const hm = H_MM.exec(text)
    if (hm) return { ok: true, value: Number(hm[1]) * 3600 + Number(hm[2]) * 60 + Number(hm[3] ?? 0) }
  }
  if (/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(text)) return fromBare(Number(text), dimension, opts.bareUnit)
  // "3h", "10ft": a unit glued to its number reads the same as with a space.
  const glued = text.replace(/^([+-]?(?:\d+\.?\d*|\.\d+))([A-Za-zµ]+)$/, '$1 $2')
  const parsed = parseQuantity(glued, dimension)
  if (parsed.ok) return parsed
  return { ok: false, reason: `"${input.trim()}" cannot be read: expected ${expected}` }
}

function fromBare(n: number, dimension: Dimension, bareUnit?: string): ReadResult {
  if (!Number.isFinite(n)) return { ok: false, reason: 'must be a finite number' }
  if (!bareUnit || bareUnit === DIMENSIONS[dimension].base) return { ok: true, value: n }
  const parsed = parseQuantity(`${n} ${bareUnit}`, dimension)
  return parsed.ok ? parsed : { ok: false, reason: parsed.reason }
}

function exampleFor(dimension: Dimension, bareUnit?: string): string {
  if (dimension === 'time') return '3 h, 180 min or 2:30'
  if (dimension === 'temperature') return '-10 °C'
  if (dimension === 'length') return bareUnit === 'ft' ? '10 ft' : '3 m or 10 ft'
  return DIMENSIONS[dimension].example
}

/** Reads a plain number ("0,8" in de-DE, "−5", "1.5"), or says what was expected. */
export function readNumber(input: unknown, opts: { locale?: string; expected?: string } = {}): ReadResult {
  const expected = opts.expected ?? 'a number'
  if (typeof input === 'number') return Number.isFinite(input) ? { ok: true, value: input } : { ok: false, reason: `expected ${expected}` }
  if (typeof input !== 'string' || input.trim() === '') return { ok: false, reason: `is required: ${expected}` }
  const norm = normaliseTyped(input, opts.locale)
  if ('reason' in norm) return { ok: false, reason: norm.reason }
  if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(norm.text)) return { ok: false, reason: `"${input.trim()}" cannot be read: expected ${expected}` }
  return { ok: true, value: Number(norm.text) }
}
