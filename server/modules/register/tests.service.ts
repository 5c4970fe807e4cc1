/**
 * The log book: routine tests recorded one at a time or a round at a time. Each record carries a
 * client-made UUID; the server upserts on (workspace, clientId), so a retried send never adds a row.
 */
import type { EntityManager } from 'typeorm'
import { durationVerdict, runtimeMismatch, type RoundSignOff, type TestRecordData } from '../../../shared/schemas/test-record.schema'
import { dataSource } from '../../data-source'
import { BadRequestError, ConflictError, NotFoundError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { findLuminaire, findSite } from './register.service'

export type SaveOutcome = 'created' | 'updated' | 'unchanged'

export interface LogBookEntry {
  id: string
  clientId: string
  luminaireId: string
  tag: string
  siteId: string
  kind: 'functional' | 'duration'
  testedOn: string
  passed: boolean
  achievedDurationH: number | null
  faults: string
  remedialAction: string
  dischargeLogId: string | null
  checklist: Record<string, boolean>
  verdictOverrideReason: string
  runtimeNote: string
  roundClientId: string | null
  recordedBy: string | null
  recordedByName: string | null
  recordedAt: string
  /** Set when the record was marked as entered in error: kept and shown struck through, left out of the luminaire's state. */
  recordedInErrorAt: string | null
  recordedInErrorReason: string
  recordedInErrorByName: string | null
}

async function upsertOne(m: EntityManager, workspaceId: string, actorId: string, r: TestRecordData): Promise<{ id: string; outcome: SaveOutcome }> {
  // Insert, or update the same client record when something in it changed; an identical retry touches nothing.
  const rows: Array<{ id: string; inserted: boolean }> = await m.query(
    `INSERT INTO test_records (workspace_id, luminaire_id, client_id, kind, tested_on, passed, achieved_duration_h, faults, remedial_action, discharge_log_id, recorded_by,
       checklist, verdict_override_reason, runtime_note, round_client_id)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15)
     ON CONFLICT (workspace_id, client_id) DO UPDATE SET
       kind = EXCLUDED.kind, tested_on = EXCLUDED.tested_on, passed = EXCLUDED.passed,
       achieved_duration_h = EXCLUDED.achieved_duration_h, faults = EXCLUDED.faults,
       remedial_action = EXCLUDED.remedial_action, discharge_log_id = EXCLUDED.discharge_log_id,
       checklist = EXCLUDED.checklist, verdict_override_reason = EXCLUDED.verdict_override_reason, runtime_note = EXCLUDED.runtime_note,
       round_client_id = EXCLUDED.round_client_id, updated_at = now()
     WHERE test_records.luminaire_id = EXCLUDED.luminaire_id
       AND (test_records.kind, test_records.tested_on, test_records.passed, test_records.achieved_duration_h, test_records.faults, test_records.remedial_action, test_records.discharge_log_id,
            test_records.checklist, test_records.verdict_override_reason, test_records.runtime_note, test_records.round_client_id)
           IS DISTINCT FROM (EXCLUDED.kind, EXCLUDED.tested_on, EXCLUDED.passed, EXCLUDED.achieved_duration_h, EXCLUDED.faults, EXCLUDED.remedial_action, EXCLUDED.discharge_log_id,
            EXCLUDED.checklist, EXCLUDED.verdict_override_reason, EXCLUDED.runtime_note, EXCLUDED.round_client_id)
     RETURNING id, (xmax = 0) AS inserted`,
    [workspaceId, r.luminaireId, r.clientId, r.kind, r.testedOn, r.passed, r.achievedDurationH, r.faults, r.remedialAction, r.dischargeLogId, actorId,
      JSON.stringify(r.checklist), r.verdictOverrideReason, r.runtimeNote, r.roundClientId],
  )
  const data = { luminaireId: r.luminaireId, kind: r.kind, testedOn: r.testedOn, passed: r.passed, achievedDurationH: r.achievedDurationH, faults: r.faults, remedialAction: r.remedialAction }
  if (rows.length) {
    const outcome: SaveOutcome = rows[0].inserted ? 'created' : 'updated'
    await recordAudit({ workspaceId, actorId, action: outcome === 'created' ? 'test.recorded' : 'test.updated', entityType: 'test', entityId: rows[0].id, data }, m)
    return { id: rows[0].id, outcome }
  }
  const existing: Array<{ id: string; luminaire_id: string }> = await m.query('SELECT id, luminaire_id FROM test_records WHERE workspace_id = $1 AND client_id = $2', [workspaceId, r.clientId])
  if (existing[0] && existing[0].luminaire_id !== r.luminaireId) {
    throw new ConflictError(`The record ${r.clientId} was already saved for another luminaire; make a new record instead.`)
  }
  return { id: existing[0].id, outcome: 'unchanged' }
}

/**
 * The rules a record must meet before it is saved: a full-duration verdict follows from the runtime
 * against the rated duration unless a reason is given, and a typed runtime agrees with its discharge
 * log within a few minutes unless a reason is given. Every broken rule is listed by field.
 */
async function checkAgainstRules(m: EntityManager, workspaceId: string, records: TestRecordData[], ratedById: Map<string, number>) {
  const logIds = [...new Set(records.map((r) => r.dischargeLogId).filter((x): x is string => !!x))]
  const runtimes = new Map<string, number>()
  if (logIds.length) {
    const rows: Array<{ id: string; runtime: number | null }> = await m.query(`SELECT id, (summary->>'runtimeH')::float8 AS runtime FROM discharge_logs WHERE workspace_id = $1 AND id = ANY($2::uuid[])`, [workspaceId, logIds])
    for (const row of rows) if (row.runtime !== null) runtimes.set(row.id, row.runtime)
  }
  const fields: Array<{ path: string; message: string }> = []
  records.forEach((r, i) => {
    if (r.dischargeLogId) {
      const logH = runtimes.get(r.dischargeLogId)
      if (logH === undefined) fields.push({ path: `records.${i}.dischargeLogId`, message: 'is not a discharge log of this workspace' })
      else if (r.kind === 'duration') {
        const mismatch = runtimeMismatch(r.achievedDurationH, logH)
        if (mismatch && !r.runtimeNote) fields.push({ path: `records.${i}.runtimeNote`, message: mismatch })
      }
    }
    if (r.kind === 'duration') {
      const rated = ratedById.get(r.luminaireId)!
      const verdict = durationVerdict(r.achievedDurationH, rated)
      if (verdict !== null && verdict !== r.passed && !r.verdictOverrideReason) {
        fields.push({ path: `records.${i}.verdictOverrideReason`, message: `${r.achievedDurationH} h against the rated ${rated} h is a ${verdict ? 'pass' : 'fail'}: give a reason to record a ${r.passed ? 'pass' : 'fail'}` })
      }
    }
  })
  if (fields.length) throw new BadRequestError('Some records break a log-book rule; see the fields.', fields)
}

/** Saves a batch in one transaction: all records or none. */
export async function recordTests(workspaceId: string, actorId: string, records: TestRecordData[]) {
  return dataSource.transaction(async (m) => {
    const ids = [...new Set(records.map((r) => r.luminaireId))]
    const found: Array<{ id: string; rated_duration_h: number }> = await m.query('SELECT id, rated_duration_h FROM luminaires WHERE workspace_id = $1 AND id = ANY($2::uuid[])', [workspaceId, ids])
    if (found.length !== ids.length) throw new NotFoundError('A luminaire in these records')
    await checkAgainstRules(m, workspaceId, records, new Map(found.map((f) => [f.id, f.rated_duration_h])))
    const saved: Array<{ clientId: string; id: string; outcome: SaveOutcome }> = []
    for (const r of records) saved.push({ clientId: r.clientId, ...(await upsertOne(m, workspaceId, actorId, r)) })
    return saved
  })
}

export const LOG_SELECT = `SELECT t.id, t.client_id AS "clientId", t.luminaire_id AS "luminaireId", l.tag, l.site_id AS "siteId", t.kind,
    t.tested_on::text AS "testedOn", t.passed, t.achieved_duration_h AS "achievedDurationH", t.faults, t.remedial_action AS "remedialAction",
    t.discharge_log_id AS "dischargeLogId", t.checklist, t.verdict_override_reason AS "verdictOverrideReason", t.runtime_note AS "runtimeNote", t.round_client_id AS "roundClientId",
    t.recorded_by AS "recordedBy", u.name AS "recordedByName", t.recorded_at AS "recordedAt",
    t.recorded_in_error_at AS "recordedInErrorAt", t.recorded_in_error_reason AS "recordedInErrorReason", e.name AS "recordedInErrorByName"
  FROM test_records t JOIN luminaires l ON l.id = t.luminaire_id LEFT JOIN users u ON u.id = t.recorded_by LEFT JOIN users e ON e.id = t.recorded_in_error_by`

/** A site's log book, newest first. */
export async function siteLogBook(workspaceId: string, siteId: string, limit = 2000): Promise<LogBookEntry[]> {
  await findSite(workspaceId, siteId)
  return dataSource.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND l.site_id = $2 ORDER BY t.tested_on DESC, t.recorded_at DESC LIMIT $3`, [workspaceId, siteId, limit])
}

/** A battery pack fitted or changed on a luminaire of the site, as the audit trail recorded it, with its note. */
export interface PackChangeEntry {
  id: string
  luminaireId: string
  tag: string
  /** Day the new pack was fitted (for a correction of the pack's details: the day it was recorded). */
  changedOn: string
  before: Record<string, unknown> | null
  after: Record<string, unknown> | null
  note: string
  recordedByName: string | null
  recordedAt: string
}

/** Pack changes of a site's luminaires (fitted in the field, or the pack's details corrected), newest first. */
export async function sitePackChanges(workspaceId: string, siteId: string, limit = 2000): Promise<PackChangeEntry[]> {
  const rows: Array<{ id: string; luminaireId: string; tag: string; action: string; data: Record<string, unknown>; recordedByName: string | null; at: Date }> = await dataSource.query(
    `SELECT a.id, l.id AS "luminaireId", l.tag, a.action, a.data, u.name AS "recordedByName", a.at
       FROM audit_events a JOIN luminaires l ON l.id::text = a.entity_id AND l.workspace_id = a.workspace_id LEFT JOIN users u ON u.id = a.actor_id
      WHERE a.workspace_id = $1 AND l.site_id = $2 AND a.action IN ('pack.replaced', 'pack.changed') ORDER BY a.at DESC LIMIT $3`,
    [workspaceId, siteId, limit],
  )
  return rows.map((r) => {
    const at = new Date(r.at).toISOString()
    if (r.action === 'pack.replaced') {
      const after = (r.data.after ?? null) as Record<string, unknown> | null
      return { id: r.id, luminaireId: r.luminaireId, tag: r.tag, changedOn: String(after?.packFittedOn ?? at.slice(0, 10)), before: (r.data.before ?? null) as Record<string, unknown> | null, after, note: String(r.data.note ?? ''), recordedByName: r.recordedByName, recordedAt: at }
    }
    // A correction of the pack's details: { field: { from, to } }.
    const changes = (r.data.changes ?? {}) as Record<string, { from: unknown; to: unknown }>
    const before = Object.fromEntries(Object.entries(changes).map(([k, v]) => [k, v.from]))
    const after = Object.fromEntries(Object.entries(changes).map(([k, v]) => [k, v.to]))
    return { id: r.id, luminaireId: r.luminaireId, tag: r.tag, changedOn: at.slice(0, 10), before, after, note: 'Pack details corrected in the register', recordedByName: r.recordedByName, recordedAt: at }
  })
}

/** One luminaire's tests, newest first. */
export async function luminaireLogBook(workspaceId: string, luminaireId: string): Promise<LogBookEntry[]> {
  await findLuminaire(workspaceId, luminaireId)
  return dataSource.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND t.luminaire_id = $2 ORDER BY t.tested_on DESC, t.recorded_at DESC`, [workspaceId, luminaireId])
}

/** Removes a record entered in error; the audit trail keeps what it said. */
export async function deleteTest(workspaceId: string, actorId: string, id: string) {
  await dataSource.transaction(async (m) => {
    const rows: LogBookEntry[] = await m.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND t.id = $2`, [workspaceId, id])
    if (!rows.length) throw new NotFoundError('That test record')
    await m.query('DELETE FROM test_records WHERE workspace_id = $1 AND id = $2', [workspaceId, id])
    await recordAudit({ workspaceId, actorId, action: 'test.deleted', entityType: 'test', entityId: id, data: { ...rows[0] } }, m)
  })
}

/**
 * Marks a record as entered in error (a test that never ran, the wrong luminaire): the row stays in
 * the log book, struck through with the reason, and no longer counts towards the luminaire's state.
 * Marking again is refused so the first reason and who gave it are kept.
 */
export async function markRecordedInError(workspaceId: string, actorId: string, id: string, reason: string): Promise<LogBookEntry> {
  return dataSource.transaction(async (m) => {
    const rows: LogBookEntry[] = await m.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND t.id = $2 FOR UPDATE OF t`, [workspaceId, id])
    if (!rows.length) throw new NotFoundError('That test record')
    if (rows[0].recordedInErrorAt) throw new ConflictError(`This test was already marked as recorded in error (${rows[0].recordedInErrorReason}).`)
    await m.query('UPDATE test_records SET recorded_in_error_at = now(), recorded_in_error_by = $3, recorded_in_error_reason = $4, updated_at = now() WHERE workspace_id = $1 AND id = $2', [workspaceId, id, actorId, reason])
    await recordAudit({ workspaceId, actorId, action: 'test.recorded-in-error', entityType: 'test', entityId: id, data: { reason, record: { ...rows[0] } } }, m)
    const after: LogBookEntry[] = await m.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND t.id = $2`, [workspaceId, id])
    return after[0]
  })
}

/** Signs off a round (retries with the same clientId answer the same row); lists its records' failures. */
export async function signOffRound(workspaceId: string, actorId: string, siteId: string, input: RoundSignOff) {
  await findSite(workspaceId, siteId)
  return dataSource.transaction(async (m) => {
    const rows: Array<{ id: string; inserted: boolean }> = await m.query(
      `INSERT INTO test_rounds (workspace_id, site_id, client_id, signed_off_by_name, signed_off_on, notes, recorded_by, recorded_at)
       VALUES ($1, $2, $3, $4, $5, $6, $7, now())
       ON CONFLICT (workspace_id, client_id) DO UPDATE SET signed_off_by_name = EXCLUDED.signed_off_by_name, signed_off_on = EXCLUDED.signed_off_on, notes = EXCLUDED.notes
       WHERE test_rounds.site_id = EXCLUDED.site_id
       RETURNING id, (xmax = 0) AS inserted`,
      [workspaceId, siteId, input.clientId, input.signedOffByName, input.signedOffOn, input.notes, actorId],
    )
    if (!rows.length) throw new ConflictError(`The round ${input.clientId} was signed off for another site.`)
    const records: LogBookEntry[] = await m.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND t.round_client_id = $2 ORDER BY l.tag`, [workspaceId, input.clientId])
    await recordAudit({ workspaceId, actorId, action: 'round.signed-off', entityType: 'site', entityId: siteId, data: { roundId: rows[0].id, ...input, records: records.length } }, m)
    return {
      id: rows[0].id,
      created: rows[0].inserted,
      ...input,
      records: records.length,
      failures: records.filter((r) => !r.passed && !r.recordedInErrorAt).map((r) => ({ tag: r.tag, kind: r.kind, faults: r.faults, remedialAction: r.remedialAction })),
    }
  })
}
