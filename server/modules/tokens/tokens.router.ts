/** /api/tokens: personal API tokens for the current workspace. Managed only from a signed-in session. */
import type { Request } from 'express'
import { CreateApiTokenSchema } from '../../../shared/schemas/token.schema'
import { ForbiddenError } from '../../errors/app-error'
import { IdParams } from '../../lib/parse'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import { createToken, listTokens, revokeMemberToken, revokeToken, workspaceTokens } from './tokens.service'
import { ApiTokenListAnswer, MemberTokenListAnswer, NewApiTokenAnswer } from '../../../shared/schemas/answers/accounts'

const SESSION_ONLY = 'API tokens cannot manage API tokens; sign in.'

function sessionOnly(req: Request) {
  if (req.ctx?.viaToken) throw new ForbiddenError(SESSION_ONLY)
}

export const tokenRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/tokens',
    response: ApiTokenListAnswer,
    access: 'viewer',
    summary: 'My API tokens in this workspace',
    handler: async (_input, req) => {
      const s = scope(req)
      return { tokens: await listTokens(s.userId, s.workspaceId) }
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/tokens',
    response: NewApiTokenAnswer,
    access: 'viewer',
    summary: 'Make an API token (role at most mine); the secret is shown once',
    body: CreateApiTokenSchema,
    status: 201,
    secretAnswer: true,
    handler: ({ body }, req) => {
      sessionOnly(req)
      const s = scope(req)
      return createToken(s.userId, s.workspaceId, s.role, body)
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/tokens/:id',
    access: 'viewer',
    summary: 'Revoke an API token',
    // An API token is refused before anything about the id is said.
    before: [(req, _res, next) => next(req.ctx?.viaToken ? new ForbiddenError(SESSION_ONLY) : undefined)],
    params: IdParams,
    notFound: 'That token',
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await revokeToken(s.userId, s.workspaceId, params.id)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/workspace/tokens',
    response: MemberTokenListAnswer,
    access: 'owner',
    summary: "Every member's API tokens in this workspace (owners)",
    handler: async (_input, req) => ({ tokens: await workspaceTokens(scope(req).workspaceId) }),
  }),
  defineRoute({
    method: 'delete',
    path: '/api/workspace/tokens/:id',
    access: 'owner',
    summary: "Revoke a member's API token (owners)",
    before: [(req, _res, next) => next(req.ctx?.viaToken ? new ForbiddenError(SESSION_ONLY) : undefined)],
    params: IdParams,
    notFound: 'That token',
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await revokeMemberToken(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
]
