/**
 * Readings no luminaire gives: each mains reading against the range a single emergency luminaire on a
 * public supply can show, and, when one is outside, the slip that would bring it back (a milliamp
 * reading typed as amps, a misplaced decimal point). A warning, never a silent correction: the user
 * re-reads the meter.
 */
import type { AuditInput } from './audit-input'
import { significantText as fmt } from './round'
import type { EngineWarning, Reference } from './types'

export interface PlausibleRange {
  min: number
  max: number
  unit: string
  ref: Reference
}

/** Nominal a.c. supply voltages of IEC 60038 run from 100 V to 277 V; ±10 % around them. */
export const SUPPLY_VOLTAGE_RANGE: PlausibleRange = {
  min: 90,
  max: 305,
  unit: 'V',
  ref: { source: 'IEC 60038: nominal a.c. supply voltages 100–277 V (single phase to neutral), with ±10 % supply tolerance', basis: 'published' },
}
/** One emergency luminaire on mains draws milliamps to about an amp. */
export const MAINS_CURRENT_RANGE: PlausibleRange = {
  min: 0.001,
  max: 5,
  unit: 'A',
  ref: { source: 'A single self-contained luminaire draws about 1 mA to 5 A from the mains', basis: 'common practice' },
}
/** Declared and measured power of one emergency luminaire. */
export const LUMINAIRE_POWER_RANGE: PlausibleRange = {
  min: 0.1,
  max: 1000,
  unit: 'W',
  ref: { source: 'A single emergency luminaire takes about 0.1 W to 1 kW', basis: 'common practice' },
}
/** Small capacitive-input LED drivers reach a power factor of about 0.3; below 0.2 a reading is wrong. */
export const POWER_FACTOR_RANGE: PlausibleRange = {
  min: 0.2,
  max: 1,
  unit: '',
  ref: { source: 'Power factor of mains LED drivers: about 0.3 for the smallest capacitive-input drivers, up to 1 with correction', basis: 'common practice' },
}

const SLIPS: Array<{ factor: number; words: string }> = [
  { factor: 1e-3, words: 'a milli-unit reading typed as whole units (write the unit, e.g. "28 mA")' },
  { factor: 1e3, words: 'a whole-unit reading typed as milli-units, or the wrong meter range' },
  { factor: 1e-2, words: 'extra zeros or a misplaced decimal point' },
  { factor: 1e2, words: 'a misplaced decimal point' },
  { factor: 1e-1, words: 'an extra digit or a misplaced decimal point' },
  { factor: 10, words: 'a missing digit or a misplaced decimal point' },
]

/** The scale factor that brings a value into range, with the slip it suggests; null when none does. */
export function likelySlip(value: number, inRange: (v: number) => boolean): { factor: number; words: string } | null {
  for (const slip of SLIPS) if (inRange(value * slip.factor)) return slip
  return null
}

function outside(
  field: string,
  label: string,
  value: number,
  range: PlausibleRange,
  inRange = (v: number) => v >= range.min && v <= range.max,
): EngineWarning | null {
  if (inRange(value)) return null
  const slip = likelySlip(value, inRange)
  const u = range.unit ? ` ${range.unit}` : ''
  return {
    code: 'implausible-reading',
    severity: slip ? 'critical' : 'warning',
    field,
    message:
      `${field} (${label} ${fmt(value)}${u}) is outside the ${fmt(range.min)}–${fmt(range.max)}${u} a single luminaire gives (${range.ref.source}).` +
      (slip
        ? ` ${fmt(value * slip.factor)}${u} would fit: probably ${slip.words}. Re-read the meter before relying on any figure here.`
        : ' Re-read the meter before relying on any figure here.'),
  }
}

/**
 * Plausibility of the mains readings, given the power triangle the audit worked out (P, S, λ). Each
 * reading is checked on its own, then the power factor, which catches a current or voltage that is in
 * range but a thousand times off.
 */
export function mainsPlausibility(input: AuditInput, P: number, PF: number): EngineWarning[] {
  const found: Array<EngineWarning | null> = [
    outside('supplyVoltage', 'supply voltage', input.supplyVoltage, SUPPLY_VOLTAGE_RANGE),
    input.measuredCurrent !== undefined ? outside('measuredCurrent', 'mains current', input.measuredCurrent, MAINS_CURRENT_RANGE) : null,
    outside('claimedPower', 'claimed power', input.claimedPower, LUMINAIRE_POWER_RANGE),
    input.measuredPower !== undefined ? outside('measuredPower', 'measured power', input.measuredPower, LUMINAIRE_POWER_RANGE) : null,
    input.powerFactor !== undefined ? outside('powerFactor', 'power factor', input.powerFactor, POWER_FACTOR_RANGE) : null,
  ]
  const warnings = found.filter((w): w is EngineWarning => w !== null)
  // A power factor far below any driver's, from readings that are each in range, points at the one a thousand times off.
  const flagged = new Set(warnings.map((w) => w.field))
  if (PF < POWER_FACTOR_RANGE.min && input.measuredPower !== undefined && !flagged.has('measuredCurrent') && !flagged.has('supplyVoltage')) {
    const fits = (pf: number) => pf >= POWER_FACTOR_RANGE.min && pf <= 1.05
    const field = input.measuredCurrent !== undefined ? 'measuredCurrent' : 'apparentPower'
    const reading = input.measuredCurrent ?? input.apparentPower
    const pfWith = (r: number) => (field === 'measuredCurrent' ? P / (input.supplyVoltage * r) : P / r)
    const slip = reading !== undefined ? likelySlip(reading, (r) => fits(pfWith(r))) : null
    warnings.push({
      code: 'power-factor-implausible',
      severity: 'critical',
      field,
      message:
        `The readings give a power factor of ${fmt(PF)}, far below the ${POWER_FACTOR_RANGE.min} of the poorest LED driver (${POWER_FACTOR_RANGE.ref.source}).` +
        (slip && reading !== undefined
          ? ` ${field} is probably ${slip.words}: ${fmt(reading * slip.factor)} instead of ${fmt(reading)} would give λ = ${fmt(pfWith(reading * slip.factor))}.`
          : ' One of the readings is wrong.') +
        ` The claim check uses measuredPower (${fmt(P)} W) only, but re-read the meter before signing.`,
    })
  }
  return warnings
}
