/**
 * `charge`: checks a luminaire's charging against the pack: charge and trickle C-rates, recharge
 * time after a full rated-duration discharge (24 h rule), float voltage with temperature
 * compensation, deep-discharge cut-off, charging temperature. Formulas: docs/method.md.
 */
import { z } from 'zod'
import { batteryDraw, chemistryIdSchema, loadFields, loadIssues } from './battery-inputs'
import { deepDischargeLimitCellV, floatCellVoltage } from './battery-models'
import { CHEMISTRIES } from './chemistries'
import { REF } from './chemistries/references'
import type { ChemistryId, Range } from './chemistries/types'
import { ambientTemperature, finiteNumber, quantity } from './fields'
import { chooseCellsInSeries, describeCellChoice } from './pack-cells'
import { addChemistryNotes, packIssues } from './pack-rules'
import { defineTool } from './tool'
import { sortWarnings, workingValue, type EngineWarning, type Reference, type WorkingStep } from './types'
import { roundToSignificant } from './round'

const SECONDS_PER_HOUR = 3600
/** IEC 60598-2-22: the rated duration must be available after a 24 h charge. */
export const RECHARGE_LIMIT_H = 24

export const voltageBasisSchema = z.enum(['pack', 'cell'], { errorMap: () => ({ message: 'must be "pack" or "cell"' }) })

export const chargeInputObject = z.object({
  chemistry: chemistryIdSchema,
  cellsInSeries: finiteNumber({ int: true, min: 1, max: 400 }).optional(),
  averageCellVoltage: quantity('voltage', { positive: true, max: 10 }).optional(),
  capacity: quantity('charge', { positive: true, max: 100_000 * SECONDS_PER_HOUR, display: { unit: 'Ah', factor: 1 / SECONDS_PER_HOUR } }),
  ...loadFields,
  /** Charger current (constant-current stage), A. */
  chargeCurrent: quantity('current', { positive: true, max: 1_000 }),
  /** Permanent current once charged; defaults to chargeCurrent (the charger keeps its current on); 0 for a charger that stops when full. */
  trickleCurrent: quantity('current', { min: 0, max: 1_000 }).optional(),
  /** Charger float / hold voltage; read per pack or per cell according to voltageBasis. */
  floatVoltage: quantity('voltage', { positive: true, max: 1_000 }).optional(),
  /** Deep-discharge disconnect voltage of the luminaire; per pack or per cell according to voltageBasis. */
  cutoffVoltage: quantity('voltage', { positive: true, max: 1_000 }).optional(),
  voltageBasis: voltageBasisSchema.default('pack'),
  ambient: ambientTemperature().default(25),
})

export const chargeInputSchema = chargeInputObject.superRefine((v, ctx) => {
  for (const issue of [...loadIssues(v), ...packIssues(v)]) ctx.addIssue({ code: z.ZodIssueCode.custom, ...issue })
  const chemistry = v.chemistry ? CHEMISTRIES[v.chemistry] : undefined
  if (chemistry && typeof v.cutoffVoltage === 'number' && v.voltageBasis === 'cell' && v.cutoffVoltage >= chemistry.nominalCellVoltage.value) {
    ctx.addIssue({
      code: z.ZodIssueCode.custom,
      path: ['cutoffVoltage'],
      message: `must be below the nominal cell voltage (${chemistry.nominalCellVoltage.value} V)`,
    })
  }
})

export type ChargeInput = z.output<typeof chargeInputSchema>

export interface FloatCheck {
  /** Temperature-compensated set point per cell at the ambient, V. */
  expectedCellVoltageV: number
  expectedPackVoltageV: number
  /** Acceptable band per cell at the ambient, V. */
  bandCellV: Range
  givenCellVoltageV?: number
  withinBand?: boolean
}

export interface ChargeResult {
  chemistry: ChemistryId
  cellsInSeries: number
  averageCurrentA: number
  chargeCRate: number
  trickleCurrentA: number
  trickleCRate: number
  trickleWithinLimit: boolean
  /** Charge taken out by one full rated-duration discharge, Ah. */
  dischargeAh: number
  rechargeTimeH: number
  rechargeWithin24h: boolean
  /** Lead-acid float check; null where the chemistry is not floated. */
  floatVoltageCheck: FloatCheck | null
  /** Cut-off per cell below the chemistry's safe minimum; null when no cut-off was given. */
  deepDischarge: boolean | null
  /** Lithium pack kept at full charge on standby (ages faster). */
  heldAtFullCharge: boolean
  warnings: EngineWarning[]
  working: WorkingStep[]
}

const v = workingValue
const round = roundToSignificant

export function checkCharge(input: ChargeInput, options: { explain?: boolean } = {}): ChargeResult {
  const explain = options.explain !== false
  const chemistry = CHEMISTRIES[input.chemistry]
  const warnings: EngineWarning[] = []
  const working: WorkingStep[] = []
  const capacityAh = input.capacity / SECONDS_PER_HOUR
  const durationH = input.duration / SECONDS_PER_HOUR
  const choice = chooseCellsInSeries(chemistry, input.driver, input.load, chemistry.cutoffCellVoltage.value, input.converterInput, input.cellsInSeries)
  const n = choice.cells
  const averageCell = input.averageCellVoltage ?? chemistry.nominalCellVoltage.value
  const perCell = (volts: number) => (input.voltageBasis === 'cell' ? volts : volts / n)

  const draw = batteryDraw(input.load, input.driver, input.driverEfficiency, n * averageCell)
  // A full test cannot take out more than the pack holds: the pack runs flat first.
  const demandAh = draw.currentA * durationH
  const dischargeAh = Math.min(demandAh, capacityAh)
  const factor = chemistry.chargeFactor.value
  const rechargeH = (dischargeAh * factor) / input.chargeCurrent
  const chargeC = input.chargeCurrent / capacityAh
  // Left empty, the charger is taken to keep its current on (as nickel chargers do) for every chemistry:
  // a charger that stops when full is typed as 0, so a blank never hides a permanent charge.
  const trickleA = input.trickleCurrent ?? input.chargeCurrent
  const trickleC = trickleA / capacityAh
  const limit = chemistry.continuousChargeRangeC.value
  const tol = 1e-9
  const trickleWithinLimit = trickleC <= limit.max + tol && (trickleC === 0 ? chemistry.family !== 'nickel' : trickleC >= limit.min - tol)
  const rechargeOk = rechargeH <= RECHARGE_LIMIT_H

  if (demandAh > capacityAh * (1 + 1e-9)) {
    warnings.push({
      code: 'load-exceeds-pack',
      severity: 'critical',
      field: 'capacity',
      message: `The load takes about ${round(demandAh)} Ah over the ${round(durationH)} h rated duration, more than the ${round(capacityAh)} Ah pack holds: the pack runs flat before the end of the test. The recharge is counted from a flat pack (${round(capacityAh)} Ah).`,
    })
  }
  // Charge rate.
  if (chargeC > chemistry.maxChargeRateC.value + tol) {
    warnings.push({
      code: 'charge-rate-high',
      severity: 'warning',
      field: 'chargeCurrent',
      message: `Charge current ${round(input.chargeCurrent)} A is ${round(chargeC)} C, above the ${chemistry.maxChargeRateC.value} C ${chemistry.name} takes ${chemistry.family === 'nickel' ? 'without end-of-charge control' : 'as an initial charge current'}.`,
    })
  }
  // Trickle / permanent charge.
  const fmtC = (c: number) => (c > 0 ? `C/${round(1 / c, 2)}` : '0')
  if (chemistry.family === 'lithium') {
    if (trickleA > 0) {
      warnings.push({
        code: 'lithium-trickle',
        severity: 'critical',
        field: 'trickleCurrent',
        message: `${chemistry.name} must not be trickle-charged at full voltage: the charger should stop when full and top up only after the voltage has dropped.`,
      })
    }
  } else if (trickleC > limit.max + tol) {
    const nimh = chemistry.id === 'nimh'
    warnings.push({
      code: nimh ? 'trickle-life-limiting' : 'trickle-above-limit',
      severity: 'warning',
      field: input.trickleCurrent !== undefined ? 'trickleCurrent' : 'chargeCurrent',
      message: nimh
        ? `A permanent trickle of ${fmtC(trickleC)} heats NiMH and shortens its life; keep it at or below about C/30.`
        : `A permanent charge of ${fmtC(trickleC)} is above the ${fmtC(limit.max)} ${chemistry.name} tolerates on permanent charge.`,
    })
  } else if (chemistry.family === 'nickel' && trickleC < limit.min - tol) {
    warnings.push({
      code: 'trickle-too-low',
      severity: 'warning',
      field: input.trickleCurrent !== undefined ? 'trickleCurrent' : 'chargeCurrent',
      message: `A permanent charge of ${fmtC(trickleC)} may not make up for self-discharge (${chemistry.selfDischargePctPerMonth.value.min}–${chemistry.selfDischargePctPerMonth.value.max} %/month); about ${fmtC(limit.min)} or more keeps ${chemistry.name} full.`,
    })
  }
  if (!rechargeOk) {
    warnings.push({
      code: 'recharge-over-24h',
      severity: 'critical',
      field: 'chargeCurrent',
      message: `Recharging after a full ${round(durationH)} h discharge takes about ${round(rechargeH)} h; the rated duration must be available again after a 24 h charge (IEC 60598-2-22). A charge current of at least ${round((dischargeAh * factor) / RECHARGE_LIMIT_H)} A is needed.`,
    })
  }
  // Charging temperature.
  const chargeRange = chemistry.chargeTemperatureC.value
  if (chemistry.noChargeBelowFreezing && input.ambient < 0) {
    warnings.push({
      code: 'charge-forbidden-cold',
      severity: 'critical',
      field: 'ambient',
      message: `${chemistry.name} must not be charged below 0 °C (lithium plating, fire risk).`,
    })
  } else if (input.ambient < chargeRange.min || input.ambient > chargeRange.max) {
    warnings.push({
      code: 'charge-temperature-range',
      severity: 'warning',
      field: 'ambient',
      message: `${chemistry.name} should be charged between ${chargeRange.min} and ${chargeRange.max} °C; the ambient is ${input.ambient} °C.`,
    })
  }

  // Lithium in the cold: the makers cut the charge current between 0 °C and about 10 °C.
  const cold = chemistry.coldCharge
  if (cold && input.ambient >= 0 && input.ambient < cold.belowC && chargeC > cold.maxRateC.value + tol) {
    warnings.push({
      code: 'charge-current-cold',
      severity: 'warning',
      field: 'chargeCurrent',
      message: `At ${input.ambient} °C ${chemistry.name} should be charged at no more than ${cold.maxRateC.value} C (${round(cold.maxRateC.value * capacityAh)} A here); ${round(chargeC)} C risks lithium plating. Use a charger that reduces its current in the cold, or keep the pack above ${cold.belowC} °C.`,
    })
  }

  // Float voltage.
  let floatVoltageCheck: FloatCheck | null = null
  if (chemistry.float) {
    const expected = floatCellVoltage(chemistry, input.ambient) as number
    const band = chemistry.float.bandAt25C?.value ?? { min: chemistry.float.cellVoltageAt25C.value, max: chemistry.float.cellVoltageAt25C.value }
    const bandCellV = {
      min: floatCellVoltage(chemistry, input.ambient, band.min) as number,
      max: floatCellVoltage(chemistry, input.ambient, band.max) as number,
    }
    floatVoltageCheck = { expectedCellVoltageV: expected, expectedPackVoltageV: expected * n, bandCellV }
    if (input.floatVoltage !== undefined) {
      const given = perCell(input.floatVoltage)
      floatVoltageCheck.givenCellVoltageV = given
      floatVoltageCheck.withinBand = given >= bandCellV.min - 0.005 && given <= bandCellV.max + 0.005
      if (!floatVoltageCheck.withinBand) {
        const low = given < bandCellV.min
        warnings.push({
          code: low ? 'float-voltage-low' : 'float-voltage-high',
          severity: 'warning',
          field: 'floatVoltage',
          message: `Float voltage ${round(given, 4)} V per cell is ${low ? 'below' : 'above'} the ${round(bandCellV.min, 3)}–${round(bandCellV.max, 3)} V band at ${input.ambient} °C: ${low ? 'the block will not stay full and will sulphate' : 'the block will overcharge, dry out and age faster'}.`,
        })
      }
    } else {
      warnings.push({
        code: 'float-voltage-expected',
        severity: 'info',
        field: 'floatVoltage',
        message: `Set the float to about ${round(expected, 3)} V per cell (${round(expected * n, 3)} V for ${n} cells) at ${input.ambient} °C, with −3 mV/°C per cell compensation.`,
      })
    }
  } else if (chemistry.family === 'nickel' && input.floatVoltage !== undefined) {
    warnings.push({
      code: 'float-not-used',
      severity: 'info',
      field: 'floatVoltage',
      message: `${chemistry.name} is charged at constant current, not floated at a voltage; the float voltage was not used.`,
    })
  } else if (
    chemistry.family === 'lithium' &&
    input.floatVoltage !== undefined &&
    perCell(input.floatVoltage) > (chemistry.maxChargeCellVoltage ?? chemistry.fullChargeCellVoltage).value + 0.005
  ) {
    const limit = (chemistry.maxChargeCellVoltage ?? chemistry.fullChargeCellVoltage).value
    warnings.push({
      code: 'lithium-overvoltage',
      severity: 'critical',
      field: 'floatVoltage',
      message: `${round(perCell(input.floatVoltage), 3)} V per cell is above the ${limit} V highest charge voltage of ${chemistry.name}: overcharge is a fire risk.`,
    })
  }

  // Lithium held at full charge.
  const heldAtFullCharge = chemistry.family === 'lithium'
  if (heldAtFullCharge) {
    warnings.push({
      code: 'lithium-held-full',
      severity: 'warning',
      message: `An emergency pack sits at full charge for years; ${chemistry.name} ages faster there, more so when warm. A hold voltage a little below full charge extends its life.`,
    })
  }

  // Deep discharge.
  let deepDischarge: boolean | null = null
  if (input.cutoffVoltage !== undefined) {
    const cutCell = perCell(input.cutoffVoltage)
    // The same rule as the sizing: the makers' final voltage at this discharge rate where they tabulate it.
    const safeCell = deepDischargeLimitCellV(chemistry, draw.currentA / capacityAh)
    deepDischarge = cutCell < safeCell - tol
    if (deepDischarge) {
      warnings.push({
        code: 'deep-discharge',
        severity: 'critical',
        field: 'cutoffVoltage',
        message: `The cut-off of ${round(cutCell, 3)} V per cell is below the safe minimum of ${safeCell} V for ${chemistry.name}${chemistry.cutoffByDischargeRate ? ` at ${round(draw.currentA / capacityAh, 2)} C` : ''}: the pack is deep-discharged on every duration test.`,
      })
    }
  } else {
    warnings.push({
      code: 'deep-discharge-protection',
      severity: 'info',
      field: 'cutoffVoltage',
      message: `Give the luminaire's deep-discharge cut-off to check it; ${chemistry.name} should stop at or above ${deepDischargeLimitCellV(chemistry, draw.currentA / capacityAh)} V per cell at this rate.`,
    })
  }
  addChemistryNotes(chemistry, warnings)

  if (explain) {
    const capRef: Reference = REF.iec61951_1('published', 'It = C/1 h.')
    working.push(
      {
        id: 'averageCurrentA',
        label: 'Average discharge current',
        formula: input.driver === 'direct' ? 'I = I_LED' : 'I = P_LED / (η · n · V_avg)',
        explanation: 'Current the pack supplies during the rated duration.',
        inputs: [v('P_LED', 'LED power', draw.loadPowerW, 'W'), v('n', 'Cells in series', n, ''), v('V_avg', 'Average cell voltage', averageCell, 'V')],
        result: v('I', 'Average current', draw.currentA, 'A'),
        references: [describeCellChoice(choice, chemistry, input.load, chemistry.cutoffCellVoltage.value, input.converterInput).reference],
      },
      {
        id: 'dischargeAh',
        label: 'Charge taken by one rated-duration discharge',
        formula: 'Q = min(I · t, C)',
        explanation: 'The ampere-hours a full rated-duration test takes out of the pack; never more than the pack holds (it runs flat first).',
        inputs: [v('I', 'Average current', draw.currentA, 'A'), v('t', 'Rated duration', durationH, 'h'), v('C', 'Capacity', capacityAh, 'Ah')],
        result: v('Q', 'Charge taken out', dischargeAh, 'Ah'),
        references: [REF.commonPractice('Charge balance')],
      },
      {
        id: 'rechargeTimeH',
        label: 'Recharge time',
        formula: 't_r = Q · f_c / I_c',
        explanation: `Charge taken out times the charge factor of ${chemistry.name}, divided by the charge current. Must be at most 24 h.`,
        inputs: [v('Q', 'Charge taken out', dischargeAh, 'Ah'), v('f_c', 'Charge factor', factor, ''), v('I_c', 'Charge current', input.chargeCurrent, 'A')],
        result: v('t_r', 'Recharge time', rechargeH, 'h'),
        references: [chemistry.chargeFactor.ref, REF.annexA('from memory', 'Rated duration available after a 24 h charge.')],
      },
      {
        id: 'chargeCRate',
        label: 'Charge rate',
        formula: 'c_c = I_c / C',
        explanation: 'Charge current as a multiple of the rated capacity per hour.',
        inputs: [v('I_c', 'Charge current', input.chargeCurrent, 'A'), v('C', 'Capacity', capacityAh, 'Ah')],
        result: v('c_c', 'Charge C-rate', chargeC, 'C'),
        references: [capRef, chemistry.maxChargeRateC.ref],
      },
      {
        id: 'trickleCRate',
        label: 'Permanent (trickle) charge rate',
        formula: 'c_t = I_t / C',
        explanation: `Compared with the ${round(limit.min, 3)}–${round(limit.max, 3)} C ${chemistry.name} tolerates on permanent charge.`,
        inputs: [v('I_t', 'Trickle current', trickleA, 'A'), v('C', 'Capacity', capacityAh, 'Ah')],
        result: v('c_t', 'Trickle C-rate', trickleC, 'C'),
        references: [chemistry.continuousChargeRangeC.ref],
      },
    )
    if (floatVoltageCheck && chemistry.float) {
      working.push({
        id: 'floatVoltageCheck',
        label: 'Temperature-compensated float voltage',
        formula: 'V_f = V_25 + α · (T − 25 °C)',
        explanation: `Float set point per cell at the ambient; compensation stops outside ${chemistry.float.compensationLimitsC?.min ?? -40}–${chemistry.float.compensationLimitsC?.max ?? 85} °C.`,
        inputs: [
          v('V_25', 'Float at 25 °C', chemistry.float.cellVoltageAt25C.value, 'V'),
          v('α', 'Coefficient', chemistry.float.coefficientVPerC.value, 'V/°C'),
          v('T', 'Ambient', input.ambient, '°C'),
        ],
        result: v('V_f', 'Float per cell', floatVoltageCheck.expectedCellVoltageV, 'V'),
        references: [chemistry.float.cellVoltageAt25C.ref, chemistry.float.coefficientVPerC.ref],
      })
    }
  }

  return {
    chemistry: chemistry.id,
    cellsInSeries: n,
    averageCurrentA: draw.currentA,
    chargeCRate: chargeC,
    trickleCurrentA: trickleA,
    trickleCRate: trickleC,
    trickleWithinLimit,
    dischargeAh,
    rechargeTimeH: rechargeH,
    rechargeWithin24h: rechargeOk,
    floatVoltageCheck,
    deepDischarge,
    heldAtFullCharge,
    warnings: sortWarnings(warnings),
    working,
  }
}

export const chargeTool = defineTool({
  name: 'charge',
  summary: 'Check charge and trickle currents, recharge time, float voltage and cut-off of an emergency luminaire pack.',
  input: chargeInputSchema,
  run: (input: ChargeInput, options) => checkCharge(input, options),
})
