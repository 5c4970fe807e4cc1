/**
 * The register's lists across sites, paged by cursor: luminaires with their due state (what is
 * overdue, failed or due soon anywhere in the workspace) and the log book between two days. The
 * due rules are the engine's (shared/engine/due.ts), applied exactly as on a site's own page.
 */
import type { LuminaireDue } from '../../../shared/engine/due'
import { ATTENTION_STATES, type AttentionState } from '../../../shared/schemas/list.schema'
import { dataSource } from '../../data-source'
import { decodeCursor, pageOf } from '../../lib/list-page'
import { AreaEntity } from './area.entity'
import { stateOf } from './portfolio.service'
import { LuminaireEntity } from './luminaire.entity'
import { registerSettings, statusOf, todayIso, type LuminaireStatus } from './register.service'
import { SiteEntity } from './site.entity'
import { LOG_SELECT, type LogBookEntry } from './tests.service'

export interface LuminaireListItem extends LuminaireStatus {
  siteName: string
  /** Which of the list's states it is in (empty when nothing is due soon). */
  states: AttentionState[]
}

/**
 * The state a luminaire is listed under, by the portfolio's rule (one state each, failed first:
 * failed, then overdue, then due soon), so the list and the portfolio screen never disagree.
 */
export function attentionStatesOf(due: LuminaireDue): AttentionState[] {
  const state = stateOf(due, ATTENTION_STATES)
  return state ? [state] : []
}

export interface LuminaireFilter {
  siteId?: string
  /** Keep those in any of these states; all when left out. */
  states?: AttentionState[]
  /** Only luminaires changed at or after this moment (ISO 8601). */
  updatedSince?: string
  /** List after this luminaire id (the cursor). */
  afterId?: string
  /** At most this many rows read; only used when no state filter needs every row. */
  take?: number
}

/**
 * Luminaires of the workspace across its sites with their due dates and states, ordered by id.
 * The portfolio's overdue and failed list and GET /api/luminaires share it.
 */
export async function luminairesWithDue(workspaceId: string, filter: LuminaireFilter = {}, today = todayIso()): Promise<LuminaireListItem[]> {
  const q = dataSource.getRepository(LuminaireEntity).createQueryBuilder('l').where('l.workspace_id = :workspaceId', { workspaceId })
  if (filter.siteId) q.andWhere('l.site_id = :siteId', { siteId: filter.siteId })
  if (filter.updatedSince) q.andWhere('l.updated_at >= :since', { since: new Date(filter.updatedSince) })
  if (filter.afterId) q.andWhere('l.id > :afterId', { afterId: filter.afterId })
  q.orderBy('l.id', 'ASC')
  if (!filter.states?.length && filter.take) q.take(filter.take)
  const rows = await q.getMany()
  if (!rows.length) return []
  const [sites, areas, settings] = await Promise.all([
    dataSource.getRepository(SiteEntity).find({ where: { workspaceId } }),
    dataSource.getRepository(AreaEntity).find({ where: { workspaceId } }),
    registerSettings(workspaceId),
  ])
  const tests: Array<{
    luminaire_id: string
    kind: 'functional' | 'duration'
    tested_on: string
    passed: boolean
    achieved_duration_h: number | null
    faults: string
    remedial_action: string
  }> = await dataSource.query(
    `SELECT luminaire_id, kind, tested_on::text AS tested_on, passed, achieved_duration_h, faults, remedial_action
       FROM test_records WHERE workspace_id = $1 AND luminaire_id = ANY($2::uuid[]) AND recorded_in_error_at IS NULL ORDER BY tested_on, recorded_at`,
    [workspaceId, rows.map((l) => l.id)],
  )
  const testsBy = new Map<string, typeof tests>()
  for (const t of tests) testsBy.set(t.luminaire_id, [...(testsBy.get(t.luminaire_id) ?? []), t])
  const siteById = new Map(sites.map((s) => [s.id, s]))
  const areaName = new Map(areas.map((a) => [a.id, a.name]))
  const out: LuminaireListItem[] = []
  for (const l of rows) {
    const site = siteById.get(l.siteId)!
    const status = statusOf(site, l, l.areaId ? (areaName.get(l.areaId) ?? null) : null, testsBy.get(l.id) ?? [], today, settings)
    const states = attentionStatesOf(status.due)
    if (filter.states?.length && !states.some((s) => filter.states!.includes(s))) continue
    out.push({ ...status, siteName: site.name, states })
  }
  return out
}

/** One page of GET /api/luminaires. */
export async function listLuminaires(
  workspaceId: string,
  query: { limit: number; cursor?: string; siteId?: string; state?: AttentionState[]; updatedSince?: string },
) {
  const after = decodeCursor(query.cursor, 1)
  const rows = await luminairesWithDue(workspaceId, {
    siteId: query.siteId,
    states: query.state,
    updatedSince: query.updatedSince,
    afterId: after ? String(after[0]) : undefined,
    take: query.limit + 1,
  })
  return pageOf(rows, query.limit, (l) => [l.id])
}

/** One page of GET /api/tests: the log book across sites, oldest first, between two days. */
export async function listTests(
  workspaceId: string,
  query: { limit: number; cursor?: string; siteId?: string; luminaireId?: string; from?: string; to?: string; updatedSince?: string },
): Promise<{ items: LogBookEntry[]; nextCursor: string | null }> {
  const after = decodeCursor(query.cursor, 2)
  const where = ['t.workspace_id = $1']
  const values: unknown[] = [workspaceId]
  const add = (sql: string, value: unknown) => {
    values.push(value)
    where.push(sql.replace('?', `$${values.length}`))
  }
  if (query.siteId) add('l.site_id = ?', query.siteId)
  if (query.luminaireId) add('t.luminaire_id = ?', query.luminaireId)
  if (query.from) add('t.tested_on >= ?::date', query.from)
  if (query.to) add('t.tested_on <= ?::date', query.to)
  if (query.updatedSince) add('t.updated_at >= ?', new Date(query.updatedSince))
  if (after) {
    values.push(String(after[0]), String(after[1]))
    const n = values.length
    where.push(`(t.tested_on, t.id) > ($${n - 1}::date, $${n}::uuid)`)
  }
  values.push(query.limit + 1)
  const rows: LogBookEntry[] = await dataSource.query(`${LOG_SELECT} WHERE ${where.join(' AND ')} ORDER BY t.tested_on, t.id LIMIT $${values.length}`, values)
  return pageOf(rows, query.limit, (t) => [t.testedOn, t.id])
}
