/** A request to plan a site's full-duration tests: the designer's choices; the luminaires come from the register. */
import { z } from 'zod'
import { IsoDateSchema } from './luminaire.schema'

export const PLAN_GROUPINGS = ['alternate', 'area', 'circuit'] as const
const TimeOfDay = z
  .string({ required_error: 'is required', invalid_type_error: 'must be a time HH:MM' })
  .trim()
  .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'must be a time of day written HH:MM (24-hour clock)')

export const TestPlanRequestSchema = z
  .object({
    grouping: z.enum(PLAN_GROUPINGS, { errorMap: () => ({ message: 'must be alternate, area or circuit' }) }).default('alternate'),
    firstDay: IsoDateSchema,
    windowStart: TimeOfDay,
    windowEnd: TimeOfDay,
    /** Hours to full charge for luminaires without a charger check figure (IEC 60598-2-22: 24 h, from memory). */
    defaultRechargeH: z
      .number({ invalid_type_error: 'must be a number of hours' })
      .finite('must be a finite number')
      .min(1, 'must be at least 1 hour')
      .max(72, 'must be at most 72 hours')
      .default(24),
  })
  .strict()
  .refine((v) => v.windowStart !== v.windowEnd, { path: ['windowEnd'], message: 'must differ from the start of the window' })
export type TestPlanRequest = z.output<typeof TestPlanRequestSchema>
export type TestPlanRequestInput = z.input<typeof TestPlanRequestSchema>
