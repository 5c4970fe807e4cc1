/**
 * Saved wattage audits: what a person records (a title, the luminaire, the readings as typed), where
 * it is attached (a specification sheet, a luminaire of a site register), and the list query. The
 * readings are checked by the engine's own audit schema, so a saved audit never holds input the
 * engine would refuse.
 */
import { z } from 'zod'
import { refuseKeysOutside } from '../lib/strict-schema'
import { referenceId, type ReferenceKind } from './reference'
import { auditInput } from '../engine/audit'

export * from './wattage-audit-text'

const text = (max: number) => z.string({ invalid_type_error: 'must be text' }).trim().max(max, `must be at most ${max} characters`)
const optionalId = (kind: ReferenceKind, what: string) =>
  referenceId(kind, `must be the id of a ${what}`, { invalidType: `must be the id of a ${what}` }).nullable()

/** Keys the audit tool knows; anything else in saved readings is refused. */
export const AUDIT_INPUT_KEYS: string[] = Object.keys((auditInput as unknown as z.ZodEffects<z.AnyZodObject>).innerType().shape)

/** The readings exactly as typed ("25 mA", "230 V"), checked with the engine's schema, stored raw. */
export const AuditReadingsSchema = z
  .record(z.unknown(), { invalid_type_error: 'must be an object of readings', required_error: 'is required' })
  .superRefine(refuseKeysOutside(AUDIT_INPUT_KEYS))
  .transform((raw) => Object.fromEntries(Object.entries(raw).filter(([k, v]) => AUDIT_INPUT_KEYS.includes(k) && v !== undefined && v !== null && v !== '')))
  .superRefine((raw, ctx) => {
    const parsed = auditInput.safeParse(raw)
    if (parsed.success) return
    for (const issue of parsed.error.issues) ctx.addIssue({ code: z.ZodIssueCode.custom, path: issue.path, message: issue.message })
  })

/** Where an audit hangs: a sheet, a luminaire, both or neither (null detaches). */
export const AuditLinksSchema = z.object({
  specSheetId: optionalId('specSheet', 'specification sheet').optional(),
  luminaireId: optionalId('luminaire', 'luminaire').optional(),
})

export const AuditCreateSchema = AuditLinksSchema.extend({
  title: text(200).min(1, 'is required'),
  /** The luminaire as described by the person auditing it (model, marking, where it hangs). */
  luminaire: text(2000).default(''),
  inputs: AuditReadingsSchema,
})
export type AuditCreate = z.output<typeof AuditCreateSchema>

export const AuditAttachSchema = AuditLinksSchema.refine((v) => v.specSheetId !== undefined || v.luminaireId !== undefined, {
  message: 'give specSheetId or luminaireId (null to detach)',
  path: ['specSheetId'],
})
export type AuditAttach = z.output<typeof AuditAttachSchema>

/** At most this many audits side by side. */
export const MAX_COMPARED_AUDITS = 6

export const AuditListQuerySchema = z.object({
  sheetId: z.string().uuid('must be the id of a specification sheet').optional(),
  luminaireId: z.string().uuid('must be the id of a luminaire').optional(),
  /** Comma-separated ids, for the side-by-side table. */
  ids: z
    .string()
    .optional()
    .transform((s) =>
      s
        ? s
            .split(',')
            .map((x) => x.trim())
            .filter(Boolean)
        : undefined,
    )
    .pipe(z.array(z.string().uuid('must be a list of audit ids')).max(MAX_COMPARED_AUDITS, `at most ${MAX_COMPARED_AUDITS} audits side by side`).optional()),
  q: text(100).optional(),
  limit: z.coerce
    .number({ invalid_type_error: 'must be a number' })
    .int('must be a whole number')
    .min(1, 'must be at least 1')
    .max(200, 'must be at most 200')
    .default(50),
})
export type AuditListQuery = z.output<typeof AuditListQuerySchema>
