/** Sites (buildings under test) and their areas: the one zod schema per concept, shared by server and forms. */
import { z } from 'zod'
import { REGIME_IDS } from '../engine/regimes'
import { EmailSchema } from './auth.schema'

export const TEST_REGIMES = REGIME_IDS
export const TestRegimeSchema = z.enum(TEST_REGIMES, { errorMap: () => ({ message: `must be one of ${TEST_REGIMES.join(', ')}` }) })
export type TestRegimeId = z.infer<typeof TestRegimeSchema>

export { REGIME_LABELS, REGIME_SHORT_LABELS } from '../labels'

const text = (max: number) =>
  z.string({ required_error: 'is required', invalid_type_error: 'must be text' }).trim().max(max, `must be at most ${max} characters`)

export const SiteSchema = z.object({
  name: text(120).min(1, 'is required'),
  address: text(400).default(''),
  responsibleName: text(120).default(''),
  responsibleEmail: z.union([EmailSchema, z.literal('')]).default(''),
  regime: TestRegimeSchema.default('en50172'),
  /** Typical temperature at ceiling height where the luminaires hang, °C (drives battery life). */
  ceilingTemperatureC: z
    .number({ invalid_type_error: 'must be a number of °C' })
    .finite('must be a finite number')
    .min(-40, 'must be at least −40 °C')
    .max(85, 'must be at most 85 °C')
    .default(25),
})
export type SiteInput = z.input<typeof SiteSchema>
export type Site = z.output<typeof SiteSchema>
export const SitePatchSchema = SiteSchema.partial()
  .extend({
    /** Why the regime changes (kept in the site's regime history). */
    regimeChangeReason: text(400).optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'give at least one field to change')
  .refine((v) => v.regimeChangeReason === undefined || v.regime !== undefined, { message: 'is only for a change of regime', path: ['regimeChangeReason'] })

export const AreaSchema = z.object({
  name: text(120).min(1, 'is required'),
  notes: text(400).default(''),
})
export const AreaPatchSchema = AreaSchema.partial()

/** A workspace's log-book rules. */
export const RegisterSettingsPatchSchema = z
  .object({
    /** Days from a failure (or a new pack) to its retest before the retest is overdue. */
    repairWindowDays: z
      .number({ invalid_type_error: 'must be a whole number of days' })
      .int('must be a whole number of days')
      .min(1, 'must be at least 1 day')
      .max(365, 'must be at most 365 days')
      .optional(),
    /** The daily reminder lists tests falling due within this many days. */
    reminderDaysAhead: z
      .number({ invalid_type_error: 'must be a whole number of days' })
      .int('must be a whole number of days')
      .min(1, 'must be at least 1 day')
      .max(90, 'must be at most 90 days')
      .optional(),
    /** Whether each site's responsible person gets the reminder. */
    remindSiteContact: z.boolean({ invalid_type_error: 'must be true or false' }).optional(),
    /** Members with these roles get the reminder (owners, so the person answerable sees it). */
    remindRoles: z
      .array(z.enum(['owner', 'designer', 'technician', 'viewer'], { errorMap: () => ({ message: "must be 'owner', 'designer', 'technician' or 'viewer'" }) }))
      .max(4)
      .transform((roles) => [...new Set(roles)])
      .optional(),
  })
  .strict('give only repairWindowDays, reminderDaysAhead, remindSiteContact or remindRoles')
  .refine((v) => Object.keys(v).length > 0, 'give at least one setting to change')
