/**
 * `compare`: one luminaire sized in every chemistry with the `size` logic, then ranked by the
 * user's weights on service life, tolerance of permanent charge, pack size and restrictions.
 */
import { z } from 'zod'
import { chemistryIdSchema, designFields, loadFields, loadIssues } from './battery-inputs'
import { CHEMISTRIES, CHEMISTRY_IDS } from './chemistries'
import { REF } from './chemistries/references'
import type { Chemistry, ChemistryId, Range } from './chemistries/types'
import { ambientTemperature, finiteNumber, quantity } from './fields'
import { packIssues } from './pack-rules'
import { sizePack, type SizeInput, type SizeResult } from './size'
import { defineTool } from './tool'
import { sortWarnings, type EngineWarning, type WorkingStep } from './types'
import { roundToSignificant } from './round'

const weight = (fallback: number) => finiteNumber({ min: 0, max: 100 }).default(fallback)

export const DEFAULT_WEIGHTS = { life: 0.4, trickle: 0.2, size: 0.2, restrictions: 0.2 } as const

export const weightsSchema = z
  .object({
    life: weight(DEFAULT_WEIGHTS.life),
    trickle: weight(DEFAULT_WEIGHTS.trickle),
    size: weight(DEFAULT_WEIGHTS.size),
    restrictions: weight(DEFAULT_WEIGHTS.restrictions),
  })
  .default({})
export type Weights = z.output<typeof weightsSchema>

export const compareInputObject = z.object({
  ...loadFields,
  ...designFields,
  ambientMin: ambientTemperature().default(5),
  ambientMax: ambientTemperature().default(25),
  /** Nominal pack voltage every chemistry must make (cells recomputed per chemistry; one that cannot is flagged). */
  nominalVoltage: quantity('voltage', { positive: true, max: 1_000 }).optional(),
  chemistries: z
    .array(chemistryIdSchema, { invalid_type_error: 'must be a list of chemistry ids' })
    .min(1, 'must name at least one chemistry')
    .default([...CHEMISTRY_IDS]),
  weights: weightsSchema,
})

export const compareInputSchema = compareInputObject.superRefine((v, ctx) => {
  for (const issue of [...loadIssues(v), ...packIssues(v)]) ctx.addIssue({ code: z.ZodIssueCode.custom, ...issue })
  const w = v.weights
  if (w && typeof w === 'object' && w.life + w.trickle + w.size + w.restrictions <= 0) {
    ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['weights'], message: 'at least one weight must be greater than zero' })
  }
})

export type CompareInput = z.output<typeof compareInputSchema>

export interface CompareRow {
  chemistry: ChemistryId
  name: string
  cellsInSeries: number
  selectedCapacityAh: number
  requiredCapacityAh: number
  massKg: Range
  volumeL: Range
  serviceLifeYears: number
  /** Sub-scores 0..1 before weighting. */
  scores: { life: number; trickle: number; size: number; restrictions: number }
  /** Weighted score 0..1, halved when the chemistry has a critical warning for this luminaire. */
  score: number
  rank: number
  verdict: string
  warnings: EngineWarning[]
}

export interface CompareResult {
  rows: CompareRow[]
  weights: Weights
  warnings: EngineWarning[]
  working: WorkingStep[]
}

const CRITICAL_PENALTY = 0.5
/** A pack that cannot be charged at the site's lowest temperature is not full when needed: the same halving. */
const COLD_CHARGE_PENALTY = 0.5
const round = roundToSignificant
const CRITERION_WORDS = {
  life: 'service life',
  trickle: 'living on permanent charge',
  size: 'pack size',
  restrictions: 'restrictions and disposal',
} as const

/** The luminaire and its setting, without any one chemistry's pack: what every chemistry is sized for. */
export type Luminaire = Pick<
  SizeInput,
  | 'duration'
  | 'load'
  | 'driver'
  | 'driverEfficiency'
  | 'converterInput'
  | 'endOfLifeCapacity'
  | 'depthOfDischarge'
  | 'designMargin'
  | 'designLifeYears'
  | 'ambientMin'
  | 'ambientMax'
> & { load: NonNullable<SizeInput['load']>; nominalVoltage?: number }

/** The size input for one chemistry and a luminaire; written out (not spread) so every call has one shape. */
export function sizeInputFor(chemistry: ChemistryId, input: Luminaire): SizeInput {
  return {
    chemistry,
    duration: input.duration,
    load: input.load,
    driver: input.driver,
    driverEfficiency: input.driverEfficiency,
    converterInput: input.converterInput,
    endOfLifeCapacity: input.endOfLifeCapacity,
    depthOfDischarge: input.depthOfDischarge,
    designMargin: input.designMargin,
    designLifeYears: input.designLifeYears,
    ambientMin: input.ambientMin,
    ambientMax: input.ambientMax,
    nominalVoltage: input.nominalVoltage,
  }
}

/** The site's lowest ambient is below the chemistry's charging range (a nickel pack then stays partly charged). */
const chargesBelowRange = (chemistry: Chemistry, ambientMinC: number) => ambientMinC < chemistry.chargeTemperatureC.value.min

const hasCritical = (warnings: EngineWarning[]) => {
  for (const w of warnings) if (w.severity === 'critical') return true
  return false
}

export interface CompareOptions {
  /** `false` skips verdict sentences and working (bulk runs such as the benchmark). */
  explain?: boolean
  /** The pack already sized on a screen: its chemistry's row is sized with exactly this input, so the row matches it. */
  exact?: SizeInput
}

export function compareChemistries(input: CompareInput, options: CompareOptions = {}): CompareResult {
  const explain = options.explain !== false
  // Plain loops below: this runs once per luminaire in bulk comparisons.
  const ids: ChemistryId[] = []
  for (const id of input.chemistries) if (!ids.includes(id)) ids.push(id)
  const sized: SizeResult[] = []
  let maxLife = 0
  let minVolume = Infinity
  for (const id of ids) {
    const r = sizePack(options.exact?.chemistry === id ? options.exact : sizeInputFor(id, input), { explain: false })
    sized.push(r)
    if (r.serviceLifeYears > maxLife) maxLife = r.serviceLifeYears
    const volume = (r.volumeL.min + r.volumeL.max) / 2
    if (volume < minVolume) minVolume = volume
  }
  const w = input.weights
  const weightSum = w.life + w.trickle + w.size + w.restrictions

  const rows: CompareRow[] = []
  for (const r of sized) {
    const chemistry = CHEMISTRIES[r.chemistry]
    const scores = {
      life: r.serviceLifeYears / maxLife,
      trickle: chemistry.trickleTolerance,
      size: minVolume / ((r.volumeL.min + r.volumeL.max) / 2),
      restrictions: 1 - chemistry.regulatoryBurden,
    }
    const weighted = (w.life * scores.life + w.trickle * scores.trickle + w.size * scores.size + w.restrictions * scores.restrictions) / weightSum
    rows.push({
      chemistry: r.chemistry,
      name: chemistry.name,
      cellsInSeries: r.cellsInSeries,
      selectedCapacityAh: r.selectedCapacityAh,
      requiredCapacityAh: r.requiredCapacityAh,
      massKg: r.massKg,
      volumeL: r.volumeL,
      serviceLifeYears: r.serviceLifeYears,
      scores,
      score: hasCritical(r.warnings) ? weighted * CRITICAL_PENALTY : chargesBelowRange(chemistry, input.ambientMin) ? weighted * COLD_CHARGE_PENALTY : weighted,
      rank: 0,
      verdict: '',
      warnings: r.warnings,
    })
  }

  // Rank: higher score first; equal scores keep the order asked for. A row's rank is 1 + the rows ahead of it.
  for (let i = 0; i < rows.length; i++) {
    let ahead = 0
    for (let j = 0; j < rows.length; j++) {
      if (rows[j].score > rows[i].score || (rows[j].score === rows[i].score && j < i)) ahead++
    }
    rows[i].rank = ahead + 1
  }
  if (!explain) return { rows, weights: w, warnings: [], working: [] }
  for (const row of rows) row.verdict = verdictFor(row, input, w)

  const warnings: EngineWarning[] = []
  for (const row of rows) {
    for (const warning of row.warnings) {
      if (warning.severity === 'critical') warnings.push({ ...warning, message: `${row.name}: ${warning.message}`, field: warning.field })
    }
  }
  if (rows.some((r) => r.chemistry === 'nicd' || r.chemistry === 'nicd-ht')) {
    warnings.push({
      code: 'cadmium-restricted',
      severity: 'warning',
      field: 'chemistries',
      message:
        'NiCd: EU Regulation 2023/1542 limits portable batteries to 0.002 % Cd; whether emergency-lighting packs are portable or industrial is unsettled, so check the classification.',
    })
  }
  warnings.push({
    code: 'competent-person',
    severity: 'info',
    message: 'The ranking weighs engineering estimates; local codes, the standards in force and a competent, licensed person decide.',
  })

  const working: WorkingStep[] = rows.map((row) => ({
    id: `score.${row.chemistry}`,
    label: `Score: ${row.name}`,
    formula: 'S = (w_L·s_L + w_T·s_T + w_S·s_S + w_R·s_R) / Σw  (× 0.5 with a critical warning; × 0.5 when it cannot be charged at the lowest ambient)',
    explanation: `s_L = life / longest life; s_T = tolerance of permanent charge; s_S = smallest mid-range volume / this volume; s_R = 1 − restriction burden.${chargesBelowRange(CHEMISTRIES[row.chemistry], input.ambientMin) ? ` Halved: ${row.name} is charged from ${CHEMISTRIES[row.chemistry].chargeTemperatureC.value.min} °C and the site goes down to ${input.ambientMin} °C.` : ''}`,
    inputs: [
      { symbol: 's_L', label: 'Life score', value: row.scores.life, unit: '' },
      { symbol: 's_T', label: 'Permanent-charge score', value: row.scores.trickle, unit: '' },
      { symbol: 's_S', label: 'Size score', value: row.scores.size, unit: '' },
      { symbol: 's_R', label: 'Restrictions score', value: row.scores.restrictions, unit: '' },
      { symbol: 'w_L', label: 'Life weight', value: w.life, unit: '' },
      { symbol: 'w_T', label: 'Permanent-charge weight', value: w.trickle, unit: '' },
      { symbol: 'w_S', label: 'Size weight', value: w.size, unit: '' },
      { symbol: 'w_R', label: 'Restrictions weight', value: w.restrictions, unit: '' },
    ],
    result: { symbol: 'S', label: 'Score', value: row.score, unit: '' },
    references: [REF.commonPractice('Weighted-sum ranking; sub-scores from the chemistry data and the sizing')],
  }))

  return { rows, weights: w, warnings: sortWarnings(warnings), working }
}

const CRITICAL_WORDS: Record<string, string> = {
  'charge-forbidden-cold': 'it must not be charged at the lowest ambient',
  'beyond-ladder': 'no listed pack is large enough',
  'converter-window-low': 'no cell count fits the converter input window',
  'converter-window-high': 'no cell count fits the converter input window',
  'deep-discharge': 'the cut-off deep-discharges it',
  'pack-voltage-changed': 'no whole number of its cells makes this pack voltage',
}

function verdictFor(row: CompareRow, input: CompareInput, w: Weights): string {
  const keys = (Object.keys(row.scores) as Array<keyof CompareRow['scores']>).filter((k) => w[k] > 0)
  const best = keys.reduce((a, b) => (row.scores[b] > row.scores[a] ? b : a), keys[0])
  const worst = keys.reduce((a, b) => (row.scores[b] < row.scores[a] ? b : a), keys[0])
  const critical = row.warnings.find((x) => x.severity === 'critical')
  const cold = chargesBelowRange(CHEMISTRIES[row.chemistry], input.ambientMin)
  const pack = `${round(row.selectedCapacityAh)} Ah × ${row.cellsInSeries} cell${row.cellsInSeries === 1 ? '' : 's'} (${round(row.massKg.min, 2)}–${round(row.massKg.max, 2)} kg)`
  const life = `about ${round(row.serviceLifeYears, 2)} years at ${input.ambientMax} °C`
  const trail = critical
    ? `but ${CRITICAL_WORDS[critical.code] ?? 'a critical check fails (see its warnings)'}`
    : cold
      ? `but it cannot be charged at ${input.ambientMin} °C, so it is not full when needed`
      : best === worst
        ? `even on every criterion`
        : `strongest on ${CRITERION_WORDS[best]}, weakest on ${CRITERION_WORDS[worst]}`
  return `Rank ${row.rank}: ${pack}, ${life}; ${trail}.`
}

export const compareTool = defineTool({
  name: 'compare',
  summary: 'Size one luminaire in every battery chemistry and rank them by service life, permanent charge, size and restrictions.',
  input: compareInputSchema,
  run: (input: CompareInput, options) => compareChemistries(input, options),
})
