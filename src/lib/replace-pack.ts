/**
 * The Replace a pack screen's pure parts: the engine run on the form values, and what the chosen
 * candidate becomes on a specification sheet (size inputs with the charger) or on a register
 * luminaire (the new pack fitted). No Vue here, so it is tested on its own.
 */
import { replaceInputSchema, replacePack, type ReplaceCandidate, type ReplaceInput, type ReplaceResult } from '../../shared/engine/replace'
import { assertFinite, toFieldErrors } from '../../shared/engine/tool'
import type { FieldError } from '../../shared/engine/types'
import { CHEMISTRY_LABELS } from '../../shared/labels'

export interface ReplaceRecalc {
  ok: boolean
  fields: FieldError[]
  input?: ReplaceInput
  result?: ReplaceResult
}

export function recalcReplace(raw: unknown): ReplaceRecalc {
  const parsed = replaceInputSchema.safeParse(raw)
  if (!parsed.success) return { ok: false, fields: toFieldErrors(parsed.error) }
  const result = replacePack(parsed.data)
  assertFinite(result)
  return { ok: true, fields: [], input: parsed.data, result }
}

const sig = (x: number, d = 4) => Number(x.toPrecision(d))

/** Common cell formats of emergency packs, to choose from (any other can be typed). */
export const COMMON_CELL_FORMATS = ['AAA', 'AA', '2/3 AA', '4/5 A', 'A', '4/5 sub-C', 'sub-C', 'C', 'D', 'F', '18650', '26650', '6 V block', '12 V block']

/** The chosen pack as specification-sheet inputs (the size tool's), carrying the charger, as typed where the form had text. */
export function sheetInputsFor(raw: Record<string, unknown>, result: ReplaceResult, c: ReplaceCandidate): Record<string, unknown> {
  const inputs: Record<string, unknown> = {
    chemistry: c.chemistry,
    cellsInSeries: c.cellsInSeries,
    nominalVoltage: `${sig(c.nominalVoltageV)} V`,
    capacity: `${sig(c.capacityAh)} Ah`,
    duration: raw.duration,
    mode: raw.mode,
    ambientMin: raw.ambientMin,
    ambientMax: raw.ambientMax,
    endOfLifeCapacity: raw.endOfLifeCapacity,
  }
  if (c.cellFormat) inputs.cellFormat = c.cellFormat
  if (result.dischargeSource === 'load') Object.assign(inputs, { load: raw.load, driver: raw.driver, driverEfficiency: raw.driverEfficiency })
  else inputs.dischargeCurrent = `${sig(c.dischargeCurrentA)} A`
  if (result.dischargeSource === 'label') {
    // The current is only the old pack's own (see the description): the sheet judges the pack as the tool did, at 20 °C and without margin.
    Object.assign(inputs, { ambientMin: '20 °C', designMargin: 0 })
  }
  const charger = (raw.charger ?? {}) as Record<string, unknown>
  inputs.charger = {
    type: charger.type,
    chargeCurrent: charger.chargeCurrent,
    ...(charger.trickleCurrent !== undefined ? { trickleCurrent: charger.trickleCurrent } : {}),
  }
  for (const k of Object.keys(inputs)) if (inputs[k] === undefined) delete inputs[k]
  return inputs
}

/** A short name for a pack: "4 × NiCd HT 1.6 Ah sub-C, 4.8 V". */
export function packName(c: Pick<ReplaceCandidate, 'chemistry' | 'cellsInSeries' | 'capacityAh' | 'cellFormat' | 'nominalVoltageV'>): string {
  return `${c.cellsInSeries} × ${CHEMISTRY_LABELS[c.chemistry]}, ${sig(c.capacityAh, 3)} Ah${c.cellFormat ? ` ${c.cellFormat}` : ''}, ${sig(c.nominalVoltageV, 3)} V`
}

/** The words of the sheet's luminaire field: which pack this replaces and how the current was found. */
export function sheetDescription(result: ReplaceResult): string {
  const old = result.oldPack
  const how =
    result.dischargeSource === 'label'
      ? 'No load or measured current was given: the discharge current is what the old pack just gives for the rated duration at end of life, so the new pack is judged against it at 20 °C with no design margin; the cold was not judged. Measure the discharge current to check it.'
      : result.dischargeSource === 'measured'
        ? 'The discharge current was measured.'
        : 'The discharge current comes from the LED load.'
  return `Replaces the old pack: ${packName({ ...old, capacityAh: old.capacityAh })}, read from its label. ${how}`
}

/** What the register records as the new pack fitted. */
export function fittedPackFor(c: ReplaceCandidate, fittedOn: string) {
  return {
    packFittedOn: fittedOn,
    chemistry: c.chemistry,
    cellsInSeries: c.cellsInSeries,
    capacityAh: sig(c.capacityAh),
    note: `Replacement from its label: ${packName(c)}`,
  }
}
