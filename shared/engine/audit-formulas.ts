/** The wattage audit's sources and pure formulas: apparent power, power factor, distortion, energy over a year. */
import type { Reference } from './types'

// ---------------------------------------------------------------------------------------------
// Sources
// ---------------------------------------------------------------------------------------------

export const IEEE_1459: Reference = {
  source: 'IEEE Std 1459-2010, single-phase definitions: S = V·I (rms), power factor = P/S',
  basis: 'published',
}
export const IEV_POWER_FACTOR: Reference = {
  source: 'IEC 60050-131, IEV 131-11-46 "power factor" (ratio of active to apparent power)',
  basis: 'from memory',
  note: 'entry number recalled, not checked against the vocabulary',
}
/** Source of `truePowerFactor`, for screens that show it. */
export const TRUE_POWER_FACTOR_REFERENCE: Reference = {
  source: 'IEEE Std 1459-2010: power factor = cos φ1 / √(1 + THD_I²) when the voltage is undistorted',
  basis: 'published',
}
export const DC_POWER: Reference = { source: 'Joule’s law for d.c.: P = V·I', basis: 'published' }
export const ENERGY_DEFINITION: Reference = {
  source: 'Energy = power × time; 1 kWh = 3.6 MJ; year taken as 365 d = 8760 h',
  basis: 'derived',
}
export const CLAIM_TOLERANCE: Reference = {
  source: 'Tolerance of 10 % between a declared and a measured power',
  basis: 'common practice',
  note: 'market-surveillance tolerances in Regulation (EU) 2019/2020 Annex IV are of this size (from memory)',
}
/** Source of `euMinimumDisplacementFactor`. */
export const EU_DISPLACEMENT_REFERENCE: Reference = {
  source: 'Regulation (EU) 2019/2020, Annex II: minimum displacement factor of mains LED light sources by power band',
  basis: 'from memory',
  note: 'bands taken from a secondary summary; whether emergency-lighting products are exempt is not confirmed',
}

// ---------------------------------------------------------------------------------------------
// Pure formulas
// ---------------------------------------------------------------------------------------------

/** Apparent power S = V_rms · I_rms (VA). IEEE Std 1459-2010. */
export function apparentPower(voltageV: number, currentA: number): number {
  return voltageV * currentA
}

/** Power factor λ = P / S. IEEE Std 1459-2010; IEC 60050-131. */
export function powerFactorOf(realPowerW: number, apparentPowerVA: number): number {
  return realPowerW / apparentPowerVA
}

/**
 * True power factor of a load with a distorted current on an undistorted voltage:
 * λ = cos φ1 × 1/√(1 + THD²) (displacement × distortion factor), IEEE Std 1459-2010.
 * `thd` is a fraction (0.8 for 80 %).
 */
export function truePowerFactor(displacementFactor: number, thd: number): number {
  if (!(displacementFactor >= 0 && displacementFactor <= 1)) throw new RangeError('displacement factor must be within 0..1')
  if (!(thd >= 0) || !Number.isFinite(thd)) throw new RangeError('THD must be a finite fraction ≥ 0')
  return displacementFactor * distortionFactor(thd)
}

/** Distortion factor I1/I = 1/√(1 + THD²), IEEE Std 1459-2010. */
export function distortionFactor(thd: number): number {
  return 1 / Math.sqrt(1 + thd * thd)
}

export const HOURS_PER_YEAR = 8760

export type LuminaireMode = 'maintained' | 'non-maintained'

export interface AnnualEnergyModel {
  mode: LuminaireMode
  /** Mains input power with the lamp lit (maintained) or on charge with the lamp off (non-maintained), W. */
  measuredPowerW: number
  /** Lit hours per day (maintained only). */
  hoursPerDay: number
  /** Power drawn during the unlit hours of a maintained luminaire, W (null when unknown → counted as 0). */
  standbyPowerW: number | null
}

/**
 * A year's mains energy in kWh.
 * Maintained: lit hours at the measured power plus the other hours of the day at the standby
 * (charging) power. Non-maintained: the light is off on mains, so the measured (charging) power
 * is drawn all day, every day. Energy drawn in mains failures and tests is ignored.
 */
export function annualEnergyKWh(model: AnnualEnergyModel): number {
  if (model.mode === 'non-maintained') return (model.measuredPowerW * HOURS_PER_YEAR) / 1000
  const days = HOURS_PER_YEAR / 24
  const standby = model.standbyPowerW ?? 0
  return ((model.measuredPowerW * model.hoursPerDay + standby * (24 - model.hoursPerDay)) * days) / 1000
}

/** Minimum displacement factor by power band, Regulation (EU) 2019/2020 (from memory, secondary); null = no requirement. */
export function euMinimumDisplacementFactor(powerW: number): number | null {
  if (powerW <= 5) return null
  if (powerW <= 10) return 0.5
  if (powerW <= 25) return 0.7
  return 0.9
}
