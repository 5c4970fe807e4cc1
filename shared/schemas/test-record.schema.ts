/** One routine test of one luminaire, as a technician records it (in a round or one at a time). */
import { z } from 'zod'
import { referenceId } from './reference'
import { IsoDateSchema } from './luminaire.schema'

export const TEST_KINDS = ['functional', 'duration'] as const
export const TestKindSchema = z.enum(TEST_KINDS, { errorMap: () => ({ message: 'must be functional or duration' }) })

export const TestRecordSchema = z
  .object({
    /** Made by the client for each record, so a retried send never creates a second record. */
    clientId: z.string({ required_error: 'is required' }).uuid('must be a UUID made by the client'),
    luminaireId: referenceId('luminaire', 'is not a luminaire id', { required: 'is required' }),
    kind: TestKindSchema,
    testedOn: IsoDateSchema,
    passed: z.boolean({ required_error: 'is required (pass or fail)', invalid_type_error: 'must be true (pass) or false (fail)' }),
    /** Hours the luminaire stayed lit on a full-duration test. */
    achievedDurationH: z.number({ invalid_type_error: 'must be a number of hours' }).finite('must be a finite number').min(0, 'cannot be negative').max(48, 'must be at most 48 hours').nullable().default(null),
    faults: z.string().trim().max(1000, 'must be at most 1000 characters').default(''),
    remedialAction: z.string().trim().max(1000, 'must be at most 1000 characters').default(''),
    dischargeLogId: referenceId('dischargeLog', 'is not a discharge log id').nullable().default(null),
  })
  .superRefine((v, ctx) => {
    if (!v.passed && !v.faults) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['faults'], message: 'say what failed' })
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
