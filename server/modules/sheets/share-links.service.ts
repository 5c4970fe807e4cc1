/**
 * Read-only links to a sheet's issued revision: made, listed, revoked and e-mailed by the
 * workspace; opened by anyone holding the token until it expires or is withdrawn.
 */
import { DEFAULT_PREFS, formatDateTime, type FormatPrefs } from '../../../shared/format'
import { SHEET_CAUTIONS } from '../../../shared/schemas/sheet.schema'
import { config } from '../../config'
import { AppError, BadRequestError, ConflictError, NotFoundError } from '../../errors/app-error'
import { hashToken, newToken, safeEqual } from '../../lib/tokens'
import { recordAudit } from '../audit/audit.service'
import { composeMail, sendMail } from '../mail/mail.service'
import type { ShareLink } from './share-link.entity'
import { person, revisionView } from './sheets.mapping'
import { findSheet, namesOf, revisions, shares, sheets } from './sheets.repository'

type ShareState = 'active' | 'expired' | 'revoked'
const shareState = (l: ShareLink, now = Date.now()): ShareState =>
  l.revokedAt ? 'revoked' : l.expiresAt && l.expiresAt.getTime() <= now ? 'expired' : 'active'
export const shareUrl = (token: string) => `${config().origin}/s/${encodeURIComponent(token)}`

function assertNotArchived(s: { archivedAt: Date | null }) {
  if (s.archivedAt) throw new ConflictError('This sheet is archived. Restore it before changing it.')
}

export async function createShare(workspaceId: string, userId: string, id: string, expiresAt: Date | null) {
  const s = await findSheet(workspaceId, id)
  assertNotArchived(s)
  if (s.issuedRevision === null) throw new ConflictError('Issue the sheet before sharing it: a shared link shows the issued revision.')
  if (expiresAt && expiresAt.getTime() <= Date.now())
    throw new BadRequestError('The expiry must be in the future.', [{ path: 'expiresAt', message: 'must be in the future' }])
  const { token, hash } = newToken()
  const link = await shares().save(
    shares().create({ workspaceId, sheetId: s.id, tokenHash: hash, createdBy: userId, expiresAt, revokedAt: null, revokedBy: null }),
  )
  await recordAudit({ workspaceId, actorId: userId, action: 'sheet.shared', entityType: 'spec_sheet', entityId: s.id, data: { shareId: link.id, expiresAt } })
  return { id: link.id, token, url: shareUrl(token), expiresAt: link.expiresAt, createdAt: link.createdAt, state: shareState(link) }
}

export async function listShares(workspaceId: string, id: string) {
  const s = await findSheet(workspaceId, id)
  const rows = await shares().find({ where: { sheetId: s.id, workspaceId }, order: { createdAt: 'DESC' } })
  const names = await namesOf(rows.map((r) => r.createdBy))
  return rows.map((l) => ({
    id: l.id,
    createdAt: l.createdAt,
    createdBy: person(names, l.createdBy),
    expiresAt: l.expiresAt,
    revokedAt: l.revokedAt,
    state: shareState(l),
  }))
}

async function findShare(workspaceId: string, sheetId: string, shareId: string) {
  const s = await findSheet(workspaceId, sheetId)
  const link = await shares().findOne({ where: { id: shareId, sheetId: s.id, workspaceId } })
  if (!link) throw new NotFoundError('That share link')
  return { sheet: s, link }
}

export async function revokeShare(workspaceId: string, userId: string, sheetId: string, shareId: string) {
  const { link } = await findShare(workspaceId, sheetId, shareId)
  if (link.revokedAt) return
  link.revokedAt = new Date()
  link.revokedBy = userId
  await shares().save(link)
  await recordAudit({ workspaceId, actorId: userId, action: 'sheet.share-revoked', entityType: 'spec_sheet', entityId: sheetId, data: { shareId } })
}

export async function emailShare(
  workspaceId: string,
  userId: string,
  sheetId: string,
  shareId: string,
  mail: { to: string; message: string; token: string },
  prefs: FormatPrefs = DEFAULT_PREFS,
) {
  const { sheet, link } = await findShare(workspaceId, sheetId, shareId)
  if (!safeEqual(hashToken(mail.token), link.tokenHash))
    throw new BadRequestError('That token does not belong to this share link.', [{ path: 'token', message: 'does not match this link' }])
  const state = shareState(link)
  if (state !== 'active') throw new ConflictError(`This link is ${state}; make a new one to send.`)
  const sender = (await namesOf([userId])).get(userId) ?? 'A colleague'
  const paragraphs = [
    `${sender} has shared the emergency-lighting specification sheet "${sheet.title}"${sheet.reference ? ` (${sheet.reference})` : ''} with you.`,
    ...(mail.message ? [`Their message: ${mail.message}`] : []),
    `The link opens a read-only copy of the issued revision; no account is needed.${link.expiresAt ? ` It works until ${formatDateTime(link.expiresAt, prefs)}${prefs.timeZone === 'UTC' ? ' UTC' : ''}.` : ''}`,
  ]
  await sendMail(
    { to: mail.to, subject: `Specification sheet: ${sheet.title}`, ...composeMail(paragraphs, { label: 'Open the sheet', url: shareUrl(mail.token) }) },
    { kind: 'share', workspaceId },
  )
  await recordAudit({
    workspaceId,
    actorId: userId,
    action: 'sheet.share-emailed',
    entityType: 'spec_sheet',
    entityId: sheetId,
    data: { shareId, to: mail.to },
  })
}

/** The public view behind a share token: the issued revision, nothing editable. */
export async function sharedSheet(token: string) {
  const link = await shares().findOne({ where: { tokenHash: hashToken(token) } })
  if (!link) throw new NotFoundError('That shared sheet')
  const state = shareState(link)
  if (state === 'revoked') throw new AppError(410, 'revoked', 'This link has been withdrawn by the people who shared it.')
  if (state === 'expired') throw new AppError(410, 'expired', 'This link has expired. Ask the sender for a new one.')
  const s = await sheets().findOne({ where: { id: link.sheetId, workspaceId: link.workspaceId } })
  if (!s || s.archivedAt || s.issuedRevision === null) throw new NotFoundError('That shared sheet')
  const r = await revisions().findOneOrFail({ where: { sheetId: s.id, number: s.issuedRevision } })
  const v = revisionView(r, await namesOf([r.authorId, r.issuedBy]))
  return { ...v, expiresAt: link.expiresAt, cautions: SHEET_CAUTIONS }
}
