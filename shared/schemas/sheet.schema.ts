/**
 * Specification sheets: the one zod schema per concept (sheet content, save, list query, share,
 * e-mail of a share), used by the server's checks and the client's forms. The pack inputs inside
 * a sheet are checked by the engine's own size schema, so a sheet can never hold an input the
 * engine would refuse.
 */
import { z } from 'zod'
import { refuseKeysOutside } from '../lib/strict-schema'
import { sizeInputObject, sizeInputSchema } from '../engine/size'
import { CHEMISTRY_IDS } from '../engine/chemistries'
import { EmailSchema } from './auth.schema'

export * from './sheet-text'

const text = (max: number) => z.string({ invalid_type_error: 'must be text' }).trim().max(max, `must be at most ${max} characters`)

/** Keys the size tool knows; anything else in saved inputs is refused. */
export const PACK_INPUT_KEYS = Object.keys(sizeInputObject.shape) as Array<keyof typeof sizeInputObject.shape>

/**
 * The pack inputs exactly as typed ("120 mA", "3 h"), so a reopened sheet shows what its author wrote.
 * Validated with the engine's schema; stored raw (an unknown key is refused, blanks are left out).
 */
export const PackInputsSchema = z
  .record(z.unknown(), { invalid_type_error: 'must be an object of pack inputs', required_error: 'is required' })
  .superRefine(refuseKeysOutside(PACK_INPUT_KEYS))
  .transform((raw) =>
    Object.fromEntries(Object.entries(raw).filter(([k, v]) => (PACK_INPUT_KEYS as string[]).includes(k) && v !== undefined && v !== null && v !== '')),
  )
  .superRefine((raw, ctx) => {
    const parsed = sizeInputSchema.safeParse(raw)
    if (parsed.success) return
    for (const issue of parsed.error.issues) ctx.addIssue({ code: z.ZodIssueCode.custom, path: issue.path, message: issue.message })
  })
export type PackInputs = Record<string, unknown>

/** What a person writes on a sheet, beside the pack inputs. */
export const SheetMetaSchema = z.object({
  title: text(200).min(1, 'is required'),
  reference: text(80).default(''),
  client: text(200).default(''),
  site: text(200).default(''),
  luminaire: text(2000).default(''),
})
export type SheetMeta = z.output<typeof SheetMetaSchema>

export const SheetContentSchema = SheetMetaSchema.extend({ inputs: PackInputsSchema })
export type SheetContent = z.output<typeof SheetContentSchema>

/** A save: the content plus the version the editor started from (optimistic concurrency). */
export const SheetSaveSchema = SheetContentSchema.extend({
  version: z
    .number({ required_error: 'is required', invalid_type_error: 'must be the version number you started from' })
    .int('must be a whole number')
    .min(1, 'must be at least 1'),
})

export const SHEET_STATUSES = ['draft', 'issued'] as const
export const REVISION_STATUSES = ['draft', 'issued', 'superseded'] as const
export type SheetStatus = (typeof SHEET_STATUSES)[number]
export type RevisionStatus = (typeof REVISION_STATUSES)[number]

export const SHEET_SORTS = ['updatedAt', 'createdAt', 'title', 'reference', 'client', 'status', 'chemistry'] as const

export const SheetListQuerySchema = z.object({
  page: z.coerce.number({ invalid_type_error: 'must be a page number' }).int('must be a whole number').min(1, 'must be at least 1').max(100_000).default(1),
  pageSize: z.coerce
    .number({ invalid_type_error: 'must be a number' })
    .int('must be a whole number')
    .min(1, 'must be at least 1')
    .max(100, 'must be at most 100')
    .default(20),
  sort: z.enum(SHEET_SORTS, { errorMap: () => ({ message: `must be one of ${SHEET_SORTS.join(', ')}` }) }).default('updatedAt'),
  order: z.enum(['asc', 'desc'], { errorMap: () => ({ message: 'must be asc or desc' }) }).default('desc'),
  q: text(200).optional(),
  chemistry: z.enum(CHEMISTRY_IDS, { errorMap: () => ({ message: `must be one of ${CHEMISTRY_IDS.join(', ')}` }) }).optional(),
  status: z.enum(SHEET_STATUSES, { errorMap: () => ({ message: 'must be draft or issued' }) }).optional(),
  author: z.string().uuid('must be a user id').optional(),
  archived: z
    .enum(['true', 'false'], { errorMap: () => ({ message: 'must be true or false' }) })
    .default('false')
    .transform((v) => v === 'true'),
})
export type SheetListQuery = z.output<typeof SheetListQuerySchema>

export const IssueSchema = z.object({
  version: z.number({ required_error: 'is required', invalid_type_error: 'must be the version number you started from' }).int().min(1),
})

export const ShareCreateSchema = z.object({
  /** When the link stops working; none means until revoked. The server checks it lies ahead (the schema has no clock). */
  expiresAt: z
    .string({ invalid_type_error: 'must be a date and time' })
    .datetime({ offset: true, message: 'must be a date and time such as 2026-03-01T12:00:00Z' })
    .nullable()
    .optional(),
})

export const ShareEmailSchema = z.object({
  to: EmailSchema,
  message: text(2000).default(''),
  /** The link's token, shown once when it was made; only its hash is stored, so the sender supplies it. */
  token: z.string({ required_error: 'is required' }).min(20, 'is not a share token').max(200, 'is not a share token'),
})
