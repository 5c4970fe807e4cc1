import type { Request } from 'express'
import { z } from 'zod'
import { NotFoundError } from '../errors/app-error'

/** Parses a request part with a shared zod schema; a ZodError becomes a 400 with field errors. */
export function parse<S extends z.ZodTypeAny>(schema: S, value: unknown): z.output<S> {
  return schema.parse(value ?? {})
}

const Uuid = z.string().uuid()

/**
 * A record id from the path. A malformed id answers 404 exactly like a missing one, so ids cannot
 * be probed; `what` names the record in the message ("That discharge log was not found.").
 */
export function idParam(req: Request, what?: string, name = 'id'): string {
  const r = Uuid.safeParse(req.params[name])
  if (!r.success) throw new NotFoundError(what)
  return r.data
}
