/** Answers of the test-plan routes: the designer's choices as stored and the engine's plan. */
import { z } from 'zod'
import { Timestamp } from './common'

const PlanGroupAnswer = z.object({
  index: z.number().int(),
  name: z.string(),
  luminaireIds: z.array(z.string()),
  tags: z.array(z.string()),
  areas: z.array(z.string()),
  testH: z.number(),
  rechargeH: z.number(),
  /** Wall-clock times of the site, "YYYY-MM-DDTHH:MM". */
  startsAt: z.string(),
  endsAt: z.string(),
  fullCoverAt: z.string(),
  darkAreas: z.array(z.string()),
})

export const TestPlanAnswer = z.object({
  id: z.string(),
  siteId: z.string(),
  input: z.object({
    grouping: z.enum(['alternate', 'area', 'circuit']),
    firstDay: z.string(),
    windowStart: z.string(),
    windowEnd: z.string(),
    defaultRechargeH: z.number(),
  }),
  plan: z.object({
    groups: z.array(PlanGroupAnswer),
    warnings: z.array(z.object({ code: z.enum(['single-luminaire-area', 'area-dark', 'window-too-short', 'no-luminaires']), message: z.string() })),
    finishesAt: z.string().nullable(),
    working: z.array(z.string()),
  }),
  createdAt: Timestamp,
})

export const TestPlanListAnswer = z.object({ plans: z.array(TestPlanAnswer) })
