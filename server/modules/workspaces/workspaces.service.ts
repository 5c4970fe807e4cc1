/** Team workspaces: members, roles, invitations. The last owner can neither leave nor be demoted. */
import { Not, type EntityManager } from 'typeorm'
import { config } from '../../config'
import { dataSource } from '../../data-source'
import { BadRequestError, ConflictError, ForbiddenError, NotFoundError } from '../../errors/app-error'
import { hashToken, newToken } from '../../lib/tokens'
import type { Role } from '../../../shared/schemas/roles'
import { recordAudit } from '../audit/audit.service'
import { composeMail, sendMail } from '../mail/mail.service'
import type { User } from '../users/user.entity'
import { endSessions } from '../users/sessions'
import { findUserById } from '../users/users.repository'
import { Invitation } from './invitation.entity'
import { Membership } from './membership.entity'
import { Workspace } from './workspace.entity'
import { forgetMemberships, listUserMemberships, listWorkspaceMembers } from './workspaces.repository'

const INVITE_TTL_MS = 7 * 24 * 60 * 60 * 1000

export async function myWorkspaces(userId: string) {
  const rows = await listUserMemberships(userId)
  return rows.map((m) => ({ id: m.workspaceId, name: m.workspace?.name ?? '', role: m.role }))
}

export async function createWorkspace(userId: string, name: string) {
  return dataSource.transaction(async (m) => {
    const ws = await m.getRepository(Workspace).save(m.getRepository(Workspace).create({ name }))
    await m.getRepository(Membership).insert({ workspaceId: ws.id, userId, role: 'owner' })
    await recordAudit({ workspaceId: ws.id, actorId: userId, action: 'workspace.created', entityType: 'workspace', entityId: ws.id }, m)
    forgetMemberships()
    return { id: ws.id, name: ws.name, role: 'owner' as Role }
  })
}

export async function renameWorkspace(workspaceId: string, actorId: string, name: string) {
  await dataSource.getRepository(Workspace).update({ id: workspaceId }, { name })
  await recordAudit({ workspaceId, actorId, action: 'workspace.renamed', entityType: 'workspace', entityId: workspaceId, data: { name } })
}

export async function members(workspaceId: string) {
  const rows = await listWorkspaceMembers(workspaceId)
  return rows.map((m) => ({ id: m.id, userId: m.userId, name: m.user?.name ?? '', email: m.user?.email ?? '', role: m.role, since: m.createdAt }))
}

/**
 * Runs a change to the workspace's members in one transaction that holds the workspace row's lock,
 * so changes to one workspace's members happen one at a time and the last-owner check cannot be
 * raced (two owners leaving, or removing each other, at the same moment).
 */
function withMembersLocked<T>(workspaceId: string, change: (tx: EntityManager) => Promise<T>): Promise<T> {
  return dataSource.transaction(async (tx) => {
    await tx.query('SELECT id FROM workspaces WHERE id = $1 FOR UPDATE', [workspaceId])
    return change(tx)
  })
}

async function otherOwners(tx: EntityManager, workspaceId: string, membershipId: string) {
  return tx.getRepository(Membership).count({ where: { workspaceId, role: 'owner', id: Not(membershipId) } })
}

/** Checked under the lock: an owner demoted or removed a moment ago can no longer change members. */
async function requireOwner(tx: EntityManager, workspaceId: string, actorId: string) {
  const actor = await tx.getRepository(Membership).findOne({ where: { workspaceId, userId: actorId } })
  if (actor?.role !== 'owner') throw new ForbiddenError('You are no longer an owner of this workspace.')
}

export async function changeRole(workspaceId: string, actorId: string, membershipId: string, role: Role) {
  const m = await withMembersLocked(workspaceId, async (tx) => {
    await requireOwner(tx, workspaceId, actorId)
    const m = await tx.getRepository(Membership).findOne({ where: { id: membershipId, workspaceId } })
    if (!m) throw new NotFoundError('That member')
    if (m.role === 'owner' && role !== 'owner' && (await otherOwners(tx, workspaceId, m.id)) === 0) {
      throw new ConflictError('This is the last owner of the workspace. Make someone else an owner first.')
    }
    const from = m.role
    m.role = role
    await tx.getRepository(Membership).save(m)
    await recordAudit({ workspaceId, actorId, action: 'member.role-changed', entityType: 'membership', entityId: m.id, data: { from, to: role } }, tx)
    return m
  })
  forgetMemberships()
  return m
}

export async function removeMember(workspaceId: string, actorId: string, membershipId: string) {
  await withMembersLocked(workspaceId, async (tx) => {
    await requireOwner(tx, workspaceId, actorId)
    const m = await tx.getRepository(Membership).findOne({ where: { id: membershipId, workspaceId } })
    if (!m) throw new NotFoundError('That member')
    if (m.role === 'owner' && (await otherOwners(tx, workspaceId, m.id)) === 0) {
      throw new ConflictError('This is the last owner of the workspace and cannot be removed.')
    }
    await tx.getRepository(Membership).delete({ id: m.id })
    // A removed member is signed out everywhere at once and their tokens here stop working.
    await endSessions(m.userId, { manager: tx })
    await tx.query('UPDATE api_tokens SET revoked_at = now() WHERE user_id = $1 AND workspace_id = $2 AND revoked_at IS NULL', [m.userId, workspaceId])
    await recordAudit({ workspaceId, actorId, action: 'member.removed', entityType: 'membership', entityId: m.id, data: { userId: m.userId } }, tx)
  })
  forgetMemberships()
}

export async function leaveWorkspace(workspaceId: string, userId: string) {
  await withMembersLocked(workspaceId, async (tx) => {
    const m = await tx.getRepository(Membership).findOne({ where: { workspaceId, userId } })
    if (!m) throw new NotFoundError('Your membership')
    if (m.role === 'owner' && (await otherOwners(tx, workspaceId, m.id)) === 0) {
      throw new ConflictError('You are the last owner: make someone else an owner before you leave.')
    }
    await tx.getRepository(Membership).delete({ id: m.id })
    await tx.query('UPDATE api_tokens SET revoked_at = now() WHERE user_id = $1 AND workspace_id = $2 AND revoked_at IS NULL', [userId, workspaceId])
    await recordAudit({ workspaceId, actorId: userId, action: 'member.left', entityType: 'membership', entityId: m.id }, tx)
  })
  forgetMemberships()
}

export async function invite(workspaceId: string, actorId: string, email: string, role: Role) {
  const ws = await dataSource.getRepository(Workspace).findOneByOrFail({ id: workspaceId })
  const already = await dataSource.query(`SELECT 1 FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.workspace_id = $1 AND u.email = $2`, [
    workspaceId,
    email,
  ])
  if (already.length) throw new ConflictError(`${email} is already a member of this workspace.`)
  const { token, hash } = newToken()
  const inviter = await findUserById(actorId)
  const url = `${config().origin}/invitation?token=${encodeURIComponent(token)}`
  const body = composeMail(
    [
      `${inviter?.name ?? 'A colleague'} invites you to the Lampwright workspace "${ws.name}" as ${role}.`,
      'The link works once and expires in seven days. Sign up or sign in to accept.',
    ],
    { label: 'Accept the invitation', url },
  )
  // Saved only when the mail goes out (a refused send, e.g. too many mails to that address, leaves no invitation).
  const inv = await dataSource.transaction(async (m) => {
    const saved = await m
      .getRepository(Invitation)
      .save(
        m
          .getRepository(Invitation)
          .create({ workspaceId, email, role, tokenHash: hash, invitedBy: actorId, expiresAt: new Date(Date.now() + INVITE_TTL_MS), acceptedAt: null }),
      )
    await sendMail({ to: email, subject: `Join "${ws.name}" on Lampwright`, ...body }, { kind: 'invitation', workspaceId })
    return saved
  })
  await recordAudit({ workspaceId, actorId, action: 'member.invited', entityType: 'invitation', entityId: inv.id, data: { email, role } })
  return { id: inv.id, email, role, expiresAt: inv.expiresAt }
}

export async function pendingInvitations(workspaceId: string) {
  const rows = await dataSource.getRepository(Invitation).find({ where: { workspaceId }, order: { createdAt: 'DESC' } })
  return rows
    .filter((i) => !i.acceptedAt && i.expiresAt.getTime() > Date.now())
    .map((i) => ({ id: i.id, email: i.email, role: i.role, expiresAt: i.expiresAt }))
}

export async function revokeInvitation(workspaceId: string, actorId: string, id: string) {
  const res = await dataSource.getRepository(Invitation).delete({ id, workspaceId })
  if (!res.affected) throw new NotFoundError('That invitation')
  await recordAudit({ workspaceId, actorId, action: 'invitation.revoked', entityType: 'invitation', entityId: id })
}

export async function usableInvitation(token: string) {
  const inv = await dataSource.getRepository(Invitation).findOne({ where: { tokenHash: hashToken(token) } })
  if (!inv) throw new BadRequestError('This invitation link is not valid.', [{ path: 'token', message: 'is not valid' }])
  if (inv.acceptedAt) throw new BadRequestError('This invitation has already been used.', [{ path: 'token', message: 'has already been used' }])
  if (inv.expiresAt.getTime() < Date.now())
    throw new BadRequestError('This invitation has expired. Ask for a new one.', [{ path: 'token', message: 'has expired' }])
  return inv
}

export async function previewInvitation(token: string) {
  const inv = await usableInvitation(token)
  const ws = await dataSource.getRepository(Workspace).findOneByOrFail({ id: inv.workspaceId })
  return { workspace: ws.name, email: inv.email, role: inv.role, expiresAt: inv.expiresAt }
}

export async function acceptInvitation(token: string, user: User) {
  const inv = await usableInvitation(token)
  if (inv.email !== user.email) {
    throw new ForbiddenError(`This invitation was sent to ${inv.email}; sign in with that address to accept it.`)
  }
  return dataSource.transaction(async (tx) => {
    const spent = await tx.query(`UPDATE invitations SET accepted_at = now() WHERE id = $1 AND accepted_at IS NULL RETURNING id`, [inv.id])
    const spentRows = Array.isArray(spent[0]) ? spent[0] : spent
    if (!spentRows.length) throw new BadRequestError('This invitation has already been used.')
    await tx.query(`INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, $3) ON CONFLICT (workspace_id, user_id) DO NOTHING`, [
      inv.workspaceId,
      user.id,
      inv.role,
    ])
    forgetMemberships()
    await recordAudit(
      { workspaceId: inv.workspaceId, actorId: user.id, action: 'member.joined', entityType: 'invitation', entityId: inv.id, data: { role: inv.role } },
      tx,
    )
    return { workspaceId: inv.workspaceId, role: inv.role }
  })
}
