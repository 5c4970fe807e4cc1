/** Answers of the portfolio: what is overdue or failed across sites, and the pack budget. */
import { z } from 'zod'

const Money = z.object({ currency: z.string(), amount: z.number() })

export const PortfolioItemAnswer = z.object({
  siteId: z.string(),
  siteName: z.string(),
  luminaireId: z.string(),
  tag: z.string(),
  location: z.string(),
  areaName: z.string().nullable(),
  typeLabel: z.string(),
  state: z.enum(['failed', 'overdue', 'due-soon']),
  /** Tests past (or near) their day: kind, the day they were due, days overdue (negative: days left). */
  tests: z.array(
    z.object({
      kind: z.enum(['functional', 'duration']),
      dueOn: z.string(),
      daysOverdue: z.number().int(),
      reason: z.enum(['interval', 'retest', 'commissioning']),
    }),
  ),
  /** Open failures: when, what was found, what was done, and by when the retest is due. */
  failures: z.array(
    z.object({
      kind: z.enum(['functional', 'duration']),
      testedOn: z.string(),
      faults: z.string(),
      remedialAction: z.string(),
      retestBy: z.string(),
      retestOverdue: z.boolean(),
    }),
  ),
})

export const PortfolioAnswer = z.object({
  today: z.string(),
  states: z.array(z.enum(['overdue', 'failed', 'due-soon'])),
  sites: z.array(z.object({ id: z.string(), name: z.string() })),
  counts: z.object({ failed: z.number().int(), overdue: z.number().int(), dueSoon: z.number().int() }),
  items: z.array(PortfolioItemAnswer),
})

const BudgetLine = z.object({ typeLabel: z.string(), count: z.number().int(), unitPrice: Money.nullable(), cost: Money.nullable() })

export const PackBudgetAnswer = z.object({
  from: z.string(),
  to: z.string(),
  months: z.number().int(),
  sites: z.array(
    z.object({
      siteId: z.string(),
      siteName: z.string(),
      count: z.number().int(),
      overdue: z.number().int(),
      lines: z.array(BudgetLine),
      costs: z.array(Money),
      unpriced: z.number().int(),
    }),
  ),
  total: z.object({ count: z.number().int(), overdue: z.number().int(), costs: z.array(Money), unpriced: z.number().int() }),
  /** Every type in the register, with its price when set (for the price list). */
  types: z.array(z.object({ typeLabel: z.string(), luminaires: z.number().int(), price: Money.nullable() })),
})

export const PackPricesAnswer = z.object({ prices: z.array(z.object({ typeLabel: z.string(), price: z.number(), currency: z.string() })) })
