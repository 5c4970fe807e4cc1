/** The portfolio across sites: which luminaires to list, and the workspace's replacement-pack prices. */
import { z } from 'zod'

export const PORTFOLIO_STATES = ['overdue', 'failed', 'due-soon'] as const
export type PortfolioState = (typeof PORTFOLIO_STATES)[number]

/** `?state=overdue,failed&site=<id>`: states as a comma list (overdue and failed when left out). */
export const PortfolioQuerySchema = z
  .object({
    state: z
      .string()
      .optional()
      .transform((v, ctx) => {
        if (v === undefined || v.trim() === '') return ['overdue', 'failed'] as PortfolioState[]
        const parts = v.split(',').map((s) => s.trim())
        const bad = parts.find((p) => !(PORTFOLIO_STATES as readonly string[]).includes(p))
        if (bad !== undefined) {
          ctx.addIssue({ code: z.ZodIssueCode.custom, message: `"${bad}" is not a state: use overdue, failed or due-soon, separated by commas` })
          return z.NEVER
        }
        return [...new Set(parts)] as PortfolioState[]
      }),
    site: z.string().uuid('must be the id of a site').optional(),
  })
  .strict()

export const PackPriceSchema = z
  .object({
    typeLabel: z.string().trim().min(1, 'is required').max(80, 'at most 80 characters'),
    price: z
      .number({ invalid_type_error: 'must be a number' })
      .finite('must be a finite number')
      .min(0, 'cannot be negative')
      .max(1_000_000, 'is not a plausible pack price'),
    currency: z.string().regex(/^[A-Z]{3}$/, 'must be a three-letter currency code such as EUR, GBP or USD'),
  })
  .strict()

/** The whole price list at once: types left out lose their price. */
export const PackPricesSchema = z
  .object({ prices: z.array(PackPriceSchema).max(500, 'at most 500 types') })
  .strict()
  .superRefine((v, ctx) => {
    const seen = new Set<string>()
    v.prices.forEach((p, i) => {
      if (seen.has(p.typeLabel)) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['prices', i, 'typeLabel'], message: 'is listed twice' })
      seen.add(p.typeLabel)
    })
  })
