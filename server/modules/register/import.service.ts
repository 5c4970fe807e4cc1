/**
 * Bulk import of a luminaire schedule from CSV: a preview with a report per row (row, column,
 * reason), then an all-or-nothing commit in one transaction. The file is read a chunk at a time
 * (papaparse), yielding to the event loop between chunks, at most two files at once per process;
 * the answer lists the first rows and problems and counts them all, so its size stays bounded. Rows are numbered as a spreadsheet
 * shows them: the header is row 1, the first luminaire row 2.
 */
import Papa from 'papaparse'
import { IMPORT_COLUMNS, ImportRowSchema, REQUIRED_IMPORT_COLUMNS, type ImportRow } from '../../../shared/schemas/luminaire.schema'
import { dataSource } from '../../data-source'
import { AppError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { AreaEntity } from './area.entity'
import { LuminaireEntity } from './luminaire.entity'
import { findSite } from './register.service'

export interface ImportIssue {
  row: number
  column: string
  reason: string
}

export interface ImportPreview {
  columns: string[]
  /** The first LISTED_IMPORT_ROWS rows with their values (null when the row has a problem). */
  rows: Array<{ row: number; values: ImportRow | null }>
  /** The first LISTED_IMPORT_ERRORS problems. */
  errors: ImportIssue[]
  /** Every problem found, listed or not. */
  errorCount: number
  validRows: number
  /** Luminaire rows in the file. */
  totalRows: number
  newAreas: string[]
}

/** "Rated duration (h)" → "rated_duration_h": header names are forgiving about case, spaces and units in brackets. */
function normaliseHeader(h: string): string {
  return h
    .replace(/^\uFEFF/, '')
    .trim()
    .toLowerCase()
    .replace(/\(([^)]*)\)/g, '_$1')
    .replace(/[\s\-./]+/g, '_')
    .replace(/_+/g, '_')
    .replace(/^_|_$/g, '')
}

/** Rows of the preview's answer listed with their values (all are checked and counted). */
export const LISTED_IMPORT_ROWS = 100
/** Problems listed by row (all are counted in errorCount). */
export const LISTED_IMPORT_ERRORS = 500
/** Schedules parsed at once in one process; more wait their turn, so memory stays bounded. */
const PARSES_AT_ONCE = 2
/** Characters handed to the parser at a time; the event loop turns between chunks. */
const CHUNK_CHARS = 64 * 1024

let parsing = 0
const waiting: Array<() => void> = []
async function parseSlot<T>(work: () => Promise<T>): Promise<T> {
  if (parsing >= PARSES_AT_ONCE) await new Promise<void>((resolve) => waiting.push(resolve))
  parsing++
  try {
    return await work()
  } finally {
    parsing--
    waiting.shift()?.()
  }
}

/**
 * Reads CSV records a chunk at a time, yielding to the event loop between chunks so other requests
 * are served while a large schedule is read. Each record goes to `onRecord` and is not kept here.
 */
function streamRecords(csv: string, onRecord: (cells: string[]) => void): Promise<void> {
  return new Promise((resolve, reject) => {
    let failed = false
    Papa.parse<string[]>(csv.replace(/^\uFEFF/, ''), {
      delimiter: ',',
      skipEmptyLines: 'greedy',
      chunkSize: CHUNK_CHARS,
      chunk: (results: Papa.ParseResult<string[]>, parser: Papa.Parser) => {
        // Rows may have fewer or more cells than the header (checked cell by cell); anything else
        // (a quote left open) is the file's fault, and the whole file is refused naming the row.
        const quote = results.errors.find((e) => e.type !== 'FieldMismatch')
        if (quote) {
          failed = true
          parser.abort()
          reject(Object.assign(new Error(`${quote.message} (row ${(quote.row ?? 0) + 1})`), { lines: (quote.row ?? 0) + 1 }))
          return
        }
        for (const cells of results.data) onRecord(cells.map((c: string) => c.trim()))
        parser.pause()
        setImmediate(() => parser.resume())
      },
      complete: () => {
        if (!failed) resolve()
      },
      error: (err: Error) => reject(err),
    })
  })
}

export async function previewImport(workspaceId: string, siteId: string, csv: string): Promise<ImportPreview> {
  const { values: _values, ...preview } = await checkSchedule(workspaceId, siteId, csv)
  return preview
}

/** The preview and, when the file is clean, the values of every row (for the commit). */
async function checkSchedule(workspaceId: string, siteId: string, csv: string) {
  await findSite(workspaceId, siteId)
  const existingTags = new Set(
    (await dataSource.getRepository(LuminaireEntity).find({ where: { workspaceId, siteId }, select: { tag: true } })).map((l) => l.tag.toLowerCase()),
  )
  const existingAreas = new Set((await dataSource.getRepository(AreaEntity).find({ where: { workspaceId, siteId } })).map((a) => a.name.toLowerCase()))
  return parseSlot(() => checkRows(csv, existingTags, existingAreas))
}

async function checkRows(csv: string, existingTags: Set<string>, existingAreas: Set<string>): Promise<ImportPreview & { values?: ImportRow[] }> {
  const errors: ImportIssue[] = []
  let errorCount = 0
  const badRows = new Set<number>()
  const problem = (issue: ImportIssue) => {
    errorCount++
    badRows.add(issue.row)
    if (errors.length < LISTED_IMPORT_ERRORS) errors.push(issue)
  }
  const answer = (extra: Partial<ImportPreview> = {}): ImportPreview => ({ columns: [], rows: [], errors, errorCount, validRows: 0, totalRows: 0, newAreas: [], ...extra })

  let header: string[] | null = null
  let rawHeader: string[] = []
  let headerBad = false
  const tagRow = new Map<string, number>()
  const newAreas = new Map<string, string>()
  const rows: ImportPreview['rows'] = []
  const values: ImportRow[] = []
  let row = 1
  let totalRows = 0

  const onRecord = (cells: string[]) => {
    if (!header) {
      rawHeader = cells
      header = cells.map(normaliseHeader)
      const known = new Set<string>(IMPORT_COLUMNS)
      header.forEach((h, i) => {
        if (!known.has(h)) problem({ row: 1, column: rawHeader[i] || `(column ${i + 1})`, reason: `is not a column this import knows; use: ${IMPORT_COLUMNS.join(', ')}` })
      })
      const seenHeader = new Set<string>()
      for (const h of header) {
        if (seenHeader.has(h)) problem({ row: 1, column: h, reason: 'appears twice in the header' })
        seenHeader.add(h)
      }
      for (const required of REQUIRED_IMPORT_COLUMNS) {
        if (!header.includes(required)) problem({ row: 1, column: required, reason: 'is missing from the header' })
      }
      headerBad = errorCount > 0
      return
    }
    if (headerBad) return
    row++
    totalRows++
    const h = header
    if (cells.length > h.length) problem({ row, column: `(column ${h.length + 1})`, reason: `has ${cells.length} cells but the header has ${h.length}` })
    const raw: Record<string, string> = {}
    h.forEach((name, c) => {
      const cell = cells[c]
      if (cell !== undefined && cell !== '') raw[name] = cell
    })
    const parsed = ImportRowSchema.safeParse(raw)
    if (!parsed.success) {
      for (const issue of parsed.error.issues) problem({ row, column: String(issue.path[0] ?? '(row)'), reason: issue.message })
      if (rows.length < LISTED_IMPORT_ROWS) rows.push({ row, values: null })
      return
    }
    const v = parsed.data
    const key = v.tag.toLowerCase()
    if (existingTags.has(key)) problem({ row, column: 'tag', reason: `"${v.tag}" is already in this site's register` })
    else if (tagRow.has(key)) problem({ row, column: 'tag', reason: `"${v.tag}" repeats the tag of row ${tagRow.get(key)}` })
    tagRow.set(key, tagRow.get(key) ?? row)
    if (v.area && !existingAreas.has(v.area.toLowerCase()) && !newAreas.has(v.area.toLowerCase())) newAreas.set(v.area.toLowerCase(), v.area)
    if (rows.length < LISTED_IMPORT_ROWS) rows.push({ row, values: v })
    if (!badRows.has(row)) values.push(v)
  }

  try {
    await streamRecords(csv, onRecord)
  } catch (err) {
    const e = err as { message?: string; lines?: number }
    problem({ row: e.lines ?? 1, column: '(file)', reason: `the file is not valid CSV: ${e.message ?? 'parse error'}` })
    return answer()
  }
  if (!header) {
    problem({ row: 1, column: '(file)', reason: 'the file is empty' })
    return answer()
  }
  if (headerBad) return answer({ columns: header })
  if (totalRows === 0) {
    problem({ row: 2, column: '(file)', reason: 'has no luminaire rows under the header' })
    return answer({ columns: header })
  }
  // Every problem of a row is found before its values are kept, so `values` holds the valid rows only.
  return { ...answer({ columns: header, rows, validRows: values.length, totalRows, newAreas: [...newAreas.values()] }), values }
}

/** Stores every row or none: any issue answers 400 with the report, and the insert runs in one transaction. */
export async function commitImport(workspaceId: string, actorId: string, siteId: string, csv: string) {
  const preview = await checkSchedule(workspaceId, siteId, csv)
  if (preview.errorCount) {
    throw new AppError(
      400,
      'import_invalid',
      `Nothing was imported: ${preview.errorCount} problem${preview.errorCount === 1 ? '' : 's'} in the file (first: row ${preview.errors[0].row}, ${preview.errors[0].column} ${preview.errors[0].reason}).`,
      preview.errors.map((e) => ({ path: `row ${e.row}.${e.column}`, message: e.reason })),
      { errors: preview.errors, errorCount: preview.errorCount },
    )
  }
  return dataSource.transaction(async (m) => {
    await findSite(workspaceId, siteId, m)
    const areaIds = new Map<string, string>()
    for (const a of await m.getRepository(AreaEntity).find({ where: { workspaceId, siteId } })) areaIds.set(a.name.toLowerCase(), a.id)
    for (const name of preview.newAreas) {
      const area = await m.getRepository(AreaEntity).save(m.getRepository(AreaEntity).create({ workspaceId, siteId, name, notes: '' }))
      areaIds.set(name.toLowerCase(), area.id)
      await recordAudit({ workspaceId, actorId, action: 'area.created', entityType: 'area', entityId: area.id, data: { siteId, name, source: 'import' } }, m)
    }
    const created: string[] = []
    for (const v of preview.values ?? []) {
      const l = await m.getRepository(LuminaireEntity).save(
        m.getRepository(LuminaireEntity).create({
          workspaceId,
          siteId,
          areaId: v.area ? (areaIds.get(v.area.toLowerCase()) ?? null) : null,
          tag: v.tag,
          location: v.location,
          typeLabel: v.type,
          purpose: v.purpose,
          mode: v.mode,
          ratedDurationH: v.rated_duration_h,
          chemistry: v.chemistry,
          cellsInSeries: v.cells,
          capacityAh: v.capacity_ah,
          packFittedOn: v.pack_fitted_on,
          specSheetId: null,
          luminaireTypeId: null,
        }),
      )
      created.push(l.id)
      await recordAudit({ workspaceId, actorId, action: 'luminaire.created', entityType: 'luminaire', entityId: l.id, data: { siteId, tag: l.tag, source: 'import' } }, m)
    }
    await recordAudit({ workspaceId, actorId, action: 'register.imported', entityType: 'site', entityId: siteId, data: { luminaires: created.length, areas: preview.newAreas } }, m)
    return { imported: created.length, areasCreated: preview.newAreas.length, ids: created }
  }).catch((err) => {
    // Someone added the same tag or area while this import ran: the transaction is already rolled back.
    if ((err as { driverError?: { code?: string } })?.driverError?.code === '23505') throw new AppError(409, 'conflict', 'Nothing was imported: a tag or area in the file was added to the site meanwhile. Preview again.')
    throw err
  })
}
