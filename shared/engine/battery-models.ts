/**
 * Battery models used by the sizing and charge tools. Plain numbers only: hours, amperes,
 * ampere-hours, °C. Every function here is documented with its formula in docs/method.md.
 */
import type { Chemistry } from './chemistries/types'

/**
 * Peukert runtime in the rated-capacity form: t = H·(C/(I·H))^k, where C is the capacity
 * rated over H hours. Returns hours.
 */
export function peukertRuntimeH(capacityAh: number, currentA: number, ratedHours: number, exponent: number): number {
  return ratedHours * Math.pow(capacityAh / (currentA * ratedHours), exponent)
}

/** Peukert in the "capacity at 1 A" form: t = Cp / I^k. Returns hours. */
export function peukertRuntimeFromConstantH(peukertCapacity: number, currentA: number, exponent: number): number {
  return peukertCapacity / Math.pow(currentA, exponent)
}

/** Peukert exponent from two constant-current tests: k = (log t2 − log t1) / (log I1 − log I2). */
export function peukertExponentFromTests(current1A: number, time1H: number, current2A: number, time2H: number): number {
  return (Math.log(time2H) - Math.log(time1H)) / (Math.log(current1A) - Math.log(current2A))
}

/**
 * Runtime of a pack, hours, with no credit taken for discharging more slowly than the rating
 * basis: at or below the rated current (C/H) the capacity is C; above it Peukert applies.
 * The two branches meet at I = C/H, so the curve is continuous.
 */
export function runtimeH(capacityAh: number, currentA: number, ratedHours: number, exponent: number): number {
  if (currentA * ratedHours <= capacityAh) return capacityAh / currentA
  return peukertRuntimeH(capacityAh, currentA, ratedHours, exponent)
}

/**
 * Rated capacity, Ah, that runs `currentA` for `durationH`: the inverse of `runtimeH`.
 * C = I·t when t ≥ H, else C = I·H·(t/H)^(1/k).
 */
export function capacityForRuntimeAh(currentA: number, durationH: number, ratedHours: number, exponent: number): number {
  if (durationH >= ratedHours) return currentA * durationH
  return currentA * ratedHours * Math.pow(durationH / ratedHours, 1 / exponent)
}

/** Linear interpolation in a table of [x, y] points sorted by x; clamps outside the table. */
export function interpolate(points: ReadonlyArray<readonly [number, number]>, x: number): number {
  const first = points[0]
  const last = points[points.length - 1]
  if (x <= first[0]) return first[1]
  if (x >= last[0]) return last[1]
  let i = 1
  while (x > points[i][0]) i++
  const [x0, y0] = points[i - 1]
  const [x1, y1] = points[i]
  return y0 + ((y1 - y0) * (x - x0)) / (x1 - x0)
}

/** Fraction of rated capacity available at an ambient temperature, from the chemistry's curve. */
export function coldCapacityFactor(chemistry: Chemistry, ambientC: number): number {
  return interpolate(chemistry.coldCapacityCurve.value, ambientC)
}

/**
 * Service life, years: L = L_ref · 2^(−(T − T_ref)/N) above the reference temperature, and L_ref
 * at or below it (no extra life is credited for a cooler place).
 */
export function serviceLifeYears(lifeAtReferenceYears: number, referenceC: number, halvingIntervalC: number, ambientC: number): number {
  const excess = Math.max(0, ambientC - referenceC)
  return lifeAtReferenceYears * Math.pow(2, -excess / halvingIntervalC)
}

export function chemistryServiceLifeYears(chemistry: Chemistry, ambientC: number): number {
  return serviceLifeYears(chemistry.standbyLifeYearsAt25C.value, chemistry.lifeReferenceTemperatureC, chemistry.lifeHalvingIntervalC.value, ambientC)
}

/**
 * IEC 60598-2-22 Annex A: recommended maximum discharge current as a fraction f of the rated
 * capacity per hour (I_max = f·C/1 h): 0.60 for 1 h, 0.40 for 1.5 h, 0.25 for 3 h.
 * Linear between those points; below 1 h f stays at 0.60; beyond 3 h the discharged share
 * f·t stays at 0.75, so f = 0.75/t.
 */
export const ANNEX_A_POINTS: ReadonlyArray<readonly [number, number]> = [
  [1, 0.6],
  [1.5, 0.4],
  [3, 0.25],
]

export function annexADischargeFraction(durationH: number): number {
  if (durationH > 3) return 0.75 / durationH
  return interpolate(ANNEX_A_POINTS, durationH)
}

/** Largest average discharge current Annex A recommends for a rated capacity and duration, A. */
export function annexAMaxCurrentA(ratedCapacityAh: number, durationH: number): number {
  return annexADischargeFraction(durationH) * ratedCapacityAh
}

/** End-of-discharge voltage per cell for a discharge rate, where the chemistry tabulates it. */
export function cutoffCellVoltageAtRate(chemistry: Chemistry, dischargeRateC: number): number {
  const table = chemistry.cutoffByDischargeRate?.value
  if (!table) return chemistry.cutoffCellVoltage.value
  for (const [upTo, volts] of table) if (dischargeRateC <= upTo) return volts
  return table[table.length - 1][1]
}

/**
 * Temperature-compensated float voltage per cell: V(T) = V25 + α·(T − 25), with T held inside
 * the compensation limits. Returns undefined for chemistries that do not float.
 */
export function floatCellVoltage(chemistry: Chemistry, ambientC: number, at25C?: number): number | undefined {
  const float = chemistry.float
  if (!float) return undefined
  const limits = float.compensationLimitsC
  const t = limits ? Math.min(limits.max, Math.max(limits.min, ambientC)) : ambientC
  return (at25C ?? float.cellVoltageAt25C.value) + float.coefficientVPerC.value * (t - 25)
}

/**
 * Lowest end-of-discharge voltage per cell the cells tolerate at a discharge rate: one rule for every
 * tool. Where the makers tabulate final voltage by rate (VRLA), it is the table's value at that rate;
 * when the rate is not known, the table's lowest value (the floor at any rate). Otherwise the chemistry's
 * minimum safe voltage.
 */
export function deepDischargeLimitCellV(chemistry: Chemistry, dischargeRateC: number | null): number {
  const table = chemistry.cutoffByDischargeRate?.value
  if (!table) return chemistry.minSafeCellVoltage.value
  if (dischargeRateC === null) return Math.min(...table.map(([, volts]) => volts))
  return cutoffCellVoltageAtRate(chemistry, dischargeRateC)
}
