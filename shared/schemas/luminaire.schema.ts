/** A luminaire in a site's register, its battery pack, and one row of an imported schedule. */
import { z } from 'zod'
import { referenceId } from './reference'
import { CHEMISTRY_IDS } from '../engine/chemistries'
import { isIsoDate } from '../engine/due'

export const PURPOSES = ['escape-route', 'open-area', 'high-risk', 'exit-sign'] as const
export const PurposeSchema = z.enum(PURPOSES, { errorMap: () => ({ message: `must be one of ${PURPOSES.join(', ')}` }) })
export const MODES = ['maintained', 'non-maintained'] as const
export const ModeSchema = z.enum(MODES, { errorMap: () => ({ message: 'must be maintained or non-maintained' }) })
export const ChemistrySchema = z.enum(CHEMISTRY_IDS, { errorMap: () => ({ message: `must be one of ${CHEMISTRY_IDS.join(', ')}` }) })

export { MODE_LABELS, PURPOSE_LABELS } from '../labels'

/** A calendar day written YYYY-MM-DD. */
export const IsoDateSchema = z
  .string({ required_error: 'is required', invalid_type_error: 'must be a date (YYYY-MM-DD)' })
  .trim()
  .refine(isIsoDate, 'must be a real date written YYYY-MM-DD')

/** Accepts numbers and numeric strings (forms, CSV cells); rejects everything else with a reason. */
const numberIn = (what: string, min: number, max: number, opts: { int?: boolean; positive?: boolean } = {}) =>
  z.preprocess(
    (v) => (typeof v === 'string' && v.trim() !== '' && Number.isFinite(Number(v)) ? Number(v) : v),
    (() => {
      let s = z.number({ required_error: 'is required', invalid_type_error: `must be a number of ${what}` }).finite('must be a finite number')
      if (opts.int) s = s.int('must be a whole number')
      if (opts.positive) s = s.positive('must be greater than zero')
      return s.min(min, `must be at least ${min} ${what}`).max(max, `must be at most ${max} ${what}`)
    })(),
  )

export const PackSchema = z.object({
  chemistry: ChemistrySchema,
  cellsInSeries: numberIn('cells', 1, 48, { int: true }),
  capacityAh: numberIn('Ah', 0.05, 400, { positive: true }),
  packFittedOn: IsoDateSchema,
})

export const LuminaireSchema = z.object({
  tag: z.string({ required_error: 'is required' }).trim().min(1, 'is required').max(40, 'must be at most 40 characters'),
  location: z.string().trim().max(200, 'must be at most 200 characters').default(''),
  areaId: referenceId('area', 'is not an area id').nullable().default(null),
  typeLabel: z.string().trim().max(80, 'must be at most 80 characters').default(''),
  purpose: PurposeSchema,
  mode: ModeSchema,
  ratedDurationH: numberIn('hours', 0.5, 24, { positive: true }),
  ...PackSchema.shape,
  /** Optional link to a specification sheet. */
  specSheetId: referenceId('specSheet', 'is not a specification sheet id').nullable().default(null),
  /** Optional link to a luminaire type. */
  luminaireTypeId: referenceId('luminaireType', 'is not a luminaire type id').nullable().default(null),
  /** Place in the site's walking order for a round (1 first); null: after those with a place. */
  walkOrder: z
    .number({ invalid_type_error: 'must be a whole number' })
    .int('must be a whole number')
    .min(1, 'must be at least 1')
    .max(100_000, 'must be at most 100000')
    .nullable()
    .default(null),
  /** The final circuit it is on, as marked at the distribution board (the test planner can group by it). */
  circuit: z.string({ invalid_type_error: 'must be text' }).trim().max(40, 'must be at most 40 characters').default(''),
  /** Hours to full charge from a charger check, when known (else 24 h is assumed for planning). */
  rechargeH: z
    .number({ invalid_type_error: 'must be a number of hours' })
    .finite('must be a finite number')
    .gt(0, 'must be more than 0 hours')
    .max(72, 'must be at most 72 hours')
    .nullable()
    .default(null),
  /** The key an outside schedule knows it by (unique on its site): importing the schedule again updates this luminaire. */
  externalId: z.string().trim().min(1, 'must not be empty (send null for none)').max(80, 'must be at most 80 characters').nullable().default(null),
  /** The last functional test done before this register kept its log book, e.g. from the previous contractor's records. */
  lastFunctionalTestOn: IsoDateSchema.nullable().default(null),
  /** The last full-duration test done before this register kept its log book. */
  lastDurationTestOn: IsoDateSchema.nullable().default(null),
})
export type LuminaireInput = z.input<typeof LuminaireSchema>
export type Luminaire = z.output<typeof LuminaireSchema>
export const LuminairePatchSchema = LuminaireSchema.partial().refine((v) => Object.keys(v).length > 0, 'give at least one field to change')

/** A new battery pack fitted to a luminaire. */
export const PackReplacementSchema = PackSchema.partial({ chemistry: true, cellsInSeries: true, capacityAh: true }).extend({
  note: z.string().trim().max(400, 'must be at most 400 characters').default(''),
})

/** Columns of an imported luminaire schedule (CSV header names). */
export const IMPORT_COLUMNS = [
  'tag',
  'area',
  'location',
  'type',
  'purpose',
  'mode',
  'rated_duration_h',
  'chemistry',
  'cells',
  'capacity_ah',
  'pack_fitted_on',
  'external_id',
  'last_functional_test_on',
  'last_duration_test_on',
] as const
export const REQUIRED_IMPORT_COLUMNS = ['tag', 'purpose', 'mode', 'rated_duration_h', 'chemistry', 'cells', 'capacity_ah', 'pack_fitted_on'] as const

/**
 * Columns the register export adds that the calendar computes (due dates, state, failures). An
 * import reads past them, so an exported register can be edited and imported again as it is; what
 * they hold is worked out again from the log book, never taken from the file.
 */
export const REGISTER_DERIVED_COLUMNS = [
  'last_functional',
  'next_functional',
  'last_duration',
  'next_duration',
  'state',
  'replace_pack_by',
  'functional_due_reason',
  'functional_overdue_after',
  'duration_due_reason',
  'duration_overdue_after',
  'open_failure',
  'failed_on',
  'faults',
  'remedial_action',
  'retest_due_by',
  'retest_overdue',
] as const

/** One CSV row, cells as text, checked column by column (the key is the CSV column). */
export const ImportRowSchema = z.object({
  tag: LuminaireSchema.shape.tag,
  area: z.string().trim().max(120, 'must be at most 120 characters').default(''),
  location: LuminaireSchema.shape.location,
  type: LuminaireSchema.shape.typeLabel,
  purpose: z.preprocess((v) => (typeof v === 'string' ? v.trim().toLowerCase() : v), PurposeSchema),
  mode: z.preprocess((v) => (typeof v === 'string' ? v.trim().toLowerCase() : v), ModeSchema),
  rated_duration_h: LuminaireSchema.shape.ratedDurationH,
  chemistry: z.preprocess((v) => (typeof v === 'string' ? v.trim().toLowerCase() : v), ChemistrySchema),
  cells: PackSchema.shape.cellsInSeries,
  capacity_ah: PackSchema.shape.capacityAh,
  pack_fitted_on: IsoDateSchema,
  /** Matches the luminaire on a second import before the tag does (left empty: matched by tag). */
  external_id: z.string().trim().max(80, 'must be at most 80 characters').optional(),
  /** Left empty: a luminaire already in the register keeps the date it has. */
  last_functional_test_on: IsoDateSchema.optional(),
  last_duration_test_on: IsoDateSchema.optional(),
})
export type ImportRow = z.output<typeof ImportRowSchema>

export const ImportRequestSchema = z.object({
  csv: z.string({ required_error: 'is required (the CSV text, or upload a file)' }).min(1, 'is empty').max(2_000_000, 'is too large (2 MB at most)'),
})
