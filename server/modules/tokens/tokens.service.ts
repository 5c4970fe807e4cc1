/** API tokens: made and revoked by their owner, checked on every request that presents one. */
import crypto from 'node:crypto'
import { IsNull } from 'typeorm'
import { roleAtLeast, roleRank, type Role } from '../../../shared/schemas/roles'
import { dataSource } from '../../data-source'
import { ForbiddenError, NotFoundError, UnprocessableError } from '../../errors/app-error'
import type { CreateApiToken, TokenScope } from '../../../shared/schemas/token.schema'
import { hashToken } from '../../lib/tokens'
import { recordAudit } from '../audit/audit.service'
import { findUserById } from '../users/users.repository'
import { findMembership } from '../workspaces/workspaces.repository'
import { ApiToken } from './api-token.entity'

const tokens = () => dataSource.getRepository(ApiToken)

export async function createToken(userId: string, workspaceId: string, myRole: Role, input: CreateApiToken, now: Date = new Date()) {
  const { name, role, scopes } = input
  if (!roleAtLeast(myRole, role)) throw new ForbiddenError(`A token cannot have a higher role than yours (${myRole}).`)
  const expiresAt = input.expiresAt === null ? null : new Date(input.expiresAt)
  if (expiresAt && expiresAt <= now)
    throw new UnprocessableError('A token cannot expire in the past.', [{ path: 'expiresAt', code: 'out_of_range', message: 'must be later than now' }])
  const secret = `lw_${crypto.randomBytes(32).toString('base64url')}`
  const row = await tokens().save(
    tokens().create({
      userId,
      workspaceId,
      role,
      name,
      scopes,
      expiresAt,
      tokenHash: hashToken(secret),
      prefix: secret.slice(0, 10),
      lastUsedAt: null,
      revokedAt: null,
    }),
  )
  await recordAudit({
    workspaceId,
    actorId: userId,
    action: 'token.created',
    entityType: 'api_token',
    entityId: row.id,
    data: { name, role, scopes, expiresAt },
  })
  return { id: row.id, name, role, scopes, expiresAt, prefix: row.prefix, createdAt: row.createdAt, token: secret }
}

export async function listTokens(userId: string, workspaceId: string) {
  const rows = await tokens().find({ where: { userId, workspaceId }, order: { createdAt: 'DESC' } })
  return rows.map((t) => ({
    id: t.id,
    name: t.name,
    role: t.role,
    prefix: t.prefix,
    scopes: t.scopes,
    expiresAt: t.expiresAt,
    createdAt: t.createdAt,
    lastUsedAt: t.lastUsedAt,
    revokedAt: t.revokedAt,
  }))
}

export async function revokeToken(userId: string, workspaceId: string, id: string) {
  const res = await tokens().update({ id, userId, workspaceId, revokedAt: IsNull() }, { revokedAt: new Date() })
  if (!res.affected) throw new NotFoundError('That token')
  await recordAudit({ workspaceId, actorId: userId, action: 'token.revoked', entityType: 'api_token', entityId: id })
}

/**
 * The user and context a bearer token stands for, or null when it is unknown, revoked or expired.
 * The role is the lower of the token's and the user's current role, so a demotion also limits old tokens.
 */
export async function authenticateToken(secret: string, now: Date = new Date()) {
  const row = await tokens().findOne({ where: { tokenHash: hashToken(secret) } })
  if (!row || row.revokedAt || (row.expiresAt && row.expiresAt <= now)) return null
  const membership = await findMembership(row.workspaceId, row.userId)
  const user = await findUserById(row.userId)
  if (!membership || !user) return null
  const role = roleRank(membership.role) < roleRank(row.role) ? membership.role : row.role
  // Last use is informative only; do not fail the request over it.
  void tokens()
    .update({ id: row.id }, { lastUsedAt: new Date() })
    .catch(() => undefined)
  return { user, token: { id: row.id, name: row.name }, ctx: { userId: user.id, workspaceId: row.workspaceId, role, viaToken: true, tokenScopes: row.scopes } }
}

/** Every member's tokens in a workspace, for its owners (never the secrets). */
export async function workspaceTokens(workspaceId: string) {
  const rows: Array<{
    id: string
    user_id: string
    user_name: string
    user_email: string
    name: string
    role: Role
    prefix: string
    scopes: TokenScope[]
    expires_at: Date | null
    created_at: Date
    last_used_at: Date | null
    revoked_at: Date | null
  }> = await dataSource.query(
    `SELECT t.id, t.user_id, u.name AS user_name, u.email AS user_email, t.name, t.role, t.prefix, t.scopes, t.expires_at, t.created_at, t.last_used_at, t.revoked_at
       FROM api_tokens t JOIN users u ON u.id = t.user_id
      WHERE t.workspace_id = $1 ORDER BY t.revoked_at IS NOT NULL, t.created_at DESC`,
    [workspaceId],
  )
  return rows.map((t) => ({
    id: t.id,
    userId: t.user_id,
    userName: t.user_name,
    userEmail: t.user_email,
    name: t.name,
    role: t.role,
    prefix: t.prefix,
    scopes: t.scopes,
    expiresAt: t.expires_at,
    createdAt: t.created_at,
    lastUsedAt: t.last_used_at,
    revokedAt: t.revoked_at,
  }))
}

/** An owner revokes any member's token in their workspace; another workspace's token is not found. */
export async function revokeMemberToken(workspaceId: string, actorId: string, id: string) {
  const res = await tokens().update({ id, workspaceId, revokedAt: IsNull() }, { revokedAt: new Date() })
  if (!res.affected) throw new NotFoundError('That token')
  await recordAudit({ workspaceId, actorId, action: 'token.revoked-by-owner', entityType: 'api_token', entityId: id })
}
