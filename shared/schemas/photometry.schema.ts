/**
 * Photometric files, luminaire types, and a route to choose a type for: the zod schemas the
 * server checks requests with and the client's forms use.
 */
import { z } from 'zod'
import { referenceId } from './reference'
import { finiteNumber, fraction, quantity } from '../engine/fields'
import { ChemistrySchema, ModeSchema } from './luminaire.schema'

const text = (max: number) => z.string({ invalid_type_error: 'must be text' }).trim().max(max, `must be at most ${max} characters`)

/** LM-63 files are small text files; a full 5°×5° table is well under 100 kB. */
export const MAX_LM63_BYTES = 512 * 1024

export const CRITERIA_IDS = ['en1838-route', 'en1838-open-area', 'en1838-high-risk', 'nfpa101'] as const
export const CriteriaSchema = z.enum(CRITERIA_IDS, { errorMap: () => ({ message: `must be one of ${CRITERIA_IDS.join(', ')}` }) })
export { CRITERIA_LABELS } from '../labels'

/** An upload as JSON (the multipart form sends the same two fields). */
export const PhotometryUploadSchema = z.object({
  name: text(120).optional(),
  text: z
    .string({ required_error: 'is required: the text of the LM-63 (.ies) file', invalid_type_error: 'must be the text of an LM-63 (.ies) file' })
    .min(1, 'is required: the text of the LM-63 (.ies) file')
    .max(MAX_LM63_BYTES, `must be at most ${MAX_LM63_BYTES / 1024} kB`),
})
export type PhotometryUpload = z.output<typeof PhotometryUploadSchema>

const HOUR = 3600

/** A luminaire type in the workspace's catalogue. */
const LuminaireTypeFields = z.object({
  name: text(120).min(1, 'is required'),
  photometricFileId: referenceId('photometricFile', 'is not a photometric file id', { invalidType: 'must be a photometric file id' }).nullable().default(null),
  /** Light output on battery as a share of the output the photometric file describes. */
  emergencyOutputFactor: fraction(),
  /** Rated duration: a bare number is seconds, or "3 h". Give this or `ratedDurationH`. */
  ratedDuration: quantity('time', { min: 0.5 * HOUR, max: 24 * HOUR, display: { unit: 'h', factor: 1 / HOUR } }).optional(),
  /** Rated duration in hours, under the name and unit the register and the type's answer use, so a value read can be sent back. */
  ratedDurationH: finiteNumber({ positive: true, min: 0.5, max: 24 }).optional(),
  modes: z
    .array(ModeSchema, { required_error: 'is required', invalid_type_error: 'must be a list of modes' })
    .min(1, 'needs at least one mode')
    .max(4, 'has at most two modes (maintained, non-maintained)')
    .transform((m) => [...new Set(m)]),
  chemistry: ChemistrySchema,
  cellsInSeries: finiteNumber({ int: true, min: 1, max: 48 }),
  /** The pack the type is sold with, Ah (optional). */
  capacityAh: finiteNumber({ positive: true, max: 400 }).nullable().default(null),
  /** Power at the light source on battery, W (what the pack supplies). */
  emergencyPower: finiteNumber({ positive: true, max: 1000 }),
  /** Mains input power in standby, W (charger, plus the lamp when maintained). */
  inputPower: finiteNumber({ min: 0, max: 10000 }),
  notes: text(2000).default(''),
})

type TypeFields = z.output<typeof LuminaireTypeFields>
/** One rated duration, in seconds, whichever of the two names carried it; both at once is refused (they could disagree). */
function oneRatedDuration(v: Partial<TypeFields>, ctx: z.RefinementCtx, required: boolean) {
  if (v.ratedDuration !== undefined && v.ratedDurationH !== undefined) {
    ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['ratedDurationH'], message: 'give the rated duration once: either ratedDuration or ratedDurationH' })
  } else if (required && v.ratedDuration === undefined && v.ratedDurationH === undefined) {
    ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['ratedDuration'], message: 'is required: a time, e.g. "3 h" (or ratedDurationH in hours)' })
  }
}
function inSeconds<T extends Partial<TypeFields>>({ ratedDurationH, ...rest }: T): Omit<T, 'ratedDurationH'> {
  return ratedDurationH === undefined ? rest : { ...rest, ratedDuration: ratedDurationH * HOUR }
}

export const LuminaireTypeSchema = LuminaireTypeFields.superRefine((v, ctx) => oneRatedDuration(v, ctx, true)).transform((v) => {
  const out = inSeconds(v)
  return { ...out, ratedDuration: out.ratedDuration as number }
})
export type LuminaireTypeInput = z.output<typeof LuminaireTypeSchema>

export const LuminaireTypePatchSchema = LuminaireTypeFields.partial()
  .refine((v) => Object.keys(v).length > 0, 'needs at least one field to change')
  .superRefine((v, ctx) => oneRatedDuration(v, ctx, false))
  .transform((v) => inSeconds(v))
export type LuminaireTypePatch = z.output<typeof LuminaireTypePatchSchema>

/** A route to find luminaire types for. Lengths are metres (or strings with units). */
export const RouteNeedSchema = z
  .object({
    routeLength: quantity('length', { positive: true, min: 0.1, max: 2000 }),
    routeWidth: quantity('length', { positive: true, min: 0.1, max: 100 }),
    mountingHeight: quantity('length', { positive: true, min: 0.1, max: 30 }),
    criteria: CriteriaSchema,
    ratedDuration: quantity('time', { min: 0.5 * HOUR, max: 24 * HOUR, display: { unit: 'h', factor: 1 / HOUR } }),
    maintenanceFactor: fraction().default(0.8),
    normalIlluminance: quantity('illuminance', { positive: true, max: 100000 }).optional(),
    /** Typed by the designer: used for every type instead of the type's own emergency output factor. */
    emergencyOutputFactor: fraction().optional(),
    /** NFPA 101: share of the initial emergency output left at the end of the rated duration. */
    endOfDurationFactor: fraction().optional(),
  })
  .superRefine((v, ctx) => {
    if (v.criteria === 'en1838-high-risk' && v.normalIlluminance === undefined) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['normalIlluminance'], message: 'is required for a high-risk task area' })
    }
  })
export type RouteNeedInput = z.output<typeof RouteNeedSchema>

/** Put a chosen type on a specification sheet: a new draft, or a new revision of an existing sheet. */
export const PickSchema = z
  .object({
    typeId: referenceId('luminaireType', 'is not a luminaire type id', { required: 'is required' }),
    route: RouteNeedSchema,
    title: text(200).optional(),
    /** The sheet to update; without it a new draft sheet is made. */
    sheetId: referenceId('specSheet', 'is not a sheet id').optional(),
    /** The sheet version the designer started from (needed with sheetId). */
    version: z.number({ invalid_type_error: 'must be the version number you started from' }).int('must be a whole number').min(1).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.sheetId && v.version === undefined) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['version'], message: 'is required when updating a sheet' })
  })
export type PickInput = z.output<typeof PickSchema>
