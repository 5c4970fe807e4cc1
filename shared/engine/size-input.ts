/** The input of the `size` tool: the pack description, the load and the design factors, with cross-field checks. */
import { z } from 'zod'
import { chemistryIdSchema, designFields, hours, loadFields, loadIssues, loadSchema } from './battery-inputs'
import { ambientTemperature, finiteNumber, quantity } from './fields'
import { chargerTypeSchema } from './pack-charger'
import { packIssues } from './pack-rules'

const SECONDS_PER_HOUR = 3600
const capacityQuantity = () => quantity('charge', { positive: true, max: 100_000 * SECONDS_PER_HOUR, display: { unit: 'Ah', factor: 1 / SECONDS_PER_HOUR } })

export const LUMINAIRE_MODES = ['maintained', 'non-maintained'] as const
export const luminaireModeSchema = z.enum(LUMINAIRE_MODES, { errorMap: () => ({ message: 'must be "maintained" or "non-maintained"' }) })
export type LuminaireMode = z.infer<typeof luminaireModeSchema>

/** Cell format as printed or seen on the pack ("sub-C", "AA", "D", "18650", "12 V block"): free text, checked only for length. */
export const cellFormatSchema = z
  .string({ invalid_type_error: 'must be text, e.g. "sub-C"' })
  .trim()
  .min(1, 'must not be empty')
  .max(40, 'must be at most 40 characters')

/** The luminaire's charger, checked against the pack (the `charge` rules, plus the charger type). */
export const packChargerSchema = z.object(
  {
    type: chargerTypeSchema.default('unknown'),
    chargeCurrent: quantity('current', { positive: true, max: 1_000 }),
    /** Permanent current once charged; defaults to the charge current (0 for a charger that stops when full). */
    trickleCurrent: quantity('current', { min: 0, max: 1_000 }).optional(),
    floatVoltage: quantity('voltage', { positive: true, max: 1_000 }).optional(),
    cutoffVoltage: quantity('voltage', { positive: true, max: 1_000 }).optional(),
    voltageBasis: z.enum(['pack', 'cell'], { errorMap: () => ({ message: 'must be "pack" or "cell"' }) }).default('pack'),
    /** Ambient while charging; defaults to the highest ambient. */
    ambient: ambientTemperature().optional(),
  },
  { invalid_type_error: 'must be an object with chargeCurrent (and type, trickleCurrent…)' },
)
export type PackCharger = z.output<typeof packChargerSchema>

/** Fields the pack description adds to the load fields. */
export const sizeInputObject = z.object({
  chemistry: chemistryIdSchema,
  cellsInSeries: finiteNumber({ int: true, min: 1, max: 400 }).optional(),
  /** Nominal pack voltage as on a label; sets the cells in series (a voltage no whole count of cells gives is flagged critical). */
  nominalVoltage: quantity('voltage', { positive: true, max: 1_000 }).optional(),
  cellFormat: cellFormatSchema.optional(),
  mode: luminaireModeSchema.optional(),
  averageCellVoltage: quantity('voltage', { positive: true, max: 10 }).optional(),
  cutoffCellVoltage: quantity('voltage', { positive: true, max: 10 }).optional(),
  /** An existing pack to check (a bare number is coulombs; "4.5 Ah" reads as expected). */
  capacity: capacityQuantity().optional(),
  ratedHours: hours().optional(),
  peukertExponent: finiteNumber({ min: 1, max: 2 }).optional(),
  ...loadFields,
  /** The emergency-mode load; or give the measured `dischargeCurrent` from the pack instead. */
  load: loadSchema.optional(),
  dischargeCurrent: quantity('current', { positive: true, max: 1_000 }).optional(),
  ...designFields,
  ambientMin: ambientTemperature().default(5),
  ambientMax: ambientTemperature().default(25),
  capacityLadder: z
    .array(capacityQuantity(), { invalid_type_error: 'must be a list of capacities' })
    .min(1, 'must hold at least one capacity')
    .max(200, 'must hold at most 200 capacities')
    .optional(),
  charger: packChargerSchema.optional(),
})

type Issue = { path: (string | number)[]; message: string }

/** The load or a measured discharge current, one of the two. */
export function dischargeIssues(v: { load?: unknown; dischargeCurrent?: unknown }): Issue[] {
  if (v.load !== undefined && v.dischargeCurrent !== undefined)
    return [{ path: ['dischargeCurrent'], message: 'give either the load or the measured dischargeCurrent, not both' }]
  if (v.load === undefined && v.dischargeCurrent === undefined)
    return [{ path: ['load', 'power'], message: 'is required: give load.power, or load.ledVoltage with load.ledCurrent, or a measured dischargeCurrent' }]
  return []
}

export const sizeInputSchema = sizeInputObject.superRefine((v, ctx) => {
  const issues = [
    ...dischargeIssues(v),
    ...(v.dischargeCurrent === undefined ? loadIssues({ ...v, cellsInSeries: v.cellsInSeries ?? (v.nominalVoltage !== undefined ? 1 : undefined) }) : []),
    ...packIssues(v),
  ]
  for (const issue of issues) ctx.addIssue({ code: z.ZodIssueCode.custom, ...issue })
})

export type SizeInput = z.output<typeof sizeInputSchema>
