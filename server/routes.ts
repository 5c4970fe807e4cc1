/**
 * The route table: every /api route with the least access it needs. The app mounts exactly these,
 * and the access-control tests walk this same list, so a route cannot escape the checks.
 */
import type { RouteSpec } from './policy/access'
import type { Limits } from './lib/limits'
import { auditRoutes } from './modules/audits/audits.router'
import { authRoutes } from './modules/auth/auth.router'
import { calcRoutes } from './modules/calc/calc.router'
import { dischargeRoutes } from './modules/discharge/discharge.router'
import { docsRoutes } from './modules/docs/docs.router'
import { handoverRoutes } from './modules/handover/handover.router'
import { healthRoutes } from './modules/health/health.router'
import { logbookRoutes } from './modules/logbook/logbook.router'
import { outboxRoutes } from './modules/mail/outbox.router'
import { photometryRoutes } from './modules/photometry/photometry.router'
import { registerRoutes } from './modules/register/register.router'
import { collectionRoutes } from './modules/register/collections.router'
import { portfolioRoutes } from './modules/register/portfolio.router'
import { sheetRoutes } from './modules/sheets/sheets.router'
import { storageRoutes } from './modules/storage/storage.router'
import { tokenRoutes } from './modules/tokens/tokens.router'
import { workspaceRoutes } from './modules/workspaces/workspaces.router'

export interface RouteTableOptions {
  signInWindowMs: number
  limits: Limits
}

export function buildRouteTable(opts: RouteTableOptions): RouteSpec[] {
  const table: RouteSpec[] = [
    ...docsRoutes(() => table),
    ...healthRoutes,
    ...authRoutes(opts),
    ...workspaceRoutes,
    ...outboxRoutes,
    ...calcRoutes,
    ...tokenRoutes,
    ...sheetRoutes,
    ...registerRoutes,
    ...collectionRoutes,
    ...portfolioRoutes,
    ...auditRoutes,
    ...dischargeRoutes,
    ...photometryRoutes,
    ...storageRoutes,
    ...handoverRoutes,
    ...logbookRoutes,
  ]
  return table
}
