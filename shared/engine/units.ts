/**
 * Display units: metric or US customary where the trade differs (lux or foot-candles, °C or °F,
 * metres or feet, kilograms or pounds, litres or cubic inches), and the regional defaults that go
 * with them (supply voltage and frequency, currency, paper). Stored and computed values stay SI;
 * this only converts for showing and reading. Conversion factors: docs/method.md.
 */
import { formatNumber, type FormatPrefs, type PaperSize } from '../format'
import { convert, withoutConversionNoise } from './quantity'

export type UnitSystem = 'si' | 'us'
export type DisplayKind = 'illuminance' | 'temperature' | 'length' | 'mass' | 'volume'
export const DISPLAY_KINDS: readonly DisplayKind[] = ['illuminance', 'temperature', 'length', 'mass', 'volume']

/** The unit each kind is shown in per system, as mathjs names it (labels: shared/labels UNIT_LABELS). */
const UNITS: Record<DisplayKind, Record<UnitSystem, string>> = {
  illuminance: { si: 'lx', us: 'fc' },
  temperature: { si: 'degC', us: 'degF' },
  length: { si: 'm', us: 'ft' },
  mass: { si: 'kg', us: 'lb' },
  volume: { si: 'L', us: 'in^3' },
}

/** The SI unit each kind is stored in. */
const BASE: Record<DisplayKind, string> = { illuminance: 'lx', temperature: 'degC', length: 'm', mass: 'kg', volume: 'L' }

const SYMBOLS: Record<string, string> = { degC: '°C', degF: '°F', 'in^3': 'in³' }

/** The unit a kind is shown in, as mathjs names it ("ft", "degF"); what `readQuantity` takes as bareUnit. */
export function displayUnit(kind: DisplayKind, system: UnitSystem): string {
  return UNITS[kind][system]
}

/** The symbol written after a number ("°F", "fc", "in³"). */
export function unitLabel(kind: DisplayKind, system: UnitSystem): string {
  const u = UNITS[kind][system]
  return SYMBOLS[u] ?? u
}

/** SI value → the value in the user's system. */
export function toDisplay(kind: DisplayKind, system: UnitSystem, value: number): number {
  return system === 'si' ? value : convert(value, BASE[kind], UNITS[kind][system])
}

/** A value typed in the user's system → SI. */
export function fromDisplay(kind: DisplayKind, system: UnitSystem, value: number): number {
  return system === 'si' ? value : convert(value, UNITS[kind][system], BASE[kind])
}

/** "12.3 lx" or "1.14 fc": through the one number formatter, so the reader's decimal mark and rounding apply. */
export function formatDisplay(kind: DisplayKind, system: UnitSystem, value: number | { min: number; max: number }, digits = 3, prefs?: FormatPrefs): string {
  if (typeof value === 'object' && value !== null) {
    const max = formatDisplay(kind, system, value.max, digits, prefs)
    return `${formatDisplay(kind, system, value.min, digits, prefs).replace(/ \S+$/, '')}–${max}`
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) return '—'
  // Temperatures read as whole or tenth degrees whatever their size; three significant digits of 104.5 °F would drop the half.
  const shown = toDisplay(kind, system, value)
  const opts =
    kind === 'temperature' ? { digits: Math.max(digits, significantFor(shown, 1)), unit: UNITS[kind][system] } : { digits, unit: UNITS[kind][system] }
  return formatNumber(kind === 'temperature' ? Math.round(shown * 10) / 10 : shown, opts, prefs)
}

/** Significant digits that keep `decimals` places of this value. */
function significantFor(value: number, decimals: number): number {
  const whole = Math.abs(value) >= 1 ? Math.floor(Math.log10(Math.abs(value))) + 1 : 1
  return Math.min(21, whole + decimals)
}

/**
 * A default written as a round number in the user's units: 2.5 m is "8 ft", 30 m "100 ft", 25 °C
 * "77 °F", never 8.2021 or 98.4252. Metric defaults are already round and pass unchanged. The value
 * returned is in the display unit; the form sends it back through `fromDisplay`, so the SI value the
 * engine sees is that of the round number shown.
 */
export function roundDefault(kind: DisplayKind, system: UnitSystem, si: number): number {
  const shown = toDisplay(kind, system, si)
  if (system === 'si' || shown === 0 || !Number.isFinite(shown)) return shown
  if (kind === 'temperature') return Math.round(shown)
  // Steps of half a unit of the second significant digit: 8.2 → 8, 6.56 → 6.5, 98.4 → 100, 0.0465 → 0.045.
  const step = 5 * 10 ** (Math.floor(Math.log10(Math.abs(shown))) - 1)
  return withoutConversionNoise(Math.round(shown / step) * step, shown)
}

export type { PaperSize }

export interface RegionDefaults {
  /** Typed text for the claim check's supply fields and currency. */
  supplyVoltage: string
  supplyFrequency: string
  currency: string
  paper: PaperSize
}

/**
 * Where a form starts when the user has not said: North American supplies are 120 V (277 V on
 * commercial lighting circuits) at 60 Hz, in dollars, on Letter paper; elsewhere 230 V 50 Hz
 * (IEC 60038 nominal), euros, A4. The system of units stands for the region until a workspace says more.
 */
export function regionDefaults(system: UnitSystem): RegionDefaults {
  return system === 'us'
    ? { supplyVoltage: '120 V', supplyFrequency: '60 Hz', currency: 'USD', paper: 'letter' }
    : { supplyVoltage: '230 V', supplyFrequency: '50 Hz', currency: 'EUR', paper: 'a4' }
}

/** A temperature difference ("10 °C" or "18 °F"): a step of 1 °C is a step of 1.8 °F, with no offset. */
export function formatTemperatureStep(system: UnitSystem, stepC: number, prefs?: FormatPrefs): string {
  return system === 'si' ? formatNumber(stepC, { unit: 'degC' }, prefs) : formatNumber(stepC * 1.8, { unit: 'degF' }, prefs)
}

const NUMBER = String.raw`[−-]?\d+(?:[.,]\d+)?`
const METRIC_IN_TEXT = new RegExp(String.raw`(?<![\w.,])(${NUMBER})(?:(\s?(?:–|−|to|and)\s?)(${NUMBER}))?\s?(°C|kg|L|m|lx)(?![\w²³])`, 'g')
const TEXT_KIND: Record<string, DisplayKind> = { '°C': 'temperature', kg: 'mass', L: 'volume', m: 'length', lx: 'illuminance' }

/**
 * The engine writes its sentences in SI ("the site reaches 40 °C", "0.3–0.45 kg"); for a reader in
 * US customary units every quantity in such a text is rewritten in theirs ("104 °F", "0.66–0.99 lb").
 * A temperature after "every", "each", "per" or "by" is a step, not a reading: 10 °C is 18 °F.
 */
export function inUserUnits(text: string, system: UnitSystem, prefs?: FormatPrefs): string {
  if (system === 'si' || !text) return text
  return text.replace(METRIC_IN_TEXT, (whole, a: string, joint: string | undefined, b: string | undefined, unit: string, offset: number, all: string) => {
    const kind = TEXT_KIND[unit]
    const read = (x: string) => Number(x.replace('−', '-').replace(',', '.'))
    const step = kind === 'temperature' && /\b(?:every|each|per|by)\s*$/i.test(all.slice(0, offset))
    const one = (x: string, withUnit: boolean) => {
      const v = read(x)
      if (!Number.isFinite(v)) return x
      const s = step ? formatTemperatureStep(system, v, prefs) : formatDisplay(kind, system, v, 3, prefs)
      return withUnit ? s : s.replace(/\s\S+$/, '')
    }
    if (b === undefined) return one(a, true)
    return `${one(a, false)}${joint}${one(b, true)}`
  })
}

/** The stored SI unit of each kind that has a US customary counterpart, as `formatNumber` names it. */
const KIND_OF_UNIT: Record<string, DisplayKind> = { lx: 'illuminance', degC: 'temperature', '°C': 'temperature', m: 'length', kg: 'mass', L: 'volume' }

/**
 * A figure for a document's reader: in their units (`prefs.units`) where metric and US customary
 * differ, rounded as the screens round it; every other unit (W, Ah, h, V) as `formatNumber` writes it.
 */
export function formatForReader(value: unknown, opts: { unit?: string; digits?: number } = {}, prefs?: FormatPrefs): string {
  const kind = opts.unit ? KIND_OF_UNIT[opts.unit] : undefined
  if (!kind || prefs?.units !== 'us' || typeof value !== 'number') return formatNumber(value, opts, prefs)
  return formatDisplay(kind, 'us', value, opts.digits ?? 3, prefs)
}

/** An engine sentence or a typed value for a document's reader: its quantities in their units. */
export function textForReader(text: string, prefs?: FormatPrefs): string {
  return inUserUnits(text, prefs?.units ?? 'si', prefs)
}
