/**
 * Quantities at the engine's edge: a string is parsed by mathjs (`"120 mA"`, `"1.6 Ah"`, `"90 min"`,
 * `"25 degC"`); a bare number is taken in the field's base unit (SI: A, V, W, Ω, Hz, m, lx, cd;
 * temperature in °C), except for times, charges and energies, where the trade writes several units
 * of very different size (s, min, h; C, mAh, Ah; J, Wh) and a bare number is refused. Inside the
 * engine every value is a plain number in the base unit, so the hot paths never touch mathjs.
 */
import { create, createUnitDependencies, unitDependencies, type Unit } from 'mathjs'

const math = create({ unitDependencies, createUnitDependencies })

// Units the trade uses that mathjs does not ship. Created once, at module load.
// lx is lm/m² = cd·sr/m²; mathjs treats the steradian as dimensionless, so cd/m² has the same base.
if (!math.Unit.isValuelessUnit('lx')) math.createUnit('lx', { definition: '1 cd / m^2' })
if (!math.Unit.isValuelessUnit('fc')) math.createUnit('fc', { definition: '10.763910416709722 lx' })

export type Dimension =
  | 'current'
  | 'charge'
  | 'time'
  | 'temperature'
  | 'voltage'
  | 'power'
  | 'apparentPower'
  | 'energy'
  | 'resistance'
  | 'frequency'
  | 'length'
  | 'illuminance'
  | 'luminousIntensity'

interface DimensionSpec {
  /** Unit a bare number is read in, and the unit the engine works in. */
  base: string
  /** A reference quantity with the right dimension, for the dimension check. */
  probe: string
  /** Words for error messages. */
  noun: string
  example: string
  /** 'base': a bare number is read in the base unit; 'refuse': a unit is required (the units in use differ by ×60 to ×3600). */
  bareNumber: 'base' | 'refuse'
  /** The units a bare number could mean, for the refusal message. */
  bareMeanings?: string
  /** Largest magnitude, in the base unit, that any field of this kind accepts: beyond it the value is a slip, not a reading. */
  ceiling: number
}

export const DIMENSIONS: Record<Dimension, DimensionSpec> = {
  current: { base: 'A', probe: '1 A', noun: 'a current', example: '120 mA', bareNumber: 'base', ceiling: 1e4 },
  charge: {
    base: 'C',
    probe: '1 C',
    noun: 'a charge (capacity)',
    example: '1.6 Ah',
    bareNumber: 'refuse',
    bareMeanings: 'coulombs, mAh or Ah',
    ceiling: 1e5 * 3600,
  },
  time: { base: 's', probe: '1 s', noun: 'a time', example: '3 h', bareNumber: 'refuse', bareMeanings: 'seconds, minutes or hours', ceiling: 366 * 24 * 3600 },
  temperature: { base: 'degC', probe: '1 K', noun: 'a temperature', example: '25 degC', bareNumber: 'base', ceiling: 1e3 },
  voltage: { base: 'V', probe: '1 V', noun: 'a voltage', example: '3.6 V', bareNumber: 'base', ceiling: 1e5 },
  power: { base: 'W', probe: '1 W', noun: 'a power', example: '4 W', bareNumber: 'base', ceiling: 1e7 },
  apparentPower: { base: 'VA', probe: '1 VA', noun: 'an apparent power', example: '6 VA', bareNumber: 'base', ceiling: 1e7 },
  energy: { base: 'J', probe: '1 J', noun: 'an energy', example: '5 Wh', bareNumber: 'refuse', bareMeanings: 'joules or watt-hours', ceiling: 1e12 },
  resistance: { base: 'ohm', probe: '1 ohm', noun: 'a resistance', example: '47 ohm', bareNumber: 'base', ceiling: 1e12 },
  frequency: { base: 'Hz', probe: '1 Hz', noun: 'a frequency', example: '50 Hz', bareNumber: 'base', ceiling: 1e9 },
  length: { base: 'm', probe: '1 m', noun: 'a length', example: '2.5 m', bareNumber: 'base', ceiling: 1e6 },
  illuminance: { base: 'lx', probe: '1 lx', noun: 'an illuminance', example: '1 lx', bareNumber: 'base', ceiling: 1e6 },
  luminousIntensity: { base: 'cd', probe: '1 cd', noun: 'a luminous intensity', example: '100 cd', bareNumber: 'base', ceiling: 1e8 },
}

export type ParseResult = { ok: true; value: number } | { ok: false; reason: string }

/**
 * A converted value without the noise of binary floating point: 104 °F is 40 °C, not
 * 40.00000000000016 °C, so a limit at 40 °C is judged on the value and no text shows the tail.
 * Twelve significant digits are far beyond any reading; a result that is only noise next to the
 * terms it came from (32 °F → 0 °C) is zero.
 */
export function withoutConversionNoise(value: number, ...terms: number[]): number {
  if (!Number.isFinite(value)) return value
  const magnitude = Math.max(Math.abs(value), ...terms.map(Math.abs))
  if (Math.abs(value) <= magnitude * 1e-12) return 0
  return Number(value.toPrecision(12))
}

/**
 * The unit symbols people type most, per dimension, with their linear conversion to the base unit
 * (value · scale + offset) taken from mathjs itself when this module loads. "120 mA" then costs a
 * regular expression and a lookup instead of a full mathjs parse; anything else still goes to mathjs.
 */
const COMMON_SYMBOLS: Record<Dimension, string[]> = {
  current: ['A', 'mA', 'uA', 'kA'],
  charge: ['Ah', 'mAh', 'C'],
  time: ['s', 'ms', 'min', 'h', 'day', 'days'],
  temperature: ['degC', 'degF', 'K'],
  voltage: ['V', 'mV', 'kV'],
  power: ['W', 'mW', 'kW'],
  apparentPower: ['VA', 'mVA', 'kVA'],
  energy: ['J', 'kJ', 'Wh', 'mWh', 'kWh'],
  resistance: ['ohm', 'kohm', 'Mohm', 'mohm'],
  frequency: ['Hz', 'kHz'],
  length: ['m', 'mm', 'cm', 'km', 'ft', 'in'],
  illuminance: ['lx', 'fc'],
  luminousIntensity: ['cd'],
}

function linearConversion(symbol: string, base: string): { scale: number; offset: number } | null {
  try {
    const zero = (math.unit(0, symbol) as Unit).toNumber(base)
    const one = (math.unit(1, symbol) as Unit).toNumber(base)
    return { scale: one - zero, offset: zero }
  } catch {
    return null
  }
}

const FAST_UNITS = new Map<string, { scale: number; offset: number }>()
for (const [dimension, symbols] of Object.entries(COMMON_SYMBOLS) as Array<[Dimension, string[]]>) {
  for (const symbol of symbols) {
    const conversion = linearConversion(symbol, DIMENSIONS[dimension].base)
    if (conversion) FAST_UNITS.set(`${dimension}|${symbol}`, conversion)
  }
}
const SIMPLE_QUANTITY = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)\s*([A-Za-z]+)$/

/** A bare number where the unit decides the meaning: refused, naming what it could mean. */
function bareRefused(spec: DimensionSpec, shown: string): ParseResult {
  return { ok: false, reason: `needs a unit: ${shown} on its own could be ${spec.bareMeanings}; write it like "${spec.example}"` }
}

/** Parse a number or a string with units into the dimension's base unit. */
export function parseQuantity(input: unknown, dimension: Dimension): ParseResult {
  const spec = DIMENSIONS[dimension]
  if (typeof input === 'number') {
    if (!Number.isFinite(input)) return { ok: false, reason: 'must be a finite number' }
    if (spec.bareNumber === 'refuse') return bareRefused(spec, String(input))
    return { ok: true, value: input }
  }
  if (typeof input !== 'string') {
    return {
      ok: false,
      reason:
        spec.bareNumber === 'refuse'
          ? `must be ${spec.noun} with its unit, e.g. "${spec.example}"`
          : `must be a number in ${spec.base} or a string with units, e.g. "${spec.example}"`,
    }
  }
  const text = input
    .trim()
    .replace(/°\s*C\b/g, 'degC')
    .replace(/°\s*F\b/g, 'degF')
    .replace(/Ω/g, 'ohm')
  if (text === '') return { ok: false, reason: 'is required' }
  // A bare numeric string is read like a bare number.
  if (/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(text)) {
    const n = Number(text)
    if (spec.bareNumber === 'refuse' && Number.isFinite(n)) return bareRefused(spec, text)
    return Number.isFinite(n) ? { ok: true, value: n } : { ok: false, reason: 'must be a finite number' }
  }
  if (/^[+-]?(nan|infinity|inf)$/i.test(text)) return { ok: false, reason: 'must be a finite number' }
  const simple = SIMPLE_QUANTITY.exec(text)
  const fast = simple ? FAST_UNITS.get(`${dimension}|${simple[2]}`) : undefined
  if (simple && fast) {
    const scaled = Number(simple[1]) * fast.scale
    const value = withoutConversionNoise(scaled + fast.offset, scaled, fast.offset)
    return Number.isFinite(value) ? { ok: true, value } : { ok: false, reason: 'must be a finite number' }
  }
  let unit: Unit
  try {
    unit = math.unit(text) as Unit
  } catch {
    return { ok: false, reason: `"${input}" is not a quantity we can read; write it like "${spec.example}"` }
  }
  if ((unit as unknown as { value: unknown }).value === null || (unit as unknown as { value: unknown }).value === undefined) {
    return { ok: false, reason: `needs a number before the unit, e.g. "${spec.example}"` }
  }
  if (!unit.equalBase(math.unit(spec.probe))) {
    return { ok: false, reason: `"${input}" is not ${spec.noun}; write it like "${spec.example}"` }
  }
  const value = unit.toNumber(spec.base)
  if (!Number.isFinite(value)) return { ok: false, reason: 'must be a finite number' }
  return { ok: true, value: withoutConversionNoise(value, (unit as unknown as { value: number }).value) }
}

/** Convert a number between two units with mathjs (used at the edges and as a test reference). */
export function convert(value: number, from: string, to: string): number {
  if (from === to) return value
  return withoutConversionNoise((math.unit(value, from) as Unit).toNumber(to), value)
}

/** Format a base-unit number for display, e.g. formatQuantity(0.12, 'A', 'mA') → "120 mA". */
export function formatQuantity(value: number, unit: string, digits = 3): string {
  const rounded = Number(value.toPrecision(digits))
  return `${rounded} ${unit}`
}
