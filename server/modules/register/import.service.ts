/**
 * Bulk import of a luminaire schedule from CSV: a preview with a report per row (row, column,
 * reason), then an all-or-nothing commit in one transaction. Rows are numbered as a spreadsheet
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
  rows: Array<{ row: number; values: ImportRow | null }>
  errors: ImportIssue[]
  validRows: number
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

export async function previewImport(workspaceId: string, siteId: string, csv: string): Promise<ImportPreview> {
  await findSite(workspaceId, siteId)
  // Rows may have fewer or more cells than the header (they are checked cell by cell below); a
  // quote left open is the file's fault, and the whole file is refused naming the row.
  const parsed = Papa.parse<string[]>(csv, { delimiter: ',', skipEmptyLines: true, transform: (v) => v.trim() })
  const broken = parsed.errors.find((e) => e.type !== 'FieldMismatch')
  if (broken) {
    return { columns: [], rows: [], errors: [{ row: (broken.row ?? 0) + 1, column: '(file)', reason: `the file is not valid CSV: ${broken.message}` }], validRows: 0, newAreas: [] }
  }
  const records = parsed.data
  const errors: ImportIssue[] = []
  if (records.length === 0) return { columns: [], rows: [], errors: [{ row: 1, column: '(file)', reason: 'the file is empty' }], validRows: 0, newAreas: [] }

  const header = records[0].map(normaliseHeader)
  const known = new Set<string>(IMPORT_COLUMNS)
  header.forEach((h, i) => {
    if (!known.has(h)) errors.push({ row: 1, column: records[0][i] || `(column ${i + 1})`, reason: `is not a column this import knows; use: ${IMPORT_COLUMNS.join(', ')}` })
  })
  const seenHeader = new Set<string>()
  for (const h of header) {
    if (seenHeader.has(h)) errors.push({ row: 1, column: h, reason: 'appears twice in the header' })
    seenHeader.add(h)
  }
  for (const required of REQUIRED_IMPORT_COLUMNS) {
    if (!header.includes(required)) errors.push({ row: 1, column: required, reason: 'is missing from the header' })
  }
  if (errors.length) return { columns: header, rows: [], errors, validRows: 0, newAreas: [] }
  if (records.length === 1) return { columns: header, rows: [], errors: [{ row: 2, column: '(file)', reason: 'has no luminaire rows under the header' }], validRows: 0, newAreas: [] }

  const existingTags = new Set(
    (await dataSource.getRepository(LuminaireEntity).find({ where: { workspaceId, siteId }, select: { tag: true } })).map((l) => l.tag.toLowerCase()),
  )
  const existingAreas = new Set((await dataSource.getRepository(AreaEntity).find({ where: { workspaceId, siteId } })).map((a) => a.name.toLowerCase()))
  const tagRow = new Map<string, number>()
  const newAreas = new Map<string, string>()
  const rows: ImportPreview['rows'] = []

  records.slice(1).forEach((cells, i) => {
    const row = i + 2
    if (cells.length > header.length) errors.push({ row, column: `(column ${header.length + 1})`, reason: `has ${cells.length} cells but the header has ${header.length}` })
    const raw: Record<string, string> = {}
    header.forEach((h, c) => {
      const cell = cells[c]
      if (cell !== undefined && cell !== '') raw[h] = cell
    })
    const parsed = ImportRowSchema.safeParse(raw)
    if (!parsed.success) {
      for (const issue of parsed.error.issues) errors.push({ row, column: String(issue.path[0] ?? '(row)'), reason: issue.message })
      rows.push({ row, values: null })
      return
    }
    const v = parsed.data
    const key = v.tag.toLowerCase()
    if (existingTags.has(key)) errors.push({ row, column: 'tag', reason: `"${v.tag}" is already in this site's register` })
    else if (tagRow.has(key)) errors.push({ row, column: 'tag', reason: `"${v.tag}" repeats the tag of row ${tagRow.get(key)}` })
    tagRow.set(key, tagRow.get(key) ?? row)
    if (v.area && !existingAreas.has(v.area.toLowerCase()) && !newAreas.has(v.area.toLowerCase())) newAreas.set(v.area.toLowerCase(), v.area)
    rows.push({ row, values: v })
  })
  const badRows = new Set(errors.map((e) => e.row))
  return { columns: header, rows, errors, validRows: rows.filter((r) => r.values && !badRows.has(r.row)).length, newAreas: [...newAreas.values()] }
}

/** Stores every row or none: any issue answers 400 with the report, and the insert runs in one transaction. */
export async function commitImport(workspaceId: string, actorId: string, siteId: string, csv: string) {
  const preview = await previewImport(workspaceId, siteId, csv)
  if (preview.errors.length) {
    throw new AppError(
      400,
      'import_invalid',
      `Nothing was imported: ${preview.errors.length} problem${preview.errors.length === 1 ? '' : 's'} in the file (first: row ${preview.errors[0].row}, ${preview.errors[0].column} ${preview.errors[0].reason}).`,
      preview.errors.map((e) => ({ path: `row ${e.row}.${e.column}`, message: e.reason })),
      { errors: preview.errors },
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
    for (const { values: v } of preview.rows) {
      if (!v) continue
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
