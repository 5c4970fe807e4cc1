/**
 * Reading the cells of a logged discharge test: numbers with a decimal point or comma, elapsed
 * times (number, hh:mm:ss) and date-times (ISO 8601 or day/month/year with a clock time), plus
 * the guesses made from the first lines of a file (delimiter, decimal mark, header row, which
 * column is which). Pure functions on strings: the server streams the file and calls these per cell.
 */

/** Scale of each column's unit to the base unit (s, V, A). */
export const TIME_UNITS = { s: 1, min: 60, h: 3600 } as const
export const VOLTAGE_UNITS = { V: 1, mV: 0.001 } as const
export const CURRENT_UNITS = { A: 1, mA: 0.001 } as const

export type TimeFormat = 'elapsed' | 'clock' | 'timestamp'
export type DateOrder = 'ymd' | 'dmy' | 'mdy'
export type Delimiter = ',' | ';' | '\t'

/** Volts per cell from pack volts, for the per-cell axis. */
export function perCellVolts(packVolts: number, cellsInSeries: number): number {
  return packVolts / cellsInSeries
}

const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/

/** A finite number from a cell, or null (empty, text, hex, Infinity…). */
export function parseNumberCell(raw: string, decimal: '.' | ','): number | null {
  let s = raw.trim()
  if (decimal === ',') s = s.replace(',', '.')
  if (!PLAIN_NUMBER.test(s)) return null
  const x = Number(s)
  return Number.isFinite(x) ? x : null
}

const CLOCK = /^(\d+):([0-5]?\d)(?::([0-5]?\d(?:[.,]\d+)?))?$/

/** Seconds from "h:mm:ss", "hh:mm:ss.s" or "mm:ss"; hours may pass 24 (a long test). */
export function parseClockCell(raw: string): number | null {
  const m = CLOCK.exec(raw.trim())
  if (!m) return null
  if (m[3] === undefined) return Number(m[1]) * 60 + Number(m[2])
  return Number(m[1]) * 3600 + Number(m[2]) * 60 + Number(m[3].replace(',', '.'))
}

const YMD = /^(\d{4})-(\d{1,2})-(\d{1,2})[T ](\d{1,2}):(\d{2})(?::(\d{2}(?:[.,]\d+)?))?\s*(Z|[+-]\d{2}:?\d{2})?$/i
const OTHER = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})[T ,]\s*(\d{1,2}):(\d{2})(?::(\d{2}(?:[.,]\d+)?))?$/

function dayCount(y: number, mo: number, d: number): number | null {
  if (mo < 1 || mo > 12 || d < 1 || d > 31) return null
  const ms = Date.UTC(y, mo - 1, d)
  // Date.UTC rolls 31 April into 1 May; such a date is a typo, not a day.
  if (new Date(ms).getUTCDate() !== d) return null
  return ms / 1000
}

/**
 * Seconds since 1970 from a date-time cell. A time without a zone is read as it stands (clock
 * changes inside a test are not known from the file); ISO 8601 offsets are applied.
 */
export function parseTimestampCell(raw: string, order: DateOrder): number | null {
  const s = raw.trim()
  let y: number, mo: number, d: number, h: number, mi: number, sec: number
  let offset = 0
  const iso = YMD.exec(s)
  if (iso) {
    ;[y, mo, d, h, mi] = [Number(iso[1]), Number(iso[2]), Number(iso[3]), Number(iso[4]), Number(iso[5])]
    sec = iso[6] ? Number(iso[6].replace(',', '.')) : 0
    if (iso[7] && iso[7].toUpperCase() !== 'Z') {
      const z = iso[7].replace(':', '')
      offset = (z[0] === '-' ? -1 : 1) * (Number(z.slice(1, 3)) * 3600 + Number(z.slice(3, 5)) * 60)
    }
  } else {
    const o = OTHER.exec(s)
    if (!o || order === 'ymd') return null
    const [a, b] = [Number(o[1]), Number(o[2])]
    ;[d, mo] = order === 'dmy' ? [a, b] : [b, a]
    ;[y, h, mi] = [Number(o[3]), Number(o[4]), Number(o[5])]
    sec = o[6] ? Number(o[6].replace(',', '.')) : 0
  }
  if (h > 23 || mi > 59 || sec >= 61) return null
  const day = dayCount(y, mo, d)
  return day === null ? null : day + h * 3600 + mi * 60 + sec - offset
}

/** A parser of one time cell to seconds (absolute for timestamps; subtract the first one). */
export function timeCellParser(format: TimeFormat, unit: keyof typeof TIME_UNITS, order: DateOrder, decimal: '.' | ','): (raw: string) => number | null {
  if (format === 'clock') return parseClockCell
  if (format === 'timestamp') return (raw) => parseTimestampCell(raw, order)
  const scale = TIME_UNITS[unit]
  return (raw) => {
    const x = parseNumberCell(raw, decimal)
    return x === null ? null : x * scale
  }
}

// ---------------------------------------------------------------------------------------------
// Guesses from the first lines of a file.

/** Splits a line on a delimiter, honouring double quotes (enough for a preview of a few lines). */
export function splitLine(line: string, delimiter: string): string[] {
  const out: string[] = []
  let cell = ''
  let quoted = false
  for (let k = 0; k < line.length; k++) {
    const c = line[k]
    if (quoted) {
      if (c === '"' && line[k + 1] === '"') {
        cell += '"'
        k++
      } else if (c === '"') quoted = false
      else cell += c
    } else if (c === '"' && cell.trim() === '') {
      quoted = true
      cell = ''
    } else if (c === delimiter) {
      out.push(cell)
      cell = ''
    } else cell += c
  }
  out.push(cell)
  return out
}

export type CellKind = 'number' | 'number-comma' | 'clock' | 'timestamp' | 'empty' | 'text'

export function cellKind(raw: string): CellKind {
  const s = raw.trim()
  if (!s) return 'empty'
  if (PLAIN_NUMBER.test(s)) return 'number'
  if (/^[+-]?\d+,\d+$/.test(s)) return 'number-comma'
  if (CLOCK.test(s)) return 'clock'
  if (YMD.test(s) || OTHER.test(s)) return 'timestamp'
  return 'text'
}

export interface Dialect {
  delimiter: Delimiter
  decimal: '.' | ','
  /** 1-based line where the table starts. */
  firstLine: number
  header: boolean
  /** Column names: the header's cells, or "Column n". */
  columns: string[]
  /** The first data rows, split. */
  rows: string[][]
}

/**
 * Delimiter, decimal mark, first line and header row from the first lines of a file: the
 * delimiter that splits the most lines into the same number (at least two) of cells wins.
 */
export function detectDialect(lines: string[], previewRows = 20): Dialect | null {
  const candidates: Delimiter[] = ['\t', ';', ',']
  let best: { delimiter: Delimiter; cells: number; start: number; score: number } | null = null
  for (const delimiter of candidates) {
    const counts = lines.map((l) => (l.trim() ? splitLine(l, delimiter).length : 0))
    const tally = new Map<number, number>()
    for (const c of counts) if (c >= 2) tally.set(c, (tally.get(c) ?? 0) + 1)
    let cells = 0
    let score = 0
    for (const [c, n] of tally) if (n > score || (n === score && c > cells)) [cells, score] = [c, n]
    if (cells < 2) continue
    // The table starts at the first line of the usual width; a comma inside decimal-comma numbers
    // gives the comma a wider but less consistent split, so consistency wins over width.
    const start = counts.findIndex((c) => c === cells)
    if (!best || score > best.score) best = { delimiter, cells, start, score }
  }
  if (!best) return null
  const table = lines.slice(best.start).filter((l) => l.trim() !== '')
  const split = table.map((l) => splitLine(l, best.delimiter))
  const kinds = split.map((row) => row.map(cellKind))
  const first = kinds[0] ?? []
  const second = kinds[1] ?? []
  // A header has text where the rows below it have numbers or times.
  const header = first.some((k, c) => k === 'text' && second[c] !== undefined && second[c] !== 'text' && second[c] !== 'empty')
  const data = header ? split.slice(1) : split
  const dataKinds = (header ? kinds.slice(1) : kinds).flat()
  const commaNumbers = dataKinds.filter((k) => k === 'number-comma').length
  const decimal: '.' | ',' = best.delimiter !== ',' && commaNumbers > 0 ? ',' : '.'
  const width = best.cells
  const columns = header ? split[0].map((c, k) => c.trim() || `Column ${k + 1}`) : Array.from({ length: width }, (_, k) => `Column ${k + 1}`)
  return { delimiter: best.delimiter, decimal, firstLine: best.start + 1, header, columns, rows: data.slice(0, previewRows) }
}

export interface MappingGuess {
  time: { column: number; format: TimeFormat; unit: keyof typeof TIME_UNITS; dateOrder: DateOrder } | null
  voltage: { column: number; unit: keyof typeof VOLTAGE_UNITS } | null
  current: { column: number; unit: keyof typeof CURRENT_UNITS } | null
}

/** Which column is time, voltage and current, from the names and the first values. */
export function guessMapping(d: Dialect): MappingGuess {
  const names = d.columns.map((c) => c.toLowerCase())
  const kindOf = (col: number): CellKind | null => {
    const ks = d.rows.map((r) => cellKind(r[col] ?? '')).filter((k) => k !== 'empty')
    return ks.length ? ks[0] : null
  }
  const numeric = (col: number) => kindOf(col) === 'number' || kindOf(col) === 'number-comma'
  const find = (re: RegExp, ok: (c: number) => boolean, not: number[] = []) => names.findIndex((n, c) => re.test(n) && ok(c) && !not.includes(c))

  let timeCol = find(/time|elapsed|date|sec|^t\b|^t[_ (]|zeit|tiempo|temps/, (c) => kindOf(c) !== null && kindOf(c) !== 'text')
  if (timeCol < 0) timeCol = d.columns.findIndex((_, c) => kindOf(c) === 'clock' || kindOf(c) === 'timestamp')
  if (timeCol < 0 && numeric(0)) timeCol = 0
  let time: MappingGuess['time'] = null
  if (timeCol >= 0) {
    const k = kindOf(timeCol)
    const format: TimeFormat = k === 'clock' ? 'clock' : k === 'timestamp' ? 'timestamp' : 'elapsed'
    const n = names[timeCol]
    const unit = /\bh\b|\(h\)|hour/.test(n) ? 'h' : /min/.test(n) ? 'min' : 's'
    time = { column: timeCol, format, unit, dateOrder: format === 'timestamp' ? guessDateOrder(d.rows.map((r) => r[timeCol] ?? '')) : 'ymd' }
  }
  const taken = timeCol >= 0 ? [timeCol] : []
  let vCol = find(/volt|^u\b|^u[_ (]|^v\b|^v[_ (]|vbat|ubat|spannung|tension|\(m?v\)/, numeric, taken)
  if (vCol < 0) vCol = d.columns.findIndex((_, c) => !taken.includes(c) && numeric(c))
  const voltage: MappingGuess['voltage'] = vCol >= 0 ? { column: vCol, unit: /mv/.test(names[vCol]) || typicalValue(d, vCol) > 100 ? 'mV' : 'V' } : null
  const iCol = find(/curr|amp|^i\b|^i[_ (]|ibat|strom|courant|\(m?a\)/, numeric, [...taken, vCol])
  const current: MappingGuess['current'] = iCol >= 0 ? { column: iCol, unit: /ma\b|\(ma\)|milliamp/.test(names[iCol]) ? 'mA' : 'A' } : null
  return { time, voltage, current }
}

function typicalValue(d: Dialect, col: number): number {
  const xs = d.rows.map((r) => parseNumberCell(r[col] ?? '', d.decimal)).filter((x): x is number => x !== null)
  return xs.length ? Math.abs(xs[0]) : 0
}

/** Day first or month first: decided by a part above 12; day first when nothing tells. */
export function guessDateOrder(cells: string[]): DateOrder {
  for (const c of cells) {
    const s = c.trim()
    if (YMD.test(s)) return 'ymd'
    const o = OTHER.exec(s)
    if (!o) continue
    if (Number(o[1]) > 12) return 'dmy'
    if (Number(o[2]) > 12) return 'mdy'
  }
  return 'dmy'
}
