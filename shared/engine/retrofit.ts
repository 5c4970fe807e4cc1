/**
 * Trickle retrofit: plan a gentler trickle current for an installed self-contained luminaire by
 * adding a resistor in the battery lead, with a diode across it that carries the discharge current.
 *
 * Model, stated once:
 * - The charger, seen from the battery lead, is a Thévenin source: open-circuit voltage V_oc behind
 *   an internal resistance R_int. Charge current I = (V_oc − V_pack) / (R_int + R_series).
 * - The two readings (the present current at the full-charge battery voltage, plus either the current
 *   with a known test resistor added or the open-circuit voltage) fix V_oc and R_int. The battery
 *   voltage is taken as unchanged during the test-resistor reading.
 * - Pack voltage rises linearly with state of charge, from the chemistry's cut-off voltage (× cells)
 *   when empty to the measured full-charge voltage when full. Recharge time is integrated over it.
 */
import { defineTool } from './tool'
import { sortWarnings, workingValue, type EngineWarning, type WorkingStep } from './types'
import { getChemistry, type Chemistry } from './chemistries'
import { nearestPreferred, resistorRatingFor, type ESeriesName } from './resistor-series'
import { significantText } from './round'

import {
  DIODE_DROP,
  DIODE_FORWARD_VOLTAGE,
  IEC_60063,
  JOULE,
  LINEAR_MODEL,
  OHM,
  RATING_MARGIN,
  RECHARGE_24H,
  RECHARGE_STEPS,
  RESISTOR_RATING_MARGIN,
  THEVENIN,
  VOLTAGE_LIMITED,
  chargeCurrent,
  fitChargerThevenin,
  largestResistanceWithin,
  rechargeTimeHours,
  runtimeChangePctFor,
} from './retrofit-model'
import { retrofitInput, type RetrofitInput } from './retrofit-input'

export * from './retrofit-model'
export * from './retrofit-input'

// ---------------------------------------------------------------------------------------------
// Result
// ---------------------------------------------------------------------------------------------

export interface SeriesPick {
  series: ESeriesName
  ohm: number
  /** Trickle current at full charge with this resistor, A. */
  currentA: number
  trickleCRate: number
  /** Dissipation at the start of a recharge (pack at cut-off, highest current), W. */
  dissipationW: number
  /** Dissipation at the steady trickle, W. */
  dissipationAtTrickleW: number
  /** Stocked rating ≥ 2 × worst-case dissipation, W; null when above the largest listed (5 W). */
  ratingW: number | null
  rechargeTimeH: number
}

export interface RetrofitResult {
  chargerOpenCircuitV: number
  chargerInternalResistanceOhm: number
  presentTrickleCRate: number
  targetCurrentA: number
  /** Exact series resistance for the target current, Ω (null when no resistor can reach it). */
  seriesResistanceOhm: number | null
  e12: SeriesPick | null
  e24: SeriesPick | null
  /** Worst-case dissipation of the E24 resistor (start of a recharge), W. */
  resistorDissipationW: number | null
  resistorRatingW: number | null
  /** Trickle C-rate with the E24 resistor (the present rate when no resistor is fitted). */
  newTrickleCRate: number
  trickleWithinLimit: boolean
  permittedTrickleRangeC: { min: number; max: number }
  rechargeTimeBeforeH: number
  rechargeTimeAfterH: number
  rechargeWithin24h: boolean
  /** Largest added resistance that still recharges within 24 h, Ω (null when it already takes longer). */
  maxSeriesResistanceFor24hOhm: number | null
  diodeForwardV: number
  diodeDissipationW: number
  /** Voltage at the load on battery, at the nominal pack voltage, V. */
  loadVoltageOnBatteryV: number
  effectiveCutoffCellV: number
  runtimeChangePct: number
  indicatorMayGoOut: boolean | null
  cautions: string[]
  warnings: EngineWarning[]
  working: WorkingStep[]
}

// ---------------------------------------------------------------------------------------------
// The plan
// ---------------------------------------------------------------------------------------------

const fmt = significantText
const val = workingValue

export const RETROFIT_CAUTIONS: readonly string[] = [
  'Modifying a certified emergency luminaire can void its certification and warranty and may breach the product standard it was approved to; the person who modifies it takes on that responsibility.',
  'Only a competent, licensed person should do this work, with the mains isolated and locked off and the battery disconnected first: a pack can deliver a high current into a short.',
  'After any change, recharge fully and repeat the full rated-duration test, and record it in the log book.',
  'These figures are engineering estimates; the standards in force, local codes and a competent person decide whether the change is acceptable.',
]

export function planRetrofit(input: RetrofitInput): RetrofitResult {
  const warnings: EngineWarning[] = []
  const working: WorkingStep[] = []
  const chem: Chemistry = getChemistry(input.chemistry)
  const cells = input.cellsInSeries
  const capacityAh = input.capacity / 3600
  const I1 = input.trickleCurrent
  const Vb = input.batteryVoltage

  // --- Charger as a Thévenin source (validated by the schema).
  const fit = fitChargerThevenin(I1, Vb, input.secondReading)
  if (!fit.ok) throw new Error(`planRetrofit needs validated input: ${fit.message}`)
  const Voc = fit.openCircuitV
  const Rint = fit.internalResistanceOhm
  const second = input.secondReading
  working.push({
    id: 'chargerThevenin',
    label: 'Charger as a Thévenin source',
    formula: second.kind === 'test-resistor' ? 'R_int = I₂·R_t / (I₁ − I₂);  V_oc = V_b + I₁·R_int' : 'R_int = (V_oc − V_b) / I₁',
    explanation:
      'Seen from the battery lead, the charger is modelled as an open-circuit voltage behind an internal resistance. ' +
      (second.kind === 'test-resistor'
        ? 'The present current and the current with a known resistor added fix both, taking the battery voltage as unchanged between the two readings.'
        : 'The open-circuit voltage is read directly; the internal resistance follows from the present current at the full-charge battery voltage.'),
    inputs: [
      val('I₁', 'present trickle current', I1, 'A'),
      val('V_b', 'battery voltage at full charge', Vb, 'V'),
      ...(second.kind === 'test-resistor'
        ? [val('R_t', 'test resistance', second.resistance, 'Ω'), val('I₂', 'current with test resistor', second.current, 'A')]
        : [val('V_oc', 'open-circuit voltage', second.voltage, 'V')]),
    ],
    result: val('R_int', 'charger internal resistance', Rint, 'Ω'),
    references: [THEVENIN, OHM],
  })

  // --- Sanity of the pack reading against the chemistry.
  const expectedFullV = chem.fullChargeCellVoltage.value * cells
  if (Math.abs(Vb / expectedFullV - 1) > 0.1) {
    warnings.push({
      code: 'battery-voltage-unexpected',
      severity: 'warning',
      field: 'batteryVoltage',
      message: `batteryVoltage (${fmt(Vb)} V) is more than 10 % from the ${fmt(expectedFullV)} V expected for ${cells} ${chem.name} cells at full charge; check cellsInSeries and chemistry.`,
    })
  }
  if (VOLTAGE_LIMITED.includes(chem.id)) {
    warnings.push({
      code: chem.continuousChargeRangeC.value.max === 0 ? 'no-trickle-chemistry' : 'voltage-limited-chemistry',
      severity: chem.continuousChargeRangeC.value.max === 0 ? 'critical' : 'warning',
      field: 'chemistry',
      message:
        chem.continuousChargeRangeC.value.max === 0
          ? `${chem.name} tolerates no continuous charge at full voltage; a resistor does not make a trickle charger safe for it. Use the charger designed for the cells.`
          : `${chem.name} is charged to a voltage limit (float), not by a constant trickle; a series resistor lowers the float voltage it reaches, and the current-source model here describes it poorly.`,
    })
  }

  // --- Target and series resistance.
  const targetA = input.targetTrickleCurrent ?? (input.targetTrickleRateC as number) * capacityAh
  const drive = Voc - Vb
  const exactR = drive / targetA - Rint
  const presentRate = I1 / capacityAh
  const range = chem.continuousChargeRangeC.value
  const resistorPossible = exactR > 1e-9 * Math.max(1, Rint)
  working.push({
    id: 'seriesResistance',
    label: 'Series resistance for the target current',
    formula: 'R_s = (V_oc − V_b) / I_target − R_int',
    explanation: 'The added resistance that brings the full-charge trickle current down to the target.',
    inputs: [
      val('V_oc', 'open-circuit voltage', Voc, 'V'),
      val('V_b', 'battery voltage at full charge', Vb, 'V'),
      val('I_target', 'target trickle current', targetA, 'A'),
      val('R_int', 'internal resistance', Rint, 'Ω'),
    ],
    result: val('R_s', 'series resistance', exactR, 'Ω'),
    references: [OHM],
  })

  // --- Recharge after a full rated-duration discharge.
  const durationH = input.duration / 3600
  let dischargedAh = input.dischargeCurrent * durationH
  if (dischargedAh > capacityAh) {
    warnings.push({
      code: 'discharge-exceeds-capacity',
      severity: 'critical',
      field: 'dischargeCurrent',
      message: `dischargeCurrent × duration (${fmt(dischargedAh)} Ah) is more than the rated capacity (${fmt(capacityAh)} Ah): the rated duration cannot be met; recharge is worked from empty.`,
    })
    dischargedAh = capacityAh
  }
  const emptyV = chem.cutoffCellVoltage.value * cells
  const rechargeFor = (addedOhm: number) =>
    rechargeTimeHours({
      openCircuitV: Voc,
      totalResistanceOhm: Rint + addedOhm,
      packFullV: Vb,
      packEmptyV: emptyV,
      capacityAh,
      dischargedAh,
      chargeFactor: chem.chargeFactor.value,
    })
  const rechargeTimeBeforeH = rechargeFor(0)
  const maxSeriesResistanceFor24hOhm = rechargeTimeBeforeH > 24 ? null : largestResistanceWithin(24, rechargeFor)

  const pick = (series: ESeriesName): SeriesPick => {
    const ohm = nearestPreferred(exactR, series)
    const currentA = chargeCurrent(Voc, Vb, Rint + ohm)
    const startCurrentA = chargeCurrent(Voc, emptyV, Rint + ohm)
    const dissipationW = startCurrentA ** 2 * ohm
    return {
      series,
      ohm,
      currentA,
      trickleCRate: currentA / capacityAh,
      dissipationW,
      dissipationAtTrickleW: currentA ** 2 * ohm,
      ratingW: resistorRatingFor(dissipationW, RESISTOR_RATING_MARGIN),
      rechargeTimeH: rechargeFor(ohm),
    }
  }

  let e12: SeriesPick | null = null
  let e24: SeriesPick | null = null
  if (resistorPossible) {
    e12 = pick('E12')
    e24 = pick('E24')
    working.push({
      id: 'standardResistor',
      label: 'Nearest preferred value (E24)',
      formula: 'R = nearest E24 value to R_s;  I = (V_oc − V_b) / (R_int + R)',
      explanation: 'The preferred value nearest by ratio to the exact resistance, and the trickle current it gives. The E12 choice is listed beside it.',
      inputs: [val('R_s', 'exact series resistance', exactR, 'Ω')],
      result: val('I_new', 'new trickle current', e24.currentA, 'A'),
      references: [IEC_60063, OHM],
    })
    working.push({
      id: 'resistorDissipation',
      label: 'Resistor dissipation and rating',
      formula: 'P = I_start² · R,  I_start = (V_oc − V_empty) / (R_int + R);  rating ≥ 2 · P',
      explanation:
        'The resistor runs hottest at the start of a recharge, when the pack is at its cut-off voltage and the current is highest; the rating is the next stocked value at least twice that.',
      inputs: [val('R', 'E24 resistance', e24.ohm, 'Ω'), val('V_empty', 'pack voltage at cut-off', emptyV, 'V')],
      result: val('P', 'worst-case dissipation', e24.dissipationW, 'W'),
      references: [JOULE, RATING_MARGIN],
    })
    if (e24.ratingW === null) {
      warnings.push({
        code: 'resistor-too-hot',
        severity: 'critical',
        message: `The resistor would dissipate up to ${fmt(e24.dissipationW)} W; with margin that is above the largest rating listed (5 W). A resistor is the wrong tool here: the heat inside the luminaire would be a hazard.`,
      })
    }
  } else if (exactR < 0) {
    warnings.push({
      code: 'cannot-raise-current',
      severity: 'critical',
      field: input.targetTrickleCurrent !== undefined ? 'targetTrickleCurrent' : 'targetTrickleRateC',
      message: 'The target is above the present trickle current; a series resistor can only lower it. The figures below are for the luminaire as it is.',
    })
  } else {
    warnings.push({
      code: 'no-resistor-needed',
      severity: 'info',
      message: 'The target equals the present trickle current, so no resistor is needed.',
    })
  }

  const newCurrentA = e24?.currentA ?? I1
  const newTrickleCRate = newCurrentA / capacityAh
  const trickleWithinLimit = newTrickleCRate >= range.min && newTrickleCRate <= range.max
  working.push({
    id: 'trickleRate',
    label: 'New trickle rate against the permitted continuous range',
    formula: 'rate = I_new / C',
    explanation: `The continuous (trickle) charge the cells tolerate, from the chemistry data: ${fmt(range.min)} C to ${fmt(range.max)} C.`,
    inputs: [val('I_new', 'new trickle current', newCurrentA, 'A'), val('C', 'rated capacity', capacityAh, 'Ah')],
    result: val('rate', 'new trickle rate', newTrickleCRate, 'C'),
    references: [chem.continuousChargeRangeC.ref],
  })
  if (newTrickleCRate > range.max) {
    warnings.push({
      code: 'trickle-above-limit',
      severity: 'warning',
      message: `The new trickle rate (${fmt(newTrickleCRate)} C) is above the ${fmt(range.max)} C the cells tolerate continuously; they will age faster.`,
    })
  } else if (newTrickleCRate < range.min) {
    warnings.push({
      code: 'trickle-below-range',
      severity: 'warning',
      message: `The new trickle rate (${fmt(newTrickleCRate)} C) is below ${fmt(range.min)} C: it may not make up self-discharge, so the pack may not stay full.`,
    })
  }

  const rechargeTimeAfterH = e24?.rechargeTimeH ?? rechargeTimeBeforeH
  const rechargeWithin24h = rechargeTimeAfterH <= 24
  working.push({
    id: 'rechargeTime',
    label: 'Recharge time after a full rated-duration discharge',
    formula: 't = Σ k·C·Δq / I(V(q)),  V(q) = V_empty + (V_b − V_empty)·q,  I = (V_oc − V) / (R_int + R)',
    explanation: `Integrated numerically in ${RECHARGE_STEPS} fixed steps of state of charge. The charge current falls as the pack voltage rises, so the recharge takes longer than the charge divided by the starting current. The pack voltage is taken as linear in state of charge; the charge factor k is the Ah put in per Ah taken out.`,
    inputs: [
      val('Q', 'charge taken out (discharge current × rated duration)', dischargedAh, 'Ah'),
      val('k', 'charge factor', chem.chargeFactor.value, ''),
      val('t_before', 'recharge time before', rechargeTimeBeforeH, 'h'),
    ],
    result: val('t_after', 'recharge time after', rechargeTimeAfterH, 'h'),
    references: [RECHARGE_24H, LINEAR_MODEL, chem.chargeFactor.ref],
  })
  if (!rechargeWithin24h) {
    warnings.push({
      code: 'recharge-over-24h',
      severity: 'critical',
      message: `Recharge after a full rated-duration discharge would take about ${fmt(rechargeTimeAfterH)} h, more than the 24 h the luminaire standard allows${maxSeriesResistanceFor24hOhm === null ? ' (it already did before the change)' : `; keep the added resistance below about ${fmt(maxSeriesResistanceFor24hOhm)} Ω`}.`,
    })
  }

  // --- The bypass diode.
  let Vf: number
  if (input.diodeForwardVoltage !== undefined) Vf = input.diodeForwardVoltage
  else {
    Vf = DIODE_FORWARD_VOLTAGE[input.diodeType ?? 'silicon']
    if (input.diodeType === undefined) {
      warnings.push({
        code: 'diode-assumed-silicon',
        severity: 'info',
        field: 'diodeType',
        message: 'No diode given: a silicon diode (≈ 0.7 V) is assumed. A Schottky diode (≈ 0.35 V) costs less runtime.',
      })
    }
  }
  const nominalV = chem.nominalCellVoltage.value * cells
  const loadVoltageOnBatteryV = nominalV - Vf
  const effectiveCutoffCellV = (emptyV + Vf) / cells
  const runtimeChangePct = runtimeChangePctFor(Vf, Vb, emptyV)
  const diodeDissipationW = Vf * input.dischargeCurrent
  working.push({
    id: 'bypassDiode',
    label: 'Bypass diode: load voltage, cut-off and runtime',
    formula: 'V_load = V_nom − V_f;  V_cut,eff = (V_cut,load + V_f) / n;  Δt/t = −V_f / (V_b − V_empty)',
    explanation:
      'On battery the discharge current flows through the diode, so the load sees the pack voltage less the diode drop. The luminaire still cuts out at its own threshold (taken as the chemistry cut-off × cells at the load), so the pack now stops higher by V_f. With pack voltage linear in charge, the fraction of charge left unused is V_f over the voltage span.',
    inputs: [val('V_f', 'diode forward voltage', Vf, 'V'), val('n', 'cells in series', cells, ''), val('V_nom', 'nominal pack voltage', nominalV, 'V')],
    result: val('Δt/t', 'runtime change', runtimeChangePct, '%'),
    references: [DIODE_DROP, LINEAR_MODEL],
  })
  if (runtimeChangePct < 0) {
    warnings.push({
      code: 'runtime-loss',
      severity: runtimeChangePct <= -10 ? 'critical' : 'warning',
      field: 'diodeForwardVoltage',
      message: `The diode drop raises the effective cut-off to ${fmt(effectiveCutoffCellV)} V per cell and may shorten the runtime by about ${fmt(-runtimeChangePct, 2)} % (linear model); the rated duration may no longer be met.`,
    })
  }

  // --- Charge indicator.
  let indicatorMayGoOut: boolean | null = null
  if (input.chargeIndicatorThreshold !== undefined) {
    indicatorMayGoOut = newCurrentA < input.chargeIndicatorThreshold
    if (indicatorMayGoOut) {
      warnings.push({
        code: 'indicator-may-go-out',
        severity: 'warning',
        field: 'chargeIndicatorThreshold',
        message: `The new trickle current (${fmt(newCurrentA * 1000)} mA) is below the charge indicator's threshold (${fmt(input.chargeIndicatorThreshold * 1000)} mA): the indicator may go out and the luminaire would look faulty in routine checks.`,
      })
    }
  }

  return {
    chargerOpenCircuitV: Voc,
    chargerInternalResistanceOhm: Rint,
    presentTrickleCRate: presentRate,
    targetCurrentA: targetA,
    seriesResistanceOhm: resistorPossible ? exactR : null,
    e12,
    e24,
    resistorDissipationW: e24?.dissipationW ?? null,
    resistorRatingW: e24?.ratingW ?? null,
    newTrickleCRate,
    trickleWithinLimit,
    permittedTrickleRangeC: { min: range.min, max: range.max },
    rechargeTimeBeforeH,
    rechargeTimeAfterH,
    rechargeWithin24h,
    maxSeriesResistanceFor24hOhm,
    diodeForwardV: Vf,
    diodeDissipationW,
    loadVoltageOnBatteryV,
    effectiveCutoffCellV,
    runtimeChangePct,
    indicatorMayGoOut,
    cautions: [...RETROFIT_CAUTIONS, ...chem.hazards],
    warnings: sortWarnings(warnings),
    working,
  }
}

export const retrofitTool = defineTool({
  name: 'retrofit',
  summary: 'Plan a gentler trickle current with a series resistor and bypass diode: resistor value and rating, recharge time, runtime effect.',
  input: retrofitInput,
  run: planRetrofit,
})
