/**
 * Display units: SI or US customary where the trade differs (lux or foot-candles, °C or °F,
 * metres or feet). Stored and computed values stay SI; this only converts for showing and reading.
 */
import { convert } from './quantity'

export type UnitSystem = 'si' | 'us'
export type DisplayKind = 'illuminance' | 'temperature' | 'length'

const UNITS: Record<DisplayKind, Record<UnitSystem, { unit: string; label: string }>> = {
  illuminance: { si: { unit: 'lx', label: 'lx' }, us: { unit: 'fc', label: 'fc' } },
  temperature: { si: { unit: 'degC', label: '°C' }, us: { unit: 'degF', label: '°F' } },
  length: { si: { unit: 'm', label: 'm' }, us: { unit: 'ft', label: 'ft' } },
}

/** The SI base unit each kind is stored in. */
const BASE: Record<DisplayKind, string> = { illuminance: 'lx', temperature: 'degC', length: 'm' }

export function unitLabel(kind: DisplayKind, system: UnitSystem): string {
  return UNITS[kind][system].label
}

/** SI value → the value in the user's system. */
export function toDisplay(kind: DisplayKind, system: UnitSystem, value: number): number {
  return system === 'si' ? value : convert(value, BASE[kind], UNITS[kind][system].unit)
}

/** A value typed in the user's system → SI. */
export function fromDisplay(kind: DisplayKind, system: UnitSystem, value: number): number {
  return system === 'si' ? value : convert(value, UNITS[kind][system].unit, BASE[kind])
}

/** "12.3 lx" or "1.14 fc". */
export function formatDisplay(kind: DisplayKind, system: UnitSystem, value: number, digits = 3): string {
  return `${Number(toDisplay(kind, system, value).toPrecision(digits))} ${unitLabel(kind, system)}`
}
