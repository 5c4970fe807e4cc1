/**
 * Specification sheets: every save is a new revision; a save names the version it started from
 * (a stale one gets 409 with what changed); issuing freezes the latest revision and supersedes
 * the one issued before. Share links live in share-links.service.ts, SQL in sheets.repository.ts,
 * the shapes of answers in sheets.mapping.ts.
 */
import type { EntityManager } from 'typeorm'
import { sizeTool } from '../../../shared/engine/size'
import { runTool } from '../../../shared/engine/tool'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import { diffSheets } from '../../../shared/schemas/sheet-diff'
import { SheetContentSchema, type SheetContent, type SheetListQuery } from '../../../shared/schemas/sheet.schema'
import { dataSource } from '../../data-source'
import { BadRequestError, ConflictError, NotFoundError } from '../../errors/app-error'
import { jsonWithRawFields } from '../../lib/raw-json'
import { recordAudit } from '../audit/audit.service'
import { person, personNamed, revisionListItem, revisionView, sheetView as mapSheet, snapshot, type SheetFields } from './sheets.mapping'
import {
  findSheet,
  insertRevision,
  namesOf,
  revisionAtVersion,
  revisions,
  sheetListRows,
  sheetRowWithNames,
  sheets,
  type SheetListRow,
} from './sheets.repository'
import type { SpecSheet } from './spec-sheet.entity'

export { sheetAuthors } from './sheets.repository'
export type { RevisionView } from './sheets.mapping'

/** Runs the engine on the sheet's inputs; the server never trusts results sent by a client. */
export function computeResults(inputs: Record<string, unknown>): Record<string, unknown> {
  const outcome = runTool(sizeTool, inputs)
  if (!outcome.ok) {
    const fields = outcome.fields.map((f) => ({ path: `inputs.${f.path}`, message: f.message }))
    throw new BadRequestError(
      `Invalid pack inputs: ${fields
        .slice(0, 3)
        .map((f) => `${f.path} ${f.message}`)
        .join('; ')}`,
      fields,
    )
  }
  return outcome.result as unknown as Record<string, unknown>
}

/** Sheet content checked by the shared schema (for callers outside a request: demo data, tests). */
export const contentOf = (raw: unknown): SheetContent => SheetContentSchema.parse(raw)

/** A sheet as the API shows it, with its authors' names looked up unless given. */
export async function sheetView(s: SheetFields, known?: Map<string, string>) {
  return mapSheet(s, known ?? (await namesOf([s.createdBy, s.updatedBy])))
}

function assertNotArchived(s: SpecSheet) {
  if (s.archivedAt) throw new ConflictError('This sheet is archived. Restore it before changing it.')
}

function applyContent(s: SpecSheet, content: SheetContent) {
  s.title = content.title
  s.reference = content.reference
  s.client = content.client
  s.site = content.site
  s.luminaire = content.luminaire
  s.inputs = content.inputs
  s.chemistry = String(content.inputs.chemistry)
  s.results = computeResults(content.inputs)
  s.engineVersion = ENGINE_VERSION
}

export async function createSheet(workspaceId: string, userId: string, content: SheetContent) {
  const saved = await dataSource.transaction(async (m) => {
    const s = sheets(m).create({
      workspaceId,
      status: 'draft',
      currentRevision: 1,
      issuedRevision: null,
      version: 1,
      createdBy: userId,
      updatedBy: userId,
      archivedAt: null,
    })
    applyContent(s, content)
    await sheets(m).save(s)
    await insertRevision(m, s, userId)
    await recordAudit({ workspaceId, actorId: userId, action: 'sheet.created', entityType: 'spec_sheet', entityId: s.id, data: { title: s.title } }, m)
    return s
  })
  return sheetView(saved)
}

async function sheetRow(workspaceId: string, id: string) {
  const row = await sheetRowWithNames(workspaceId, id)
  const names = new Map<string, string>()
  if (row.createdBy && row.creatorName !== null) names.set(row.createdBy, row.creatorName)
  if (row.updatedBy && row.updaterName !== null) names.set(row.updatedBy, row.updaterName)
  const { inputs, results, creatorName: _c, updaterName: _u, ...rest } = row
  return { inputs, results, view: mapSheet({ ...rest, inputs: {}, results: {} }, names) }
}

export async function getSheet(workspaceId: string, id: string) {
  const { inputs, results, view } = await sheetRow(workspaceId, id)
  return { ...view, inputs: JSON.parse(inputs) as Record<string, unknown>, results: JSON.parse(results) as Record<string, unknown> }
}

/** The same sheet as JSON text for the API, its stored inputs and results passed through unparsed. */
export async function getSheetJson(workspaceId: string, id: string): Promise<string> {
  const { inputs, results, view } = await sheetRow(workspaceId, id)
  const { inputs: _inputs, results: _results, ...fields } = view
  return jsonWithRawFields(fields, { inputs, results })
}

async function staleSaveConflict(m: EntityManager, s: SpecSheet, yourVersion: number): Promise<ConflictError> {
  const base = await revisionAtVersion(m, s.id, yourVersion)
  const names = await namesOf([s.updatedBy])
  return new ConflictError(
    `Someone saved this sheet after you opened it (you started from version ${yourVersion}; it is now at version ${s.version}). Review their changes, then save again.`,
    {
      currentVersion: s.version,
      yourVersion,
      changedBy: person(names, s.updatedBy),
      changedAt: s.updatedAt,
      changes: base ? diffSheets(snapshot(base), snapshot(s)) : [],
      current: await sheetView(s),
    },
  )
}

/** A save: a new revision, or 409 with what changed since the editor's version. */
export async function saveSheet(workspaceId: string, userId: string, id: string, content: SheetContent & { version: number }) {
  const saved = await dataSource.transaction(async (m) => {
    const s = await findSheet(workspaceId, id, m, true)
    assertNotArchived(s)
    if (s.version !== content.version) throw await staleSaveConflict(m, s, content.version)
    applyContent(s, content)
    s.currentRevision += 1
    s.status = 'draft'
    s.version += 1
    s.updatedBy = userId
    await sheets(m).save(s)
    await insertRevision(m, s, userId)
    await recordAudit(
      { workspaceId, actorId: userId, action: 'sheet.saved', entityType: 'spec_sheet', entityId: s.id, data: { revision: s.currentRevision } },
      m,
    )
    return s
  })
  return sheetView(saved)
}

/** A page of the sheet list with its total (see sheetListRows for the query). */
export async function listSheets(workspaceId: string, q: SheetListQuery) {
  const rows = await sheetListRows(workspaceId, q)
  return {
    page: q.page,
    pageSize: q.pageSize,
    total: Number(rows[0]?.total ?? 0),
    items: rows
      .filter((s): s is SheetListRow & { id: string } => s.id !== null)
      .map((s) => ({
        id: s.id,
        title: s.title,
        reference: s.reference,
        client: s.client,
        site: s.site,
        chemistry: s.chemistry,
        status: s.status,
        currentRevision: s.currentRevision,
        issuedRevision: s.issuedRevision,
        selectedCapacityAh: s.selectedCapacityAh,
        requiredCapacityAh: s.requiredCapacityAh,
        author: personNamed(s.createdBy, s.authorName),
        archivedAt: s.archivedAt,
        createdAt: s.createdAt,
        updatedAt: s.updatedAt,
      })),
  }
}

export async function listRevisions(workspaceId: string, id: string) {
  const s = await findSheet(workspaceId, id)
  const rows = await revisions().find({ where: { sheetId: s.id, workspaceId }, order: { number: 'DESC' } })
  const names = await namesOf(rows.flatMap((r) => [r.authorId, r.issuedBy]))
  return rows.map((r) => revisionListItem(r, names))
}

export async function getRevision(workspaceId: string, id: string, number: number) {
  const s = await findSheet(workspaceId, id)
  const r = await revisions().findOne({ where: { sheetId: s.id, workspaceId, number } })
  if (!r) throw new NotFoundError(`Revision ${number}`)
  return revisionView(r, await namesOf([r.authorId, r.issuedBy]))
}

export async function issueSheet(workspaceId: string, userId: string, id: string, version: number) {
  const saved = await dataSource.transaction(async (m) => {
    const s = await findSheet(workspaceId, id, m, true)
    assertNotArchived(s)
    if (s.version !== version) {
      throw new ConflictError(`The sheet changed after you opened it (now version ${s.version}). Reload it and check the latest revision before issuing.`, {
        currentVersion: s.version,
        yourVersion: version,
      })
    }
    if (s.status === 'issued') throw new ConflictError(`Revision ${s.currentRevision} is already issued. Save a change to make a new draft revision.`)
    const now = new Date()
    const previous = s.issuedRevision
    if (previous !== null) await revisions(m).update({ sheetId: s.id, number: previous }, { status: 'superseded' })
    await revisions(m).update({ sheetId: s.id, number: s.currentRevision }, { status: 'issued', issuedAt: now, issuedBy: userId })
    s.status = 'issued'
    s.issuedRevision = s.currentRevision
    s.version += 1
    s.updatedBy = userId
    await sheets(m).save(s)
    await recordAudit(
      {
        workspaceId,
        actorId: userId,
        action: 'sheet.issued',
        entityType: 'spec_sheet',
        entityId: s.id,
        data: { revision: s.currentRevision, supersedes: previous },
      },
      m,
    )
    return s
  })
  return sheetView(saved)
}

export async function cloneSheet(workspaceId: string, userId: string, id: string) {
  const source = await findSheet(workspaceId, id)
  const copy = await createSheet(workspaceId, userId, {
    title: `Copy of ${source.title}`.slice(0, 200),
    reference: source.reference,
    client: source.client,
    site: source.site,
    luminaire: source.luminaire,
    inputs: source.inputs,
  })
  await recordAudit({ workspaceId, actorId: userId, action: 'sheet.cloned', entityType: 'spec_sheet', entityId: copy.id, data: { from: source.id } })
  return copy
}

export async function setArchived(workspaceId: string, userId: string, id: string, archived: boolean) {
  const s = await findSheet(workspaceId, id)
  if (archived === !!s.archivedAt) return sheetView(s)
  s.archivedAt = archived ? new Date() : null
  s.version += 1
  s.updatedBy = userId
  await sheets().save(s)
  await recordAudit({ workspaceId, actorId: userId, action: archived ? 'sheet.archived' : 'sheet.restored', entityType: 'spec_sheet', entityId: s.id })
  return sheetView(s)
}

/** What the PDF needs for one revision of a sheet (the current one unless a number is given). */
export async function pdfData(workspaceId: string, id: string, number?: number) {
  const s = await findSheet(workspaceId, id)
  const r = await revisions().findOne({ where: { sheetId: s.id, workspaceId, number: number ?? s.currentRevision } })
  if (!r) throw new NotFoundError(`Revision ${number}`)
  return revisionView(r, await namesOf([r.authorId, r.issuedBy]))
}
