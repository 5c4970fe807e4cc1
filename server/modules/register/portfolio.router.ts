/** /api/portfolio: what is failed or overdue across sites, the 12-month pack budget, and the pack prices behind it. */
import { PackBudgetAnswer, PackPricesAnswer, PortfolioAnswer } from '../../../shared/schemas/answers/portfolio'
import { PackPricesSchema, PortfolioQuerySchema } from '../../../shared/schemas/portfolio.schema'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import * as portfolio from './portfolio.service'

export const portfolioRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/portfolio',
    access: 'viewer',
    summary: 'Luminaires failed, overdue or due soon across every site (filter by state and site)',
    query: PortfolioQuerySchema,
    response: PortfolioAnswer,
    handler: ({ query }, req) => portfolio.luminairesInState(scope(req).workspaceId, { states: query.state, siteId: query.site }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/portfolio/pack-budget',
    access: 'viewer',
    summary: 'Replacement packs to buy in the next 12 months, counted and costed per site',
    response: PackBudgetAnswer,
    handler: (_input, req) => portfolio.workspacePackBudget(scope(req).workspaceId),
  }),
  defineRoute({
    method: 'get',
    path: '/api/portfolio/pack-prices',
    access: 'viewer',
    summary: "The workspace's price of a replacement pack per luminaire type",
    response: PackPricesAnswer,
    handler: async (_input, req) => ({ prices: await portfolio.packPrices(scope(req).workspaceId) }),
  }),
  defineRoute({
    method: 'put',
    path: '/api/portfolio/pack-prices',
    access: 'owner',
    summary: 'Set the price list of replacement packs (a type left out loses its price)',
    body: PackPricesSchema,
    response: PackPricesAnswer,
    handler: ({ body }, req) => {
      const s = scope(req)
      return portfolio.setPackPrices(s.workspaceId, s.userId, body.prices)
    },
  }),
]
