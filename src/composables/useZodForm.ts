/**
 * The one form composable: vee-validate on a shared zod schema for naive-ui forms. The same schema
 * validates in the browser and on the server, and the server's field errors land next to the same
 * inputs.
 *
 * `keepAsTyped` is for engine forms whose fields take units ("5 Ah", "3 h"): @vee-validate/zod's
 * cast would run the engine's transforms on the initial and reset values and turn "3 h" into 10800
 * in the field, so the person would no longer see what they typed. Validation is the same zod
 * schema either way.
 */
import { computed } from 'vue'
import { useField, useForm, type TypedSchema } from 'vee-validate'
import { toTypedSchema } from '@vee-validate/zod'
import type { z } from 'zod'
import { ApiError } from '@/api/http'

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

export function useZodForm<S extends z.ZodTypeAny>(schema: S, initialValues?: Partial<z.input<S>>, opts: { keepAsTyped?: boolean } = {}) {
  const typed = toTypedSchema(schema)
  const validationSchema = opts.keepAsTyped ? uncastSchema(schema) : typed
  const form = useForm({ validationSchema: validationSchema as typeof typed, initialValues: initialValues as never })

  /** Binds one field: its value, and the status/feedback props NFormItem wants. */
  function field<T = string>(name: string) {
    const f = useField<T>(name)
    return {
      value: f.value,
      status: computed(() => (f.errorMessage.value ? ('error' as const) : undefined)),
      feedback: computed(() => f.errorMessage.value),
      label: name,
    }
  }

  /** Shows an API error: field messages next to their inputs; returns the general message. */
  function applyServerError(err: unknown): string {
    if (err instanceof ApiError) {
      if (err.fields.length) form.setErrors(err.fieldMap() as never)
      return err.message
    }
    return 'Something went wrong. Try again.'
  }

  return { ...form, field, applyServerError }
}
