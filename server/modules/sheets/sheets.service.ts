/**
 * Specification sheets: every save is a new revision; a save names the version it started from
 * (a stale one gets 409 with what changed); issuing freezes the latest revision and supersedes
 * the one issued before; share links show the issued revision without sign-in.
 */
import type { EntityManager } from 'typeorm'
import { In } from 'typeorm'
import { sizeTool } from '../../../shared/engine/size'
import { runTool } from '../../../shared/engine/tool'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import { diffSheets, type SheetSnapshot } from '../../../shared/schemas/sheet-diff'
import { SHEET_CAUTIONS, SheetContentSchema, type SheetContent, type SheetListQuery } from '../../../shared/schemas/sheet.schema'
import { config } from '../../config'
import { dataSource } from '../../data-source'
import { AppError, BadRequestError, ConflictError, NotFoundError } from '../../errors/app-error'
import { jsonWithRawFields } from '../../lib/raw-json'
import { preparedRows } from '../../lib/sql'
import { hashToken, newToken, safeEqual } from '../../lib/tokens'
import { recordAudit } from '../audit/audit.service'
import { composeMail, sendMail } from '../mail/mail.service'
import { User } from '../users/user.entity'
import { ShareLink } from './share-link.entity'
import { SpecRevision } from './spec-revision.entity'
import { SpecSheet } from './spec-sheet.entity'

const sheets = (m: EntityManager = dataSource.manager) => m.getRepository(SpecSheet)
const revisions = (m: EntityManager = dataSource.manager) => m.getRepository(SpecRevision)
const shares = (m: EntityManager = dataSource.manager) => m.getRepository(ShareLink)

/** Runs the engine on the sheet's inputs; the server never trusts results sent by a client. */
export function computeResults(inputs: Record<string, unknown>): Record<string, unknown> {
  const outcome = runTool(sizeTool, inputs)
  if (!outcome.ok) {
    const fields = outcome.fields.map((f) => ({ path: `inputs.${f.path}`, message: f.message }))
    throw new BadRequestError(`Invalid pack inputs: ${fields.slice(0, 3).map((f) => `${f.path} ${f.message}`).join('; ')}`, fields)
  }
  return outcome.result as unknown as Record<string, unknown>
}

/** Sheet content checked by the shared schema (for callers outside a request: demo data, tests). */
export const contentOf = (raw: unknown): SheetContent => SheetContentSchema.parse(raw)

async function namesOf(ids: Array<string | null | undefined>): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))]
  if (!wanted.length) return new Map()
  const rows = await dataSource.getRepository(User).find({ where: { id: In(wanted) }, select: { id: true, name: true } })
  return new Map(rows.map((u) => [u.id, u.name]))
}

const personNamed = (id: string | null, name: string | null | undefined) => (id ? { id, name: name ?? 'Former member' } : null)
const person = (names: Map<string, string>, id: string | null) => personNamed(id, id ? names.get(id) : null)

export async function sheetView(s: Omit<SpecSheet, 'workspaceId' | 'selectedCapacityAh' | 'requiredCapacityAh'>, known?: Map<string, string>) {
  const names = known ?? (await namesOf([s.createdBy, s.updatedBy]))
  return {
    id: s.id,
    title: s.title,
    reference: s.reference,
    client: s.client,
    site: s.site,
    luminaire: s.luminaire,
    chemistry: s.chemistry,
    inputs: s.inputs,
    results: s.results,
    engineVersion: s.engineVersion,
    status: s.status,
    currentRevision: s.currentRevision,
    issuedRevision: s.issuedRevision,
    version: s.version,
    createdBy: person(names, s.createdBy),
    updatedBy: person(names, s.updatedBy),
    archivedAt: s.archivedAt,
    createdAt: s.createdAt,
    updatedAt: s.updatedAt,
  }
}

function revisionView(r: SpecRevision, names: Map<string, string>) {
  return {
    number: r.number,
    status: r.status,
    title: r.title,
    reference: r.reference,
    client: r.client,
    site: r.site,
    luminaire: r.luminaire,
    inputs: r.inputs,
    results: r.results,
    engineVersion: r.engineVersion,
    author: person(names, r.authorId),
    createdAt: r.createdAt,
    issuedAt: r.issuedAt,
    issuedBy: person(names, r.issuedBy),
  }
}

const snapshot = (x: SpecSheet | SpecRevision): SheetSnapshot => ({
  title: x.title,
  reference: x.reference,
  client: x.client,
  site: x.site,
  luminaire: x.luminaire,
  inputs: x.inputs,
  results: x.results,
  engineVersion: x.engineVersion,
})

async function findSheet(workspaceId: string, id: string, m?: EntityManager, lock = false): Promise<SpecSheet> {
  const s = lock
    ? await sheets(m).createQueryBuilder('s').setLock('pessimistic_write').where('s.id = :id AND s.workspace_id = :workspaceId', { id, workspaceId }).getOne()
    : await sheets(m).findOne({ where: { id, workspaceId } })
  if (!s) throw new NotFoundError('That sheet')
  return s
}

function assertNotArchived(s: SpecSheet) {
  if (s.archivedAt) throw new ConflictError('This sheet is archived. Restore it before changing it.')
}

function newRevision(m: EntityManager, s: SpecSheet, authorId: string): Promise<SpecRevision> {
  return revisions(m).save(
    revisions(m).create({
      workspaceId: s.workspaceId,
      sheetId: s.id,
      number: s.currentRevision,
      sheetVersion: s.version,
      title: s.title,
      reference: s.reference,
      client: s.client,
      site: s.site,
      luminaire: s.luminaire,
      inputs: s.inputs,
      results: s.results,
      engineVersion: s.engineVersion,
      status: 'draft',
      authorId,
      issuedAt: null,
      issuedBy: null,
    }),
  )
}

function applyContent(s: SpecSheet, content: SheetContent) {
  s.title = content.title
  s.reference = content.reference
  s.client = content.client
  s.site = content.site
  s.luminaire = content.luminaire
  s.inputs = content.inputs
  s.chemistry = String(content.inputs.chemistry)
  s.results = computeResults(content.inputs)
  s.engineVersion = ENGINE_VERSION
}

export async function createSheet(workspaceId: string, userId: string, content: SheetContent) {
  const saved = await dataSource.transaction(async (m) => {
    const s = sheets(m).create({ workspaceId, status: 'draft', currentRevision: 1, issuedRevision: null, version: 1, createdBy: userId, updatedBy: userId, archivedAt: null })
    applyContent(s, content)
    await sheets(m).save(s)
    await newRevision(m, s, userId)
    await recordAudit({ workspaceId, actorId: userId, action: 'sheet.created', entityType: 'spec_sheet', entityId: s.id, data: { title: s.title } }, m)
    return s
  })
  return sheetView(saved)
}

type SheetRow = Omit<SpecSheet, 'workspaceId' | 'selectedCapacityAh' | 'requiredCapacityAh' | 'inputs' | 'results'> & {
  /** JSON text: parsed only when the caller needs objects (see getSheetJson). */
  inputs: string
  results: string
  creatorName: string | null
  updaterName: string | null
}

const GET_SHEET_SQL = `SELECT s.id, s.title, s.reference, s.client, s.site, s.luminaire, s.chemistry, s.inputs::text AS inputs,
  s.results::text AS results, s.engine_version AS "engineVersion", s.status, s.current_revision AS "currentRevision",
  s.issued_revision AS "issuedRevision", s.version, s.created_by AS "createdBy", s.updated_by AS "updatedBy",
  s.archived_at AS "archivedAt", s.created_at AS "createdAt", s.updated_at AS "updatedAt",
  creator.name AS "creatorName", updater.name AS "updaterName"
FROM spec_sheets s
LEFT JOIN users creator ON creator.id = s.created_by
LEFT JOIN users updater ON updater.id = s.updated_by
WHERE s.id = $1 AND s.workspace_id = $2`

/** One sheet row with its authors' names: one prepared statement, as this is the most frequent read of all. */
async function sheetRow(workspaceId: string, id: string) {
  const [row] = await preparedRows<SheetRow>('sheet-get', GET_SHEET_SQL, [id, workspaceId])
  if (!row) throw new NotFoundError('That sheet')
  const names = new Map<string, string>()
  if (row.createdBy && row.creatorName !== null) names.set(row.createdBy, row.creatorName)
  if (row.updatedBy && row.updaterName !== null) names.set(row.updatedBy, row.updaterName)
  const { inputs, results, ...rest } = row
  return { inputs, results, view: await sheetView({ ...rest, inputs: {}, results: {} }, names) }
}

export async function getSheet(workspaceId: string, id: string) {
  const { inputs, results, view } = await sheetRow(workspaceId, id)
  return { ...view, inputs: JSON.parse(inputs) as Record<string, unknown>, results: JSON.parse(results) as Record<string, unknown> }
}

/** The same sheet as JSON text for the API, its stored inputs and results passed through unparsed. */
export async function getSheetJson(workspaceId: string, id: string): Promise<string> {
  const { inputs, results, view } = await sheetRow(workspaceId, id)
  const { inputs: _inputs, results: _results, ...fields } = view
  return jsonWithRawFields(fields, { inputs, results })
}

/** A save: a new revision, or 409 with what changed since the editor's version. */
export async function saveSheet(workspaceId: string, userId: string, id: string, content: SheetContent & { version: number }) {
  const saved = await dataSource.transaction(async (m) => {
    const s = await findSheet(workspaceId, id, m, true)
    assertNotArchived(s)
    if (s.version !== content.version) {
      const base = await revisions(m)
        .createQueryBuilder('r')
        .where('r.sheet_id = :id AND r.sheet_version <= :v', { id: s.id, v: content.version })
        .orderBy('r.number', 'DESC')
        .getOne()
      const names = await namesOf([s.updatedBy])
      throw new ConflictError(
        `Someone saved this sheet after you opened it (you started from version ${content.version}; it is now at version ${s.version}). Review their changes, then save again.`,
        {
          currentVersion: s.version,
          yourVersion: content.version,
          changedBy: person(names, s.updatedBy),
          changedAt: s.updatedAt,
          changes: base ? diffSheets(snapshot(base), snapshot(s)) : [],
          current: await sheetView(s),
        },
      )
    }
    applyContent(s, content)
    s.currentRevision += 1
    s.status = 'draft'
    s.version += 1
    s.updatedBy = userId
    await sheets(m).save(s)
    await newRevision(m, s, userId)
    await recordAudit({ workspaceId, actorId: userId, action: 'sheet.saved', entityType: 'spec_sheet', entityId: s.id, data: { revision: s.currentRevision } }, m)
    return s
  })
  return sheetView(saved)
}

/** The sort keys of the list, as SQL over a given table alias (the page, then the answer, are ordered alike). */
const LIST_SORT_KEYS: Record<SheetListQuery['sort'], (alias: string) => string> = {
  updatedAt: (t) => `${t}.updated_at`,
  createdAt: (t) => `${t}.created_at`,
  title: (t) => `lower(${t}.title)`,
  reference: (t) => `lower(${t}.reference)`,
  client: (t) => `lower(${t}.client)`,
  status: (t) => `${t}.status`,
  chemistry: (t) => `${t}.chemistry`,
}

interface SheetListRow {
  id: string | null; title: string; reference: string; client: string; site: string; chemistry: string; status: SpecSheet['status']
  currentRevision: number; issuedRevision: number | null; selectedCapacityAh: number | null; requiredCapacityAh: number | null
  createdBy: string | null; authorName: string | null; archivedAt: Date | null; createdAt: Date; updatedAt: Date; total: string
}

/**
 * A page of sheets. The SQL text depends only on which filters are present and on the order, so
 * each variant is one named prepared statement; the values are always parameters. The page is
 * taken first (by the (workspace, updated_at, id) index for the usual order) and only its rows are
 * joined to their authors; the total comes in the same answer, which holds one row of nulls past
 * the last page. A row needs two figures of the results, not the whole working: they come from
 * generated columns.
 */
export async function listSheets(workspaceId: string, q: SheetListQuery) {
  const values: unknown[] = [workspaceId]
  const where = ['workspace_id = $1', q.archived ? 'archived_at IS NOT NULL' : 'archived_at IS NULL']
  const variant = [q.archived ? 'a' : 'c', q.sort, q.order]
  if (q.q) {
    values.push(`%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`)
    const n = `$${values.length}`
    where.push(`(title ILIKE ${n} OR reference ILIKE ${n} OR client ILIKE ${n} OR site ILIKE ${n} OR luminaire ILIKE ${n})`)
    variant.push('q')
  }
  for (const [key, column] of [['chemistry', 'chemistry'], ['status', 'status'], ['author', 'created_by']] as const) {
    if (!q[key]) continue
    values.push(q[key])
    where.push(`${column} = $${values.length}`)
    variant.push(key)
  }
  const direction = q.order === 'asc' ? 'ASC' : 'DESC'
  const order = (alias: string) => `${LIST_SORT_KEYS[q.sort](alias)} ${direction}, ${alias}.id ${direction}`
  values.push(q.pageSize, (q.page - 1) * q.pageSize)
  const text = `WITH total AS (SELECT COUNT(*) AS n FROM spec_sheets WHERE ${where.join(' AND ')}),
page AS (SELECT id, title, reference, client, site, chemistry, status, current_revision, issued_revision,
    selected_capacity_ah, required_capacity_ah, created_by, archived_at, created_at, updated_at
  FROM spec_sheets s WHERE ${where.join(' AND ')}
  ORDER BY ${order('s')} LIMIT $${values.length - 1} OFFSET $${values.length})
SELECT page.id, page.title, page.reference, page.client, page.site, page.chemistry, page.status,
  page.current_revision AS "currentRevision", page.issued_revision AS "issuedRevision",
  page.selected_capacity_ah AS "selectedCapacityAh", page.required_capacity_ah AS "requiredCapacityAh",
  page.created_by AS "createdBy", author.name AS "authorName", page.archived_at AS "archivedAt",
  page.created_at AS "createdAt", page.updated_at AS "updatedAt", total.n AS total
FROM total LEFT JOIN page ON true LEFT JOIN users author ON author.id = page.created_by
ORDER BY ${order('page')}`
  const rows = await preparedRows<SheetListRow>(`sheet-list-${variant.join('-')}`, text, values)
  return {
    page: q.page,
    pageSize: q.pageSize,
    total: Number(rows[0]?.total ?? 0),
    items: rows
      .filter((s): s is SheetListRow & { id: string } => s.id !== null)
      .map((s) => ({
        id: s.id,
        title: s.title,
        reference: s.reference,
        client: s.client,
        site: s.site,
        chemistry: s.chemistry,
        status: s.status,
        currentRevision: s.currentRevision,
        issuedRevision: s.issuedRevision,
        selectedCapacityAh: s.selectedCapacityAh,
        requiredCapacityAh: s.requiredCapacityAh,
        author: personNamed(s.createdBy, s.authorName),
        archivedAt: s.archivedAt,
        createdAt: s.createdAt,
        updatedAt: s.updatedAt,
      })),
  }
}

/** People who authored sheets in the workspace (for the author filter). */
export async function sheetAuthors(workspaceId: string) {
  const rows: Array<{ id: string; name: string }> = await dataSource.query(
    `SELECT DISTINCT u.id, u.name FROM spec_sheets s JOIN users u ON u.id = s.created_by WHERE s.workspace_id = $1 ORDER BY u.name`,
    [workspaceId],
  )
  return rows
}

export async function listRevisions(workspaceId: string, id: string) {
  const s = await findSheet(workspaceId, id)
  const rows = await revisions().find({ where: { sheetId: s.id, workspaceId }, order: { number: 'DESC' } })
  const names = await namesOf(rows.flatMap((r) => [r.authorId, r.issuedBy]))
  return rows.map((r) => {
    const v = revisionView(r, names)
    return { number: v.number, status: v.status, title: v.title, engineVersion: v.engineVersion, author: v.author, createdAt: v.createdAt, issuedAt: v.issuedAt, issuedBy: v.issuedBy }
  })
}

export async function getRevision(workspaceId: string, id: string, number: number) {
  const s = await findSheet(workspaceId, id)
  const r = await revisions().findOne({ where: { sheetId: s.id, workspaceId, number } })
  if (!r) throw new NotFoundError(`Revision ${number}`)
  return revisionView(r, await namesOf([r.authorId, r.issuedBy]))
}

export async function issueSheet(workspaceId: string, userId: string, id: string, version: number) {
  const saved = await dataSource.transaction(async (m) => {
    const s = await findSheet(workspaceId, id, m, true)
    assertNotArchived(s)
    if (s.version !== version) {
      throw new ConflictError(`The sheet changed after you opened it (now version ${s.version}). Reload it and check the latest revision before issuing.`, { currentVersion: s.version, yourVersion: version })
    }
    if (s.status === 'issued') throw new ConflictError(`Revision ${s.currentRevision} is already issued. Save a change to make a new draft revision.`)
    const now = new Date()
    const previous = s.issuedRevision
    if (previous !== null) await revisions(m).update({ sheetId: s.id, number: previous }, { status: 'superseded' })
    await revisions(m).update({ sheetId: s.id, number: s.currentRevision }, { status: 'issued', issuedAt: now, issuedBy: userId })
    s.status = 'issued'
    s.issuedRevision = s.currentRevision
    s.version += 1
    s.updatedBy = userId
    await sheets(m).save(s)
    await recordAudit(
      { workspaceId, actorId: userId, action: 'sheet.issued', entityType: 'spec_sheet', entityId: s.id, data: { revision: s.currentRevision, supersedes: previous } },
      m,
    )
    return s
  })
  return sheetView(saved)
}

export async function cloneSheet(workspaceId: string, userId: string, id: string) {
  const source = await findSheet(workspaceId, id)
  const copy = await createSheet(workspaceId, userId, {
    title: `Copy of ${source.title}`.slice(0, 200),
    reference: source.reference,
    client: source.client,
    site: source.site,
    luminaire: source.luminaire,
    inputs: source.inputs,
  })
  await recordAudit({ workspaceId, actorId: userId, action: 'sheet.cloned', entityType: 'spec_sheet', entityId: copy.id, data: { from: source.id } })
  return copy
}

export async function setArchived(workspaceId: string, userId: string, id: string, archived: boolean) {
  const s = await findSheet(workspaceId, id)
  if (archived === !!s.archivedAt) return sheetView(s)
  s.archivedAt = archived ? new Date() : null
  s.version += 1
  s.updatedBy = userId
  await sheets().save(s)
  await recordAudit({ workspaceId, actorId: userId, action: archived ? 'sheet.archived' : 'sheet.restored', entityType: 'spec_sheet', entityId: s.id })
  return sheetView(s)
}

// ---- Sharing ----

type ShareState = 'active' | 'expired' | 'revoked'
const shareState = (l: ShareLink, now = Date.now()): ShareState => (l.revokedAt ? 'revoked' : l.expiresAt && l.expiresAt.getTime() <= now ? 'expired' : 'active')
export const shareUrl = (token: string) => `${config().origin}/s/${encodeURIComponent(token)}`

export async function createShare(workspaceId: string, userId: string, id: string, expiresAt: Date | null) {
  const s = await findSheet(workspaceId, id)
  assertNotArchived(s)
  if (s.issuedRevision === null) throw new ConflictError('Issue the sheet before sharing it: a shared link shows the issued revision.')
  if (expiresAt && expiresAt.getTime() <= Date.now()) throw new BadRequestError('The expiry must be in the future.', [{ path: 'expiresAt', message: 'must be in the future' }])
  const { token, hash } = newToken()
  const link = await shares().save(shares().create({ workspaceId, sheetId: s.id, tokenHash: hash, createdBy: userId, expiresAt, revokedAt: null, revokedBy: null }))
  await recordAudit({ workspaceId, actorId: userId, action: 'sheet.shared', entityType: 'spec_sheet', entityId: s.id, data: { shareId: link.id, expiresAt } })
  return { id: link.id, token, url: shareUrl(token), expiresAt: link.expiresAt, createdAt: link.createdAt, state: shareState(link) }
}

export async function listShares(workspaceId: string, id: string) {
  const s = await findSheet(workspaceId, id)
  const rows = await shares().find({ where: { sheetId: s.id, workspaceId }, order: { createdAt: 'DESC' } })
  const names = await namesOf(rows.map((r) => r.createdBy))
  return rows.map((l) => ({ id: l.id, createdAt: l.createdAt, createdBy: person(names, l.createdBy), expiresAt: l.expiresAt, revokedAt: l.revokedAt, state: shareState(l) }))
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

export async function emailShare(workspaceId: string, userId: string, sheetId: string, shareId: string, mail: { to: string; message: string; token: string }) {
  const { sheet, link } = await findShare(workspaceId, sheetId, shareId)
  if (!safeEqual(hashToken(mail.token), link.tokenHash)) throw new BadRequestError('That token does not belong to this share link.', [{ path: 'token', message: 'does not match this link' }])
  const state = shareState(link)
  if (state !== 'active') throw new ConflictError(`This link is ${state}; make a new one to send.`)
  const sender = (await namesOf([userId])).get(userId) ?? 'A colleague'
  const paragraphs = [
    `${sender} has shared the emergency-lighting specification sheet "${sheet.title}"${sheet.reference ? ` (${sheet.reference})` : ''} with you.`,
    ...(mail.message ? [`Their message: ${mail.message}`] : []),
    `The link opens a read-only copy of the issued revision; no account is needed.${link.expiresAt ? ` It works until ${link.expiresAt.toISOString().slice(0, 10)}.` : ''}`,
  ]
  await sendMail({ to: mail.to, subject: `Specification sheet: ${sheet.title}`, ...composeMail(paragraphs, { label: 'Open the sheet', url: shareUrl(mail.token) }) }, { kind: 'share', workspaceId })
  await recordAudit({ workspaceId, actorId: userId, action: 'sheet.share-emailed', entityType: 'spec_sheet', entityId: sheetId, data: { shareId, to: mail.to } })
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

/** What the PDF needs for one revision of a sheet (the current one unless a number is given). */
export async function pdfData(workspaceId: string, id: string, number?: number) {
  const s = await findSheet(workspaceId, id)
  const r = await revisions().findOne({ where: { sheetId: s.id, workspaceId, number: number ?? s.currentRevision } })
  if (!r) throw new NotFoundError(`Revision ${number}`)
  return revisionView(r, await namesOf([r.authorId, r.issuedBy]))
}

export type RevisionView = ReturnType<typeof revisionView>
