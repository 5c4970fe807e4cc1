/** zod building blocks for engine inputs: quantities with units, ranges, fractions. */
import { z } from 'zod'
import { DIMENSIONS, parseQuantity, type Dimension } from './quantity'

export interface QuantityBounds {
  /** Smallest allowed value, in the base unit. */
  min?: number
  /** Largest allowed value, in the base unit. */
  max?: number
  /** Strictly greater than zero. */
  positive?: boolean
  /** Human-readable unit for the bound messages, with a factor from the base unit. */
  display?: { unit: string; factor: number }
}

/**
 * A quantity field: accepts a number (base unit) or a string with units and yields the
 * number in the base unit, or a field error naming the reason.
 */
export function quantity(dimension: Dimension, bounds: QuantityBounds = {}) {
  const show = (v: number) => {
    const d = bounds.display ?? { unit: DIMENSIONS[dimension].base, factor: 1 }
    return `${Number((v * d.factor).toPrecision(6))} ${d.unit === 'degC' ? '°C' : d.unit}`
  }
  // z.unknown rather than a number/string union, so NaN and Infinity get their own plain message.
  return z.unknown().transform((raw, ctx): number => {
    if (raw === undefined || raw === null) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: `is required: ${DIMENSIONS[dimension].noun}, e.g. "${DIMENSIONS[dimension].example}"` })
      return z.NEVER
    }
    const parsed = parseQuantity(raw, dimension)
    if (!parsed.ok) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: parsed.reason })
      return z.NEVER
    }
    const v = parsed.value
    // Beyond the kind's ceiling a value is a slip (1e300, a unit typed wrong), never a reading.
    const ceiling = DIMENSIONS[dimension].ceiling
    if (bounds.max === undefined && Math.abs(v) > ceiling) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: `is not a plausible value for ${DIMENSIONS[dimension].noun}: at most ${show(ceiling)} in size` })
      return z.NEVER
    }
    if (bounds.positive && !(v > 0)) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: 'must be greater than zero' })
      return z.NEVER
    }
    if (bounds.min !== undefined && v < bounds.min) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: `must be at least ${show(bounds.min)}` })
      return z.NEVER
    }
    if (bounds.max !== undefined && v > bounds.max) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: `must be at most ${show(bounds.max)}` })
      return z.NEVER
    }
    return v
  })
}

/** Largest magnitude a plain number field takes when it states no bounds of its own: beyond it the value is a slip. */
export const PLAIN_NUMBER_CEILING = 1e9

/** A plain finite number (counts, ratios), optionally bounded; unbounded sides stop at ±PLAIN_NUMBER_CEILING. */
export function finiteNumber(opts: { min?: number; max?: number; positive?: boolean; int?: boolean } = {}) {
  let s = z.number({ invalid_type_error: 'must be a number' }).finite('must be a finite number')
  if (opts.max === undefined) s = s.max(PLAIN_NUMBER_CEILING, `is not a plausible value: at most ${PLAIN_NUMBER_CEILING.toExponential()}`)
  if (opts.min === undefined && !opts.positive) s = s.min(-PLAIN_NUMBER_CEILING, `is not a plausible value: at least −${PLAIN_NUMBER_CEILING.toExponential()}`)
  if (opts.int) s = s.int('must be a whole number')
  if (opts.positive) s = s.positive('must be greater than zero')
  if (opts.min !== undefined) s = s.min(opts.min, `must be at least ${opts.min}`)
  if (opts.max !== undefined) s = s.max(opts.max, `must be at most ${opts.max}`)
  return z.preprocess((v) => (typeof v === 'string' && v.trim() !== '' && !Number.isNaN(Number(v)) ? Number(v) : v), s)
}

/** A fraction in (0, 1] (or [0, 1] with allowZero). */
export function fraction(opts: { allowZero?: boolean } = {}) {
  return finiteNumber({ min: 0, max: 1 }).refine((v) => opts.allowZero || v > 0, 'must be greater than zero')
}

/** Ambient temperature in °C, limited to the range the engine's models are valid for. */
export const ambientTemperature = () => quantity('temperature', { min: -40, max: 85 })
