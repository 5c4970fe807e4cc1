/** The portfolio across sites: failed and overdue luminaires, the 12-month pack budget, pack prices. */
import type { Answer } from '@shared/schemas/answers/common'
import type { PackBudgetAnswer, PackPricesAnswer, PortfolioAnswer } from '@shared/schemas/answers/portfolio'
import type { PortfolioState } from '@shared/schemas/portfolio.schema'
import { http } from './http'

export type Portfolio = Answer<typeof PortfolioAnswer>
export type PackBudget = Answer<typeof PackBudgetAnswer>
export type PackPrices = Answer<typeof PackPricesAnswer>

export function fetchPortfolio(states: PortfolioState[], siteId: string | null) {
  const q = new URLSearchParams({ state: states.join(',') })
  if (siteId) q.set('site', siteId)
  return http.get<Portfolio>(`/portfolio?${q}`)
}
export const fetchPackBudget = () => http.get<PackBudget>('/portfolio/pack-budget')
export const savePackPrices = (prices: PackPrices['prices']) => http.put<PackPrices>('/portfolio/pack-prices', { prices })
