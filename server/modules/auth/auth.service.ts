/** Sign-up, e-mail confirmation, password checks, password reset and change. */
import { bcryptHash, bcryptVerify } from '../../lib/password-hash'
import { IsNull, MoreThan } from 'typeorm'
import type { z } from 'zod'
import type { SignUpSchema } from '../../../shared/schemas/auth.schema'
import { config } from '../../config'
import { dataSource } from '../../data-source'
import { BadRequestError, ConflictError, ForbiddenError } from '../../errors/app-error'
import { afterAnswer } from '../../lib/after-answer'
import { hashToken, newToken } from '../../lib/tokens'
import { recordAudit } from '../audit/audit.service'
import { composeMail, sendMail } from '../mail/mail.service'
import { User } from '../users/user.entity'
import { endSessions } from '../users/sessions'
import { findUserByEmail, findUserById, forgetUser } from '../users/users.repository'
import { Membership } from '../workspaces/membership.entity'
import { Workspace } from '../workspaces/workspace.entity'
import { acceptInvitation, usableInvitation } from '../workspaces/workspaces.service'
import { EmailConfirmation } from './email-confirmation.entity'
import { PasswordReset } from './password-reset.entity'

/** bcrypt cost: 12, as current guidance for bcrypt asks (tests may lower it through the env). */
export const BCRYPT_COST = 12
const RESET_TTL_MS = 60 * 60 * 1000

/** bcrypt at cost 12, on the thread pool (see server/lib/password-hash.ts). */
export function hashPassword(password: string) {
  return bcryptHash(password, BCRYPT_COST)
}

/**
 * Compared against when the e-mail is unknown, so a wrong password takes as long for an unknown
 * e-mail as for a known one: same algorithm, same cost (a hash of a random secret nobody holds).
 */
export const UNKNOWN_USER_HASH = '$2b$12$kwm2FufxfoJbbmTnf.e1sOEbjM.5H8JcybOjDRlF.KAFiJjyL5C12'

export function verifyPassword(password: string, hash: string) {
  return bcryptVerify(password, hash)
}

export async function verifyCredentials(email: string, password: string): Promise<User | null> {
  const user = await findUserByEmail(email)
  const ok = await verifyPassword(password, user?.passwordHash ?? UNKNOWN_USER_HASH)
  return user && ok ? user : null
}

const CONFIRM_TTL_MS = 48 * 60 * 60 * 1000

/** The same answer for a new and a taken address: only the mailbox's owner learns which it was. */
export const SIGN_UP_ANSWER = {
  message: 'Check your e-mail: we have sent a link to confirm the address (it works for 48 hours). Confirm it, then sign in.',
}

/**
 * Sign-up without an invitation. The answer never depends on whether the address is taken: the
 * password is hashed either way, and the mail (a confirmation link, or a note to the existing
 * account's owner) is sent after the answer.
 */
export async function signUp(input: z.infer<typeof SignUpSchema>): Promise<void> {
  const passwordHash = await hashPassword(input.password)
  const existing = await findUserByEmail(input.email)
  if (existing) {
    afterAnswer('sign-up notice', () => mailSignUpNotice(existing))
    return
  }
  let user: User
  try {
    user = await dataSource.transaction(async (m) => {
      const created = await m
        .getRepository(User)
        .save(m.getRepository(User).create({ email: input.email, name: input.name, passwordHash, emailConfirmedAt: null }))
      const ws = await m.getRepository(Workspace).save(m.getRepository(Workspace).create({ name: input.workspaceName ?? `${input.name}'s team` }))
      await m.getRepository(Membership).insert({ workspaceId: ws.id, userId: created.id, role: 'owner' })
      await recordAudit({ workspaceId: ws.id, actorId: created.id, action: 'workspace.created', entityType: 'workspace', entityId: ws.id }, m)
      return created
    })
  } catch (err) {
    // Two sign-ups for one address at once: the second is a taken address like any other.
    if ((err as { driverError?: { code?: string } }).driverError?.code === '23505') {
      const taken = await findUserByEmail(input.email)
      if (taken) afterAnswer('sign-up notice', () => mailSignUpNotice(taken))
      return
    }
    throw err
  }
  afterAnswer('confirmation mail', () => mailConfirmationLink(user))
}

/**
 * Sign-up with an invitation: the invitation was mailed to this address, so following it proves
 * the address; the account is confirmed and joins the workspace at once.
 */
export async function signUpWithInvitation(input: z.infer<typeof SignUpSchema> & { invitation: string }): Promise<User> {
  const inv = await usableInvitation(input.invitation)
  if (inv.email !== input.email) throw new ForbiddenError(`This invitation was sent to ${inv.email}; sign up with that address to accept it.`)
  if (await findUserByEmail(input.email)) throw new ConflictError('An account with this e-mail already exists: sign in, then accept the invitation.')
  const passwordHash = await hashPassword(input.password)
  const user = await dataSource
    .getRepository(User)
    .save(dataSource.getRepository(User).create({ email: input.email, name: input.name, passwordHash, emailConfirmedAt: new Date() }))
  await acceptInvitation(input.invitation, user)
  return user
}

/** A new single-use confirmation link (older unused links of the user stop working). */
export async function mailConfirmationLink(user: User): Promise<void> {
  const { token, hash } = newToken()
  await dataSource.transaction(async (m) => {
    await m.query('DELETE FROM email_confirmations WHERE user_id = $1 AND used_at IS NULL', [user.id])
    await m.getRepository(EmailConfirmation).insert({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + CONFIRM_TTL_MS), usedAt: null })
  })
  const url = `${config().origin}/confirm-email?token=${encodeURIComponent(token)}`
  const body = composeMail(
    [
      `Hello ${user.name},`,
      'Please confirm that this is your e-mail address for Lampwright. The link works once, for 48 hours.',
      'If you did not create an account, ignore this message.',
    ],
    { label: 'Confirm my e-mail address', url },
  )
  await sendMail({ to: user.email, subject: 'Confirm your e-mail address for Lampwright', ...body }, { kind: 'account', workspaceId: null })
}

async function mailSignUpNotice(user: User): Promise<void> {
  const body = composeMail(
    [
      `Hello ${user.name},`,
      'Someone tried to create a Lampwright account with this e-mail address, which already has one. No new account was made.',
      'If it was you, sign in; if you have forgotten your password, ask for a reset link.',
    ],
    { label: 'Reset my password', url: `${config().origin}/forgot-password` },
  )
  await sendMail({ to: user.email, subject: 'Your Lampwright account', ...body }, { kind: 'account', workspaceId: null })
}

/** Follows a confirmation link: the address is confirmed and the link is spent. */
export async function confirmEmail(token: string): Promise<void> {
  const repo = dataSource.getRepository(EmailConfirmation)
  const row = await repo.findOne({ where: { tokenHash: hashToken(token) } })
  if (!row)
    throw new BadRequestError('This confirmation link is not valid (a newer link may have replaced it). Sign in to get a new one.', [
      { path: 'token', message: 'is not valid' },
    ])
  if (row.usedAt) throw new BadRequestError('This confirmation link has already been used. Sign in.', [{ path: 'token', message: 'has already been used' }])
  if (row.expiresAt.getTime() < Date.now())
    throw new BadRequestError('This confirmation link has expired. Sign in to get a new one.', [{ path: 'token', message: 'has expired' }])
  await dataSource.transaction(async (m) => {
    const spent = await m.getRepository(EmailConfirmation).update({ id: row.id, usedAt: IsNull() }, { usedAt: new Date() })
    if (!spent.affected)
      throw new BadRequestError('This confirmation link has already been used. Sign in.', [{ path: 'token', message: 'has already been used' }])
    await m.query('UPDATE users SET email_confirmed_at = now() WHERE id = $1 AND email_confirmed_at IS NULL', [row.userId])
    await recordAudit({ workspaceId: null, actorId: row.userId, action: 'user.email-confirmed', entityType: 'user', entityId: row.userId }, m)
  })
  forgetUser(row.userId)
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
    [
      `Hello ${user.name},`,
      'Someone asked to reset the password of your Lampwright account. The link below works once, for one hour.',
      'If it was not you, ignore this message: your password stays as it is.',
    ],
    { label: 'Choose a new password', url },
  )
  await sendMail({ to: user.email, subject: 'Reset your Lampwright password', ...body }, { kind: 'account', workspaceId: null })
}

export async function resetPassword(token: string, password: string): Promise<void> {
  const repo = dataSource.getRepository(PasswordReset)
  const reset = await repo.findOne({ where: { tokenHash: hashToken(token) } })
  if (!reset)
    throw new BadRequestError('This reset link is not valid (a newer link may have replaced it). Ask for a new one.', [
      { path: 'token', message: 'is not valid' },
    ])
  if (reset.usedAt)
    throw new BadRequestError('This reset link has already been used. Ask for a new one.', [{ path: 'token', message: 'has already been used' }])
  if (reset.expiresAt.getTime() < Date.now())
    throw new BadRequestError('This reset link has expired (links last one hour). Ask for a new one.', [{ path: 'token', message: 'has expired' }])
  const user = await findUserById(reset.userId)
  if (!user) throw new BadRequestError('This reset link is not valid.', [{ path: 'token', message: 'is not valid' }])
  const passwordHash = await hashPassword(password)
  await dataSource.transaction(async (m) => {
    // Spend the token atomically, so two concurrent uses cannot both succeed.
    const spent = await m.getRepository(PasswordReset).update({ id: reset.id, usedAt: IsNull(), expiresAt: MoreThan(new Date()) }, { usedAt: new Date() })
    if (!spent.affected)
      throw new BadRequestError('This reset link has already been used. Ask for a new one.', [{ path: 'token', message: 'has already been used' }])
    // Every other link of this user is void once one has been used.
    await m.query('DELETE FROM password_resets WHERE user_id = $1 AND used_at IS NULL', [user.id])
    // A reset link reached the mailbox, so it also confirms the address.
    await m.query('UPDATE users SET password_hash = $2, email_confirmed_at = COALESCE(email_confirmed_at, now()) WHERE id = $1', [user.id, passwordHash])
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
