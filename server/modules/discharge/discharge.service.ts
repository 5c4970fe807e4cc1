/**
 * Discharge-test logs. An upload is first staged in a folder every app process shares (its bytes
 * never in the database) and answered with a preview and guesses; the analysis reads the staged (or an already stored) file with the chosen
 * mapping, runs the engine, and only a successful save stores the raw file (once per SHA-256) and
 * the log in one transaction. A refused or abandoned upload leaves no log behind; staged uploads
 * (a row in staged_uploads, the bytes in the shared staging folder) expire after an hour and count
 * against the workspace's storage quota until saved or expired. Every query is scoped by
 * workspace; another workspace's ids read as missing.
 */
import fs from 'node:fs'
import { Readable } from 'node:stream'
import { In, type EntityManager } from 'typeorm'
import type { DischargeResult } from '../../../shared/engine/discharge'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import type { DischargeAnalyse, DischargeListQuery } from '../../../shared/schemas/discharge-log.schema'
import { runtimeMismatch } from '../../../shared/schemas/test-record.schema'
import { dataSource } from '../../data-source'
import { BadRequestError, NotFoundError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { User } from '../users/user.entity'
import { DischargeFile } from './discharge-file.entity'
import { DischargeLog } from './discharge-log.entity'
import { analyseStream, readStaged, removeStagedFile, sampleOf, type StagedUpload } from './discharge-staging'

export { analyseStream, newStagingPath, stageUpload, stagingDir, sweepStagedUploads, type Analysis, type Curve, type ReadReport } from './discharge-staging'

const logs = (m: EntityManager = dataSource.manager) => m.getRepository(DischargeLog)
const files = (m: EntityManager = dataSource.manager) => m.getRepository(DischargeFile)

// ---------------------------------------------------------------------------------------------
// Links and views

/** A log backs a full-duration test only (that the ids are of this workspace is checked before the handler, server/lib/references.ts). */
async function checkLinks(m: EntityManager, workspaceId: string, v: { testRecordId?: string | null }) {
  if (!v.testRecordId) return
  const rows: Array<{ kind: string }> = await m.query('SELECT kind FROM test_records WHERE id = $1 AND workspace_id = $2', [v.testRecordId, workspaceId])
  if (!rows.length) throw new NotFoundError('That test record')
  if (rows[0].kind !== 'duration') {
    throw new BadRequestError('A log can only be attached to a full-duration test.', [
      { path: 'testRecordId', message: 'is a functional test; attach a discharge log to a full-duration test' },
    ])
  }
}

interface Links {
  specSheet: { id: string; title: string } | null
  testRecord: { id: string; testedOn: string; luminaireId: string; luminaireTag: string } | null
  luminaire: { id: string; tag: string; siteId: string } | null
}

async function linksOf(rows: DischargeLog[], m: EntityManager = dataSource.manager): Promise<Map<string, Links>> {
  const sheetIds = [...new Set(rows.map((r) => r.specSheetId).filter((x): x is string => !!x))]
  const testIds = [...new Set(rows.map((r) => r.testRecordId).filter((x): x is string => !!x))]
  const sheets = new Map<string, { id: string; title: string }>()
  const tests = new Map<string, Links['testRecord']>()
  if (sheetIds.length)
    for (const s of (await m.query('SELECT id, title FROM spec_sheets WHERE id = ANY($1::uuid[])', [sheetIds])) as Array<{ id: string; title: string }>)
      sheets.set(s.id, s)
  if (testIds.length) {
    const found: Array<{ id: string; tested_on: string; luminaire_id: string; tag: string }> = await m.query(
      `SELECT t.id, to_char(t.tested_on, 'YYYY-MM-DD') AS tested_on, t.luminaire_id, l.tag FROM test_records t JOIN luminaires l ON l.id = t.luminaire_id WHERE t.id = ANY($1::uuid[])`,
      [testIds],
    )
    for (const t of found) tests.set(t.id, { id: t.id, testedOn: t.tested_on, luminaireId: t.luminaire_id, luminaireTag: t.tag })
  }
  const luminaireIds = [...new Set(rows.map((r) => r.luminaireId).filter((x): x is string => !!x))]
  const luminaires = new Map<string, { id: string; tag: string; siteId: string }>()
  if (luminaireIds.length) {
    for (const l of (await m.query('SELECT id, tag, site_id AS "siteId" FROM luminaires WHERE id = ANY($1::uuid[])', [luminaireIds])) as Array<{
      id: string
      tag: string
      siteId: string
    }>)
      luminaires.set(l.id, l)
  }
  return new Map(
    rows.map((r) => [
      r.id,
      {
        specSheet: r.specSheetId ? (sheets.get(r.specSheetId) ?? null) : null,
        testRecord: r.testRecordId ? (tests.get(r.testRecordId) ?? null) : null,
        luminaire: r.luminaireId ? (luminaires.get(r.luminaireId) ?? null) : null,
      },
    ]),
  )
}

async function names(ids: Array<string | null>, m: EntityManager = dataSource.manager): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))]
  if (!wanted.length) return new Map()
  const users = await m.getRepository(User).find({ where: { id: In(wanted) }, select: { id: true, name: true } })
  return new Map(users.map((u) => [u.id, u.name]))
}

function dto(log: DischargeLog, people: Map<string, string>, links: Links | undefined, full: boolean) {
  // Lists leave out the working and the curve; one log carries everything.
  const { working, ...summary } = log.summary as Record<string, unknown>
  return {
    id: log.id,
    title: log.title,
    notes: log.notes,
    fileId: log.fileId,
    mapping: log.mapping,
    options: log.options,
    summary: full ? { ...summary, working } : summary,
    curve: full ? log.curve : undefined,
    engineVersion: log.engineVersion,
    author: log.createdBy ? { id: log.createdBy, name: people.get(log.createdBy) ?? 'former member' } : null,
    specSheetId: log.specSheetId,
    testRecordId: log.testRecordId,
    luminaireId: log.luminaireId,
    specSheet: links?.specSheet ?? null,
    testRecord: links?.testRecord ?? null,
    luminaire: links?.luminaire ?? null,
    createdAt: log.createdAt,
  }
}
export type DischargeLogDto = ReturnType<typeof dto>

async function view(log: DischargeLog, full: boolean, m: EntityManager = dataSource.manager) {
  return dto(log, await names([log.createdBy], m), (await linksOf([log], m)).get(log.id), full)
}

async function findLog(workspaceId: string, id: string, m: EntityManager = dataSource.manager): Promise<DischargeLog> {
  const log = await logs(m).findOne({ where: { id, workspaceId } })
  if (!log) throw new NotFoundError('That discharge log')
  return log
}

// ---------------------------------------------------------------------------------------------
// The log and the log book agree

interface RecordTarget {
  luminaireId: string
  ratedDurationH: number
  /** The record the log is attached to, or null to make one. */
  record: { id: string; achievedH: number | null; faults: string } | null
  mismatch: string | null
}

const hoursText = (h: number) => String(Number(h.toFixed(2)))

/** Which luminaire and record a log being saved belongs to; refuses a mismatched runtime without a reason. */
async function recordTarget(m: EntityManager, workspaceId: string, body: DischargeAnalyse, r: DischargeResult): Promise<RecordTarget | null> {
  let luminaireId = body.luminaireId ?? null
  let record: RecordTarget['record'] = null
  if (body.testRecordId) {
    const rows: Array<{ id: string; luminaire_id: string; achieved_duration_h: number | null; faults: string }> = await m.query(
      'SELECT id, luminaire_id, achieved_duration_h, faults FROM test_records WHERE id = $1 AND workspace_id = $2',
      [body.testRecordId, workspaceId],
    )
    const row = rows[0]
    if (luminaireId && row.luminaire_id !== luminaireId)
      throw new BadRequestError('The log and the test record name different luminaires.', [
        { path: 'luminaireId', message: 'is not the luminaire of that test record' },
      ])
    luminaireId = row.luminaire_id
    record = { id: row.id, achievedH: row.achieved_duration_h, faults: row.faults }
  }
  if (!luminaireId) return null
  const found: Array<{ rated_duration_h: number }> = await m.query('SELECT rated_duration_h FROM luminaires WHERE id = $1 AND workspace_id = $2', [
    luminaireId,
    workspaceId,
  ])
  if (!found.length)
    throw new BadRequestError('The luminaire was not found in this workspace.', [{ path: 'luminaireId', message: 'is not a luminaire of this workspace' }])
  if (r.pass === null) {
    throw new BadRequestError('The log stops before both the rated duration and the cut-off, so it cannot decide a full-duration test.', [
      {
        path: record ? 'testRecordId' : 'luminaireId',
        message: 'the log is too short to record a pass or fail; save it without a luminaire or log the whole test',
      },
    ])
  }
  const mismatch = record ? runtimeMismatch(record.achievedH, r.runtimeH) : null
  if (mismatch && !body.runtimeNote)
    throw new BadRequestError(`The runtime typed in the test record and the log disagree: ${mismatch}.`, [{ path: 'runtimeNote', message: mismatch }])
  return { luminaireId, ratedDurationH: found[0].rated_duration_h, record, mismatch }
}

/** Records the full-duration test from the log (runtime, verdict, day), or updates the attached record; returns its id. */
async function recordFromLog(
  m: EntityManager,
  workspaceId: string,
  userId: string,
  logId: string,
  target: RecordTarget,
  r: DischargeResult,
  body: DischargeAnalyse,
): Promise<string> {
  const passed = r.pass === true
  const shortfall = `Stayed lit ${hoursText(r.runtimeH)} h of the rated ${hoursText(target.ratedDurationH)} h (discharge log)`
  if (target.record) {
    const note = target.mismatch ? `Typed ${hoursText(target.record.achievedH ?? 0)} h, the log ${hoursText(r.runtimeH)} h: ${body.runtimeNote}` : ''
    const faults = !passed && !target.record.faults ? shortfall : target.record.faults
    await m.query(
      `UPDATE test_records SET discharge_log_id = $1, achieved_duration_h = $2, passed = $3, faults = $4, runtime_note = CASE WHEN $5 = '' THEN runtime_note ELSE $5 END, updated_at = now()
        WHERE id = $6 AND workspace_id = $7`,
      [logId, r.runtimeH, passed, faults, note, target.record.id, workspaceId],
    )
    await recordAudit(
      {
        workspaceId,
        actorId: userId,
        action: 'test.updated',
        entityType: 'test',
        entityId: target.record.id,
        data: { fromDischargeLog: logId, achievedDurationH: r.runtimeH, passed, runtimeNote: note },
      },
      m,
    )
    return target.record.id
  }
  const testedOn = body.testedOn ?? new Date().toISOString().slice(0, 10)
  const rows: Array<{ id: string }> = await m.query(
    `INSERT INTO test_records (workspace_id, luminaire_id, client_id, kind, tested_on, passed, achieved_duration_h, faults, discharge_log_id, recorded_by)
     VALUES ($1, $2, gen_random_uuid(), 'duration', $3, $4, $5, $6, $7, $8) RETURNING id`,
    [workspaceId, target.luminaireId, testedOn, passed, r.runtimeH, passed ? '' : shortfall, logId, userId],
  )
  await recordAudit(
    {
      workspaceId,
      actorId: userId,
      action: 'test.recorded',
      entityType: 'test',
      entityId: rows[0].id,
      data: { luminaireId: target.luminaireId, kind: 'duration', testedOn, passed, achievedDurationH: r.runtimeH, fromDischargeLog: logId },
    },
    m,
  )
  return rows[0].id
}

// ---------------------------------------------------------------------------------------------
// Analyse and save

export async function analyseAndMaybeSave(workspaceId: string, userId: string, body: DischargeAnalyse) {
  let input: Readable
  let sample: Buffer
  let size: number
  let staged: { meta: StagedUpload; file: string } | null = null
  let storedFileId: string | null = null
  if (body.uploadId) {
    staged = await readStaged(workspaceId, body.uploadId)
    size = staged.meta.size
    sample = await sampleOf(staged.file)
    input = fs.createReadStream(staged.file, { highWaterMark: 64 * 1024 })
  } else {
    const row = await files()
      .createQueryBuilder('f')
      .addSelect('f.bytes')
      .where('f.id = :id AND f.workspace_id = :workspaceId', { id: body.fileId, workspaceId })
      .getOne()
    if (!row) throw new NotFoundError('That stored log file')
    storedFileId = row.id
    size = row.size
    sample = row.bytes.subarray(0, 64 * 1024)
    input = Readable.from([row.bytes])
  }
  const analysis = await analyseStream(input, sample, size, body)
  const summary = { ...analysis.result, read: analysis.read } as unknown as Record<string, unknown>
  if (body.dryRun) return { saved: false as const, columns: analysis.columns, summary, curve: analysis.curve }

  const saved = await dataSource.transaction(async (m) => {
    await checkLinks(m, workspaceId, body)
    const target = await recordTarget(m, workspaceId, body, analysis.result)
    let fileId = storedFileId
    if (staged) {
      const bytes = await fs.promises.readFile(staged.file)
      // The same bytes are kept once per workspace, however many logs read them.
      const inserted: Array<{ id: string }> = await m.query(
        `INSERT INTO discharge_files (workspace_id, sha256, original_name, bytes, size, uploaded_by) VALUES ($1, $2, $3, $4, $5, $6)
         ON CONFLICT (workspace_id, sha256) DO UPDATE SET sha256 = EXCLUDED.sha256 RETURNING id`,
        [workspaceId, staged.meta.sha256, staged.meta.originalName, bytes, staged.meta.size, userId],
      )
      fileId = inserted[0].id
      // Saved: the upload no longer waits (its file goes after the commit).
      await m.query('DELETE FROM staged_uploads WHERE id = $1 AND workspace_id = $2', [staged.meta.id, workspaceId])
    }
    const log = await logs(m).save(
      logs(m).create({
        workspaceId,
        fileId: fileId as string,
        title: body.title,
        notes: body.notes,
        mapping: body.mapping as unknown as Record<string, unknown>,
        options: body.options as unknown as Record<string, unknown>,
        summary,
        curve: analysis.curve,
        engineVersion: ENGINE_VERSION,
        createdBy: userId,
        specSheetId: body.specSheetId ?? null,
        testRecordId: body.testRecordId ?? null,
        luminaireId: target?.luminaireId ?? null,
      }),
    )
    if (target) {
      log.testRecordId = await recordFromLog(m, workspaceId, userId, log.id, target, analysis.result, body)
      await logs(m).update({ id: log.id }, { testRecordId: log.testRecordId })
    }
    const r = analysis.result
    await recordAudit(
      {
        workspaceId,
        actorId: userId,
        action: 'discharge-log.saved',
        entityType: 'discharge_log',
        entityId: log.id,
        data: {
          title: log.title,
          fileId,
          runtimeH: r.runtimeH,
          pass: r.pass,
          deliveredAh: r.deliveredAh,
          badRows: analysis.read.badRows.count,
          specSheetId: log.specSheetId,
          testRecordId: log.testRecordId,
          luminaireId: log.luminaireId,
        },
      },
      m,
    )
    return view(log, true, m)
  })
  if (staged) removeStagedFile(staged.meta.id)
  return { saved: true as const, columns: analysis.columns, ...saved }
}

export async function getLog(workspaceId: string, id: string) {
  return view(await findLog(workspaceId, id), true)
}

export async function listLogs(workspaceId: string, q: DischargeListQuery) {
  const qb = logs().createQueryBuilder('d').where('d.workspace_id = :workspaceId', { workspaceId })
  if (q.sheetId) qb.andWhere('d.spec_sheet_id = :sheetId', { sheetId: q.sheetId })
  if (q.testRecordId) qb.andWhere('d.test_record_id = :testRecordId', { testRecordId: q.testRecordId })
  if (q.luminaireId) qb.andWhere('d.luminaire_id = :luminaireId', { luminaireId: q.luminaireId })
  qb.orderBy('d.created_at', 'DESC').addOrderBy('d.id', 'ASC').take(q.limit)
  const [rows, total] = await qb.getManyAndCount()
  const people = await names(rows.map((r) => r.createdBy))
  const links = await linksOf(rows)
  return { items: rows.map((r) => dto(r, people, links.get(r.id), false)), total }
}

export async function deleteLog(workspaceId: string, userId: string, id: string) {
  await dataSource.transaction(async (m) => {
    const log = await findLog(workspaceId, id, m)
    await logs(m).delete({ id: log.id, workspaceId })
    // The raw file goes with its last log.
    await m.query(
      'DELETE FROM discharge_files f WHERE f.id = $1 AND f.workspace_id = $2 AND NOT EXISTS (SELECT 1 FROM discharge_logs d WHERE d.file_id = f.id)',
      [log.fileId, workspaceId],
    )
    await recordAudit(
      {
        workspaceId,
        actorId: userId,
        action: 'discharge-log.deleted',
        entityType: 'discharge_log',
        entityId: log.id,
        data: { title: log.title, options: log.options, mapping: log.mapping, specSheetId: log.specSheetId, testRecordId: log.testRecordId },
      },
      m,
    )
  })
}

const COMPARED_FIGURES = ['runtimeH', 'deliveredAh', 'deliveredWh', 'midpointVoltageV', 'marginH', 'stateOfHealth'] as const
const diff = (a: unknown, b: unknown) => (typeof a === 'number' && typeof b === 'number' ? b - a : null)

/** Two logs side by side, with the change from the first to the second. */
export async function compareLogs(workspaceId: string, aId: string, bId: string) {
  const [a, b] = await Promise.all([getLog(workspaceId, aId), getLog(workspaceId, bId)])
  const sa = a.summary as Record<string, unknown>
  const sb = b.summary as Record<string, unknown>
  const change = Object.fromEntries(COMPARED_FIGURES.map((k) => [k, diff(sa[k], sb[k])])) as Record<(typeof COMPARED_FIGURES)[number], number | null>
  return { a, b, change }
}

/** The logs attached to one sheet, oldest first, for its PDF. */
export async function logsForSheet(workspaceId: string, sheetId: string): Promise<DischargeLogDto[]> {
  const rows = await logs().find({ where: { workspaceId, specSheetId: sheetId }, order: { createdAt: 'ASC', id: 'ASC' } })
  const people = await names(rows.map((r) => r.createdBy))
  return rows.map((r) => dto(r, people, undefined, true))
}
