/** The shape of one battery chemistry's data. Every value carries where it comes from. */
import type { Reference } from '../types'

export type ChemistryId = 'nicd' | 'nicd-ht' | 'nimh' | 'lifepo4' | 'lead-acid' | 'li-ion'

/** A value with its source, so the UI can show how firmly it rests. */
export interface Sourced<T> {
  value: T
  unit: string
  ref: Reference
}

export interface Range {
  min: number
  max: number
}

export interface Chemistry {
  id: ChemistryId
  name: string
  /** Per cell, volts. */
  nominalCellVoltage: Sourced<number>
  /** Default end-of-discharge voltage per cell at emergency-lighting rates, volts. */
  cutoffCellVoltage: Sourced<number>
  /** Lowest safe end-of-discharge voltage per cell (deep discharge below this), volts. */
  minSafeCellVoltage: Sourced<number>
  /** Voltage per cell at full charge (on charge / float), volts. */
  fullChargeCellVoltage: Sourced<number>
  /** Standard charge rate, in C (e.g. 0.1 for 0.1 It). */
  standardChargeRateC: Sourced<number>
  /** Ah to put in per Ah taken out (≥ 1). */
  chargeFactor: Sourced<number>
  /** Permitted continuous (trickle / overcharge) current, in C; max 0 means none tolerated. */
  continuousChargeRangeC: Sourced<Range>
  /** Float voltage per cell at 25 °C and its temperature coefficient (V/°C/cell), where the chemistry floats. */
  float?: {
    cellVoltageAt25C: Sourced<number>
    coefficientVPerC: Sourced<number>
    /** Acceptable float band per cell at 25 °C; shifted by the coefficient like the set point. */
    bandAt25C?: Sourced<Range>
    /** Compensation is held constant outside this ambient range, °C. */
    compensationLimitsC?: Range
  }
  /** Highest charge (hold) voltage per cell a charger may apply, where it differs from the full-charge voltage, volts. */
  maxChargeCellVoltage?: Sourced<number>
  /** Charge current limit in the cold: at ambients from 0 °C up to `belowC`, at most `maxRateC` (lithium). */
  coldCharge?: { belowC: number; maxRateC: Sourced<number> }
  /** Maximum charge current, in C. */
  maxChargeRateC: Sourced<number>
  chargeTemperatureC: Sourced<Range>
  dischargeTemperatureC: Sourced<Range>
  selfDischargePctPerMonth: Sourced<Range>
  /**
   * Standby (float/trickle) design life, years, at temperatures up to `lifeReferenceTemperatureC`
   * (25 °C for most chemistries; higher for cells built for warm luminaires).
   */
  standbyLifeYearsAt25C: Sourced<number>
  /** Life halves for every this many °C above the reference temperature. */
  lifeHalvingIntervalC: Sourced<number>
  /** Reference temperature for the life model, °C. */
  lifeReferenceTemperatureC: number
  /** Fraction of rated capacity available by ambient temperature, °C → fraction (linear between points). */
  coldCapacityCurve: Sourced<Array<[number, number]>>
  peukertExponent: Sourced<Range>
  /** Default Peukert exponent used when the user gives none (1 = rate-independent). */
  defaultPeukertExponent: number
  /** Hours of the capacity rating basis (e.g. 20 for C20). */
  defaultRatedHours: number
  specificEnergyWhPerKg: Sourced<Range>
  energyDensityWhPerL: Sourced<Range>
  /** Whether the chemistry tolerates sitting on permanent charge (0..1 score used in the comparison). */
  trickleTolerance: number
  /** Whether charging below 0 °C is forbidden. */
  noChargeBelowFreezing: boolean
  /** Family, for rules that follow the charge method (constant current vs constant voltage). */
  family: 'nickel' | 'lead' | 'lithium'
  /** Common pack capacities, Ah, that the sizing picks from when no pack is given. */
  capacityLadderAh: Sourced<number[]>
  /** Cells in series assumed for a converter-driven luminaire when no input window is given. */
  defaultCellsInSeries: Sourced<number>
  /** Fraction of rated capacity the design may use (to the end-of-discharge voltage). */
  defaultDepthOfDischarge: Sourced<number>
  /** End-of-discharge voltage per cell by discharge rate: [up to this C-rate, V/cell], ascending; the last entry covers higher rates. */
  cutoffByDischargeRate?: Sourced<Array<[number, number]>>
  /** 0 (none) .. 1 (heavy): restrictions on placing on the market, transport and disposal, used by the comparison. */
  regulatoryBurden: number
  disposal: string[]
  regulatory: string[]
  hazards: string[]
}
