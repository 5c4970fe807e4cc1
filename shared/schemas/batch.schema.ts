/**
 * Batches: many luminaires sized in one request, many luminaires changed in one request. Each
 * item is checked and answered on its own, so one bad item never stops the others; the request
 * itself is refused only when its outer shape is wrong (not a list, too many items).
 */
import { z } from 'zod'
import { referenceId } from './reference'
import { LuminaireAnswer } from './answers/register'

/** Items in one batch: enough for a large site's register, small enough to answer in about a second. */
export const MAX_BATCH_ITEMS = 1000

/** The integrator's own key for an item, echoed in its answer (a schedule row, a ticket number). */
const ItemRef = z.string().trim().min(1, 'must not be empty').max(80, 'must be at most 80 characters')

/**
 * One sizing: `input` is the `size` tool's input (docs/engine.md); with `luminaireId` the
 * luminaire's pack, rated duration, mode and its site's ceiling temperature come from the
 * register, its type's emergency power is the load when it has a type, and `input` adds or
 * overrides fields.
 */
export const SizeBatchItemSchema = z.object({
  ref: ItemRef.optional(),
  luminaireId: referenceId('luminaire', 'is not a luminaire id').optional(),
  input: z.record(z.unknown(), { invalid_type_error: 'must be an object: the size tool input' }).default({}),
})

export const SizeBatchSchema = z.object({
  items: z
    .array(SizeBatchItemSchema, { required_error: 'is required', invalid_type_error: 'must be a list of items' })
    .min(1, 'must hold at least one item')
    .max(MAX_BATCH_ITEMS, `must hold at most ${MAX_BATCH_ITEMS} items`),
  /** Include each result's working steps (off by default: a batch is for figures). */
  working: z.boolean({ invalid_type_error: 'must be true or false' }).default(false),
})
export type SizeBatchInput = z.input<typeof SizeBatchSchema>

/** One item's problem, located by an RFC 6901 JSON Pointer into the request body. */
export const ItemErrorSchema = z.object({ pointer: z.string(), code: z.string(), detail: z.string() })
export type ItemError = z.output<typeof ItemErrorSchema>

const ItemAnswerBase = z.object({
  index: z.number().int(),
  ref: z.string().optional(),
  /** The HTTP status this item would have had on its own (200, 400, 404, 409, 422). */
  status: z.number().int(),
  ok: z.boolean(),
  errors: z.array(ItemErrorSchema).optional(),
})

export const SizeBatchAnswer = z.object({
  tool: z.literal('size'),
  engineVersion: z.string(),
  count: z.number().int(),
  failed: z.number().int(),
  results: z.array(
    ItemAnswerBase.extend({
      luminaireId: z.string().optional(),
      /** The `size` tool's result (docs/engine.md), present when ok. */
      result: z.record(z.unknown()).optional(),
    }),
  ),
})

/** One luminaire to change: its id and the fields to change (as PATCH /api/luminaires/:id takes them). */
export const LuminaireBulkItemSchema = z.object({
  ref: ItemRef.optional(),
  id: referenceId('luminaire', 'is not a luminaire id', { required: 'is required' }),
  changes: z.record(z.unknown(), { required_error: 'is required', invalid_type_error: 'must be an object of fields to change' }),
})

export const LuminaireBulkSchema = z.object({
  items: z
    .array(LuminaireBulkItemSchema, { required_error: 'is required', invalid_type_error: 'must be a list of items' })
    .min(1, 'must hold at least one item')
    .max(MAX_BATCH_ITEMS, `must hold at most ${MAX_BATCH_ITEMS} items`),
})

export const LuminaireBulkAnswer = z.object({
  count: z.number().int(),
  failed: z.number().int(),
  results: z.array(ItemAnswerBase.extend({ id: z.string(), luminaire: LuminaireAnswer.optional() })),
})
