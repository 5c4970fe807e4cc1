/**
 * The steps of `sizePack`, each a pure function named for what it settles: the pack's cells, what
 * the load draws, the capacity needed, the pack chosen (or checked) and how that pack performs.
 * `SizedPack` carries what the steps found to the checks, the charger check and the working.
 */
import { batteryDraw, type BatteryDraw } from './battery-inputs'
import {
  annexADischargeFraction,
  capacityForRuntimeAh,
  chemistryServiceLifeYears,
  coldCapacityFactor,
  cutoffCellVoltageAtRate,
  runtimeH,
} from './battery-models'
import { CHEMISTRIES } from './chemistries'
import type { Chemistry, Range } from './chemistries/types'
import { cellsForVoltage, chooseCellsInSeries, type CellChoice, type VoltageCells } from './pack-cells'
import { roundToSignificant as round } from './round'
import type { SizeInput } from './size-input'
import type { EngineWarning } from './types'

const SECONDS_PER_HOUR = 3600

/** The chemistry and the factors the input leaves to it. */
export interface PackBasis {
  input: SizeInput
  chemistry: Chemistry
  durationH: number
  peukertExponent: number
  ratedH: number
  depthOfDischarge: number
  nominalCellV: number
  averageCellV: number
  fullCellV: number
  designCutoffCellV: number
}

export function packBasis(input: SizeInput): PackBasis {
  const chemistry = CHEMISTRIES[input.chemistry]
  const nominalCellV = chemistry.nominalCellVoltage.value
  return {
    input,
    chemistry,
    durationH: input.duration / SECONDS_PER_HOUR,
    peukertExponent: input.peukertExponent ?? chemistry.defaultPeukertExponent,
    ratedH: input.ratedHours ?? chemistry.defaultRatedHours,
    depthOfDischarge: input.depthOfDischarge ?? chemistry.defaultDepthOfDischarge.value,
    nominalCellV,
    averageCellV: input.averageCellVoltage ?? nominalCellV,
    fullCellV: chemistry.fullChargeCellVoltage.value,
    designCutoffCellV: input.cutoffCellVoltage ?? chemistry.cutoffCellVoltage.value,
  }
}

export interface PackCells {
  choice: CellChoice
  n: number
  nominalVoltageV: number
  /** The whole-cell match to `nominalVoltage`, when one was asked for. */
  voltageMatch?: VoltageCells
}

/** Step 1: cells in series (given, from the nominal voltage, or chosen for the load). */
export function chooseCells(b: PackBasis): PackCells {
  const { input, chemistry } = b
  const choice = chooseCellsInSeries(chemistry, input.driver, input.load, b.designCutoffCellV, input.converterInput, input.cellsInSeries, input.nominalVoltage)
  const voltageMatch = input.nominalVoltage !== undefined ? cellsForVoltage(chemistry, input.nominalVoltage) : undefined
  return { choice, n: choice.cells, nominalVoltageV: choice.cells * b.nominalCellV, voltageMatch }
}

/** Step 2: what the pack delivers: the load through its driver, or the measured discharge current. */
export function packDraw(b: PackBasis, cells: PackCells): BatteryDraw {
  const packAverageV = cells.n * b.averageCellV
  const measured = b.input.dischargeCurrent
  if (measured !== undefined) return { currentA: measured, powerW: measured * packAverageV, loadPowerW: measured * packAverageV }
  return batteryDraw(b.input.load ?? {}, b.input.driver, b.input.driverEfficiency, packAverageV)
}

export interface CapacityNeed {
  peukertAh: number
  coldFactor: number
  requiredAh: number
  annexFraction: number
  annexMinAh: number
}

/** Step 3: rated capacity that runs the load for the rated duration, derated for cold, ageing and the margin; and the Annex A minimum. */
export function capacityNeed(b: PackBasis, draw: BatteryDraw): CapacityNeed {
  const { input, chemistry } = b
  const peukertAh = capacityForRuntimeAh(draw.currentA, b.durationH, b.ratedH, b.peukertExponent)
  const coldFactor = coldCapacityFactor(chemistry, input.ambientMin)
  const requiredAh = (peukertAh * (1 + input.designMargin)) / (b.depthOfDischarge * input.endOfLifeCapacity * coldFactor)
  const annexFraction = annexADischargeFraction(b.durationH)
  return { peukertAh, coldFactor, requiredAh, annexFraction, annexMinAh: draw.currentA / annexFraction }
}

export interface CapacityChoice {
  selectedAh: number
  capacityGiven: boolean
  /** The capacities chosen from, Ah ascending (empty when a capacity was given). */
  ladder: number[]
}

const byValue = (a: number, b: number) => a - b
function ladderInAh(coulombs: number[]): number[] {
  const ah: number[] = []
  for (const c of coulombs) ah.push(c / SECONDS_PER_HOUR)
  return ah.sort(byValue)
}

/** Step 4: the pack given, or the smallest ladder rung meeting both the derated need and Annex A. */
export function selectCapacity(b: PackBasis, need: CapacityNeed, warnings: EngineWarning[]): CapacityChoice {
  const { input, chemistry } = b
  if (input.capacity !== undefined) return { selectedAh: input.capacity / SECONDS_PER_HOUR, capacityGiven: true, ladder: [] }
  const ladder = input.capacityLadder ? ladderInAh(input.capacityLadder) : chemistry.capacityLadderAh.value
  const target = Math.max(need.requiredAh, need.annexMinAh)
  let rung: number | undefined
  for (const c of ladder) {
    if (c >= target * (1 - 1e-9)) {
      rung = c
      break
    }
  }
  if (rung !== undefined) {
    if (need.annexMinAh > need.requiredAh) {
      warnings.push({
        code: 'annex-a-set-capacity',
        severity: 'info',
        message: `The IEC 60598-2-22 Annex A discharge limit (${round(need.annexFraction * 100)} % of rated capacity per hour for this duration) asked for more capacity (${round(need.annexMinAh)} Ah) than the derated need.`,
      })
    }
    return { selectedAh: rung, capacityGiven: false, ladder }
  }
  const selectedAh = Math.ceil(target * 10) / 10
  warnings.push({
    code: 'beyond-ladder',
    severity: 'critical',
    field: 'capacityLadder',
    message: `No capacity in the list reaches the ${round(target)} Ah needed (largest ${ladder[ladder.length - 1]} Ah). Use parallel strings, a larger block or a lower load; ${selectedAh} Ah is shown.`,
  })
  return { selectedAh, capacityGiven: false, ladder }
}

export interface PackPerformance {
  dischargeCRate: number
  cutoffCellV: number
  usableBeginAh: number
  usableEndAh: number
  runtimeBeginH: number
  runtimeEndH: number
  energyWh: number
  massKg: Range
  volumeL: Range
  lifeYears: number
  annexMaxA: number
}

/** Step 5: runtime new and at end of life, cut-off, energy, mass, volume, service life and the Annex A current of the selected pack. */
export function packPerformance(b: PackBasis, cells: PackCells, draw: BatteryDraw, need: CapacityNeed, pack: CapacityChoice): PackPerformance {
  const { input, chemistry } = b
  const { selectedAh } = pack
  const dischargeCRate = draw.currentA / selectedAh
  const usableBeginAh = selectedAh * b.depthOfDischarge * need.coldFactor
  const usableEndAh = usableBeginAh * input.endOfLifeCapacity
  const energyWh = selectedAh * cells.n * b.nominalCellV
  const se = chemistry.specificEnergyWhPerKg.value
  const ed = chemistry.energyDensityWhPerL.value
  return {
    dischargeCRate,
    cutoffCellV: input.cutoffCellVoltage ?? cutoffCellVoltageAtRate(chemistry, dischargeCRate),
    usableBeginAh,
    usableEndAh,
    runtimeBeginH: runtimeH(usableBeginAh, draw.currentA, b.ratedH, b.peukertExponent),
    runtimeEndH: runtimeH(usableEndAh, draw.currentA, b.ratedH, b.peukertExponent),
    energyWh,
    massKg: { min: energyWh / se.max, max: energyWh / se.min },
    volumeL: { min: energyWh / ed.max, max: energyWh / ed.min },
    lifeYears: chemistryServiceLifeYears(chemistry, input.ambientMax),
    annexMaxA: need.annexFraction * selectedAh,
  }
}

/** Everything the steps found, for the checks, the charger check and the working. */
export interface SizedPack {
  basis: PackBasis
  cells: PackCells
  draw: BatteryDraw
  need: CapacityNeed
  pack: CapacityChoice
  performance: PackPerformance
}
