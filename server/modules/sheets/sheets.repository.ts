/**
 * Reading and writing sheets, revisions and share links: TypeORM for the ordinary work, named
 * prepared statements for the two reads on every screen's path (opening a sheet, the list).
 */
import type { EntityManager } from 'typeorm'
import { In } from 'typeorm'
import type { SheetListQuery } from '../../../shared/schemas/sheet.schema'
import { dataSource } from '../../data-source'
import { NotFoundError } from '../../errors/app-error'
import { preparedRows } from '../../lib/sql'
import { User } from '../users/user.entity'
import { ShareLink } from './share-link.entity'
import { SpecRevision } from './spec-revision.entity'
import { SpecSheet } from './spec-sheet.entity'

export const sheets = (m: EntityManager = dataSource.manager) => m.getRepository(SpecSheet)
export const revisions = (m: EntityManager = dataSource.manager) => m.getRepository(SpecRevision)
export const shares = (m: EntityManager = dataSource.manager) => m.getRepository(ShareLink)

/** Names of the given users (missing ones are left out: they left the workspace). */
export async function namesOf(ids: Array<string | null | undefined>): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))]
  if (!wanted.length) return new Map()
  const rows = await dataSource.getRepository(User).find({ where: { id: In(wanted) }, select: { id: true, name: true } })
  return new Map(rows.map((u) => [u.id, u.name]))
}

/** A sheet of this workspace (locked for update when asked), or 404. */
export async function findSheet(workspaceId: string, id: string, m?: EntityManager, lock = false): Promise<SpecSheet> {
  const s = lock
    ? await sheets(m).createQueryBuilder('s').setLock('pessimistic_write').where('s.id = :id AND s.workspace_id = :workspaceId', { id, workspaceId }).getOne()
    : await sheets(m).findOne({ where: { id, workspaceId } })
  if (!s) throw new NotFoundError('That sheet')
  return s
}

/** Stores the sheet as it now stands as its current revision, a draft. */
export function insertRevision(m: EntityManager, s: SpecSheet, authorId: string): Promise<SpecRevision> {
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

/** The revision a stale editor started from: the newest one saved at or before their version. */
export function revisionAtVersion(m: EntityManager, sheetId: string, version: number) {
  return revisions(m)
    .createQueryBuilder('r')
    .where('r.sheet_id = :id AND r.sheet_version <= :v', { id: sheetId, v: version })
    .orderBy('r.number', 'DESC')
    .getOne()
}

export type SheetRow = Omit<SpecSheet, 'workspaceId' | 'selectedCapacityAh' | 'requiredCapacityAh' | 'inputs' | 'results'> & {
  /** JSON text: parsed only when the caller needs objects. */
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
export async function sheetRowWithNames(workspaceId: string, id: string): Promise<SheetRow> {
  const [row] = await preparedRows<SheetRow>('sheet-get', GET_SHEET_SQL, [id, workspaceId])
  if (!row) throw new NotFoundError('That sheet')
  return row
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

export interface SheetListRow {
  id: string | null
  title: string
  reference: string
  client: string
  site: string
  chemistry: string
  status: SpecSheet['status']
  currentRevision: number
  issuedRevision: number | null
  selectedCapacityAh: number | null
  requiredCapacityAh: number | null
  createdBy: string | null
  authorName: string | null
  archivedAt: Date | null
  createdAt: Date
  updatedAt: Date
  total: string
}

/**
 * A page of sheets. The SQL text depends only on which filters are present and on the order, so
 * each variant is one named prepared statement; the values are always parameters. The page is
 * taken first (by the (workspace, updated_at, id) index for the usual order) and only its rows are
 * joined to their authors; the total comes in the same answer, which holds one row of nulls past
 * the last page. A row needs two figures of the results, not the whole working: they come from
 * generated columns.
 */
export function sheetListRows(workspaceId: string, q: SheetListQuery): Promise<SheetListRow[]> {
  const values: unknown[] = [workspaceId]
  const where = ['workspace_id = $1', q.archived ? 'archived_at IS NOT NULL' : 'archived_at IS NULL']
  const variant = [q.archived ? 'a' : 'c', q.sort, q.order]
  if (q.q) {
    values.push(`%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`)
    const n = `$${values.length}`
    where.push(`(title ILIKE ${n} OR reference ILIKE ${n} OR client ILIKE ${n} OR site ILIKE ${n} OR luminaire ILIKE ${n})`)
    variant.push('q')
  }
  for (const [key, column] of [
    ['chemistry', 'chemistry'],
    ['status', 'status'],
    ['author', 'created_by'],
  ] as const) {
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
  return preparedRows<SheetListRow>(`sheet-list-${variant.join('-')}`, text, values)
}

/** People who authored sheets in the workspace (for the author filter). */
export async function sheetAuthors(workspaceId: string): Promise<Array<{ id: string; name: string }>> {
  return dataSource.query(`SELECT DISTINCT u.id, u.name FROM spec_sheets s JOIN users u ON u.id = s.created_by WHERE s.workspace_id = $1 ORDER BY u.name`, [
    workspaceId,
  ])
}
