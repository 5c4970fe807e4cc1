/**
 * One shape for a list the API pages through: `{ items, nextCursor }`, with the next page also in
 * an RFC 8288 `Link: <…>; rel="next"` header. The cursor is opaque; send it back unchanged as
 * `?cursor=` with the same filters. A missing `nextCursor` (null) means the last page.
 */
import { z } from 'zod'
import { IsoDateSchema } from './luminaire.schema'

export const DEFAULT_PAGE_SIZE = 100
export const MAX_PAGE_SIZE = 500

export const PageQuery = z.object({
  limit: z.coerce
    .number({ invalid_type_error: 'must be a whole number' })
    .int('must be a whole number')
    .min(1, 'must be at least 1')
    .max(MAX_PAGE_SIZE, `must be at most ${MAX_PAGE_SIZE}`)
    .default(DEFAULT_PAGE_SIZE),
  cursor: z.string().max(400, 'is not a cursor this API gave').optional(),
})

/** A moment, ISO 8601 with a zone ("2026-11-30T06:00:00Z"): records changed at or after it. */
export const UpdatedSinceSchema = z
  .string()
  .refine(
    (v) => /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/.test(v) && !Number.isNaN(Date.parse(v)),
    'must be a moment written ISO 8601 with its zone, e.g. 2026-11-30T06:00:00Z',
  )

/** The states the register's lists filter on (a luminaire may be in several). */
export const ATTENTION_STATES = ['overdue', 'failed', 'due-soon'] as const
export type AttentionState = (typeof ATTENTION_STATES)[number]

/** `?state=overdue,failed` or `?state=overdue&state=failed`. */
const StatesSchema = z
  .union([z.string(), z.array(z.string())])
  .transform((v) =>
    (Array.isArray(v) ? v : [v])
      .flatMap((s) => s.split(','))
      .map((s) => s.trim())
      .filter(Boolean),
  )
  .pipe(z.array(z.enum(ATTENTION_STATES, { errorMap: () => ({ message: `must be ${ATTENTION_STATES.join(', ')} (or several, comma-separated)` }) })))

const uuidQuery = (what: string) => z.string().uuid(`is not ${what} id`)

export const LuminaireListQuery = PageQuery.extend({
  state: StatesSchema.optional(),
  siteId: uuidQuery('a site').optional(),
  updatedSince: UpdatedSinceSchema.optional(),
})

export const TestListQuery = PageQuery.extend({
  siteId: uuidQuery('a site').optional(),
  luminaireId: uuidQuery('a luminaire').optional(),
  /** First and last day of the log book to list (YYYY-MM-DD, both included). */
  from: IsoDateSchema.optional(),
  to: IsoDateSchema.optional(),
  updatedSince: UpdatedSinceSchema.optional(),
}).refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'must not be before from' })

/** The list answer around an item schema. */
export function listAnswer<T extends z.ZodTypeAny>(item: T) {
  return z.object({ items: z.array(item), nextCursor: z.string().nullable() })
}
