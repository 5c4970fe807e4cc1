/**
 * The log book: routine tests recorded one at a time or a round at a time. Each record carries a
 * client-made UUID naming that record: a retried send never adds a row, and the same clientId with
 * other content is a conflict (409), never a rewrite of the log book.
 */
import type { EntityManager } from 'typeorm'
import { durationVerdict, runtimeMismatch, type RoundSignOff, type TestRecordData } from '../../../shared/schemas/test-record.schema'
import { requiredDurationH } from '../../../shared/engine/round-order'
import type { TestRegime } from '../../../shared/engine/due'
import { dataSource } from '../../data-source'
import { BadRequestError, ConflictError, NotFoundError, UnprocessableError } from '../../errors/app-error'
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

async function upsertOne(
  m: EntityManager,
  workspaceId: string,
  actorId: string,
  r: TestRecordData,
  index: number,
): Promise<{ id: string; outcome: SaveOutcome }> {
  const values = [
    r.luminaireId,
    r.kind,
    r.testedOn,
    r.passed,
    r.achievedDurationH,
    r.faults,
    r.remedialAction,
    r.dischargeLogId,
    JSON.stringify(r.checklist),
    r.verdictOverrideReason,
    r.runtimeNote,
    r.roundClientId,
  ]
  // Insert, or find the record this clientId already names: a clientId stands for one record, so a
  // retry with the same content changes nothing and different content is a conflict, never a rewrite.
  const rows: Array<{ id: string }> = await m.query(
    `INSERT INTO test_records (workspace_id, client_id, recorded_by, luminaire_id, kind, tested_on, passed, achieved_duration_h, faults, remedial_action, discharge_log_id,
       checklist, verdict_override_reason, runtime_note, round_client_id)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15)
     ON CONFLICT (workspace_id, client_id) DO NOTHING
     RETURNING id`,
    [workspaceId, r.clientId, actorId, ...values],
  )
  if (rows.length) {
    const data = {
      luminaireId: r.luminaireId,
      kind: r.kind,
      testedOn: r.testedOn,
      passed: r.passed,
      achievedDurationH: r.achievedDurationH,
      faults: r.faults,
      remedialAction: r.remedialAction,
    }
    await recordAudit({ workspaceId, actorId, action: 'test.recorded', entityType: 'test', entityId: rows[0].id, data }, m)
    return { id: rows[0].id, outcome: 'created' }
  }
  const existing: Array<{ id: string; same: boolean }> = await m.query(
    `SELECT id, (luminaire_id, kind, tested_on, passed, achieved_duration_h, faults, remedial_action, discharge_log_id, checklist, verdict_override_reason, runtime_note, round_client_id)
              IS NOT DISTINCT FROM ($3::uuid, $4::varchar, $5::date, $6::boolean, $7::float8, $8::text, $9::text, $10::uuid, $11::jsonb, $12::text, $13::text, $14::uuid) AS same
       FROM test_records WHERE workspace_id = $1 AND client_id = $2`,
    [workspaceId, r.clientId, ...values],
  )
  if (!existing[0]) throw new ConflictError(`The record ${r.clientId} is being saved by another request; try again.`)
  if (!existing[0].same) {
    throw new ConflictError(
      `The log book already holds a different record under clientId ${r.clientId}. A clientId names one record: send a new clientId for a new record.`,
      undefined,
      [{ path: `records.${index}.clientId`, code: 'conflict', message: 'already names a record with other values' }],
    )
  }
  return { id: existing[0].id, outcome: 'unchanged' }
}

/** Latest calendar day it is anywhere on Earth (UTC+14), so a test recorded just after local midnight is never "in the future". */
export function latestTodayAnywhere(now: Date = new Date()): string {
  return new Date(now.getTime() + 14 * 3600_000).toISOString().slice(0, 10)
}

/** A test cannot be dated after today: such a record is refused (422) with the field named. */
function refuseFutureDates(records: TestRecordData[]) {
  const today = latestTodayAnywhere()
  const fields = records.flatMap((r, i) =>
    r.testedOn > today
      ? [
          {
            path: `records.${i}.testedOn`,
            code: 'future_date',
            message: `is later than today (${r.testedOn}); a test can only be recorded once it has been done`,
          },
        ]
      : [],
  )
  if (fields.length) throw new UnprocessableError('A test is dated in the future; see the fields.', fields)
}

/**
 * The rules a record must meet before it is saved: a full-duration verdict follows from the runtime
 * against the rated duration unless a reason is given, and a typed runtime agrees with its discharge
 * log within a few minutes unless a reason is given. Every broken rule is listed by field.
 */
async function checkAgainstRules(m: EntityManager, workspaceId: string, records: TestRecordData[], requiredById: Map<string, number>) {
  const logIds = [...new Set(records.map((r) => r.dischargeLogId).filter((x): x is string => !!x))]
  const runtimes = new Map<string, number>()
  if (logIds.length) {
    const rows: Array<{ id: string; runtime: number | null }> = await m.query(
      `SELECT id, (summary->>'runtimeH')::float8 AS runtime FROM discharge_logs WHERE workspace_id = $1 AND id = ANY($2::uuid[])`,
      [workspaceId, logIds],
    )
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
      const required = requiredById.get(r.luminaireId)!
      const verdict = durationVerdict(r.achievedDurationH, required)
      if (verdict !== null && verdict !== r.passed && !r.verdictOverrideReason) {
        fields.push({
          path: `records.${i}.verdictOverrideReason`,
          message: `${r.achievedDurationH} h against the required ${required} h is a ${verdict ? 'pass' : 'fail'}: give a reason to record a ${r.passed ? 'pass' : 'fail'}`,
        })
      }
    }
  })
  if (fields.length) throw new BadRequestError('Some records break a log-book rule; see the fields.', fields)
}

/** Saves a batch in one transaction: all records or none. */
export async function recordTests(workspaceId: string, actorId: string, records: TestRecordData[]) {
  refuseFutureDates(records)
  return dataSource.transaction(async (m) => {
    const ids = [...new Set(records.map((r) => r.luminaireId))]
    const found: Array<{ id: string; rated_duration_h: number; regime: TestRegime }> = await m.query(
      'SELECT l.id, l.rated_duration_h, s.regime FROM luminaires l JOIN sites s ON s.id = l.site_id WHERE l.workspace_id = $1 AND l.id = ANY($2::uuid[])',
      [workspaceId, ids],
    )
    if (found.length !== ids.length) throw new NotFoundError('A luminaire in these records')
    // The time a full-duration test must last depends on the site's regime (rated duration, or a fixed time).
    await checkAgainstRules(m, workspaceId, records, new Map(found.map((f) => [f.id, requiredDurationH(f.regime, f.rated_duration_h)])))
    const saved: Array<{ clientId: string; id: string; outcome: SaveOutcome }> = []
    for (const [i, r] of records.entries()) saved.push({ clientId: r.clientId, ...(await upsertOne(m, workspaceId, actorId, r, i)) })
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
  return dataSource.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND l.site_id = $2 ORDER BY t.tested_on DESC, t.recorded_at DESC LIMIT $3`, [
    workspaceId,
    siteId,
    limit,
  ])
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
  const rows: Array<{ id: string; luminaireId: string; tag: string; action: string; data: Record<string, unknown>; recordedByName: string | null; at: Date }> =
    await dataSource.query(
      `SELECT a.id, l.id AS "luminaireId", l.tag, a.action, a.data, u.name AS "recordedByName", a.at
       FROM audit_events a JOIN luminaires l ON l.id::text = a.entity_id AND l.workspace_id = a.workspace_id LEFT JOIN users u ON u.id = a.actor_id
      WHERE a.workspace_id = $1 AND l.site_id = $2 AND a.action IN ('pack.replaced', 'pack.changed') ORDER BY a.at DESC LIMIT $3`,
      [workspaceId, siteId, limit],
    )
  return rows.map((r) => {
    const at = new Date(r.at).toISOString()
    if (r.action === 'pack.replaced') {
      const after = (r.data.after ?? null) as Record<string, unknown> | null
      return {
        id: r.id,
        luminaireId: r.luminaireId,
        tag: r.tag,
        changedOn: String(after?.packFittedOn ?? at.slice(0, 10)),
        before: (r.data.before ?? null) as Record<string, unknown> | null,
        after,
        note: String(r.data.note ?? ''),
        recordedByName: r.recordedByName,
        recordedAt: at,
      }
    }
    // A correction of the pack's details: { field: { from, to } }.
    const changes = (r.data.changes ?? {}) as Record<string, { from: unknown; to: unknown }>
    const before = Object.fromEntries(Object.entries(changes).map(([k, v]) => [k, v.from]))
    const after = Object.fromEntries(Object.entries(changes).map(([k, v]) => [k, v.to]))
    return {
      id: r.id,
      luminaireId: r.luminaireId,
      tag: r.tag,
      changedOn: at.slice(0, 10),
      before,
      after,
      note: 'Pack details corrected in the register',
      recordedByName: r.recordedByName,
      recordedAt: at,
    }
  })
}

/** One luminaire's tests, newest first. */
export async function luminaireLogBook(workspaceId: string, luminaireId: string): Promise<LogBookEntry[]> {
  await findLuminaire(workspaceId, luminaireId)
  return dataSource.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND t.luminaire_id = $2 ORDER BY t.tested_on DESC, t.recorded_at DESC`, [
    workspaceId,
    luminaireId,
  ])
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
    await m.query(
      'UPDATE test_records SET recorded_in_error_at = now(), recorded_in_error_by = $3, recorded_in_error_reason = $4, updated_at = now() WHERE workspace_id = $1 AND id = $2',
      [workspaceId, id, actorId, reason],
    )
    await recordAudit({ workspaceId, actorId, action: 'test.recorded-in-error', entityType: 'test', entityId: id, data: { reason, record: { ...rows[0] } } }, m)
    const after: LogBookEntry[] = await m.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND t.id = $2`, [workspaceId, id])
    return after[0]
  })
}

/** Signs off a round (retries with the same clientId answer the same row); lists its records' failures. */
export async function signOffRound(workspaceId: string, actorId: string, siteId: string, input: RoundSignOff) {
  if (input.signedOffOn > latestTodayAnywhere()) {
    throw new UnprocessableError('A round cannot be signed off with a date in the future.', [
      { path: 'signedOffOn', code: 'future_date', message: `is later than today (${input.signedOffOn})` },
    ])
  }
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
    const records: LogBookEntry[] = await m.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND t.round_client_id = $2 ORDER BY l.tag`, [
      workspaceId,
      input.clientId,
    ])
    await recordAudit(
      {
        workspaceId,
        actorId,
        action: 'round.signed-off',
        entityType: 'site',
        entityId: siteId,
        data: { roundId: rows[0].id, ...input, records: records.length },
      },
      m,
    )
    return {
      id: rows[0].id,
      created: rows[0].inserted,
      ...input,
      records: records.length,
      failures: records
        .filter((r) => !r.passed && !r.recordedInErrorAt)
        .map((r) => ({ tag: r.tag, kind: r.kind, faults: r.faults, remedialAction: r.remedialAction })),
    }
  })
}
