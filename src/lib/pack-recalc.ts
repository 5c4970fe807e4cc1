/**
 * What the pack bench computes on every keystroke, in the browser: the engine's schema, the sizing
 * with its working, the comparison of every chemistry, and runtime over a range of ambient
 * temperatures for the chosen pack. No formula here: each figure comes from the engine.
 * Plain TypeScript (no Vue) so scripts/bench-recalc.ts can time exactly these calls.
 */
import { CHEMISTRY_IDS } from '../../shared/engine/chemistries'
import { compareChemistries, DEFAULT_WEIGHTS, type CompareResult } from '../../shared/engine/compare'
import { sizeInputSchema, sizePack, type SizeInput, type SizeResult } from '../../shared/engine/size'
import { assertFinite, toFieldErrors } from '../../shared/engine/tool'
import { chargeInputSchema, checkCharge, type ChargeResult } from '../../shared/engine/charge'
import type { FieldError } from '../../shared/engine/types'

export interface RuntimePoint {
  temperatureC: number
  runtimeH: number
  runtimeEndOfLifeH: number
}

export interface PackRecalc {
  ok: boolean
  fields: FieldError[]
  input?: SizeInput
  result?: SizeResult
  comparison?: CompareResult
  curve?: RuntimePoint[]
  /** Set when the comparison could not run for this input (and why). */
  comparisonNote?: string
}

/** Ambient temperatures of the runtime chart, °C (the engine's models hold from −40 to 85 °C). */
export const CURVE_TEMPERATURES = Array.from({ length: 15 }, (_, i) => -20 + i * 5)

/** Runtime of the chosen pack when the coldest ambient is each temperature of the chart. */
export function runtimeCurve(input: SizeInput, capacityAh: number, temperatures = CURVE_TEMPERATURES): RuntimePoint[] {
  return temperatures.map((t) => {
    const r = sizePack(
      { ...input, capacity: capacityAh * 3600, capacityLadder: undefined, ambientMin: t, ambientMax: Math.max(t, input.ambientMax) },
      { explain: false },
    )
    return { temperatureC: t, runtimeH: r.runtimeH, runtimeEndOfLifeH: r.runtimeEndOfLifeH }
  })
}

/**
 * Every chemistry sized for the same luminaire at the same nominal pack voltage and ranked with the
 * default weights; the chosen chemistry's row is sized with exactly the bench's input, so it matches the results.
 */
export function compareAll(input: SizeInput & { load: NonNullable<SizeInput['load']> }, nominalVoltageV: number): CompareResult {
  return compareChemistries({ ...input, nominalVoltage: nominalVoltageV, chemistries: [...CHEMISTRY_IDS], weights: { ...DEFAULT_WEIGHTS } }, { exact: input })
}

/** One keystroke's worth of work. Raw values are the form's, units as typed. */
export function recalcPack(raw: unknown): PackRecalc {
  const parsed = sizeInputSchema.safeParse(raw)
  if (!parsed.success) return { ok: false, fields: toFieldErrors(parsed.error) }
  const input = parsed.data
  const result = sizePack(input)
  const out: PackRecalc = { ok: true, fields: [], input, result }
  // The comparison picks each chemistry's own cell count, which a direct drive can only do from the LED voltage.
  if (!input.load) {
    out.comparisonNote = 'Give the LED load to compare chemistries (a measured discharge current belongs to this pack only).'
  } else if (input.driver === 'direct' && input.load.ledVoltage === undefined) {
    out.comparisonNote = 'Give the LED string voltage to compare chemistries for a direct-driven load.'
  } else {
    out.comparison = compareAll({ ...input, load: input.load }, result.nominalVoltageV)
  }
  out.curve = runtimeCurve(input, result.selectedCapacityAh)
  assertFinite(out)
  return out
}

export interface ChargeRecalc {
  ok: boolean
  fields: FieldError[]
  result?: ChargeResult
}

export function recalcCharge(raw: unknown): ChargeRecalc {
  const parsed = chargeInputSchema.safeParse(raw)
  if (!parsed.success) return { ok: false, fields: toFieldErrors(parsed.error) }
  const result = checkCharge(parsed.data)
  assertFinite(result)
  return { ok: true, fields: [], result }
}

/** Form values without the empty fields (recursively), as they would be computed and saved. */
export function withoutEmptyFields(values: unknown): Record<string, unknown> {
  const out: Record<string, unknown> = {}
  if (!values || typeof values !== 'object' || Array.isArray(values)) return out
  for (const [k, v] of Object.entries(values)) {
    if (v === undefined || v === null || v === '') continue
    if (typeof v === 'object' && !Array.isArray(v)) {
      const inner = withoutEmptyFields(v)
      if (Object.keys(inner).length) out[k] = inner
    } else out[k] = v
  }
  return out
}
