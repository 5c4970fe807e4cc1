/**
 * `size`: the battery pack an emergency luminaire needs for its rated duration, or a check of
 * an existing pack. Peukert for the discharge rate, a cold-capacity curve, an end-of-life
 * fraction, depth of discharge and a design margin; the IEC 60598-2-22 Annex A discharge
 * limit; service life at the warmest ambient; the charger, when given. Formulas: docs/method.md.
 *
 * `sizePack` is a sequence of named steps (size-steps.ts), then the checks (size-checks.ts), the
 * charger check (size-charger.ts) and the working (size-working.ts).
 */
import type { ChemistryId, Range } from './chemistries/types'
import { addChemistryNotes, inSeverityOrder } from './pack-rules'
import { packChecks } from './size-checks'
import { checkPackCharger, type SizeChargerCheck } from './size-charger'
import type { SizeInput } from './size-input'
import { sizeInputSchema } from './size-input'
import { capacityNeed, chooseCells, packBasis, packDraw, packPerformance, selectCapacity, type SizedPack } from './size-steps'
import { sizeWorking } from './size-working'
import { defineTool } from './tool'
import { sortWarnings, type EngineWarning, type WorkingStep } from './types'

export { cellFormatSchema, dischargeIssues, LUMINAIRE_MODES, luminaireModeSchema, packChargerSchema, sizeInputObject, sizeInputSchema } from './size-input'
export type { LuminaireMode, PackCharger, SizeInput } from './size-input'
export { chooseCellsInSeries, describeCellChoice, type CellChoice } from './pack-cells'
export { addChemistryNotes, inSeverityOrder, packIssues } from './pack-rules'
export type { SizeChargerCheck } from './size-charger'

export interface SizeResult {
  chemistry: ChemistryId
  cellsInSeries: number
  /** Nominal pack voltage, n × nominal cell voltage: what a pack is ordered by. */
  nominalVoltageV: number
  /** Cell format as given (e.g. "sub-C"); null when not given. */
  cellFormat: string | null
  averageCurrentA: number
  averagePowerW: number
  dischargeCRate: number
  requiredCapacityAh: number
  selectedCapacityAh: number
  /** True when `capacity` was given and checked rather than chosen. */
  capacityGiven: boolean
  runtimeH: number
  runtimeEndOfLifeH: number
  cutoffVoltageV: number
  cutoffCellVoltageV: number
  energyWh: number
  massKg: Range
  volumeL: Range
  serviceLifeYears: number
  /** IEC 60598-2-22 Annex A: highest recommended average current for the selected pack and duration. */
  annexAMaxCurrentA: number
  /** The luminaire's charger checked against this pack; null when no charger was given. */
  chargerCheck: SizeChargerCheck | null
  warnings: EngineWarning[]
  working: WorkingStep[]
}

export interface SizeOptions {
  /** Build the working steps (default true). The benchmark measures both ways. */
  explain?: boolean
}

/** Size or check a pack on already-parsed input (numbers in base units). Pure and fast. */
export function sizePack(input: SizeInput, options: SizeOptions = {}): SizeResult {
  const explain = options.explain !== false
  const warnings: EngineWarning[] = []
  const basis = packBasis(input)
  const cells = chooseCells(basis) // 1. cells in series
  const draw = packDraw(basis, cells) // 2. what the pack delivers
  const need = capacityNeed(basis, draw) // 3. capacity needed
  const pack = selectCapacity(basis, need, warnings) // 4. the pack chosen or given
  const performance = packPerformance(basis, cells, draw, need, pack) // 5. how it performs
  const sized: SizedPack = { basis, cells, draw, need, pack, performance }
  packChecks(sized, warnings) // 6. checks
  const charger = input.charger ? checkPackCharger(sized, input.charger, explain) : null // 7. the charger, when given
  if (charger) {
    for (const w of charger.check.warnings)
      if (w.severity === 'critical')
        warnings.push({ ...w, message: `Charger: ${w.message}`, field: w.field?.startsWith('charger.') ? w.field : `charger.${w.field ?? 'chargeCurrent'}` })
  }
  addChemistryNotes(basis.chemistry, warnings)
  const working = explain ? [...sizeWorking(sized), ...(charger?.working ?? [])] : [] // 8. working

  return {
    chemistry: basis.chemistry.id,
    cellsInSeries: cells.n,
    nominalVoltageV: cells.nominalVoltageV,
    cellFormat: input.cellFormat ?? null,
    averageCurrentA: draw.currentA,
    averagePowerW: draw.powerW,
    dischargeCRate: performance.dischargeCRate,
    requiredCapacityAh: need.requiredAh,
    selectedCapacityAh: pack.selectedAh,
    capacityGiven: pack.capacityGiven,
    runtimeH: performance.runtimeBeginH,
    runtimeEndOfLifeH: performance.runtimeEndH,
    cutoffVoltageV: cells.n * performance.cutoffCellV,
    cutoffCellVoltageV: performance.cutoffCellV,
    energyWh: performance.energyWh,
    massKg: performance.massKg,
    volumeL: performance.volumeL,
    serviceLifeYears: performance.lifeYears,
    annexAMaxCurrentA: performance.annexMaxA,
    chargerCheck: charger?.check ?? null,
    warnings: inSeverityOrder(warnings) ? warnings : sortWarnings(warnings),
    working,
  }
}

export const sizeTool = defineTool({
  name: 'size',
  summary: 'Size a battery pack for an emergency luminaire, or check an existing pack, for its rated duration (and its charger, when given).',
  input: sizeInputSchema,
  run: (input: SizeInput, options) => sizePack(input, options),
})
