/**
 * Settings of a workspace as a whole. The currency prices and costs are written in (the pack
 * budget's prices, the claim check's tariff): chosen by an owner from a short list of ISO 4217
 * codes, or, until chosen, the usual one of the owner's region (US customary units: US dollar;
 * metric: euro; `regionDefaults` in shared/engine/units.ts).
 */
import { z } from 'zod'

/** The currencies offered: ISO 4217 codes. */
export const CURRENCIES = ['EUR', 'GBP', 'USD', 'CAD', 'AUD', 'NZD', 'CHF', 'SEK', 'NOK', 'DKK', 'PLN'] as const
export type Currency = (typeof CURRENCIES)[number]

export const CurrencySchema = z.enum(CURRENCIES, { errorMap: () => ({ message: `must be one of ${CURRENCIES.join(', ')}` }) })

export const WorkspaceSettingsPatchSchema = z.object({
  /** A currency from the list; null goes back to the owner's region's. */
  currency: CurrencySchema.nullable(),
})
export type WorkspaceSettingsPatch = z.output<typeof WorkspaceSettingsPatchSchema>
