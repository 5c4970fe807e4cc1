import type { z } from 'zod'

/** Parses a request part with a shared zod schema; a ZodError becomes a 400 with field errors. */
export function parse<S extends z.ZodTypeAny>(schema: S, value: unknown): z.output<S> {
  return schema.parse(value ?? {})
}
