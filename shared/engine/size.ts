/**
 * `size`: the battery pack an emergency luminaire needs for its rated duration, or a check of
 * an existing pack. Peukert for the discharge rate, a cold-capacity curve, an end-of-life
 * fraction, depth of discharge and a design margin; the IEC 60598-2-22 Annex A discharge
 * limit; service life at the warmest ambient. Formulas: docs/method.md.
 */
import { z } from 'zod'
import {
  batteryDraw,
  chemistryIdSchema,
  designFields,
  hours,
  loadFields,
  loadIssues,
  type ConverterInput,
  type Driver,
  type Load,
} from './battery-inputs'
import {
  annexADischargeFraction,
  capacityForRuntimeAh,
  chemistryServiceLifeYears,
  coldCapacityFactor,
  cutoffCellVoltageAtRate,
  deepDischargeLimitCellV,
  runtimeH,
} from './battery-models'
import { CHEMISTRIES } from './chemistries'
import { REF } from './chemistries/references'
import type { Chemistry, ChemistryId, Range } from './chemistries/types'
import { ambientTemperature, finiteNumber, quantity } from './fields'
import { defineTool } from './tool'
import { SEVERITY_ORDER, sortWarnings, workingValue, type EngineWarning, type Reference, type WorkingStep, type WorkingValue } from './types'
import { roundToSignificant } from './round'

const SECONDS_PER_HOUR = 3600

/** Fields the pack description adds to the load fields. */
export const sizeInputObject = z.object({
  chemistry: chemistryIdSchema,
  cellsInSeries: finiteNumber({ int: true, min: 1, max: 400 }).optional(),
  averageCellVoltage: quantity('voltage', { positive: true, max: 10 }).optional(),
  cutoffCellVoltage: quantity('voltage', { positive: true, max: 10 }).optional(),
  /** An existing pack to check (a bare number is coulombs; "4.5 Ah" reads as expected). */
  capacity: quantity('charge', { positive: true, max: 100_000 * SECONDS_PER_HOUR, display: { unit: 'Ah', factor: 1 / SECONDS_PER_HOUR } }).optional(),
  ratedHours: hours().optional(),
  peukertExponent: finiteNumber({ min: 1, max: 2 }).optional(),
  ...loadFields,
  ...designFields,
  ambientMin: ambientTemperature().default(5),
  ambientMax: ambientTemperature().default(25),
  capacityLadder: z
    .array(quantity('charge', { positive: true, max: 100_000 * SECONDS_PER_HOUR, display: { unit: 'Ah', factor: 1 / SECONDS_PER_HOUR } }), {
      invalid_type_error: 'must be a list of capacities',
    })
    .min(1, 'must hold at least one capacity')
    .max(200, 'must hold at most 200 capacities')
    .optional(),
})

type Issue = { path: (string | number)[]; message: string }

/** Cross-field checks shared with the charge tool: temperatures in order, cell voltages consistent. */
export function packIssues(v: {
  chemistry?: ChemistryId
  averageCellVoltage?: number
  cutoffCellVoltage?: number
  ambientMin?: number
  ambientMax?: number
}): Issue[] {
  const issues: Issue[] = []
  if (typeof v.ambientMin === 'number' && typeof v.ambientMax === 'number' && v.ambientMin > v.ambientMax) {
    issues.push({ path: ['ambientMin'], message: 'must not be above ambientMax' })
  }
  const chemistry = v.chemistry ? CHEMISTRIES[v.chemistry] : undefined
  if (!chemistry) return issues
  const nominal = chemistry.nominalCellVoltage.value
  if (typeof v.cutoffCellVoltage === 'number' && v.cutoffCellVoltage >= nominal) {
    issues.push({ path: ['cutoffCellVoltage'], message: `must be below the nominal cell voltage (${nominal} V for ${chemistry.name})` })
  }
  if (typeof v.averageCellVoltage === 'number') {
    const cutoff = typeof v.cutoffCellVoltage === 'number' ? v.cutoffCellVoltage : chemistry.cutoffCellVoltage.value
    const full = chemistry.fullChargeCellVoltage.value
    if (v.averageCellVoltage <= cutoff) {
      issues.push({ path: ['averageCellVoltage'], message: `must be above the end-of-discharge voltage (${cutoff} V per cell)` })
    } else if (v.averageCellVoltage > full) {
      issues.push({ path: ['averageCellVoltage'], message: `must not exceed the full-charge voltage (${full} V per cell for ${chemistry.name})` })
    }
  }
  return issues
}

export const sizeInputSchema = sizeInputObject.superRefine((v, ctx) => {
  for (const issue of [...loadIssues(v), ...packIssues(v)]) ctx.addIssue({ code: z.ZodIssueCode.custom, ...issue })
})

export type SizeInput = z.output<typeof sizeInputSchema>

export interface SizeResult {
  chemistry: ChemistryId
  cellsInSeries: number
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
  warnings: EngineWarning[]
  working: WorkingStep[]
}

export interface SizeOptions {
  /** Build the working steps (default true). The benchmark measures both ways. */
  explain?: boolean
}

const v = workingValue

function step(
  id: string,
  label: string,
  formula: string,
  explanation: string,
  inputs: WorkingValue[],
  result: WorkingValue,
  references: Reference[],
): WorkingStep {
  return { id, label, formula, explanation, inputs, result, references }
}

const round = roundToSignificant

export interface CellChoice {
  cells: number
  /** Which rule set the count: given, direct drive, converter minimum input, converter maximum input, or the usual pack. */
  rule: 'given' | 'direct' | 'window-min' | 'window-max' | 'usual'
}

const GIVEN_CELLS_REF = REF.commonPractice('Cells in series as given by the user')
const DIRECT_CELLS_REF = REF.commonPractice('Direct drive: pack voltage at cut-off must reach the LED forward voltage plus the current limiter’s headroom')
/** Volts a direct-drive current limiter (series resistor or linear regulator) needs above the LED string to hold its current. */
export const DIRECT_DRIVE_HEADROOM_V = 0.3
export const DIRECT_DRIVE_HEADROOM_REF = REF.commonPractice(
  'Linear constant-current limiters need about 0.3–0.5 V across them to regulate; a series resistor needs a share of the supply to set the current',
)
const WINDOW_CELLS_REF = REF.commonPractice('Converter drive: the pack must stay inside the converter input window')

/** Fewest cells that keep the load working to the end-of-discharge voltage, or the given count. */
export function chooseCellsInSeries(
  chemistry: Chemistry,
  driver: Driver,
  load: Load,
  cutoffCellVoltage: number,
  window: ConverterInput | undefined,
  given?: number,
): CellChoice {
  if (given !== undefined) return { cells: given, rule: 'given' }
  if (driver === 'direct') {
    // Tiny tolerance so 3 × 1.0 V exactly reaching 3.0 V does not ask for a 4th cell.
    return { cells: Math.max(1, Math.ceil(((load.ledVoltage as number) + DIRECT_DRIVE_HEADROOM_V) / cutoffCellVoltage - 1e-9)), rule: 'direct' }
  }
  if (window?.min !== undefined) {
    return { cells: Math.max(1, Math.ceil(window.min / cutoffCellVoltage - 1e-9)), rule: 'window-min' }
  }
  const preferred = chemistry.defaultCellsInSeries.value
  if (window?.max !== undefined) {
    return { cells: Math.max(1, Math.min(preferred, Math.floor(window.max / chemistry.fullChargeCellVoltage.value + 1e-9))), rule: 'window-max' }
  }
  return { cells: preferred, rule: 'usual' }
}

/** Words and source for the working step of a cell choice (built only when the working is shown). */
export function describeCellChoice(
  choice: CellChoice,
  chemistry: Chemistry,
  load: Load,
  cutoffCellVoltage: number,
  window: ConverterInput | undefined,
): { explanation: string; reference: Reference } {
  const preferred = chemistry.defaultCellsInSeries.value
  switch (choice.rule) {
    case 'given':
      return { explanation: 'Cells in series as given.', reference: GIVEN_CELLS_REF }
    case 'direct':
      return {
        explanation: `Fewest cells whose end-of-discharge voltage (n × ${cutoffCellVoltage} V) still reaches the LED string voltage ${round(load.ledVoltage as number)} V plus ${DIRECT_DRIVE_HEADROOM_V} V for the current limiter, so the string stays lit at its current to the cut-off.`,
        reference: DIRECT_CELLS_REF,
      }
    case 'window-min':
      return {
        explanation: `Fewest cells whose end-of-discharge voltage (n × ${cutoffCellVoltage} V) stays at or above the converter's minimum input ${round(window?.min as number)} V.`,
        reference: WINDOW_CELLS_REF,
      }
    case 'window-max':
      return {
        explanation: `The usual ${preferred}-cell pack for ${chemistry.name}, reduced if needed so the full-charge voltage (n × ${chemistry.fullChargeCellVoltage.value} V) stays at or below the converter's maximum input ${round(window?.max as number)} V.`,
        reference: chemistry.defaultCellsInSeries.ref,
      }
    default:
      return { explanation: `No converter input window given: the usual ${preferred}-cell pack for ${chemistry.name}.`, reference: chemistry.defaultCellsInSeries.ref }
  }
}

const byValue = (a: number, b: number) => a - b
function ladderInAh(coulombs: number[]): number[] {
  const ah: number[] = []
  for (const c of coulombs) ah.push(c / SECONDS_PER_HOUR)
  return ah.sort(byValue)
}

/** Size or check a pack on already-parsed input (numbers in base units). Pure and fast. */
export function sizePack(input: SizeInput, options: SizeOptions = {}): SizeResult {
  const explain = options.explain !== false
  const chemistry = CHEMISTRIES[input.chemistry]
  const warnings: EngineWarning[] = []
  const working: WorkingStep[] = []
  const durationH = input.duration / SECONDS_PER_HOUR
  const k = input.peukertExponent ?? chemistry.defaultPeukertExponent
  const ratedH = input.ratedHours ?? chemistry.defaultRatedHours
  const dod = input.depthOfDischarge ?? chemistry.defaultDepthOfDischarge.value
  const nominalCell = chemistry.nominalCellVoltage.value
  const averageCell = input.averageCellVoltage ?? nominalCell
  const fullCell = chemistry.fullChargeCellVoltage.value
  const designCutoffCell = input.cutoffCellVoltage ?? chemistry.cutoffCellVoltage.value

  // 1. Cells in series.
  const choice = chooseCellsInSeries(chemistry, input.driver, input.load, designCutoffCell, input.converterInput, input.cellsInSeries)
  const n = choice.cells
  const packAverageV = n * averageCell

  // 2. What the pack delivers.
  const draw = batteryDraw(input.load, input.driver, input.driverEfficiency, packAverageV)
  const currentA = draw.currentA

  // 3. Capacity needed.
  const peukertAh = capacityForRuntimeAh(currentA, durationH, ratedH, k)
  const coldFactor = coldCapacityFactor(chemistry, input.ambientMin)
  const requiredAh = (peukertAh * (1 + input.designMargin)) / (dod * input.endOfLifeCapacity * coldFactor)
  const annexFraction = annexADischargeFraction(durationH)
  const annexMinAh = currentA / annexFraction

  // 4. Pack: the one given, or the smallest ladder rung meeting both the derated need and Annex A.
  const capacityGiven = input.capacity !== undefined
  let selectedAh: number
  let ladder: number[] = []
  if (capacityGiven) {
    selectedAh = (input.capacity as number) / SECONDS_PER_HOUR
  } else {
    ladder = input.capacityLadder ? ladderInAh(input.capacityLadder) : chemistry.capacityLadderAh.value
    const need = Math.max(requiredAh, annexMinAh)
    let rung: number | undefined
    for (const c of ladder) {
      if (c >= need * (1 - 1e-9)) {
        rung = c
        break
      }
    }
    if (rung !== undefined) {
      selectedAh = rung
      if (annexMinAh > requiredAh) {
        warnings.push({
          code: 'annex-a-set-capacity',
          severity: 'info',
          message: `The IEC 60598-2-22 Annex A discharge limit (${round(annexFraction * 100)} % of rated capacity per hour for this duration) asked for more capacity (${round(annexMinAh)} Ah) than the derated need.`,
        })
      }
    } else {
      selectedAh = Math.ceil(need * 10) / 10
      warnings.push({
        code: 'beyond-ladder',
        severity: 'critical',
        field: 'capacityLadder',
        message: `No capacity in the list reaches the ${round(need)} Ah needed (largest ${ladder[ladder.length - 1]} Ah). Use parallel strings, a larger block or a lower load; ${selectedAh} Ah is shown.`,
      })
    }
  }

  // 5. Performance of that pack.
  const dischargeCRate = currentA / selectedAh
  const cutoffCell = input.cutoffCellVoltage ?? cutoffCellVoltageAtRate(chemistry, dischargeCRate)
  const usableBeginAh = selectedAh * dod * coldFactor
  const usableEndAh = usableBeginAh * input.endOfLifeCapacity
  const runtimeBeginH = runtimeH(usableBeginAh, currentA, ratedH, k)
  const runtimeEndH = runtimeH(usableEndAh, currentA, ratedH, k)
  const energyWh = selectedAh * n * nominalCell
  const se = chemistry.specificEnergyWhPerKg.value
  const ed = chemistry.energyDensityWhPerL.value
  const massKg = { min: energyWh / se.max, max: energyWh / se.min }
  const volumeL = { min: energyWh / ed.max, max: energyWh / ed.min }
  const lifeYears = chemistryServiceLifeYears(chemistry, input.ambientMax)
  const annexMaxA = annexFraction * selectedAh

  // 6. Checks.
  if (capacityGiven) {
    if (runtimeBeginH < durationH) {
      warnings.push({
        code: 'pack-too-small',
        severity: 'critical',
        field: 'capacity',
        message: `The ${round(selectedAh)} Ah pack runs about ${round(runtimeBeginH)} h when new at ${input.ambientMin} °C, short of the ${round(durationH)} h rated duration.`,
      })
    } else if (runtimeEndH < durationH) {
      warnings.push({
        code: 'pack-too-small-end-of-life',
        severity: 'critical',
        field: 'capacity',
        message: `At end of life (${round(input.endOfLifeCapacity * 100)} % capacity) the ${round(selectedAh)} Ah pack runs about ${round(runtimeEndH)} h, short of the ${round(durationH)} h rated duration; it needs about ${round(requiredAh)} Ah with the design margin.`,
      })
    } else if (selectedAh < requiredAh * (1 - 1e-9)) {
      warnings.push({
        code: 'margin-not-met',
        severity: 'warning',
        field: 'capacity',
        message: `The pack covers the rated duration at end of life but not the ${round(input.designMargin * 100)} % design margin (${round(requiredAh)} Ah would).`,
      })
    }
    if (currentA > annexMaxA * (1 + 1e-9)) {
      warnings.push({
        code: 'annex-a-discharge-exceeded',
        severity: 'warning',
        field: 'capacity',
        message: `Average discharge ${round(currentA)} A exceeds the IEC 60598-2-22 Annex A recommendation of ${round(annexFraction * 100)} % of rated capacity per hour for ${round(durationH)} h (${round(annexMaxA)} A for ${round(selectedAh)} Ah).`,
      })
    }
  }
  if (durationH < 1) {
    warnings.push({
      code: 'duration-below-minimum',
      severity: 'warning',
      field: 'duration',
      message: 'Escape-route emergency lighting needs at least 1 h (EN 1838); 3 h where people sleep or return before recharge (BS 5266-1), 90 min under NFPA 101.',
    })
  }
  if (chemistry.noChargeBelowFreezing && input.ambientMin < 0) {
    warnings.push({
      code: 'charge-forbidden-cold',
      severity: 'critical',
      field: 'ambientMin',
      message: `${chemistry.name} must not be charged below 0 °C (lithium plating, fire risk); the site goes down to ${input.ambientMin} °C. Use a charger that stops below 0 °C, a heated enclosure, or a nickel chemistry.`,
    })
  } else if (input.ambientMin < chemistry.chargeTemperatureC.value.min) {
    warnings.push({
      code: 'charge-temperature-low',
      severity: 'warning',
      field: 'ambientMin',
      message: `${chemistry.name} should be charged at ${chemistry.chargeTemperatureC.value.min} °C or above; the site goes down to ${input.ambientMin} °C.`,
    })
  }
  if (input.ambientMax > chemistry.chargeTemperatureC.value.max) {
    warnings.push({
      code: 'charge-temperature-high',
      severity: 'warning',
      field: 'ambientMax',
      message: `${chemistry.name} should be charged at ${chemistry.chargeTemperatureC.value.max} °C or below; the site reaches ${input.ambientMax} °C.`,
    })
  }
  const dischargeRange = chemistry.dischargeTemperatureC.value
  if (input.ambientMin < dischargeRange.min || input.ambientMax > dischargeRange.max) {
    warnings.push({
      code: 'discharge-temperature-range',
      severity: 'warning',
      field: input.ambientMin < dischargeRange.min ? 'ambientMin' : 'ambientMax',
      message: `${chemistry.name} is specified for discharge between ${dischargeRange.min} and ${dischargeRange.max} °C; the site range is ${input.ambientMin} to ${input.ambientMax} °C.`,
    })
  }
  if (lifeYears < input.designLifeYears) {
    warnings.push({
      code: 'service-life-short',
      severity: 'warning',
      field: 'designLifeYears',
      message: `At ${input.ambientMax} °C ${chemistry.name} lasts about ${round(lifeYears, 2)} years on standby, less than the ${input.designLifeYears}-year design life.`,
    })
  }
  if (input.designLifeYears < 4) {
    warnings.push({
      code: 'design-life-below-4-years',
      severity: 'info',
      field: 'designLifeYears',
      message: 'Emergency-luminaire batteries are designed for at least 4 years of normal operation (IEC 60598-2-22 Annex A, IEC 61347-2-7).',
    })
  }
  // One deep-discharge rule with the makers' rate table where there is one (the same table chose the default cut-off).
  const safeCell = deepDischargeLimitCellV(chemistry, dischargeCRate)
  if (cutoffCell < safeCell - 1e-9) {
    warnings.push({
      code: 'deep-discharge',
      severity: 'critical',
      field: 'cutoffCellVoltage',
      message: `An end-of-discharge voltage of ${cutoffCell} V per cell is below the safe minimum of ${safeCell} V for ${chemistry.name}${chemistry.cutoffByDischargeRate ? ` at ${round(dischargeCRate, 2)} C` : ''}: deep discharge damages the cells.`,
    })
  }
  if (input.driver === 'direct' && input.load.ledVoltage !== undefined) {
    const packCutoffV = n * cutoffCell
    if (packCutoffV < input.load.ledVoltage * (1 - 1e-9)) {
      warnings.push({
        code: 'led-string-drops-out',
        severity: choice.rule === 'given' ? 'critical' : 'warning',
        field: 'cellsInSeries',
        message: `At the end-of-discharge voltage the pack gives ${round(packCutoffV)} V, below the LED string's ${round(input.load.ledVoltage)} V: the light fades out before the pack is used up.`,
      })
    } else if (packCutoffV - input.load.ledVoltage < DIRECT_DRIVE_HEADROOM_V - 1e-9) {
      warnings.push({
        code: 'direct-drive-headroom',
        severity: 'warning',
        field: 'cellsInSeries',
        message: `At the end-of-discharge voltage the pack gives ${round(packCutoffV)} V, only ${round(packCutoffV - input.load.ledVoltage, 2)} V above the LED string's ${round(input.load.ledVoltage)} V; the current limiter needs about ${DIRECT_DRIVE_HEADROOM_V} V, so the LED current (and the light) falls before the cut-off. Add a cell or use a converter.`,
      })
    }
  }
  const window = input.converterInput
  if (input.driver === 'converter' && window) {
    if (window.min !== undefined && n * designCutoffCell < window.min * (1 - 1e-9)) {
      warnings.push({
        code: 'converter-window-low',
        severity: 'critical',
        field: 'cellsInSeries',
        message: `At cut-off the pack gives ${round(n * designCutoffCell)} V, below the converter's minimum input of ${window.min} V.`,
      })
    }
    if (window.max !== undefined && n * fullCell > window.max * (1 + 1e-9)) {
      warnings.push({
        code: 'converter-window-high',
        severity: 'critical',
        field: 'cellsInSeries',
        message: `On charge the pack reaches ${round(n * fullCell)} V, above the converter's maximum input of ${window.max} V.`,
      })
    }
  }
  if (input.peukertExponent !== undefined) {
    const typical = chemistry.peukertExponent.value
    if (input.peukertExponent < typical.min || input.peukertExponent > typical.max) {
      warnings.push({
        code: 'peukert-untypical',
        severity: 'info',
        field: 'peukertExponent',
        message: `A Peukert exponent of ${input.peukertExponent} is outside the usual ${typical.min}–${typical.max} for ${chemistry.name}.`,
      })
    }
  }
  if (input.load.mainsPower !== undefined) {
    warnings.push({
      code: 'maintained-heat',
      severity: 'info',
      field: 'ambientMax',
      message: 'In maintained mode the lamp runs from the mains and warms the luminaire: use the temperature inside the battery compartment for ambientMax.',
    })
  }
  addChemistryNotes(chemistry, warnings)

  // 7. Working.
  if (explain) {
    const refs = (...r: Reference[]) => r
    const cellWords = describeCellChoice(choice, chemistry, input.load, designCutoffCell, input.converterInput)
    working.push(
      step('cellsInSeries', 'Cells in series', 'n', cellWords.explanation, [v('V_cut', 'End-of-discharge voltage per cell', designCutoffCell, 'V')], v('n', 'Cells in series', n, ''), refs(cellWords.reference)),
      step(
        'averagePowerW',
        'Average power from the pack',
        input.driver === 'direct' ? 'P = n · V_avg · I_LED' : 'P = P_LED / η',
        input.driver === 'direct'
          ? 'Direct drive: the pack current is the LED current; the pack power is that current at the average pack voltage.'
          : 'Converter drive: the pack supplies the LED power divided by the converter efficiency.',
        input.driver === 'direct'
          ? [v('n', 'Cells in series', n, ''), v('V_avg', 'Average cell voltage', averageCell, 'V'), v('I_LED', 'LED current', currentA, 'A')]
          : [v('P_LED', 'LED power', draw.loadPowerW, 'W'), v('η', 'Converter efficiency', input.driverEfficiency, '')],
        v('P', 'Average pack power', draw.powerW, 'W'),
        refs(REF.commonPractice('Power balance of the driver')),
      ),
      step(
        'averageCurrentA',
        'Average current from the pack',
        input.driver === 'direct' ? 'I = I_LED' : 'I = P / (n · V_avg)',
        'The average discharge current over the rated duration, at the average cell voltage.',
        [v('P', 'Average pack power', draw.powerW, 'W'), v('n', 'Cells in series', n, ''), v('V_avg', 'Average cell voltage', averageCell, 'V')],
        v('I', 'Average current', currentA, 'A'),
        refs(chemistry.nominalCellVoltage.ref),
      ),
      step(
        'peukertCapacityAh',
        'Rated capacity for the discharge rate (Peukert)',
        durationH >= ratedH ? 'C_P = I · t   (t ≥ H: no credit for a slower discharge)' : 'C_P = I · H · (t / H)^(1/k)',
        `Capacity, on the ${ratedH} h rating basis, that delivers I for the rated duration: Peukert's law solved for C.`,
        [v('I', 'Average current', currentA, 'A'), v('t', 'Rated duration', durationH, 'h'), v('H', 'Rating basis', ratedH, 'h'), v('k', 'Peukert exponent', k, '')],
        v('C_P', 'Capacity at the discharge rate', peukertAh, 'Ah'),
        refs(REF.peukert(), chemistry.peukertExponent.ref),
      ),
      step(
        'coldCapacityFactor',
        'Capacity available in the cold',
        'f_T = curve(T_min)',
        `Share of rated capacity ${chemistry.name} gives at the lowest ambient, interpolated from the chemistry's temperature curve.`,
        [v('T_min', 'Lowest ambient', input.ambientMin, '°C')],
        v('f_T', 'Cold-capacity factor', coldFactor, ''),
        refs(chemistry.coldCapacityCurve.ref),
      ),
      step(
        'requiredCapacityAh',
        'Required rated capacity',
        'C_req = C_P · (1 + m) / (DoD · f_EoL · f_T)',
        'The Peukert capacity with the design margin added, divided by the usable depth of discharge, the end-of-life capacity fraction and the cold-capacity factor.',
        [
          v('C_P', 'Capacity at the discharge rate', peukertAh, 'Ah'),
          v('m', 'Design margin', input.designMargin, ''),
          v('DoD', 'Depth of discharge', dod, ''),
          v('f_EoL', 'End-of-life capacity fraction', input.endOfLifeCapacity, ''),
          v('f_T', 'Cold-capacity factor', coldFactor, ''),
        ],
        v('C_req', 'Required rated capacity', requiredAh, 'Ah'),
        refs(REF.ieee485('from memory', 'Same structure as the IEEE 485 sizing: temperature, ageing and design-margin factors.'), chemistry.defaultDepthOfDischarge.ref),
      ),
      step(
        'annexAMaxCurrentA',
        'IEC 60598-2-22 Annex A discharge limit',
        'I_max = f(t) · C / 1 h,  f(1 h) = 0.60, f(1.5 h) = 0.40, f(3 h) = 0.25',
        'Highest recommended average discharge current for the selected pack; f is interpolated linearly between the durations, held at 0.60 below 1 h, and f·t is held at 0.75 beyond 3 h.',
        [v('f', 'Allowed fraction per hour', annexFraction, ''), v('C', 'Selected capacity', selectedAh, 'Ah'), v('I', 'Average current', currentA, 'A')],
        v('I_max', 'Recommended maximum current', annexMaxA, 'A'),
        refs(REF.annexA('published', 'Worked: 4.5 Ah gives 1.125 A for 3 h and 1.8 A for 90 min.')),
      ),
      step(
        'selectedCapacityAh',
        capacityGiven ? 'Pack being checked' : 'Pack chosen',
        capacityGiven ? 'C = given' : 'C = smallest rung ≥ max(C_req, I · 1 h / f)',
        capacityGiven ? 'The existing pack, checked against the need.' : `The smallest capacity in the list (${ladder.join(', ')} Ah) that meets both the derated need and the Annex A limit.`,
        [v('C_req', 'Required rated capacity', requiredAh, 'Ah'), v('C_A', 'Capacity for the Annex A limit', annexMinAh, 'Ah')],
        v('C', 'Selected capacity', selectedAh, 'Ah'),
        refs(chemistry.capacityLadderAh.ref),
      ),
      step(
        'dischargeCRate',
        'Discharge rate',
        'c = I / C',
        'Average current as a multiple of the rated capacity per hour.',
        [v('I', 'Average current', currentA, 'A'), v('C', 'Selected capacity', selectedAh, 'Ah')],
        v('c', 'Discharge C-rate', dischargeCRate, 'C'),
        refs(REF.iec61951_1('published', 'It = C/1 h is the IEC way of writing a C-rate.')),
      ),
      step(
        'runtimeH',
        'Runtime, new pack',
        'C_u = C · DoD · f_T;  t = C_u / I if I ≤ C_u / H, else t = H · (C_u / (I · H))^k',
        `Runtime of the new pack at the lowest ambient (${input.ambientMin} °C), with the usable depth of discharge; Peukert above the rated current.`,
        [v('C_u', 'Usable capacity', usableBeginAh, 'Ah'), v('I', 'Average current', currentA, 'A'), v('H', 'Rating basis', ratedH, 'h'), v('k', 'Peukert exponent', k, '')],
        v('t', 'Runtime, new', runtimeBeginH, 'h'),
        refs(REF.peukert()),
      ),
      step(
        'runtimeEndOfLifeH',
        'Runtime at end of life',
        'C_u,EoL = C · DoD · f_T · f_EoL;  t from the same Peukert form',
        'Runtime when the pack has aged to its end-of-life capacity fraction.',
        [v('C_u,EoL', 'Usable capacity at end of life', usableEndAh, 'Ah'), v('I', 'Average current', currentA, 'A')],
        v('t_EoL', 'Runtime at end of life', runtimeEndH, 'h'),
        refs(REF.peukert()),
      ),
      step(
        'cutoffCellVoltageV',
        'End-of-discharge voltage per cell',
        input.cutoffCellVoltage !== undefined ? 'V_cut = given' : chemistry.cutoffByDischargeRate ? 'V_cut = table(c)' : 'V_cut = chemistry value',
        chemistry.cutoffByDischargeRate && input.cutoffCellVoltage === undefined
          ? 'Lead-acid: the final voltage falls as the discharge rate rises.'
          : 'The voltage per cell at which the discharge ends.',
        [v('c', 'Discharge C-rate', dischargeCRate, 'C')],
        v('V_cut', 'Cut-off per cell', cutoffCell, 'V'),
        refs((chemistry.cutoffByDischargeRate ?? chemistry.cutoffCellVoltage).ref),
      ),
      step('cutoffVoltageV', 'End-of-discharge voltage of the pack', 'V_pack,cut = n · V_cut', 'Cells in series times the cut-off per cell.',
        [v('n', 'Cells in series', n, ''), v('V_cut', 'Cut-off per cell', cutoffCell, 'V')], v('V_pack,cut', 'Pack cut-off', n * cutoffCell, 'V'), refs(chemistry.cutoffCellVoltage.ref)),
      step('energyWh', 'Nominal energy', 'E = C · n · V_nom', 'Rated capacity times nominal pack voltage.',
        [v('C', 'Selected capacity', selectedAh, 'Ah'), v('n', 'Cells in series', n, ''), v('V_nom', 'Nominal cell voltage', nominalCell, 'V')], v('E', 'Energy', energyWh, 'Wh'), refs(chemistry.nominalCellVoltage.ref)),
      step('massKg', 'Mass (range)', 'm = E / e_m', `Energy divided by the specific energy of ${chemistry.name} packs (${se.min}–${se.max} Wh/kg).`,
        [v('E', 'Energy', energyWh, 'Wh')], v('m_max', 'Heaviest estimate', massKg.max, 'kg'), refs(chemistry.specificEnergyWhPerKg.ref)),
      step('volumeL', 'Volume (range)', 'V = E / e_v', `Energy divided by the energy density of ${chemistry.name} packs (${ed.min}–${ed.max} Wh/L).`,
        [v('E', 'Energy', energyWh, 'Wh')], v('V_max', 'Largest estimate', volumeL.max, 'L'), refs(chemistry.energyDensityWhPerL.ref)),
      step(
        'serviceLifeYears',
        'Service life at the warmest ambient',
        'L = L_ref · 2^(−max(0, T_max − T_ref) / N)',
        `Standby life halves for every ${chemistry.lifeHalvingIntervalC.value} °C above ${chemistry.lifeReferenceTemperatureC} °C; no extra life is credited for a cooler place.`,
        [
          v('L_ref', 'Life at the reference temperature', chemistry.standbyLifeYearsAt25C.value, 'years'),
          v('T_ref', 'Reference temperature', chemistry.lifeReferenceTemperatureC, '°C'),
          v('N', 'Halving interval', chemistry.lifeHalvingIntervalC.value, '°C'),
          v('T_max', 'Warmest ambient', input.ambientMax, '°C'),
        ],
        v('L', 'Service life', lifeYears, 'years'),
        refs(chemistry.standbyLifeYearsAt25C.ref, chemistry.lifeHalvingIntervalC.ref),
      ),
    )
  }

  return {
    chemistry: chemistry.id,
    cellsInSeries: n,
    averageCurrentA: currentA,
    averagePowerW: draw.powerW,
    dischargeCRate,
    requiredCapacityAh: requiredAh,
    selectedCapacityAh: selectedAh,
    capacityGiven,
    runtimeH: runtimeBeginH,
    runtimeEndOfLifeH: runtimeEndH,
    cutoffVoltageV: n * cutoffCell,
    cutoffCellVoltageV: cutoffCell,
    energyWh,
    massKg,
    volumeL,
    serviceLifeYears: lifeYears,
    annexAMaxCurrentA: annexMaxA,
    warnings: inSeverityOrder(warnings) ? warnings : sortWarnings(warnings),
    working,
  }
}

/** True when the warnings are already critical → warning → info (the usual case; saves a sort). */
export function inSeverityOrder(warnings: EngineWarning[]): boolean {
  for (let i = 1; i < warnings.length; i++) if (SEVERITY_ORDER[warnings[i - 1].severity] > SEVERITY_ORDER[warnings[i].severity]) return false
  return true
}

/** Restrictions, disposal and the competent-person note every pack result carries. */
export function addChemistryNotes(chemistry: Chemistry, warnings: EngineWarning[]): void {
  if (chemistry.id === 'nicd' || chemistry.id === 'nicd-ht') {
    warnings.push({
      code: 'cadmium-restricted',
      severity: 'warning',
      field: 'chemistry',
      message: 'Cadmium: EU Regulation 2023/1542 limits portable batteries to 0.002 % Cd and no longer exempts emergency lighting; whether this pack is portable or industrial is unsettled, so check the classification before specifying NiCd. Recycle, never bin.',
    })
  } else if (chemistry.family === 'lithium') {
    warnings.push({
      code: 'lithium-safety',
      severity: 'info',
      field: 'chemistry',
      message: 'Lithium: transport needs UN 38.3 evidence; cells can overheat and burn if abused or charged below 0 °C; look for IEC 62133-2 or IEC 62619 and a protection board.',
    })
  } else if (chemistry.family === 'lead') {
    warnings.push({
      code: 'lead-acid-handling',
      severity: 'info',
      field: 'chemistry',
      message: 'Lead-acid: contains lead and sulphuric acid; keep it charged in store and return it for recycling.',
    })
  }
  warnings.push({
    code: 'competent-person',
    severity: 'info',
    message: 'Engineering estimate only: isolate the mains before work on a luminaire; local codes, the standards in force and a competent, licensed person decide.',
  })
}

export const sizeTool = defineTool({
  name: 'size',
  summary: 'Size a battery pack for an emergency luminaire, or check an existing pack, for its rated duration.',
  input: sizeInputSchema,
  run: (input: SizeInput, options) => sizePack(input, options),
})
