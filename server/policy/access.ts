/**
 * Who may call what. Every /api route is declared with the least access it needs; this module is the
 * only place that turns a declaration into checks, and the route table in ../routes.ts is what the
 * access-control tests walk.
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express'
import { roleAtLeast, type Role } from '../../shared/schemas/roles'
import { ForbiddenError, UnauthorizedError } from '../errors/app-error'
import type { Access } from './route'
import { findMembership, firstMembership } from '../modules/workspaces/workspaces.repository'

export type { Access, Method, RouteSpec, RouteInput } from './route'
export { defineRoute } from './route'

export interface RequestContext {
  userId: string
  workspaceId: string | null
  role: Role | null
  /** Set when the request was authenticated with an API token rather than a session. */
  viaToken?: boolean
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

/** `opts.tokens`: an API token may call this `signed-in` route (account-level routes refuse tokens). */
export function authorize(access: Access, opts: { tokens?: boolean } = {}): RequestHandler {
  return async (req: Request, _res: Response, next: NextFunction) => {
    if (access === 'public') return next()
    const userId = currentUserId(req)
    if (!userId) return next(new UnauthorizedError())
    if (req.ctx?.viaToken) {
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
