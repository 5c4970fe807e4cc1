/** /api/tokens: personal API tokens for the current workspace. Managed only from a signed-in session. */
import type { Request, Response } from 'express'
import { z } from 'zod'
import { CreateApiTokenSchema } from '../../../shared/schemas/token.schema'
import { ForbiddenError, NotFoundError } from '../../errors/app-error'
import { parse } from '../../lib/parse'
import { scope, type RouteSpec } from '../../policy/access'
import { createToken, listTokens, revokeToken } from './tokens.service'

function sessionOnly(req: Request) {
  if (req.ctx?.viaToken) throw new ForbiddenError('API tokens cannot manage API tokens; sign in.')
}

async function list(req: Request, res: Response) {
  const s = scope(req)
  res.json({ tokens: await listTokens(s.userId, s.workspaceId) })
}

async function create(req: Request, res: Response) {
  sessionOnly(req)
  const s = scope(req)
  const input = parse(CreateApiTokenSchema, req.body)
  res.status(201).json(await createToken(s.userId, s.workspaceId, s.role, input.name, input.role))
}

async function revoke(req: Request, res: Response) {
  sessionOnly(req)
  const s = scope(req)
  const id = z.string().uuid().safeParse(req.params.id)
  if (!id.success) throw new NotFoundError('That token')
  await revokeToken(s.userId, s.workspaceId, id.data)
  res.status(204).end()
}

export const tokenRoutes: RouteSpec[] = [
  { method: 'get', path: '/api/tokens', access: 'viewer', summary: 'My API tokens in this workspace', handler: list },
  { method: 'post', path: '/api/tokens', access: 'viewer', summary: 'Make an API token (role at most mine); the secret is shown once', body: CreateApiTokenSchema, handler: create },
  { method: 'delete', path: '/api/tokens/:id', access: 'viewer', summary: 'Revoke an API token', handler: revoke },
]
