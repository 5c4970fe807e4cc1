/**
 * Staged discharge uploads and the streaming read of a log: an upload waits in a folder every app
 * process shares (its bytes never in the database) with a row in staged_uploads, is read with the
 * chosen column mapping and down-sampled for the chart, and expires after an hour.
 */
import crypto from 'node:crypto'
import fs from 'node:fs'
import path from 'node:path'
import { Readable } from 'node:stream'
import { analyseDischarge, type DischargeResult } from '../../../shared/engine/discharge'
import { splitLine } from '../../../shared/engine/discharge-log'
import { lttbIndices } from '../../../shared/engine/lttb'
import { CURVE_POINTS, engineOptions, type ColumnMapping, type DischargeAnalyse } from '../../../shared/schemas/discharge-log.schema'
import { config } from '../../config'
import { dataSource } from '../../data-source'
import { AppError, BadRequestError, NotFoundError } from '../../errors/app-error'
import { admitBytes } from '../storage/storage.service'
import { DischargeFile } from './discharge-file.entity'
import { fingerprint, lookAtSample, parseLog, type BadRow } from './log-parser'

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/

const files = () => dataSource.getRepository(DischargeFile)

/** The folder every app process stages uploads in (shared: any process may save what another received). */
export function stagingDir(): string {
  const dir = path.join(config().dataDir, 'discharge-uploads')
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 })
  return dir
}

export interface StagedUpload {
  id: string
  workspaceId: string
  originalName: string
  sha256: string
  size: number
  expiresAt: Date
}

const stagedFile = (uploadId: string) => path.join(stagingDir(), `${uploadId}.upload`)

export function removeStagedFile(uploadId: string) {
  fs.rmSync(stagedFile(uploadId), { force: true })
}

const NOT_STAGED = 'That upload (uploads wait an hour to be saved; upload the file again)'

/**
 * Removes uploads nobody saved within the hour: their rows, their files, and files no row claims
 * (an upload cut off half-way). Runs on each upload and every few minutes in each process; two
 * processes sweeping at once each delete what they find.
 */
export async function sweepStagedUploads(now = Date.now()): Promise<number> {
  // TypeORM answers a DELETE … RETURNING with [rows, count].
  const [expired] = (await dataSource.query('DELETE FROM staged_uploads WHERE expires_at <= now() RETURNING id', [])) as [Array<{ id: string }>, number]
  for (const r of expired) removeStagedFile(r.id)
  const dir = stagingDir()
  const old: string[] = []
  for (const name of fs.readdirSync(dir)) {
    try {
      if (now - fs.statSync(path.join(dir, name)).mtimeMs > config().storage.stagedForMs) old.push(name)
    } catch {
      // Another process removed it first.
    }
  }
  const ids = old.map((n) => n.replace(/\.upload$/, '')).filter((id) => UUID.test(id))
  const claimed = new Set(
    ids.length ? ((await dataSource.query('SELECT id FROM staged_uploads WHERE id = ANY($1::uuid[])', [ids])) as Array<{ id: string }>).map((r) => r.id) : [],
  )
  for (const name of old) if (!claimed.has(name.replace(/\.upload$/, ''))) fs.rmSync(path.join(dir, name), { force: true })
  return expired.length
}

/** A new staging path for an upload written by the caller (multer or a JSON body). */
export function newStagingPath(): { uploadId: string; file: string } {
  const uploadId = crypto.randomUUID()
  return { uploadId, file: stagedFile(uploadId) }
}

/** Checks a file just written to the staging folder and answers with a preview; refused files are removed. */
export async function stageUpload(workspaceId: string, userId: string, file: string, originalName: string) {
  const uploadId = path.basename(file).replace(/\.upload$/, '')
  try {
    await sweepStagedUploads()
    const { sha256, size, sample } = await fingerprint(file)
    const look = lookAtSample(sample, size <= sample.length)
    const name = originalName.slice(0, 200)
    const expiresAt = new Date(Date.now() + config().storage.stagedForMs)
    await dataSource.transaction(async (m) => {
      await admitBytes(m, workspaceId, size, { staged: true })
      await m.query('INSERT INTO staged_uploads (id, workspace_id, user_id, original_name, sha256, size, expires_at) VALUES ($1, $2, $3, $4, $5, $6, $7)', [
        uploadId,
        workspaceId,
        userId,
        name,
        sha256,
        size,
        expiresAt,
      ])
    })
    const stored = await files().findOne({ where: { workspaceId, sha256 }, select: { id: true } })
    return {
      uploadId,
      sha256,
      size,
      name,
      /** Save it before then; an upload nobody saves is deleted after an hour. */
      expiresAt: expiresAt.toISOString(),
      /** The same file is already stored in this workspace (it will not be stored twice). */
      storedFileId: stored?.id ?? null,
      delimiter: look.delimiter,
      decimal: look.decimal,
      header: look.header,
      firstLine: look.firstLine,
      columns: look.columns,
      preview: look.rows,
      guess: look.guess,
    }
  } catch (err) {
    removeStagedFile(uploadId)
    throw err
  }
}

export async function readStaged(workspaceId: string, uploadId: string): Promise<{ meta: StagedUpload; file: string }> {
  if (!UUID.test(uploadId)) throw new NotFoundError(NOT_STAGED)
  const rows: Array<{ id: string; original_name: string; sha256: string; size: string; expires_at: Date }> = await dataSource.query(
    'SELECT id, original_name, sha256, size, expires_at FROM staged_uploads WHERE id = $1 AND workspace_id = $2 AND expires_at > now()',
    [uploadId, workspaceId],
  )
  const file = stagedFile(uploadId)
  if (!rows.length || !fs.existsSync(file)) throw new NotFoundError(NOT_STAGED)
  const r = rows[0]
  return { meta: { id: r.id, workspaceId, originalName: r.original_name, sha256: r.sha256, size: Number(r.size), expiresAt: r.expires_at }, file }
}

/** Column names for the mapping's header line, from the first bytes of the file. */
function columnNames(sample: Buffer, mapping: ColumnMapping): string[] {
  const lines = sample
    .toString('utf8')
    .replace(/^\uFEFF/, '')
    .split(/\r\n|\n|\r/)
  const line = lines[mapping.firstLine - 1] ?? ''
  const cells = splitLine(line, mapping.delimiter)
  return cells.map((c, k) => (mapping.header ? c.trim() || `Column ${k + 1}` : `Column ${k + 1}`))
}

export interface Curve {
  tH: number[]
  v: number[]
  i: number[] | null
}

const round = (x: number, digits: number) => Number(x.toFixed(digits))

/** The curve for plotting: at most CURVE_POINTS points, chosen by LTTB on the voltage. */
function downSample(t: Float64Array, v: Float64Array, i: Float64Array | undefined): Curve {
  const keep = lttbIndices(t, v, Math.min(CURVE_POINTS, t.length))
  const t0 = t[0]
  const tH: number[] = []
  const vs: number[] = []
  const is: number[] | null = i ? [] : null
  for (const k of keep) {
    tH.push(round((t[k] - t0) / 3600, 6))
    vs.push(round(v[k], 5))
    if (is && i) is.push(round(i[k], 5))
  }
  return { tH, v: vs, i: is }
}

export interface ReadReport {
  rows: number
  badRows: { count: number; items: BadRow[] }
  currentInverted: boolean
}

export interface Analysis {
  result: DischargeResult
  curve: Curve
  read: ReadReport
  columns: string[]
}

/** Parses a file stream with the mapping and runs the engine; bad rows stop it unless accepted. */
export async function analyseStream(
  input: Readable,
  sample: Buffer,
  size: number,
  body: Pick<DischargeAnalyse, 'mapping' | 'options' | 'acceptBadRows'>,
): Promise<Analysis> {
  const columns = columnNames(sample, body.mapping)
  const sampleLines = sample.toString('latin1').split('\n').length - 1
  const parsed = await parseLog(input, body.mapping, columns, size, sampleLines > 0 ? sample.length / sampleLines : 12)
  const read: ReadReport = { rows: parsed.rows, badRows: parsed.badRows, currentInverted: parsed.currentInverted }
  if (parsed.badRows.count > 0 && !body.acceptBadRows) {
    const first = parsed.badRows.items[0]
    throw new AppError(
      422,
      'bad_rows',
      `${parsed.badRows.count} row(s) could not be read; the first is row ${first.row}, column "${first.column}": "${first.value}" ${first.reason}. Fix the file or the mapping, or go on without ${parsed.badRows.count === 1 ? 'it' : 'them'}.`,
      parsed.badRows.items.map((b) => ({ path: `row ${b.row}, ${b.column}`, message: `"${b.value}" ${b.reason}` })),
      { badRows: parsed.badRows, rows: parsed.rows + parsed.badRows.count },
    )
  }
  const outcome = analyseDischarge({ t: parsed.t, v: parsed.v, i: parsed.i }, engineOptions(body.options))
  if (!outcome.ok)
    throw new BadRequestError(
      'The log could not be analysed.',
      outcome.fields.map((f) => ({ path: f.path, message: f.message })),
    )
  return { result: outcome.result, curve: downSample(parsed.t, parsed.v, parsed.i), read, columns }
}

export async function sampleOf(file: string): Promise<Buffer> {
  const handle = await fs.promises.open(file, 'r')
  try {
    const buf = Buffer.alloc(64 * 1024)
    const { bytesRead } = await handle.read(buf, 0, buf.length, 0)
    return buf.subarray(0, bytesRead)
  } finally {
    await handle.close()
  }
}
