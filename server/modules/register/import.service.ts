/**
 * Bulk import of a luminaire schedule from CSV: a preview with a report per row (row, column,
 * reason), then an all-or-nothing commit in one transaction. The import can run again: a row
 * matches the luminaire with its `external_id` (else its tag) and updates it, and a row that
 * changes nothing touches nothing, so the same schedule imported twice changes nothing. The file is read a chunk at a time
 * (papaparse), yielding to the event loop between chunks, at most two files at once per process;
 * the answer lists the first rows and problems and counts them all, so its size stays bounded. Rows are numbered as a spreadsheet
 * shows them: the header is row 1, the first luminaire row 2.
 */
import Papa from 'papaparse'
import { IMPORT_COLUMNS, ImportRowSchema, REGISTER_DERIVED_COLUMNS, REQUIRED_IMPORT_COLUMNS, type ImportRow } from '../../../shared/schemas/luminaire.schema'

/** The register export's computed columns: read past, never taken from the file. */
const DERIVED = new Set<string>(REGISTER_DERIVED_COLUMNS)
import { dataSource } from '../../data-source'
import { AppError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { AreaEntity } from './area.entity'
import { LuminaireEntity } from './luminaire.entity'
import { findSite, todayIso } from './register.service'

/** What a row does: add a luminaire, change the one it matches, or nothing (it already says the same). */
export type RowAction = 'create' | 'update' | 'unchanged'

/** A luminaire already on the site, as a row is compared with it. */
interface Existing {
  id: string
  tag: string
  areaName: string | null
  values: LuminaireEntity
}

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
  /** Valid rows that add a luminaire, change one, or change nothing. */
  creates: number
  updates: number
  unchanged: number
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
  const { values: _values, plan: _plan, ...preview } = await checkSchedule(workspaceId, siteId, csv)
  return preview
}

/** The preview and, when the file is clean, the values of every row (for the commit). */
async function checkSchedule(workspaceId: string, siteId: string, csv: string) {
  await findSite(workspaceId, siteId)
  const areas = await dataSource.getRepository(AreaEntity).find({ where: { workspaceId, siteId } })
  const areaName = new Map(areas.map((a) => [a.id, a.name]))
  const existing = (await dataSource.getRepository(LuminaireEntity).find({ where: { workspaceId, siteId } })).map((l): Existing => ({
    id: l.id,
    tag: l.tag,
    areaName: l.areaId ? (areaName.get(l.areaId) ?? null) : null,
    values: l,
  }))
  const existingAreas = new Set(areas.map((a) => a.name.toLowerCase()))
  return parseSlot(() => checkRows(csv, existing, existingAreas, todayIso()))
}

/** The luminaire fields a row sets (dates and external id only when the row gives them). */
function fieldsOf(v: ImportRow): Partial<LuminaireEntity> {
  return {
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
    ...(v.external_id ? { externalId: v.external_id } : {}),
    ...(v.last_functional_test_on ? { lastFunctionalTestOn: v.last_functional_test_on } : {}),
    ...(v.last_duration_test_on ? { lastDurationTestOn: v.last_duration_test_on } : {}),
  }
}

/** { field: { from, to } } for what the row would change on the luminaire (the area by name). */
export function rowChanges(v: ImportRow, e: Existing): Record<string, { from: unknown; to: unknown }> {
  const out: Record<string, { from: unknown; to: unknown }> = {}
  for (const [k, to] of Object.entries(fieldsOf(v))) {
    const from = (e.values as unknown as Record<string, unknown>)[k] ?? null
    if (from !== to) out[k] = { from, to }
  }
  if ((e.areaName ?? '').toLowerCase() !== v.area.toLowerCase()) out.area = { from: e.areaName, to: v.area || null }
  return out
}

async function checkRows(
  csv: string,
  existing: Existing[],
  existingAreas: Set<string>,
  today: string,
): Promise<ImportPreview & { values?: ImportRow[]; plan?: Array<{ action: RowAction; target: Existing | null }> }> {
  const byTag = new Map(existing.map((e) => [e.tag.toLowerCase(), e]))
  const byExternalId = new Map(existing.flatMap((e) => (e.values.externalId ? [[e.values.externalId, e] as const] : [])))
  const errors: ImportIssue[] = []
  let errorCount = 0
  const badRows = new Set<number>()
  const problem = (issue: ImportIssue) => {
    errorCount++
    badRows.add(issue.row)
    if (errors.length < LISTED_IMPORT_ERRORS) errors.push(issue)
  }
  const answer = (extra: Partial<ImportPreview> = {}): ImportPreview => ({
    columns: [],
    rows: [],
    errors,
    errorCount,
    validRows: 0,
    totalRows: 0,
    newAreas: [],
    creates: 0,
    updates: 0,
    unchanged: 0,
    ...extra,
  })
  const plan: Array<{ action: RowAction; target: Existing | null }> = []
  const externalIdRow = new Map<string, number>()
  const claimed = new Map<string, number>()

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
      const known = new Set<string>([...IMPORT_COLUMNS, ...REGISTER_DERIVED_COLUMNS])
      header.forEach((h, i) => {
        if (!known.has(h))
          problem({ row: 1, column: rawHeader[i] || `(column ${i + 1})`, reason: `is not a column this import knows; use: ${IMPORT_COLUMNS.join(', ')}` })
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
      if (cell !== undefined && cell !== '' && !DERIVED.has(name)) raw[name] = cell
    })
    const parsed = ImportRowSchema.safeParse(raw)
    if (!parsed.success) {
      for (const issue of parsed.error.issues) problem({ row, column: String(issue.path[0] ?? '(row)'), reason: issue.message })
      if (rows.length < LISTED_IMPORT_ROWS) rows.push({ row, values: null })
      return
    }
    const v = parsed.data
    const key = v.tag.toLowerCase()
    if (tagRow.has(key)) problem({ row, column: 'tag', reason: `"${v.tag}" repeats the tag of row ${tagRow.get(key)}` })
    tagRow.set(key, tagRow.get(key) ?? row)
    if (v.external_id) {
      if (externalIdRow.has(v.external_id))
        problem({ row, column: 'external_id', reason: `"${v.external_id}" repeats the external id of row ${externalIdRow.get(v.external_id)}` })
      externalIdRow.set(v.external_id, externalIdRow.get(v.external_id) ?? row)
    }
    for (const column of ['last_functional_test_on', 'last_duration_test_on'] as const) {
      if (v[column] && v[column]! > today) problem({ row, column, reason: `is after today (${today}): a test not yet done cannot be carried over` })
    }
    // The luminaire this row stands for: its external id first, else its tag.
    const byId = v.external_id ? byExternalId.get(v.external_id) : undefined
    const byName = byTag.get(key)
    const target = byId ?? (byName && (!v.external_id || !byName.values.externalId) ? byName : undefined)
    if (!byId && byName && v.external_id && byName.values.externalId) {
      problem({ row, column: 'tag', reason: `"${v.tag}" is already in this site's register with another external id (${byName.values.externalId})` })
    } else if (byId && byName && byName.id !== byId.id) {
      problem({ row, column: 'tag', reason: `"${v.tag}" is the tag of another luminaire in this site's register` })
    }
    if (target) {
      if (claimed.has(target.id)) problem({ row, column: 'tag', reason: `matches the same luminaire as row ${claimed.get(target.id)}` })
      claimed.set(target.id, claimed.get(target.id) ?? row)
    }
    if (v.area && !existingAreas.has(v.area.toLowerCase()) && !newAreas.has(v.area.toLowerCase())) newAreas.set(v.area.toLowerCase(), v.area)
    if (rows.length < LISTED_IMPORT_ROWS) rows.push({ row, values: v })
    if (!badRows.has(row)) {
      values.push(v)
      plan.push({ action: !target ? 'create' : Object.keys(rowChanges(v, target)).length ? 'update' : 'unchanged', target: target ?? null })
    }
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
  const count = (a: RowAction) => plan.filter((p) => p.action === a).length
  return {
    ...answer({
      columns: header,
      rows,
      validRows: values.length,
      totalRows,
      newAreas: [...newAreas.values()],
      creates: count('create'),
      updates: count('update'),
      unchanged: count('unchanged'),
    }),
    values,
    plan,
  }
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
  return dataSource
    .transaction(async (m) => {
      await findSite(workspaceId, siteId, m)
      const areaIds = new Map<string, string>()
      for (const a of await m.getRepository(AreaEntity).find({ where: { workspaceId, siteId } })) areaIds.set(a.name.toLowerCase(), a.id)
      for (const name of preview.newAreas) {
        const area = await m.getRepository(AreaEntity).save(m.getRepository(AreaEntity).create({ workspaceId, siteId, name, notes: '' }))
        areaIds.set(name.toLowerCase(), area.id)
        await recordAudit({ workspaceId, actorId, action: 'area.created', entityType: 'area', entityId: area.id, data: { siteId, name, source: 'import' } }, m)
      }
      const created: string[] = []
      const updated: string[] = []
      const values = preview.values ?? []
      for (const [i, v] of values.entries()) {
        const { action, target } = preview.plan![i]!
        const areaId = v.area ? (areaIds.get(v.area.toLowerCase()) ?? null) : null
        if (action === 'unchanged') continue
        if (action === 'update' && target) {
          const changes = rowChanges(v, target)
          const l = await m.getRepository(LuminaireEntity).findOneOrFail({ where: { id: target.id, workspaceId } })
          Object.assign(l, fieldsOf(v), { areaId })
          await m.getRepository(LuminaireEntity).save(l)
          updated.push(l.id)
          await recordAudit(
            { workspaceId, actorId, action: 'luminaire.updated', entityType: 'luminaire', entityId: l.id, data: { tag: l.tag, changes, source: 'import' } },
            m,
          )
          continue
        }
        const l = await m.getRepository(LuminaireEntity).save(
          m.getRepository(LuminaireEntity).create({
            externalId: null,
            lastFunctionalTestOn: null,
            lastDurationTestOn: null,
            ...fieldsOf(v),
            workspaceId,
            siteId,
            areaId,
            specSheetId: null,
            luminaireTypeId: null,
          }),
        )
        created.push(l.id)
        await recordAudit(
          { workspaceId, actorId, action: 'luminaire.created', entityType: 'luminaire', entityId: l.id, data: { siteId, tag: l.tag, source: 'import' } },
          m,
        )
      }
      await recordAudit(
        {
          workspaceId,
          actorId,
          action: 'register.imported',
          entityType: 'site',
          entityId: siteId,
          data: { luminaires: created.length, updated: updated.length, unchanged: preview.unchanged, areas: preview.newAreas },
        },
        m,
      )
      // `imported` counts the luminaires added (as before re-running was possible); updated and unchanged say the rest.
      return {
        imported: created.length,
        updated: updated.length,
        unchanged: preview.unchanged,
        areasCreated: preview.newAreas.length,
        ids: created,
        updatedIds: updated,
      }
    })
    .catch((err) => {
      // Someone added the same tag or area while this import ran: the transaction is already rolled back.
      if ((err as { driverError?: { code?: string } })?.driverError?.code === '23505')
        throw new AppError(409, 'conflict', 'Nothing was imported: a tag or area in the file was added to the site meanwhile. Preview again.')
      throw err
    })
}
