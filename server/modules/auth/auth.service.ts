/** Sign-up, password checks and password reset. */
import bcrypt from 'bcryptjs'
import { IsNull, MoreThan } from 'typeorm'
import type { z } from 'zod'
import type { SignUpSchema } from '../../../shared/schemas/auth.schema'
import { config } from '../../config'
import { dataSource } from '../../data-source'
import { BadRequestError, ConflictError } from '../../errors/app-error'
import { hashToken, newToken } from '../../lib/tokens'
import { recordAudit } from '../audit/audit.service'
import { composeMail, sendMail } from '../mail/mail.service'
import { User } from '../users/user.entity'
import { endSessions } from '../users/sessions'
import { findUserByEmail, findUserById, forgetUser } from '../users/users.repository'
import { Membership } from '../workspaces/membership.entity'
import { Workspace } from '../workspaces/workspace.entity'
import { acceptInvitation } from '../workspaces/workspaces.service'
import { PasswordReset } from './password-reset.entity'

/** bcrypt cost: 12, as current guidance for bcrypt asks (tests may lower it through the env). */
export const BCRYPT_COST = 12
const RESET_TTL_MS = 60 * 60 * 1000

export function hashPassword(password: string) {
  return bcrypt.hash(password, BCRYPT_COST)
}

// A hash to compare against when the e-mail is unknown, so timing does not reveal which e-mails exist.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password-at-all', 4)

export function verifyPassword(password: string, hash: string) {
  return bcrypt.compare(password, hash)
}

export async function verifyCredentials(email: string, password: string): Promise<User | null> {
  const user = await findUserByEmail(email)
  const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH)
  return user && ok ? user : null
}

export async function signUp(input: z.infer<typeof SignUpSchema>): Promise<User> {
  if (await findUserByEmail(input.email)) {
    throw new ConflictError('An account with this e-mail already exists. Sign in, or reset the password.')
  }
  const passwordHash = await hashPassword(input.password)
  const user = await dataSource.transaction(async (m) => {
    const created = await m.getRepository(User).save(m.getRepository(User).create({ email: input.email, name: input.name, passwordHash }))
    if (!input.invitation) {
      const ws = await m.getRepository(Workspace).save(m.getRepository(Workspace).create({ name: input.workspaceName ?? `${input.name}'s team` }))
      await m.getRepository(Membership).insert({ workspaceId: ws.id, userId: created.id, role: 'owner' })
      await recordAudit({ workspaceId: ws.id, actorId: created.id, action: 'workspace.created', entityType: 'workspace', entityId: ws.id }, m)
    }
    return created
  })
  if (input.invitation) await acceptInvitation(input.invitation, user)
  return user
}

/** Always succeeds from the caller's view, so it does not reveal which e-mails have accounts. */
export async function requestPasswordReset(email: string): Promise<void> {
  const user = await findUserByEmail(email)
  if (!user) return
  const { token, hash } = newToken()
  // Only the newest link works: a new one voids every older unused link of this user.
  await dataSource.transaction(async (m) => {
    await m.query('DELETE FROM password_resets WHERE user_id = $1 AND used_at IS NULL', [user.id])
    await m.getRepository(PasswordReset).insert({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + RESET_TTL_MS), usedAt: null })
  })
  const url = `${config().origin}/reset-password?token=${encodeURIComponent(token)}`
  const body = composeMail(
    [`Hello ${user.name},`, 'Someone asked to reset the password of your Lampwright account. The link below works once, for one hour.', 'If it was not you, ignore this message: your password stays as it is.'],
    { label: 'Choose a new password', url },
  )
  await sendMail({ to: user.email, subject: 'Reset your Lampwright password', ...body }, { kind: 'account', workspaceId: null })
}

export async function resetPassword(token: string, password: string): Promise<void> {
  const repo = dataSource.getRepository(PasswordReset)
  const reset = await repo.findOne({ where: { tokenHash: hashToken(token) } })
  if (!reset) throw new BadRequestError('This reset link is not valid (a newer link may have replaced it). Ask for a new one.', [{ path: 'token', message: 'is not valid' }])
  if (reset.usedAt) throw new BadRequestError('This reset link has already been used. Ask for a new one.', [{ path: 'token', message: 'has already been used' }])
  if (reset.expiresAt.getTime() < Date.now()) throw new BadRequestError('This reset link has expired (links last one hour). Ask for a new one.', [{ path: 'token', message: 'has expired' }])
  const user = await findUserById(reset.userId)
  if (!user) throw new BadRequestError('This reset link is not valid.', [{ path: 'token', message: 'is not valid' }])
  const passwordHash = await hashPassword(password)
  await dataSource.transaction(async (m) => {
    // Spend the token atomically, so two concurrent uses cannot both succeed.
    const spent = await m.getRepository(PasswordReset).update({ id: reset.id, usedAt: IsNull(), expiresAt: MoreThan(new Date()) }, { usedAt: new Date() })
    if (!spent.affected) throw new BadRequestError('This reset link has already been used. Ask for a new one.', [{ path: 'token', message: 'has already been used' }])
    // Every other link of this user is void once one has been used.
    await m.query('DELETE FROM password_resets WHERE user_id = $1 AND used_at IS NULL', [user.id])
    await m.query('UPDATE users SET password_hash = $2 WHERE id = $1', [user.id, passwordHash])
    // Signed out everywhere, and scripts' tokens revoked: none of them is trusted after a reset.
    await endSessions(user.id, { manager: m })
    await m.query('UPDATE api_tokens SET revoked_at = now() WHERE user_id = $1 AND revoked_at IS NULL', [user.id])
    await recordAudit({ workspaceId: null, actorId: user.id, action: 'user.password-reset', entityType: 'user', entityId: user.id }, m)
  })
  forgetUser(user.id)
}

/** A signed-in user changes their password: every other session of theirs ends; this one goes on. */
export async function changePassword(userId: string, currentPassword: string, newPassword: string, keepSid: string): Promise<number> {
  const user = await findUserById(userId)
  if (!user || !(await verifyPassword(currentPassword, user.passwordHash))) {
    throw new BadRequestError('The current password is wrong.', [{ path: 'currentPassword', message: 'is wrong' }])
  }
  const passwordHash = await hashPassword(newPassword)
  const stamp = await dataSource.transaction(async (m) => {
    await m.query('UPDATE users SET password_hash = $2 WHERE id = $1', [userId, passwordHash])
    const at = await endSessions(userId, { manager: m, keepSid })
    await recordAudit({ workspaceId: null, actorId: userId, action: 'user.password-changed', entityType: 'user', entityId: userId }, m)
    return at
  })
  forgetUser(userId)
  return stamp
}
