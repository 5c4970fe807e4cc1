/**
 * A vee-validate form on an engine schema. Unlike useZodForm it never casts: @vee-validate/zod's
 * cast would run the engine's transforms on the initial values and turn "3 h" into 10800 in the
 * field, so the person would no longer see what they typed. Validation is the same zod schema.
 */
import { useForm, type TypedSchema } from 'vee-validate'
import type { z } from 'zod'

/** The schema as vee-validate wants it: parse with zod, errors by dotted path, no cast. */
export function uncastSchema<S extends z.ZodTypeAny>(schema: S): TypedSchema<z.input<S>, z.output<S>> {
  return {
    __type: 'VVTypedSchema',
    async parse(values) {
      const result = schema.safeParse(values)
      if (result.success) return { value: result.data, errors: [] }
      const byPath = new Map<string, string[]>()
      for (const issue of result.error.issues) {
        const path = issue.path.join('.')
        byPath.set(path, [...(byPath.get(path) ?? []), issue.message])
      }
      return { errors: [...byPath].map(([path, errors]) => ({ path, errors })) }
    },
  }
}

export function useEngineForm<S extends z.ZodTypeAny>(schema: S, initialValues: Record<string, unknown>) {
  return useForm({ validationSchema: uncastSchema(schema), initialValues: initialValues as never })
}
