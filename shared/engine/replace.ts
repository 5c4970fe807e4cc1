/**
 * `replace`: a replacement for a dead pack, starting from what its label says. Keeps the nominal
 * voltage, checks each candidate against the luminaire's charger, its rated duration at end of life,
 * its duty (high-temperature cells for maintained luminaires or warm places) and the cell format,
 * then recommends one. Rules and sources: docs/method.md, "Replacing a pack (`replace`)".
 */
import { batteryDraw } from './battery-inputs'
import { capacityForRuntimeAh, chemistryServiceLifeYears, coldCapacityFactor, runtimeH } from './battery-models'
import { CHEMISTRIES, CHEMISTRY_IDS } from './chemistries'
import { REF } from './chemistries/references'
import type { Chemistry, ChemistryId } from './chemistries/types'
import { cellsForVoltage, sameNominalVoltage } from './pack-cells'
import { chargerFit, chargerTypeForFamily, type ChargerType, type ChargerVerdict } from './pack-charger'
import { addChemistryNotes } from './pack-rules'
import { replaceInputSchema, type ReplaceInput } from './replace-input'
import { roundToSignificant as round } from './round'
import { defineTool } from './tool'
import { sortWarnings, workingValue as v, type EngineWarning, type WorkingStep } from './types'

export { replaceInputSchema, type ReplaceInput } from './replace-input'

const SECONDS_PER_HOUR = 3600
/** IEC 60598-2-22 Annex A and IEC 61347-2-7: at least 4 years of normal operation. */
const DESIGN_LIFE_YEARS = 4
const RECHARGE_LIMIT_H = 24
/** With the current only assumed from the old label, packs are compared with the old one at room temperature (rated capacity). */
const LABEL_COMPARISON_AMBIENT_C = 20

export interface ReplaceCandidate {
  chemistry: ChemistryId
  name: string
  cellsInSeries: number
  nominalVoltageV: number
  capacityAh: number
  cellFormat: string | null
  /** 'given' by the user, or 'proposed' by the tool. */
  source: 'given' | 'proposed'
  dischargeCurrentA: number
  runtimeH: number
  runtimeEndOfLifeH: number
  meetsDuration: boolean
  sameVoltage: boolean
  chargerCompatible: ChargerVerdict
  chargeCRate: number
  trickleCRate: number
  rechargeTimeH: number
  /** Suits the duty's temperature (high-temperature cells where needed, life ≥ 4 years at the warmest ambient). */
  suitsTemperature: boolean
  serviceLifeYears: number
  sameFormat: boolean | null
  reasons: string[]
}

export interface ReplaceResult {
  oldPack: { chemistry: ChemistryId; name: string; cellsInSeries: number; nominalVoltageV: number; capacityAh: number; cellFormat: string | null }
  oldPackNominalVoltageV: number
  /** Where the discharge current came from: the load, a measurement, or the old pack's label (assumed). */
  dischargeSource: 'load' | 'measured' | 'label'
  dischargeCurrentA: number
  requiredCapacityAh: number
  needsHighTemperature: boolean
  chargerType: ChargerType
  assumedChargerType: Exclude<ChargerType, 'unknown'>
  candidates: ReplaceCandidate[]
  recommended: number | null
  warnings: EngineWarning[]
  working: WorkingStep[]
}

const sameFamily = (a: Chemistry, b: Chemistry) => a.family === b.family
const normFormat = (f: string) => f.toLowerCase().replace(/[\s_-]+/g, '')

interface Duty {
  input: ReplaceInput
  old: Chemistry
  oldCells: number
  oldVoltage: number
  oldCapacityAh: number
  durationH: number
  currentA: number
  needsHT: boolean
  /** Ambient the runtimes are worked at: the coldest ambient, or 20 °C when the current is only assumed from the old label (packs are then compared with the old one). */
  runtimeAmbientC: number
  chargerType: Exclude<ChargerType, 'unknown'>
  trickleA: number
}

/** Discharge current from a candidate pack of this voltage: the load through its driver, or the same power as from the old pack. */
function currentFor(duty: Duty, volts: number): number {
  const { input } = duty
  if (input.load && input.dischargeCurrent === undefined) return batteryDraw(input.load, input.driver, input.driverEfficiency, volts).currentA
  return (duty.currentA * duty.oldVoltage) / volts
}

/** Usable capacity factor (depth of discharge × cold factor) and Peukert terms of a chemistry at the duty's coldest ambient. */
function usable(chemistry: Chemistry, duty: Duty) {
  return {
    factor: chemistry.defaultDepthOfDischarge.value * coldCapacityFactor(chemistry, duty.runtimeAmbientC),
    H: chemistry.defaultRatedHours,
    k: chemistry.defaultPeukertExponent,
  }
}

/** Rated capacity a chemistry needs to run `currentA` for the rated duration at end of life, at the coldest ambient. */
function requiredAh(chemistry: Chemistry, duty: Duty, currentA: number): number {
  const u = usable(chemistry, duty)
  return capacityForRuntimeAh(currentA, duty.durationH, u.H, u.k) / (u.factor * duty.input.endOfLifeCapacity)
}

function evaluate(
  duty: Duty,
  c: { chemistry: ChemistryId; cellsInSeries: number; capacityAh: number; cellFormat: string | null; source: 'given' | 'proposed' },
): ReplaceCandidate {
  const chemistry = CHEMISTRIES[c.chemistry]
  const reasons: string[] = []
  const volts = c.cellsInSeries * chemistry.nominalCellVoltage.value
  const sameVoltage = sameNominalVoltage(volts, duty.oldVoltage)
  if (!sameVoltage)
    reasons.push(
      `${c.cellsInSeries} × ${chemistry.nominalCellVoltage.value} V = ${round(volts)} V, not the ${round(duty.oldVoltage)} V of the old pack: the luminaire's charger and driver are made for ${round(duty.oldVoltage)} V.`,
    )
  const currentA = currentFor(duty, volts)
  const u = usable(chemistry, duty)
  const usableAh = c.capacityAh * u.factor
  const runtimeNewH = runtimeH(usableAh, currentA, u.H, u.k)
  const runtimeEolH = runtimeH(usableAh * duty.input.endOfLifeCapacity, currentA, u.H, u.k)
  const meetsDuration = runtimeEolH >= duty.durationH * (1 - 1e-9)
  reasons.push(
    meetsDuration
      ? `Runs about ${round(runtimeEolH)} h at end of life (${round(duty.input.endOfLifeCapacity * 100)} % capacity) at ${duty.runtimeAmbientC} °C: covers the ${round(duty.durationH)} h rated duration.`
      : `Runs only about ${round(runtimeEolH)} h at end of life (${round(duty.input.endOfLifeCapacity * 100)} % capacity) at ${duty.runtimeAmbientC} °C, short of the ${round(duty.durationH)} h rated duration.`,
  )

  const fit = chargerFit({
    chemistry,
    cellsInSeries: c.cellsInSeries,
    capacityAh: c.capacityAh,
    chargerType: duty.chargerType,
    chargeCurrentA: duty.input.charger.chargeCurrent,
    trickleCurrentA: duty.trickleA,
    madeFor: { chemistry: duty.old.id, cellsInSeries: duty.oldCells },
  })
  let chargerCompatible = fit.verdict
  reasons.push(...fit.reasons)
  if (chemistry.noChargeBelowFreezing && duty.input.ambientMin < 0) {
    chargerCompatible = 'no'
    reasons.push(`${chemistry.name} must not be charged below 0 °C and the luminaire goes down to ${duty.input.ambientMin} °C.`)
  }
  const takenAh = Math.min(currentA * duty.durationH, c.capacityAh)
  const rechargeTimeH = (takenAh * chemistry.chargeFactor.value) / duty.input.charger.chargeCurrent
  if (rechargeTimeH > RECHARGE_LIMIT_H && chargerCompatible === 'yes') chargerCompatible = 'conditional'
  if (rechargeTimeH > RECHARGE_LIMIT_H)
    reasons.push(`Recharging after a full test takes about ${round(rechargeTimeH)} h at ${round(duty.input.charger.chargeCurrent * 1000)} mA, more than 24 h.`)

  const lifeYears = chemistryServiceLifeYears(chemistry, duty.input.ambientMax)
  let suitsTemperature = lifeYears >= DESIGN_LIFE_YEARS
  if (duty.needsHT && (chemistry.id === 'nicd' || chemistry.id === 'nimh')) {
    suitsTemperature = false
    reasons.push(
      chemistry.id === 'nicd'
        ? `Standard NiCd cells: a ${duty.input.mode === 'maintained' ? 'maintained luminaire' : `place reaching ${duty.input.ambientMax} °C`} wants high-temperature cells.`
        : `Only NiMH cells rated for permanent charge when warm: a ${duty.input.mode === 'maintained' ? 'maintained luminaire' : `place reaching ${duty.input.ambientMax} °C`} keeps the pack warm.`,
    )
  } else if (lifeYears < DESIGN_LIFE_YEARS) {
    reasons.push(`About ${round(lifeYears, 2)} years of life at ${duty.input.ambientMax} °C, under the 4-year design life.`)
  }

  const oldFormat = duty.input.oldPack.cellFormat
  let sameFormat: boolean | null = null
  if (oldFormat && c.cellFormat) {
    sameFormat = normFormat(oldFormat) === normFormat(c.cellFormat)
    if (!sameFormat) reasons.push(`Cell format ${c.cellFormat}, not ${oldFormat}: check that it fits the compartment and has the same connector.`)
  } else if (oldFormat || c.cellFormat) {
    reasons.push(
      c.cellFormat
        ? "The old pack's cell format is not known: check that this one fits the compartment and has the same connector."
        : 'Cell format not given for this pack: check that it fits the compartment and has the same connector.',
    )
  }
  return {
    chemistry: c.chemistry,
    name: chemistry.name,
    cellsInSeries: c.cellsInSeries,
    nominalVoltageV: volts,
    capacityAh: c.capacityAh,
    cellFormat: c.cellFormat,
    source: c.source,
    dischargeCurrentA: currentA,
    runtimeH: runtimeNewH,
    runtimeEndOfLifeH: runtimeEolH,
    meetsDuration,
    sameVoltage,
    chargerCompatible,
    chargeCRate: fit.chargeCRate,
    trickleCRate: fit.trickleCRate,
    rechargeTimeH,
    suitsTemperature,
    serviceLifeYears: lifeYears,
    sameFormat,
    reasons,
  }
}

/** Packs to consider when none are given: per chemistry, whole cells nearest the old voltage; like-for-like capacity for the old family, else the smallest common size that covers the need. */
function proposals(duty: Duty): Array<Parameters<typeof evaluate>[1]> {
  const out: Array<Parameters<typeof evaluate>[1]> = []
  const format = duty.input.oldPack.cellFormat ?? null
  for (const id of CHEMISTRY_IDS) {
    const chemistry = CHEMISTRIES[id]
    const { cells, nominalVoltageV } = cellsForVoltage(chemistry, duty.oldVoltage)
    const need = requiredAh(chemistry, duty, currentFor(duty, nominalVoltageV))
    const ladder = chemistry.capacityLadderAh.value
    const rung = ladder.find((c) => c >= need * (1 - 1e-9)) ?? ladder[ladder.length - 1]
    if (sameFamily(chemistry, duty.old))
      out.push({ chemistry: id, cellsInSeries: cells, capacityAh: duty.oldCapacityAh, cellFormat: format, source: 'proposed' })
    if (!sameFamily(chemistry, duty.old) || Math.abs(rung - duty.oldCapacityAh) > 1e-9)
      out.push({ chemistry: id, cellsInSeries: cells, capacityAh: rung, cellFormat: null, source: 'proposed' })
  }
  return out
}

const VERDICT_ORDER: Record<ChargerVerdict, number> = { yes: 0, conditional: 1, no: 2 }

/** The eligible candidate ranked first: charger yes before conditional, suits the temperature, same chemistry, same format, capacity nearest the old one. */
function recommend(duty: Duty, candidates: ReplaceCandidate[]): number | null {
  let best: number | null = null
  const key = (c: ReplaceCandidate) => [
    VERDICT_ORDER[c.chargerCompatible],
    c.suitsTemperature ? 0 : 1,
    c.chemistry === duty.old.id || (duty.old.id === 'nicd' && c.chemistry === 'nicd-ht') ? 0 : 1,
    c.sameFormat === true ? 0 : 1,
    Math.abs(c.capacityAh - duty.oldCapacityAh),
  ]
  candidates.forEach((c, i) => {
    if (!c.meetsDuration || !c.sameVoltage || c.chargerCompatible === 'no') return
    if (best === null) return void (best = i)
    const a = key(c)
    const b = key(candidates[best])
    for (let j = 0; j < a.length; j++) {
      if (a[j] < b[j] - 1e-12) return void (best = i)
      if (a[j] > b[j] + 1e-12) return
    }
  })
  return best
}

export function replacePack(input: ReplaceInput): ReplaceResult {
  const warnings: EngineWarning[] = []
  const labelled = CHEMISTRIES[input.oldPack.chemistry]
  const old = input.oldPack.highTemperature && labelled.id === 'nicd' ? CHEMISTRIES['nicd-ht'] : labelled
  const oldCells = input.oldPack.cellsInSeries ?? cellsForVoltage(old, input.oldPack.nominalVoltage as number).cells
  const oldVoltage = oldCells * old.nominalCellVoltage.value
  const oldCapacityAh = input.oldPack.capacity / SECONDS_PER_HOUR
  const durationH = input.duration / SECONDS_PER_HOUR

  // The discharge current from the old pack: measured, from the load, or (neither) what the label's pack just covers at end of life.
  const dischargeSource: ReplaceResult['dischargeSource'] = input.dischargeCurrent !== undefined ? 'measured' : input.load ? 'load' : 'label'
  const runtimeAmbientC = dischargeSource === 'label' ? LABEL_COMPARISON_AMBIENT_C : input.ambientMin
  const oldU = { factor: old.defaultDepthOfDischarge.value * coldCapacityFactor(old, runtimeAmbientC), H: old.defaultRatedHours, k: old.defaultPeukertExponent }
  const currentA =
    dischargeSource === 'measured'
      ? (input.dischargeCurrent as number)
      : dischargeSource === 'load'
        ? batteryDraw(input.load ?? {}, input.driver, input.driverEfficiency, oldVoltage).currentA
        : (oldCapacityAh * oldU.factor * input.endOfLifeCapacity) / capacityForRuntimeAh(1, durationH, oldU.H, oldU.k)

  const standardLife = chemistryServiceLifeYears(CHEMISTRIES.nicd, input.ambientMax)
  const needsHT = input.mode === 'maintained' || standardLife < DESIGN_LIFE_YEARS
  const chargerType = input.charger.type === 'unknown' ? chargerTypeForFamily(old.family) : input.charger.type
  const duty: Duty = {
    input,
    old,
    oldCells,
    oldVoltage,
    oldCapacityAh,
    durationH,
    currentA,
    needsHT,
    runtimeAmbientC,
    chargerType,
    trickleA: input.charger.trickleCurrent ?? input.charger.chargeCurrent,
  }
  const required = requiredAh(old, duty, currentA)

  const asked = input.candidates?.map((c) => ({
    chemistry: c.chemistry,
    cellsInSeries: c.cellsInSeries,
    capacityAh: c.capacity / SECONDS_PER_HOUR,
    cellFormat: c.cellFormat ?? null,
    source: 'given' as const,
  }))
  const candidates = (asked ?? proposals(duty)).map((c) => evaluate(duty, c))
  const recommended = recommend(duty, candidates)

  // Warnings: what stops a pack the user named, the recommendation (or its absence), the assumptions, the cautions.
  candidates.forEach((c, i) => {
    if (c.source !== 'given') return
    const label = `Pack ${i + 1} (${c.cellsInSeries} × ${c.name}, ${round(c.capacityAh)} Ah)`
    if (!c.sameVoltage)
      warnings.push({
        code: 'candidate-voltage-differs',
        severity: 'critical',
        field: `candidates.${i}.cellsInSeries`,
        message: `${label} is ${round(c.nominalVoltageV)} V, not the ${round(oldVoltage)} V of the old pack.`,
      })
    if (c.chargerCompatible === 'no')
      warnings.push({
        code: 'candidate-charger-unsuitable',
        severity: 'critical',
        field: `candidates.${i}.chemistry`,
        message: `${label} must not go on this charger: ${c.reasons.find((r) => /charger|charged|float|0 °C/.test(r)) ?? 'see its reasons'}`,
      })
    if (!c.meetsDuration)
      warnings.push({
        code: 'candidate-short-of-duration',
        severity: 'critical',
        field: `candidates.${i}.capacity`,
        message: `${label} runs about ${round(c.runtimeEndOfLifeH)} h at end of life, short of the ${round(durationH)} h rated duration.`,
      })
  })
  const chosen = recommended === null ? null : candidates[recommended]
  if (!chosen) {
    warnings.push({
      code: 'no-suitable-candidate',
      severity: 'critical',
      message:
        'No pack here keeps the old voltage, covers the rated duration at end of life and suits the charger. Ask the luminaire maker for its replacement pack, or replace the luminaire (or its charger) with one made for the pack you can get.',
    })
  } else {
    if (chosen.sameFormat !== true)
      warnings.push({
        code: 'cell-format-check',
        severity: 'warning',
        field: 'oldPack.cellFormat',
        message: `Check that the recommended pack fits the compartment and has the same connector${chosen.cellFormat && input.oldPack.cellFormat ? ` (${chosen.cellFormat} instead of ${input.oldPack.cellFormat})` : ''}.`,
      })
    if (chosen.rechargeTimeH > RECHARGE_LIMIT_H)
      warnings.push({
        code: 'recharge-over-24h',
        severity: 'critical',
        field: 'charger.chargeCurrent',
        message: `After a full test the charger needs about ${round(chosen.rechargeTimeH)} h to recharge the recommended pack; the rated duration must be available again after 24 h (IEC 60598-2-22).`,
      })
  }
  if (dischargeSource === 'label')
    warnings.push({
      code: 'discharge-current-assumed',
      severity: 'info',
      field: 'dischargeCurrent',
      message: `Neither the load nor a measured current was given: the luminaire is taken to draw ${round(currentA)} A, what the old ${round(oldCapacityAh)} Ah pack just gives for ${round(durationH)} h at end of life at ${LABEL_COMPARISON_AMBIENT_C} °C, and each pack is compared with the old one there. The cold (down to ${input.ambientMin} °C) is not judged: measure the discharge current to check it.`,
    })
  if (input.charger.type === 'unknown')
    warnings.push({
      code: 'charger-type-assumed',
      severity: 'warning',
      field: 'charger.type',
      message: `Charger type not known: taken as the usual one for the old ${old.name} pack. Read it from the luminaire's label or its maker before fitting another chemistry.`,
    })
  if (needsHT && old.id === 'nicd')
    warnings.push({
      code: 'high-temperature-cells',
      severity: 'warning',
      field: 'oldPack.highTemperature',
      message: `The old pack has standard NiCd cells; a ${input.mode === 'maintained' ? 'maintained luminaire' : `place reaching ${input.ambientMax} °C`} wants high-temperature cells.`,
    })
  warnings.push({
    code: 'charge-then-test',
    severity: 'info',
    message: 'After fitting, charge the new pack for 24 h, then run a full rated-duration test and record it (date, pack fitted, result) in the log book.',
  })
  warnings.push({
    code: 'old-pack-disposal',
    severity: 'info',
    field: 'oldPack.chemistry',
    message:
      old.family === 'nickel' && old.id !== 'nimh'
        ? 'The old pack contains cadmium: return it for recycling, never bin it.'
        : `Return the old ${old.name} pack for recycling, never bin it.`,
  })
  addChemistryNotes(chosen ? CHEMISTRIES[chosen.chemistry] : old, warnings)

  const working: WorkingStep[] = [
    {
      id: 'oldPackNominalVoltageV',
      label: 'Nominal voltage of the old pack',
      formula: 'V = n · V_cell',
      explanation: 'Cells in series times the nominal cell voltage; a replacement keeps this voltage.',
      inputs: [v('n', 'Cells in series', oldCells, ''), v('V_cell', `Nominal ${old.name} cell`, old.nominalCellVoltage.value, 'V')],
      result: v('V', 'Nominal pack voltage', oldVoltage, 'V'),
      references: [
        old.nominalCellVoltage.ref,
        REF.commonPractice(
          'A replacement pack keeps the nominal voltage the luminaire is marked for',
          'IEC 60598-2-22 marking: battery type, nominal voltage and capacity (from memory).',
        ),
      ],
    },
    {
      id: 'dischargeCurrentA',
      label: 'Discharge current',
      formula: dischargeSource === 'label' ? 'I = C · DoD · f_T · f_EoL / C_P(1 A)' : dischargeSource === 'measured' ? 'I = measured' : 'I = P_LED / (η · V)',
      explanation:
        dischargeSource === 'label'
          ? `No load given: the current the old pack just supplies for the rated duration at end of life, at ${LABEL_COMPARISON_AMBIENT_C} °C (Peukert inverted).`
          : dischargeSource === 'measured'
            ? 'The measured average current from the pack.'
            : 'The load through its driver at the old pack voltage.',
      inputs: [v('C', 'Old pack capacity', oldCapacityAh, 'Ah'), v('t', 'Rated duration', durationH, 'h'), v('V', 'Nominal pack voltage', oldVoltage, 'V')],
      result: v('I', 'Discharge current', currentA, 'A'),
      references: [
        dischargeSource === 'label'
          ? REF.commonPractice('The luminaire was designed so its marked pack gives the rated duration at end of life')
          : REF.commonPractice('Power balance of the driver'),
        REF.peukert(),
      ],
    },
    {
      id: 'requiredCapacityAh',
      label: 'Capacity for the rated duration at end of life',
      formula: 'C_req = C_P / (DoD · f_T · f_EoL)',
      explanation: `Rated capacity of ${old.name} that runs the current for the rated duration at end of life at ${runtimeAmbientC} °C (no design margin).`,
      inputs: [
        v('I', 'Discharge current', currentA, 'A'),
        v('t', 'Rated duration', durationH, 'h'),
        v('f_EoL', 'End-of-life capacity', input.endOfLifeCapacity, ''),
        v('f_T', 'Cold-capacity factor', coldCapacityFactor(old, runtimeAmbientC), ''),
      ],
      result: v('C_req', 'Required capacity', required, 'Ah'),
      references: [REF.peukert(), old.coldCapacityCurve.ref, REF.commonPractice('End of life at 80 % of rated capacity (IEEE 450 practice)')],
    },
    ...candidates.map((c, i): WorkingStep => ({
      id: `candidates.${i}.runtimeEndOfLifeH`,
      label: `Pack ${i + 1}: ${c.cellsInSeries} × ${c.name}, ${round(c.capacityAh)} Ah`,
      formula: 't_EoL = runtime(C · DoD · f_T · f_EoL, I)',
      explanation: c.reasons.join(' '),
      inputs: [
        v('C', 'Capacity', c.capacityAh, 'Ah'),
        v('I', 'Discharge current', c.dischargeCurrentA, 'A'),
        v('V', 'Nominal voltage', c.nominalVoltageV, 'V'),
      ],
      result: v('t_EoL', 'Runtime at end of life', c.runtimeEndOfLifeH, 'h'),
      references: [REF.peukert(), CHEMISTRIES[c.chemistry].continuousChargeRangeC.ref],
    })),
  ]
  return {
    oldPack: {
      chemistry: old.id,
      name: old.name,
      cellsInSeries: oldCells,
      nominalVoltageV: oldVoltage,
      capacityAh: oldCapacityAh,
      cellFormat: input.oldPack.cellFormat ?? null,
    },
    oldPackNominalVoltageV: oldVoltage,
    dischargeSource,
    dischargeCurrentA: currentA,
    requiredCapacityAh: required,
    needsHighTemperature: needsHT,
    chargerType: input.charger.type,
    assumedChargerType: chargerType,
    candidates,
    recommended,
    warnings: sortWarnings(warnings),
    working,
  }
}

export const replaceTool = defineTool({
  name: 'replace',
  summary: 'Choose a replacement for a dead emergency pack from its label: same voltage, suits the charger, covers the rated duration at end of life.',
  input: replaceInputSchema,
  run: (input: ReplaceInput) => replacePack(input),
})
