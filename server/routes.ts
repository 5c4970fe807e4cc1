/**
 * The route table: every /api route with the least access it needs. The app mounts exactly these,
 * and the access-control tests walk this same list, so a route cannot escape the checks.
 */
import type { RouteSpec } from './policy/access'
import { authRoutes } from './modules/auth/auth.router'
import { calcRoutes } from './modules/calc/calc.router'
import { healthRoutes } from './modules/health/health.router'
import { outboxRoutes } from './modules/mail/outbox.router'
import { registerRoutes } from './modules/register/register.router'
import { sheetRoutes } from './modules/sheets/sheets.router'
import { workspaceRoutes } from './modules/workspaces/workspaces.router'

export interface RouteTableOptions {
  signInWindowMs: number
}

export function buildRouteTable(opts: RouteTableOptions): RouteSpec[] {
  return [
    ...healthRoutes,
    ...authRoutes(opts),
    ...workspaceRoutes,
    ...outboxRoutes,
    ...calcRoutes,
    ...sheetRoutes,
    ...registerRoutes,
  ]
}
