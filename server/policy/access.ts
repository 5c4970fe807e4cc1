/**
 * Who may call what. Every /api route is declared with the least access it needs; this module is the
 * only place that turns a declaration into checks, and the route table in ../routes.ts is what the
 * access-control tests walk.
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express'
import { roleAtLeast, type Role } from '../../shared/schemas/roles'
import { AppError, ForbiddenError, UnauthorizedError } from '../errors/app-error'
import type { TokenScope } from '../../shared/schemas/token.schema'
import type { Access } from './route'
import { requestToken, withRequestToken } from '../lib/request-token'
import { recordAudit } from '../modules/audit/audit.service'
import { findMembership, firstMembership } from '../modules/workspaces/workspaces.repository'

export type { Access, Method, RouteSpec, RouteInput } from './route'
export { defineRoute } from './route'

export interface RequestContext {
  userId: string
  workspaceId: string | null
  role: Role | null
  /** Set when the request was authenticated with an API token rather than a session. */
  viaToken?: boolean
  /** What that token may do (read, write, calc). */
  tokenScopes?: TokenScope[]
}

declare module 'express-serve-static-core' {
  interface Request {
    ctx?: RequestContext
  }
}

declare module 'express-session' {
  interface SessionData {
    workspaceId?: string
    csrfToken?: string
  }
}

/** The signed-in user's id, from the session (passport) or an API token. */
function currentUserId(req: Request): string | null {
  if (req.ctx?.userId) return req.ctx.userId
  const u = req.user as { id?: string } | undefined
  return u?.id ?? null
}

/**
 * Every write made with a token leaves one event naming the token, the method, the path and the
 * status, besides the events the services record (which name the token too): the trail then holds
 * each of a script's writes even where a service records nothing of its own.
 */
function auditTokenWrite(req: Request, res: Response) {
  const token = requestToken()
  const ctx = req.ctx
  if (!token || !ctx) return
  const path = req.originalUrl.split('?')[0]
  res.on('finish', () => {
    if (res.statusCode >= 400) return
    const event = {
      workspaceId: ctx.workspaceId,
      actorId: ctx.userId,
      action: 'api.write',
      entityType: 'api_token',
      entityId: token.id,
      data: { method: req.method, path, status: res.statusCode },
    }
    void withRequestToken(token, () => recordAudit(event)).catch(() => undefined)
  })
}

/** A token without the scope a route needs: 403, saying which scope (RFC 6750 §3.1). */
function insufficientScope(res: Response, scope: TokenScope) {
  res.set('WWW-Authenticate', `Bearer realm="api", error="insufficient_scope", scope="${scope}"`)
  return new AppError(403, 'insufficient_scope', `This API token does not have the ${scope} scope this request needs.`)
}

/**
 * `opts.tokens`: an API token may call this `signed-in` route (account-level routes refuse tokens).
 * `opts.scope`: the token scope the route needs (read, write or calc).
 */
export function authorize(access: Access, opts: { tokens?: boolean; scope?: TokenScope } = {}): RequestHandler {
  return async (req: Request, res: Response, next: NextFunction) => {
    if (access === 'public') return next()
    const userId = currentUserId(req)
    if (!userId) return next(new UnauthorizedError())
    if (req.ctx?.viaToken) {
      if (opts.scope && !req.ctx.tokenScopes?.includes(opts.scope)) return next(insufficientScope(res, opts.scope))
      if (opts.scope === 'write') auditTokenWrite(req, res)
      // API tokens act only inside their workspace and role: account-level actions need a session.
      if (access === 'signed-in' && !opts.tokens) return next(new ForbiddenError('API tokens act only inside their workspace; sign in for account actions.'))
      // API tokens carry their own workspace and role, fixed when the token was made.
      if (access !== 'signed-in' && (!req.ctx.role || !roleAtLeast(req.ctx.role, access))) return next(new ForbiddenError())
      return next()
    }
    // Routes open to any signed-in user need no workspace: skip the membership lookup.
    if (access === 'signed-in') {
      req.ctx = { userId, workspaceId: req.session?.workspaceId ?? null, role: null }
      return next()
    }
    let membership = req.session?.workspaceId ? await findMembership(req.session.workspaceId, userId) : null
    if (!membership) {
      membership = await firstMembership(userId)
      if (req.session) req.session.workspaceId = membership?.workspaceId
    }
    req.ctx = { userId, workspaceId: membership?.workspaceId ?? null, role: membership?.role ?? null }
    if (!membership) return next(new ForbiddenError('You are not a member of any workspace yet.'))
    if (!roleAtLeast(membership.role, access)) return next(new ForbiddenError())
    next()
  }
}

/** The context of a request that passed `authorize` with a role: workspace and role are set. */
export function scope(req: Request): { userId: string; workspaceId: string; role: Role } {
  const ctx = req.ctx
  if (!ctx?.workspaceId || !ctx.role) throw new ForbiddenError('You are not a member of any workspace yet.')
  return { userId: ctx.userId, workspaceId: ctx.workspaceId, role: ctx.role }
}
