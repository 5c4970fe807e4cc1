/**
 * Read-only links to a site's log book: made, listed and withdrawn by the workspace's designers and
 * owners; opened by anyone holding the token (an inspector, a fire officer, the building's owner)
 * until the end of its last day. Unlike a handover pack the log book is not frozen: the link shows
 * it as it stands on the day it is opened, summary first.
 */
import { In, type EntityManager } from 'typeorm'
import type { FormatPrefs } from '../../../shared/format'
import { config } from '../../config'
import { dataSource } from '../../data-source'
import { NotFoundError } from '../../errors/app-error'
import { newToken } from '../../lib/tokens'
import { recordAudit } from '../audit/audit.service'
import { exportFile } from '../register/export.service'
import { siteLogBookSummary } from '../register/logbook-summary.service'
import { findSite, todayIso } from '../register/register.service'
import { User } from '../users/user.entity'
import { Workspace } from '../workspaces/workspace.entity'
import { checkLastDay, linkState, openLink } from '../links/read-only-links'
import { LogBookLink } from './logbook-link.entity'

const links = (m: EntityManager = dataSource.manager) => m.getRepository(LogBookLink)

/** How many entries the shared page lists, newest first (the PDF holds them all). */
export const SHARED_PAGE_ENTRIES = 500

export const logBookUrl = (token: string) => `${config().origin}/l/${encodeURIComponent(token)}`

async function namesOf(ids: Array<string | null>): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))]
  if (!wanted.length) return new Map()
  const rows = await dataSource.getRepository(User).find({ where: { id: In(wanted) }, select: { id: true, name: true } })
  return new Map(rows.map((u) => [u.id, u.name]))
}

/** A new link to the site's log book, open until `expiresOn` (included) or until withdrawn. */
export async function createLink(workspaceId: string, userId: string, siteId: string, expiresOn: string | null, today = todayIso()) {
  await findSite(workspaceId, siteId)
  checkLastDay(expiresOn, today)
  const { token, hash } = newToken()
  const link = await dataSource.transaction(async (m) => {
    const saved = await links(m).save(links(m).create({ workspaceId, siteId, tokenHash: hash, expiresOn, revokedAt: null, revokedBy: null, createdBy: userId }))
    await recordAudit(
      { workspaceId, actorId: userId, action: 'logbook.shared', entityType: 'site', entityId: siteId, data: { linkId: saved.id, expiresOn } },
      m,
    )
    return saved
  })
  return { id: link.id, url: logBookUrl(token), token, expiresOn: link.expiresOn, createdAt: link.createdAt, state: linkState(link, today) }
}

/** The site's links, newest first, with who made them and whether they still open; never a token. */
export async function listLinks(workspaceId: string, siteId: string, today = todayIso()) {
  await findSite(workspaceId, siteId)
  const rows = await links().find({ where: { workspaceId, siteId }, order: { createdAt: 'DESC' } })
  const names = await namesOf(rows.map((r) => r.createdBy))
  return {
    links: rows.map((l) => ({
      id: l.id,
      expiresOn: l.expiresOn,
      createdAt: l.createdAt,
      revokedAt: l.revokedAt,
      state: linkState(l, today),
      createdBy: l.createdBy ? { id: l.createdBy, name: names.get(l.createdBy) ?? 'Former member' } : null,
    })),
  }
}

/** Withdraws a link at once; withdrawing it again changes nothing. */
export async function revokeLink(workspaceId: string, userId: string, siteId: string, linkId: string) {
  await findSite(workspaceId, siteId)
  await dataSource.transaction(async (m) => {
    const link = await links(m).findOne({ where: { id: linkId, siteId, workspaceId } })
    if (!link) throw new NotFoundError('That log book link')
    if (link.revokedAt) return
    link.revokedAt = new Date()
    link.revokedBy = userId
    await links(m).save(link)
    await recordAudit({ workspaceId, actorId: userId, action: 'logbook.link-revoked', entityType: 'site', entityId: siteId, data: { linkId } }, m)
  })
}

const openBook = (token: string, today: string) => openLink(links(), token, today, 'That log book')

/** The log book behind a link as it stands today: the site, its summary and its newest entries, without the workspace's ids. */
export async function sharedLogBook(token: string, today = todayIso()) {
  const link = await openBook(token, today)
  const book = await siteLogBookSummary(link.workspaceId, link.siteId, today)
  const workspace = await dataSource.getRepository(Workspace).findOneOrFail({ where: { id: link.workspaceId } })
  const s = book.status.site
  return {
    firm: workspace.name,
    site: { name: s.name, address: s.address, responsibleName: s.responsibleName, regime: s.regime },
    repairWindowDays: book.status.settings.repairWindowDays,
    expiresOn: link.expiresOn,
    summary: book.summary,
    entries: book.entries.slice(0, SHARED_PAGE_ENTRIES).map((e) => ({
      testedOn: e.testedOn,
      tag: e.tag,
      kind: e.kind,
      passed: e.passed,
      achievedDurationH: e.achievedDurationH,
      faults: e.faults,
      remedialAction: e.remedialAction,
      recordedByName: e.recordedByName,
      recordedInError: e.recordedInErrorAt !== null,
      recordedInErrorReason: e.recordedInErrorReason,
    })),
    totalEntries: book.entries.length,
  }
}

/** The log book PDF behind a link: the same document a signed-in member downloads. */
export async function sharedLogBookPdf(token: string, prefs: FormatPrefs, today = todayIso()) {
  const link = await openBook(token, today)
  return exportFile(link.workspaceId, link.siteId, 'logbook.pdf', prefs)
}
