/**
 * A site's regime history: which regime profile (and which version of it) applied from which day,
 * who changed it and why. Rows are only ever added, so an inspector can see under which rules
 * older tests were due.
 */
import type { EntityManager } from 'typeorm'
import { regimeProfile, type RegimeId } from '../../../shared/engine/regimes'
import { dataSource } from '../../data-source'

export interface RegimeChange {
  id: string
  fromRegime: RegimeId | null
  toRegime: RegimeId
  profileVersion: string
  reason: string
  changedBy: string | null
  changedByName: string | null
  changedAt: string
}

export async function recordRegimeChange(
  m: EntityManager,
  workspaceId: string,
  siteId: string,
  actorId: string | null,
  from: RegimeId | null,
  to: RegimeId,
  reason = '',
): Promise<void> {
  await m.query(
    `INSERT INTO site_regime_changes (workspace_id, site_id, from_regime, to_regime, profile_version, reason, changed_by) VALUES ($1, $2, $3, $4, $5, $6, $7)`,
    [workspaceId, siteId, from, to, regimeProfile(to).version, reason, actorId],
  )
}

/** Oldest first. */
export async function regimeHistory(workspaceId: string, siteId: string, m: EntityManager = dataSource.manager): Promise<RegimeChange[]> {
  const rows: Array<Omit<RegimeChange, 'changedAt'> & { changedAt: Date }> = await m.query(
    `SELECT c.id, c.from_regime AS "fromRegime", c.to_regime AS "toRegime", c.profile_version AS "profileVersion", c.reason,
            c.changed_by AS "changedBy", u.name AS "changedByName", c.changed_at AS "changedAt"
       FROM site_regime_changes c LEFT JOIN users u ON u.id = c.changed_by
      WHERE c.workspace_id = $1 AND c.site_id = $2 ORDER BY c.changed_at, c.id`,
    [workspaceId, siteId],
  )
  return rows.map((r) => ({ ...r, changedAt: new Date(r.changedAt).toISOString() }))
}
