/**
 * The trickle retrofit's model: sources, constants and pure formulas (the charger as a Thévenin
 * source, recharge time integrated over state of charge, the largest resistance within 24 h, the
 * runtime cost of a bypass diode). The plan that uses them is retrofit.ts.
 */
import type { Reference } from './types'

// ---------------------------------------------------------------------------------------------
// Sources and constants
// ---------------------------------------------------------------------------------------------

export const OHM: Reference = { source: "Ohm's law, I = V / R", basis: 'published' }
export const THEVENIN: Reference = { source: "Thévenin's theorem: a linear source seen from two terminals is V_oc in series with R_int", basis: 'published' }
export const JOULE: Reference = { source: "Joule's law, P = I²·R", basis: 'published' }
export const IEC_60063: Reference = { source: 'IEC 60063:2015, preferred number series E12 and E24', basis: 'published' }
export const RATING_MARGIN: Reference = {
  source: 'Resistor power rating at least twice the worst-case dissipation, next stocked rating',
  basis: 'common practice',
}
export const RECHARGE_24H: Reference = {
  source: 'IEC 60598-2-22: rated duration must be reached after a 24 h recharge',
  basis: 'from memory',
  note: 'the 24 h charge before the duration test is found in IEC 61347-2-7, clause 20; the luminaire clause is recalled',
}
export const LINEAR_MODEL: Reference = {
  source: 'Pack voltage taken as linear in state of charge between cut-off and full charge (simplification)',
  basis: 'derived',
}
export const DIODE_DROP: Reference = {
  source: 'Forward voltage at the discharge current: silicon ≈ 0.7 V, Schottky ≈ 0.35 V',
  basis: 'common practice',
}

/** Typical forward voltages at emergency discharge currents (common practice). */
export const DIODE_FORWARD_VOLTAGE: Record<'silicon' | 'schottky', number> = { silicon: 0.7, schottky: 0.35 }

/** Margin applied to the worst-case dissipation before choosing a rating (common practice). */
export const RESISTOR_RATING_MARGIN = 2

/** Integration steps in state of charge for the recharge time. */
export const RECHARGE_STEPS = 2000

/** Chemistries charged to a voltage limit rather than by a constant trickle. */
export const VOLTAGE_LIMITED: ReadonlyArray<string> = ['lead-acid', 'lifepo4', 'li-ion']

// ---------------------------------------------------------------------------------------------
// Pure formulas
// ---------------------------------------------------------------------------------------------

export type SecondReading = { kind: 'test-resistor'; resistance: number; current: number } | { kind: 'open-circuit'; voltage: number }

export type TheveninFit = { ok: true; openCircuitV: number; internalResistanceOhm: number } | { ok: false; path: Array<string>; message: string }

/**
 * Fit the charger's Thévenin source from the present current at the battery voltage and a second
 * reading. With a test resistor R_t: V_oc − V_b = I₁·R_int = I₂·(R_int + R_t) → R_int = I₂·R_t/(I₁ − I₂).
 * With the open-circuit voltage: R_int = (V_oc − V_b)/I₁.
 */
export function fitChargerThevenin(presentCurrentA: number, batteryVoltageV: number, second: SecondReading): TheveninFit {
  if (second.kind === 'test-resistor') {
    const I1 = presentCurrentA
    const I2 = second.current
    if (I2 === I1) {
      return {
        ok: false,
        path: ['secondReading', 'current'],
        message:
          'the current did not fall with the test resistor: the charger behaves as a constant-current source (infinite internal resistance), so a series resistor will not lower its trickle current',
      }
    }
    if (I2 > I1) {
      return {
        ok: false,
        path: ['secondReading', 'current'],
        message:
          'is higher than trickleCurrent: adding resistance cannot raise the current (it would mean a negative internal resistance); check both readings',
      }
    }
    const internalResistanceOhm = (I2 * second.resistance) / (I1 - I2)
    return { ok: true, internalResistanceOhm, openCircuitV: batteryVoltageV + I1 * internalResistanceOhm }
  }
  if (second.voltage <= batteryVoltageV) {
    return {
      ok: false,
      path: ['secondReading', 'voltage'],
      message:
        second.voltage === batteryVoltageV
          ? 'equals batteryVoltage: no current could flow (zero driving voltage); check the readings'
          : 'is below batteryVoltage: the charger could not push current into the battery (negative internal resistance); check the readings',
    }
  }
  return { ok: true, openCircuitV: second.voltage, internalResistanceOhm: (second.voltage - batteryVoltageV) / presentCurrentA }
}

/** Charge current from a Thévenin source into a pack at `packV` through `totalOhm` (never negative). */
export function chargeCurrent(openCircuitV: number, packV: number, totalOhm: number): number {
  return Math.max(0, (openCircuitV - packV) / totalOhm)
}

export interface RechargeModel {
  openCircuitV: number
  /** R_int + added series resistance, Ω. */
  totalResistanceOhm: number
  /** Pack voltage at full charge (top of the linear model), V; must be below openCircuitV. */
  packFullV: number
  /** Pack voltage when empty (cut-off × cells), V. */
  packEmptyV: number
  capacityAh: number
  /** Charge taken out by the discharge, Ah (at most capacityAh). */
  dischargedAh: number
  /** Ah to put in per Ah taken out. */
  chargeFactor: number
  steps?: number
}

/**
 * Hours to restore the charge taken out, integrating in fixed state-of-charge steps (midpoint rule):
 * dt = k·C·dq / I(V(q)), V(q) linear between empty and full, I from the Thévenin source. The
 * current falls as the pack voltage rises, so this is longer than k·Q / I_start.
 */
export function rechargeTimeHours(m: RechargeModel): number {
  const steps = m.steps ?? RECHARGE_STEPS
  const q0 = Math.max(0, 1 - m.dischargedAh / m.capacityAh)
  const dq = (1 - q0) / steps
  let hours = 0
  for (let i = 0; i < steps; i += 1) {
    const q = q0 + (i + 0.5) * dq
    const v = m.packEmptyV + (m.packFullV - m.packEmptyV) * q
    hours += (m.chargeFactor * m.capacityAh * dq) / chargeCurrent(m.openCircuitV, v, m.totalResistanceOhm)
  }
  return hours
}

/**
 * The largest added resistance whose recharge time stays within `limitH`, by bisection (recharge time
 * rises with resistance). Assumes `rechargeFor(0)` is within the limit.
 */
export function largestResistanceWithin(limitH: number, rechargeFor: (addedOhm: number) => number): number {
  let low = 0
  let high = 1
  while (rechargeFor(high) <= limitH && high < 1e9) high *= 2
  for (let i = 0; i < 50 && high - low > 1e-6 * high; i += 1) {
    const mid = (low + high) / 2
    if (rechargeFor(mid) <= limitH) low = mid
    else high = mid
  }
  return low
}

/**
 * Runtime change when the load's cut-off, seen at the battery, rises by the diode drop. With pack
 * voltage linear in charge, the charge left unused is V_f / (V_full − V_empty) of the total.
 */
export function runtimeChangePctFor(diodeDropV: number, packFullV: number, packEmptyV: number): number {
  return -100 * Math.min(1, diodeDropV / (packFullV - packEmptyV))
}
