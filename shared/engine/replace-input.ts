/**
 * The input of the `replace` tool: the old pack as its label reads, the luminaire's duty, its load (or
 * a measured current, or neither), its charger, and optionally the packs the electrician can get.
 */
import { z } from 'zod'
import { chemistryIdSchema, loadFields, loadIssues, loadSchema } from './battery-inputs'
import { CHEMISTRIES } from './chemistries'
import { ambientTemperature, finiteNumber, fraction, quantity } from './fields'
import { cellsForVoltage } from './pack-cells'
import { chargerTypeSchema } from './pack-charger'
import { cellFormatSchema, dischargeIssues, luminaireModeSchema } from './size-input'

const SECONDS_PER_HOUR = 3600
const capacity = () => quantity('charge', { positive: true, max: 100_000 * SECONDS_PER_HOUR, display: { unit: 'Ah', factor: 1 / SECONDS_PER_HOUR } })
const cells = () => finiteNumber({ int: true, min: 1, max: 400 })

export const oldPackSchema = z.object(
  {
    chemistry: chemistryIdSchema,
    cellsInSeries: cells().optional(),
    nominalVoltage: quantity('voltage', { positive: true, max: 1_000 }).optional(),
    capacity: capacity(),
    cellFormat: cellFormatSchema.optional(),
    /** Marked as high-temperature cells (NiCd "HT"): a standard-cell NiCd label with this set reads as high-temperature NiCd. */
    highTemperature: z.boolean({ invalid_type_error: 'must be true or false' }).optional(),
  },
  {
    invalid_type_error: 'must be an object: chemistry, cellsInSeries or nominalVoltage, capacity',
    required_error: 'is required: the old pack as its label reads',
  },
)

export const replaceCandidateSchema = z.object({
  chemistry: chemistryIdSchema,
  cellsInSeries: cells(),
  capacity: capacity(),
  cellFormat: cellFormatSchema.optional(),
})
export type ReplaceCandidateInput = z.output<typeof replaceCandidateSchema>

export const replaceChargerSchema = z.object(
  {
    type: chargerTypeSchema,
    chargeCurrent: quantity('current', { positive: true, max: 1_000 }),
    /** Permanent current once charged; defaults to the charge current (0 for a charger that stops when full). */
    trickleCurrent: quantity('current', { min: 0, max: 1_000 }).optional(),
  },
  { invalid_type_error: 'must be an object: type, chargeCurrent, trickleCurrent', required_error: 'is required: the charger type and its charge current' },
)

export const replaceInputObject = z.object({
  oldPack: oldPackSchema,
  duration: loadFields.duration,
  mode: luminaireModeSchema,
  load: loadSchema.optional(),
  driver: loadFields.driver,
  driverEfficiency: loadFields.driverEfficiency,
  /** Measured average current from the pack during a discharge, instead of the load. */
  dischargeCurrent: quantity('current', { positive: true, max: 1_000 }).optional(),
  charger: replaceChargerSchema,
  ambientMin: ambientTemperature().default(5),
  ambientMax: ambientTemperature().default(25),
  endOfLifeCapacity: fraction().default(0.8),
  candidates: z
    .array(replaceCandidateSchema, { invalid_type_error: 'must be a list of packs: chemistry, cellsInSeries, capacity' })
    .min(1, 'must hold at least one pack (or leave it out to have packs proposed)')
    .max(30, 'must hold at most 30 packs')
    .optional(),
})

type Issue = { path: (string | number)[]; message: string }

/** The old pack's cells: given, or from its nominal voltage, which must be a whole number of cells. */
export function oldPackIssues(p: { chemistry?: unknown; cellsInSeries?: number; nominalVoltage?: number } | undefined): Issue[] {
  if (!p || typeof p !== 'object') return []
  const chemistry = CHEMISTRIES[p.chemistry as keyof typeof CHEMISTRIES]
  if (p.cellsInSeries === undefined && p.nominalVoltage === undefined) {
    return [{ path: ['oldPack', 'nominalVoltage'], message: 'is required: give the nominal voltage on the label (or the number of cells in series)' }]
  }
  if (!chemistry || p.nominalVoltage === undefined) return []
  const match = cellsForVoltage(chemistry, p.nominalVoltage)
  if (!match.exact) {
    return [
      {
        path: ['oldPack', 'nominalVoltage'],
        message: `is not a whole number of ${chemistry.name} cells (${chemistry.nominalCellVoltage.value} V each); check the label's chemistry and voltage`,
      },
    ]
  }
  if (p.cellsInSeries !== undefined && p.cellsInSeries !== match.cells) {
    return [{ path: ['oldPack', 'cellsInSeries'], message: `does not match the nominal voltage (${p.nominalVoltage} V is ${match.cells} cells)` }]
  }
  return []
}

export const replaceInputSchema = replaceInputObject.superRefine((v, ctx) => {
  const issues: Issue[] = [...oldPackIssues(v.oldPack)]
  if (v.load !== undefined && v.dischargeCurrent !== undefined) issues.push(...dischargeIssues(v))
  if (v.load !== undefined) issues.push(...loadIssues({ ...v, cellsInSeries: 1 }))
  if (typeof v.ambientMin === 'number' && typeof v.ambientMax === 'number' && v.ambientMin > v.ambientMax) {
    issues.push({ path: ['ambientMin'], message: 'must not be above ambientMax' })
  }
  for (const issue of issues) ctx.addIssue({ code: z.ZodIssueCode.custom, ...issue })
})

export type ReplaceInput = z.output<typeof replaceInputSchema>
