/**
 * Ids in a request body that point at another record of the caller's workspace. A schema field made
 * with `referenceId(kind, …)` carries its kind, so the server can check every such id against the
 * workspace before the handler runs, and tests can find every id field of every route.
 */
import { z } from 'zod'

/** The kinds of record a body may point at. */
export const REFERENCE_KINDS = [
  'site',
  'area',
  'luminaire',
  'testRecord',
  'specSheet',
  'luminaireType',
  'photometricFile',
  'dischargeLog',
  'dischargeFile',
  'stagedUpload',
  'wattageAudit',
] as const
export type ReferenceKind = (typeof REFERENCE_KINDS)[number]

interface ReferenceDef extends z.ZodStringDef {
  reference?: ReferenceKind
}

/** A UUID field that names a record of the caller's workspace. */
export function referenceId(kind: ReferenceKind, message: string, opts: { invalidType?: string; required?: string } = {}) {
  const s = z.string({ invalid_type_error: opts.invalidType, required_error: opts.required }).uuid(message)
  // Kept on the definition: zod copies it when the string is refined further or described.
  ;(s._def as ReferenceDef).reference = kind
  return s
}

/** The kind of a string schema made by `referenceId`, if it is one. */
export function referenceKindOf(schema: z.ZodTypeAny): ReferenceKind | undefined {
  return (schema._def as ReferenceDef).reference
}

/** The schema inside wrappers that do not change the shape (optional, nullable, default, refinements…). */
function unwrap(schema: z.ZodTypeAny): z.ZodTypeAny {
  let s = schema
  for (;;) {
    if (s instanceof z.ZodOptional || s instanceof z.ZodNullable || s instanceof z.ZodDefault || s instanceof z.ZodReadonly || s instanceof z.ZodCatch)
      s = s._def.innerType
    else if (s instanceof z.ZodEffects) s = s._def.schema
    else if (s instanceof z.ZodBranded) s = s._def.type
    else if (s instanceof z.ZodPipeline) s = s._def.in
    else return s
  }
}

const isUuidString = (s: z.ZodTypeAny) => s instanceof z.ZodString && s._def.checks.some((c) => c.kind === 'uuid')

export interface IdField {
  /** Path as zod writes it; `[]` stands for any item of an array. */
  path: string[]
  /** null for a UUID field that names no record (e.g. an id made by the client). */
  kind: ReferenceKind | null
}

/** Every UUID field of a schema, with the record kind it refers to. */
export function idFieldsOf(schema: z.ZodTypeAny, path: string[] = [], out: IdField[] = []): IdField[] {
  const s = unwrap(schema)
  if (s instanceof z.ZodObject) for (const [k, v] of Object.entries(s.shape as Record<string, z.ZodTypeAny>)) idFieldsOf(v, [...path, k], out)
  else if (s instanceof z.ZodArray) idFieldsOf(s._def.type, [...path, '[]'], out)
  else if (s instanceof z.ZodUnion || s instanceof z.ZodDiscriminatedUnion) for (const o of s._def.options as z.ZodTypeAny[]) idFieldsOf(o, path, out)
  else if (s instanceof z.ZodIntersection) {
    idFieldsOf(s._def.left, path, out)
    idFieldsOf(s._def.right, path, out)
  } else if (isUuidString(s)) {
    const key = path.join('.')
    if (!out.some((f) => f.path.join('.') === key)) out.push({ path, kind: referenceKindOf(s) ?? null })
  }
  return out
}

export interface ReferenceInValue {
  /** Path as zod writes it in a 400, e.g. "records.0.dischargeLogId". */
  path: string
  kind: ReferenceKind
  id: string
}

/** Every reference id present in a (parsed) value of the schema. */
export function referencesIn(schema: z.ZodTypeAny, value: unknown, path: Array<string | number> = [], out: ReferenceInValue[] = []): ReferenceInValue[] {
  if (value === null || value === undefined) return out
  const s = unwrap(schema)
  if (s instanceof z.ZodObject) {
    if (typeof value !== 'object' || Array.isArray(value)) return out
    for (const [k, v] of Object.entries(s.shape as Record<string, z.ZodTypeAny>)) referencesIn(v, (value as Record<string, unknown>)[k], [...path, k], out)
  } else if (s instanceof z.ZodArray) {
    if (Array.isArray(value)) value.forEach((item, i) => referencesIn(s._def.type, item, [...path, i], out))
  } else if (s instanceof z.ZodUnion || s instanceof z.ZodDiscriminatedUnion) {
    for (const o of s._def.options as z.ZodTypeAny[]) referencesIn(o, value, path, out)
  } else if (s instanceof z.ZodIntersection) {
    referencesIn(s._def.left, value, path, out)
    referencesIn(s._def.right, value, path, out)
  } else if (s instanceof z.ZodString) {
    const kind = referenceKindOf(s)
    const key = path.join('.')
    if (kind && typeof value === 'string' && !out.some((r) => r.path === key)) out.push({ path: key, kind, id: value })
  }
  return out
}
