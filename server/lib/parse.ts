import type { Request } from 'express'
import { z } from 'zod'
import { NotFoundError } from '../errors/app-error'

/** Parses a request part with a shared zod schema; a ZodError becomes a 400 with field errors. */
export function parse<S extends z.ZodTypeAny>(schema: S, value: unknown): z.output<S> {
  return schema.parse(value ?? {})
}

/** A record id in a path. */
export const Uuid = z.string().uuid()

/** Path parameters of the routes about one record: `/:id`. */
export const IdParams = z.object({ id: Uuid })

/** Path parameters made of several record ids, e.g. `uuidParams('id', 'shareId')`. */
export function uuidParams<K extends string>(...names: K[]) {
  return z.object(Object.fromEntries(names.map((n) => [n, Uuid])) as Record<K, typeof Uuid>)
}

/**
 * A record id from the path, for code outside a route declaration. Routes declare
 * `params: IdParams` instead: the route middleware then answers a malformed id with 404.
 */
export function idParam(req: Request, what?: string, name = 'id'): string {
  const r = Uuid.safeParse(req.params[name])
  if (!r.success) throw new NotFoundError(what)
  return r.data
}
