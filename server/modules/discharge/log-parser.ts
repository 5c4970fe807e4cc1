/**
 * Reading a discharge log file: a look at its first bytes (empty? binary? which delimiter, decimal
 * mark and header?) and the full read, streamed through papaparse straight into Float64Arrays, so a
 * million rows never become a million objects. Rows that cannot be read are counted and the first
 * ones listed by line number and column; the caller decides whether to go on without them.
 */
import crypto from 'node:crypto'
import fs from 'node:fs'
import type { Readable } from 'node:stream'
import Papa from 'papaparse'
import {
  CURRENT_UNITS,
  detectDialect,
  guessMapping,
  parseNumberCell,
  timeCellParser,
  VOLTAGE_UNITS,
  type Dialect,
  type MappingGuess,
} from '../../../shared/engine/discharge-log'
import { LISTED_BAD_ROWS, MAX_BAD_ROW_SHARE, type ColumnMapping } from '../../../shared/schemas/discharge-log.schema'
import { AppError, BadRequestError } from '../../errors/app-error'

/** Bytes looked at for the preview and the guesses. */
const SAMPLE_BYTES = 64 * 1024

export interface BadRow {
  /** Line of the file, counting from 1, as a text editor or spreadsheet shows it. */
  row: number
  column: string
  value: string
  reason: string
}

export interface FileLook extends Dialect {
  guess: MappingGuess
}

function refuse(message: string, path = 'file'): never {
  throw new BadRequestError(message, [{ path, message }])
}

/** Empty, binary and UTF-16 files are refused before any parsing; otherwise the dialect and a preview. */
export function lookAtSample(sample: Buffer, wholeFile: boolean): FileLook {
  if (sample.length === 0 || sample.toString('utf8').trim() === '')
    refuse('The file is empty: export the log again and upload the file that holds the readings.')
  if ((sample[0] === 0xff && sample[1] === 0xfe) || (sample[0] === 0xfe && sample[1] === 0xff)) {
    refuse('The file is saved as UTF-16 text; save or export it as UTF-8 (or plain) CSV and upload it again.')
  }
  let control = 0
  for (const b of sample) {
    if (b === 0)
      refuse('This is not a text file (it holds binary data). Upload the log as CSV or TSV text, not a spreadsheet workbook or the logger’s own format.')
    if (b < 9 || (b > 13 && b < 32)) control++
  }
  if (control > sample.length * 0.01) refuse('This does not look like a text file. Upload the log as CSV or TSV text.')
  const lines = sample
    .toString('utf8')
    .replace(/^\uFEFF/, '')
    .split(/\r\n|\n|\r/)
  // The sample may end half-way through a line.
  if (!wholeFile && lines.length > 1) lines.pop()
  const dialect = detectDialect(lines.slice(0, 400))
  if (!dialect) refuse('No columns found: a log needs at least two columns (time and voltage) separated by commas, semicolons or tabs.')
  if (dialect.rows.length === 0) refuse('The file has a header but no rows of readings.')
  return { ...dialect, guess: guessMapping(dialect) }
}

/** SHA-256, size and the first bytes of a file on disk, in one read. */
export async function fingerprint(path: string): Promise<{ sha256: string; size: number; sample: Buffer }> {
  const hash = crypto.createHash('sha256')
  const chunks: Buffer[] = []
  let kept = 0
  let size = 0
  for await (const chunk of fs.createReadStream(path, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) {
    hash.update(chunk)
    size += chunk.length
    if (kept < SAMPLE_BYTES) {
      const part = chunk.subarray(0, SAMPLE_BYTES - kept)
      chunks.push(part)
      kept += part.length
    }
  }
  return { sha256: hash.digest('hex'), size, sample: Buffer.concat(chunks) }
}

export interface ParsedLog {
  t: Float64Array
  v: Float64Array
  i: Float64Array | undefined
  /** Rows read as readings (bad ones excluded). */
  rows: number
  badRows: { count: number; items: BadRow[] }
  /** The current was logged negative while discharging and has been turned round. */
  currentInverted: boolean
}

const TIME_HINT = { elapsed: 'a number', clock: 'a time written h:mm:ss', timestamp: 'a date and time' } as const

/** Grows a typed array (doubling), keeping what it holds. */
function grow(a: Float64Array<ArrayBuffer>): Float64Array<ArrayBuffer> {
  const b = new Float64Array(a.length * 2)
  b.set(a)
  return b
}

/**
 * Streams the file through papaparse and fills typed arrays with seconds from the first reading,
 * volts and amps. `sizeHint` (bytes) and `bytesPerLine` size the arrays up front.
 */
export async function parseLog(input: Readable, mapping: ColumnMapping, columnNames: string[], sizeHint = 0, bytesPerLine = 12): Promise<ParsedLog> {
  const { time: tm, voltage: vm, current: im, decimal } = mapping
  const name = (col: number) => columnNames[col] ?? `Column ${col + 1}`
  const names = { t: name(tm.column), v: name(vm.column), i: im ? name(im.column) : '' }
  const timeOf = timeCellParser(tm.format, tm.unit, tm.dateOrder, decimal)
  const vScale = VOLTAGE_UNITS[vm.unit]
  const iScale = im ? CURRENT_UNITS[im.unit] : 1
  const need = Math.max(tm.column, vm.column, im?.column ?? 0) + 1

  // Rows expected from the bytes per line of the file's start, with a little room; grown if short.
  let capacity = Math.max(1024, Math.ceil((sizeHint / Math.max(8, bytesPerLine)) * 1.05))
  let t = new Float64Array(capacity)
  let v = new Float64Array(capacity)
  let cur = im ? new Float64Array(capacity) : null
  let n = 0
  let t0 = Number.NaN
  let lastT = Number.NEGATIVE_INFINITY
  let lastRaw = ''
  let seen = 0
  let iSum = 0
  const bad: BadRow[] = []
  let badCount = 0
  const flag = (row: number, column: string, value: string, reason: string) => {
    badCount++
    if (bad.length < LISTED_BAD_ROWS) bad.push({ row, column, value: value.length > 40 ? `${value.slice(0, 40)}…` : value, reason })
  }

  // papaparse hands over rows a chunk at a time (no object per row), and switches to its fast
  // splitter when the file holds no quotes; lines are counted here so messages can name them.
  const firstDataLine = mapping.firstLine + (mapping.header ? 1 : 0)
  let line = 0
  const onRow = (record: string[]) => {
    line++
    if (line === 1 && record[0]?.charCodeAt(0) === 0xfeff) record[0] = record[0].slice(1)
    if (line < firstDataLine) return
    if (record.length === 1 && record[0].trim() === '') return
    seen++
    const row = line
    if (record.length < need) {
      const missing = record.length <= tm.column ? names.t : record.length <= vm.column ? names.v : names.i
      flag(row, missing, record.join(mapping.delimiter), `has ${record.length} cell(s), so no "${missing}"`)
      return
    }
    const rawT = record[tm.column]
    const abs = timeOf(rawT)
    if (abs === null) {
      flag(row, names.t, rawT, `is not ${TIME_HINT[tm.format]}`)
      return
    }
    const volts = parseNumberCell(record[vm.column], decimal)
    if (volts === null) {
      flag(row, names.v, record[vm.column], 'is not a number')
      return
    }
    let amps = 0
    if (im) {
      const a = parseNumberCell(record[im.column], decimal)
      if (a === null) {
        flag(row, names.i, record[im.column], 'is not a number')
        return
      }
      amps = a * iScale
    }
    if (Number.isNaN(t0)) t0 = abs
    const secs = abs - t0
    if (secs < lastT) {
      flag(row, names.t, rawT, `runs backwards (after ${lastRaw})`)
      return
    }
    if (n === capacity) {
      capacity *= 2
      t = grow(t)
      v = grow(v)
      if (cur) cur = grow(cur)
    }
    t[n] = secs
    v[n] = volts * vScale
    if (cur) {
      cur[n] = amps
      iSum += amps
    }
    n++
    lastT = secs
    lastRaw = rawT
  }
  await new Promise<void>((resolve, reject) => {
    input.once('error', reject)
    Papa.parse<string[]>(input as unknown as File, {
      delimiter: mapping.delimiter,
      skipEmptyLines: false,
      chunk: (results) => {
        for (const record of results.data) onRow(record)
      },
      complete: () => resolve(),
      error: (err: Error) => refuseOrReject(err, reject),
    })
  })
  function refuseOrReject(err: Error, reject: (e: unknown) => void) {
    try {
      refuse(`The file could not be read as ${mapping.delimiter === '\t' ? 'tab' : `"${mapping.delimiter}"`}-separated text: ${err.message}`)
    } catch (e) {
      reject(e)
    }
  }

  const badRows = { count: badCount, items: bad }
  if (n < 2) {
    const first = bad[0]
    throw new AppError(
      400,
      'no_readings',
      first
        ? `No readings could be read: row ${first.row}, column "${first.column}": "${first.value}" ${first.reason}. Check the column mapping and the decimal mark.`
        : 'The file holds fewer than two rows of readings.',
      bad.map((b) => ({ path: `row ${b.row}, ${b.column}`, message: `"${b.value}" ${b.reason}` })),
      { badRows, rows: seen },
    )
  }
  if (badCount > 0 && badCount > seen * MAX_BAD_ROW_SHARE) {
    const first = bad[0]
    throw new AppError(
      422,
      'too_many_bad_rows',
      `${badCount} of ${seen} rows could not be read (first: row ${first.row}, column "${first.column}": "${first.value}" ${first.reason}). That is too many to leave out: check the column mapping, the decimal mark and the time format.`,
      bad.map((b) => ({ path: `row ${b.row}, ${b.column}`, message: `"${b.value}" ${b.reason}` })),
      { badRows, rows: seen },
    )
  }
  const tOut = t.subarray(0, n)
  const vOut = v.subarray(0, n)
  const iOut = cur ? cur.subarray(0, n) : undefined
  // Many loggers count current into the battery as positive; the engine wants discharge positive.
  const currentInverted = !!iOut && iSum < 0
  if (iOut && currentInverted) {
    for (let k = 0; k < n; k++) iOut[k] = -iOut[k]
  }
  return { t: tOut, v: vOut, i: iOut, rows: n, badRows, currentInverted }
}
