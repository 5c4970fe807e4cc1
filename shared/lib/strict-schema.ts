/**
 * A copy of a zod schema in which every object refuses keys it does not declare (zod's default is
 * to drop them silently). The API validates requests with these copies, so a misspelt field is an
 * error the caller sees, not a value quietly ignored. Objects that already say what to do with
 * unknown keys (`.passthrough()`, `.catchall()`) keep their choice; an intersection is left as it
 * is, because each side of it would refuse the other side's keys.
 */
import { z, ZodFirstPartyTypeKind as Kind, type ZodTypeAny } from 'zod'

const made = new WeakMap<ZodTypeAny, ZodTypeAny>()

export function strictSchema<S extends ZodTypeAny>(schema: S): S {
  const known = made.get(schema)
  if (known) return known as S
  const copy = build(schema)
  made.set(schema, copy)
  return copy as S
}

function build(schema: ZodTypeAny): ZodTypeAny {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const def = schema._def as any
  switch (def.typeName as Kind) {
    case Kind.ZodObject: {
      const shape = Object.fromEntries(Object.entries((schema as z.AnyZodObject).shape).map(([k, v]) => [k, strictSchema(v as ZodTypeAny)]))
      const refusesUnknown = def.unknownKeys === 'strip' && def.catchall instanceof z.ZodNever
      return new z.ZodObject({ ...def, shape: () => shape, unknownKeys: refusesUnknown ? 'strict' : def.unknownKeys })
    }
    case Kind.ZodArray:
      return new z.ZodArray({ ...def, type: strictSchema(def.type) })
    case Kind.ZodOptional:
      return new z.ZodOptional({ ...def, innerType: strictSchema(def.innerType) })
    case Kind.ZodNullable:
      return new z.ZodNullable({ ...def, innerType: strictSchema(def.innerType) })
    case Kind.ZodDefault:
      return new z.ZodDefault({ ...def, innerType: strictSchema(def.innerType) })
    case Kind.ZodCatch:
      return new z.ZodCatch({ ...def, innerType: strictSchema(def.innerType) })
    case Kind.ZodReadonly:
      return new z.ZodReadonly({ ...def, innerType: strictSchema(def.innerType) })
    case Kind.ZodBranded:
      return new z.ZodBranded({ ...def, type: strictSchema(def.type) })
    case Kind.ZodEffects:
      return new z.ZodEffects({ ...def, schema: strictSchema(def.schema) })
    case Kind.ZodPipeline:
      return new z.ZodPipeline({ ...def, in: strictSchema(def.in) })
    case Kind.ZodLazy:
      return new z.ZodLazy({ ...def, getter: () => strictSchema(def.getter()) })
    case Kind.ZodUnion:
      return new z.ZodUnion({ ...def, options: def.options.map((o: ZodTypeAny) => strictSchema(o)) })
    case Kind.ZodDiscriminatedUnion: {
      const optionsMap = new Map<unknown, ZodTypeAny>()
      for (const [value, option] of def.optionsMap as Map<unknown, ZodTypeAny>) optionsMap.set(value, strictSchema(option))
      return new z.ZodDiscriminatedUnion({ ...def, options: def.options.map((o: ZodTypeAny) => strictSchema(o)), optionsMap })
    }
    case Kind.ZodRecord:
      return new z.ZodRecord({ ...def, valueType: strictSchema(def.valueType) })
    case Kind.ZodTuple:
      return new z.ZodTuple({ ...def, items: def.items.map((i: ZodTypeAny) => strictSchema(i)), rest: def.rest ? strictSchema(def.rest) : null })
    default:
      return schema
  }
}

/**
 * A refinement for an object read as a record (its keys checked by another schema later): each
 * key outside `known` is an unrecognized key, reported like an undeclared field of an object.
 */
export function refuseKeysOutside(known: readonly string[]) {
  return (raw: Record<string, unknown>, ctx: z.RefinementCtx) => {
    const unknown = Object.keys(raw).filter((k) => !known.includes(k))
    if (unknown.length) ctx.addIssue({ code: z.ZodIssueCode.unrecognized_keys, keys: unknown })
  }
}
