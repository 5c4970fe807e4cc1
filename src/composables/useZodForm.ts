/**
 * vee-validate + zod for naive-ui forms: one shared schema validates in the browser, and the
 * server's field errors land next to the same inputs.
 */
import { computed } from 'vue'
import { useField, useForm } from 'vee-validate'
import { toTypedSchema } from '@vee-validate/zod'
import type { z } from 'zod'
import { ApiError } from '@/api/http'

export function useZodForm<S extends z.ZodTypeAny>(schema: S, initialValues?: Partial<z.input<S>>, opts: { keepAsTyped?: boolean } = {}) {
  const typed = toTypedSchema(schema)
  // vee-validate "casts" initial and reset values through the schema; with unit-parsing transforms
  // that turns "5 Ah" into 18000 in the field. keepAsTyped leaves values exactly as given.
  const validationSchema = opts.keepAsTyped ? { ...typed, cast: (values: unknown) => values } : typed
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
