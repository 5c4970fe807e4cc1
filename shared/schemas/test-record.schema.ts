/** One routine test of one luminaire, as a technician records it (in a round or one at a time). */
import { z } from 'zod'
import { referenceId } from './reference'
import { IsoDateSchema } from './luminaire.schema'

export const TEST_KINDS = ['functional', 'duration'] as const
export const TestKindSchema = z.enum(TEST_KINDS, { errorMap: () => ({ message: 'must be functional or duration' }) })

/**
 * The checks made at each luminaire on a round (common practice for the monthly and annual routine
 * tests of EN 50172 / BS 5266-1, from memory): stored with the record, shown in words.
 */
export const CHECKLIST_ITEMS = [
  { id: 'lamp-lit', label: 'Lamp lit on the simulated supply failure', kinds: ['functional', 'duration'] },
  { id: 'charge-indicator', label: 'Charge indicator lit again when the supply came back', kinds: ['functional', 'duration'] },
  { id: 'sign-legible', label: 'Sign or diffuser clean and legible', kinds: ['functional', 'duration'] },
  { id: 'test-switch', label: 'Test switch or key works', kinds: ['functional', 'duration'] },
  { id: 'no-damage', label: 'No damage, no missing parts', kinds: ['functional', 'duration'] },
  { id: 'lit-full-duration', label: 'Stayed lit to the end of the rated duration', kinds: ['duration'] },
] as const
export const CHECKLIST_ITEM_IDS = CHECKLIST_ITEMS.map((i) => i.id) as unknown as readonly [
  (typeof CHECKLIST_ITEMS)[number]['id'],
  ...Array<(typeof CHECKLIST_ITEMS)[number]['id']>,
]
export type ChecklistItemId = (typeof CHECKLIST_ITEMS)[number]['id']
export const checklistFor = (kind: (typeof TEST_KINDS)[number]) => CHECKLIST_ITEMS.filter((i) => (i.kinds as readonly string[]).includes(kind))

/** A typed runtime and its discharge log may differ by this many minutes (reading a stopwatch) before a reason is asked for. Common practice. */
export const RUNTIME_TOLERANCE_MIN = 5

const hoursText = (h: number) => String(Number(h.toFixed(2)))
/** The reason a typed runtime needs a note, or null when it agrees with the log. */
export function runtimeMismatch(typedH: number | null, logH: number): string | null {
  if (typedH === null) return null
  const minutes = Math.abs(typedH - logH) * 60
  if (minutes <= RUNTIME_TOLERANCE_MIN) return null
  return `the record says ${hoursText(typedH)} h, the log ${hoursText(logH)} h (${Math.round(minutes)} min apart): say why they differ`
}

/**
 * The pass or fail a full-duration runtime gives against the rated duration (EN 50172 / BS 5266-1:
 * the luminaire must stay lit for its full rated duration, from memory); null when no runtime was typed.
 */
export function durationVerdict(achievedH: number | null, ratedH: number): boolean | null {
  return achievedH === null ? null : achievedH >= ratedH
}

export const TestRecordSchema = z
  .object({
    /** Made by the client for each record, so a retried send never creates a second record. */
    clientId: z.string({ required_error: 'is required' }).uuid('must be a UUID made by the client'),
    luminaireId: referenceId('luminaire', 'is not a luminaire id', { required: 'is required' }),
    kind: TestKindSchema,
    testedOn: IsoDateSchema,
    passed: z.boolean({ required_error: 'is required (pass or fail)', invalid_type_error: 'must be true (pass) or false (fail)' }),
    /** Hours the luminaire stayed lit on a full-duration test. */
    achievedDurationH: z
      .number({ invalid_type_error: 'must be a number of hours' })
      .finite('must be a finite number')
      .min(0, 'cannot be negative')
      .max(48, 'must be at most 48 hours')
      .nullable()
      .default(null),
    faults: z.string().trim().max(1000, 'must be at most 1000 characters').default(''),
    remedialAction: z.string().trim().max(1000, 'must be at most 1000 characters').default(''),
    dischargeLogId: referenceId('dischargeLog', 'is not a discharge log id').nullable().default(null),
    /** Why a typed runtime differs from its discharge log by more than RUNTIME_TOLERANCE_MIN minutes. */
    runtimeNote: z.string().trim().max(500, 'must be at most 500 characters').default(''),
    /** The checklist for the test kind, as ticked: item id → fine (true) or found wrong (false). */
    checklist: z
      .record(
        z.enum(CHECKLIST_ITEM_IDS, { errorMap: () => ({ message: `must be one of ${CHECKLIST_ITEM_IDS.join(', ')}` }) }),
        z.boolean({ invalid_type_error: 'must be true (fine) or false (found wrong)' }),
      )
      .default({}),
    /** Why a full-duration verdict differs from what the runtime against the rated duration says. */
    verdictOverrideReason: z.string().trim().max(500, 'must be at most 500 characters').default(''),
    /** The round it belongs to (the round's client id), when recorded on a round. */
    roundClientId: z.string().uuid('is not a round id').nullable().default(null),
  })
  .superRefine((v, ctx) => {
    if (!v.passed && !v.faults) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['faults'], message: 'say what failed' })
    // A full-duration result is only as good as the time it stayed lit: no runtime, no result.
    if (v.kind === 'duration' && v.achievedDurationH === null && !v.dischargeLogId) {
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: ['achievedDurationH'],
        message: 'a full-duration test needs the time the luminaire stayed lit (hours), or its discharge log',
      })
    }
    if (v.kind === 'functional' && v.achievedDurationH !== null && v.achievedDurationH > 1) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['achievedDurationH'], message: 'a functional test is short; record long runs as a duration test' })
    }
  })
export type TestRecordInput = z.input<typeof TestRecordSchema>
export type TestRecordData = z.output<typeof TestRecordSchema>

/** Several records at once (a round). Each is saved or updated by its clientId. */
export const TestBatchSchema = z.object({
  records: z.array(TestRecordSchema, { required_error: 'is required' }).min(1, 'give at least one record').max(500, 'at most 500 records at once'),
})

/** The end of a round: signed off by name and date; its records carry the same round id. */
export const RoundSignOffSchema = z.object({
  clientId: z.string({ required_error: 'is required' }).uuid('must be a UUID made by the client'),
  signedOffByName: z
    .string({ required_error: 'is required' })
    .trim()
    .min(1, 'is required: the name of the person signing off')
    .max(120, 'must be at most 120 characters'),
  signedOffOn: IsoDateSchema,
  notes: z.string().trim().max(2000, 'must be at most 2000 characters').default(''),
})
export type RoundSignOff = z.output<typeof RoundSignOffSchema>

/** Marking a test as recorded in error: the record stays in the log book, struck through, with this reason. */
export const RecordedInErrorSchema = z
  .object({
    reason: z
      .string({ required_error: 'is required', invalid_type_error: 'must be text' })
      .trim()
      .min(3, 'say why, in a few words')
      .max(400, 'must be at most 400 characters'),
  })
  .strict('give only reason')
