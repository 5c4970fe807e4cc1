/** /api/sheets (workspace sheets, revisions, issue, shares, PDF) and /api/shared/:token (public, read-only). */
import type { Request, Response } from 'express'
import { z } from 'zod'
import {
  IssueSchema,
  ShareCreateSchema,
  ShareEmailSchema,
  SheetContentSchema,
  SheetListQuerySchema,
  SheetSaveSchema,
} from '../../../shared/schemas/sheet.schema'
import { dataSource } from '../../data-source'
import { NotFoundError } from '../../errors/app-error'
import { parse } from '../../lib/parse'
import { scope, type RouteSpec } from '../../policy/access'
import { Workspace } from '../workspaces/workspace.entity'
import { auditsForSheet } from '../audits/audits.service'
import { withWattageAudits } from '../audits/audit-pdf-section'
import { logsForSheet } from '../discharge/discharge.service'
import { withDischargeLogs } from '../discharge/discharge-pdf-section'
import { buildSheetPdf, cautionsSection, SHEET_SECTIONS } from './sheet-pdf'
import { formatPrefsOf } from '../../lib/format-prefs'
import * as shareLinks from './share-links.service'
import * as service from './sheets.service'

const Uuid = z.string().uuid()
const RevisionNumber = z.coerce.number().int().min(1).max(1_000_000)
const TokenParam = z.string().min(20).max(200)

/** A malformed id answers 404 like a missing one, so ids cannot be probed. */
function param(req: Request, name: string, schema: z.ZodTypeAny = Uuid) {
  const r = schema.safeParse(req.params[name])
  if (!r.success) throw new NotFoundError()
  return r.data as string
}

const fileName = (title: string, revision: number) => `${title.replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'sheet'}-rev${revision}.pdf`

function sendPdf(res: Response, pdf: Buffer, name: string) {
  res.setHeader('Content-Type', 'application/pdf')
  res.setHeader('Content-Disposition', `attachment; filename="${name}"`)
  res.setHeader('Cache-Control', 'private, no-store')
  res.end(pdf)
}

async function list(req: Request, res: Response) {
  res.json(await service.listSheets(scope(req).workspaceId, parse(SheetListQuerySchema, req.query)))
}

async function authors(req: Request, res: Response) {
  res.json({ authors: await service.sheetAuthors(scope(req).workspaceId) })
}

async function create(req: Request, res: Response) {
  const s = scope(req)
  res.status(201).json(await service.createSheet(s.workspaceId, s.userId, parse(SheetContentSchema, req.body)))
}

async function read(req: Request, res: Response) {
  res.type('json').send(await service.getSheetJson(scope(req).workspaceId, param(req, 'id')))
}

async function save(req: Request, res: Response) {
  const s = scope(req)
  const id = param(req, 'id')
  res.json(await service.saveSheet(s.workspaceId, s.userId, id, parse(SheetSaveSchema, req.body)))
}

async function revisions(req: Request, res: Response) {
  res.json({ revisions: await service.listRevisions(scope(req).workspaceId, param(req, 'id')) })
}

async function revision(req: Request, res: Response) {
  const id = param(req, 'id')
  res.json(await service.getRevision(scope(req).workspaceId, id, Number(param(req, 'n', RevisionNumber))))
}

async function issue(req: Request, res: Response) {
  const s = scope(req)
  const id = param(req, 'id')
  const { version } = parse(IssueSchema, req.body)
  res.json(await service.issueSheet(s.workspaceId, s.userId, id, version))
}

async function clone(req: Request, res: Response) {
  const s = scope(req)
  res.status(201).json(await service.cloneSheet(s.workspaceId, s.userId, param(req, 'id')))
}

async function archive(req: Request, res: Response) {
  const s = scope(req)
  res.json(await service.setArchived(s.workspaceId, s.userId, param(req, 'id'), true))
}

async function restore(req: Request, res: Response) {
  const s = scope(req)
  res.json(await service.setArchived(s.workspaceId, s.userId, param(req, 'id'), false))
}

async function pdf(req: Request, res: Response) {
  const s = scope(req)
  const id = param(req, 'id')
  const q = z.object({ revision: RevisionNumber.optional() }).safeParse(req.query)
  const data = await service.pdfData(s.workspaceId, id, q.success ? q.data.revision : undefined)
  const ws = await dataSource.getRepository(Workspace).findOneBy({ id: s.workspaceId })
  const audits = await auditsForSheet(s.workspaceId, id)
  const dischargeLogs = await logsForSheet(s.workspaceId, id)
  const sections = withDischargeLogs(withWattageAudits(SHEET_SECTIONS, audits, cautionsSection), dischargeLogs, cautionsSection)
  sendPdf(res, await buildSheetPdf({ ...data, issuer: ws?.name, prefs: formatPrefsOf(req) }, sections), fileName(data.title, data.number))
}

async function createShare(req: Request, res: Response) {
  const s = scope(req)
  const id = param(req, 'id')
  const { expiresAt } = parse(ShareCreateSchema, req.body)
  res.status(201).json(await shareLinks.createShare(s.workspaceId, s.userId, id, expiresAt ? new Date(expiresAt) : null))
}

async function listShares(req: Request, res: Response) {
  res.json({ shares: await shareLinks.listShares(scope(req).workspaceId, param(req, 'id')) })
}

async function revokeShare(req: Request, res: Response) {
  const s = scope(req)
  await shareLinks.revokeShare(s.workspaceId, s.userId, param(req, 'id'), param(req, 'shareId'))
  res.status(204).end()
}

async function emailShare(req: Request, res: Response) {
  const s = scope(req)
  const id = param(req, 'id')
  const shareId = param(req, 'shareId')
  await shareLinks.emailShare(s.workspaceId, s.userId, id, shareId, parse(ShareEmailSchema, req.body))
  res.status(202).json({ sent: true })
}

async function shared(req: Request, res: Response) {
  res.setHeader('Cache-Control', 'no-store')
  res.json(await shareLinks.sharedSheet(param(req, 'token', TokenParam)))
}

async function sharedPdf(req: Request, res: Response) {
  const view = await shareLinks.sharedSheet(param(req, 'token', TokenParam))
  sendPdf(res, await buildSheetPdf({ ...view, prefs: formatPrefsOf(req) }), fileName(view.title, view.number))
}

export const sheetRoutes: RouteSpec[] = [
  { method: 'get', path: '/api/sheets', access: 'viewer', summary: 'Specification sheets (paginated, sortable, searchable, filtered)', handler: list },
  { method: 'get', path: '/api/sheets/authors', access: 'viewer', summary: 'People who wrote sheets (for the author filter)', handler: authors },
  { method: 'post', path: '/api/sheets', access: 'designer', summary: 'Create a sheet (revision 1, draft)', handler: create },
  { method: 'get', path: '/api/sheets/:id', access: 'viewer', summary: 'A sheet with its current content and results', handler: read },
  { method: 'put', path: '/api/sheets/:id', access: 'designer', summary: 'Save a sheet: a new revision; 409 when the version is stale', handler: save },
  { method: 'get', path: '/api/sheets/:id/revisions', access: 'viewer', summary: "A sheet's revisions, newest first", handler: revisions },
  { method: 'get', path: '/api/sheets/:id/revisions/:n', access: 'viewer', summary: 'One revision, as saved', handler: revision },
  { method: 'post', path: '/api/sheets/:id/issue', access: 'designer', summary: 'Issue the latest revision (supersedes the previous issue)', handler: issue },
  { method: 'post', path: '/api/sheets/:id/clone', access: 'designer', summary: 'Copy a sheet into a new draft', handler: clone },
  { method: 'post', path: '/api/sheets/:id/archive', access: 'designer', summary: 'Archive a sheet (restorable)', handler: archive },
  { method: 'post', path: '/api/sheets/:id/restore', access: 'designer', summary: 'Restore an archived sheet', handler: restore },
  { method: 'get', path: '/api/sheets/:id/pdf', access: 'viewer', summary: 'The sheet as a PDF (current revision, or ?revision=n)', handler: pdf },
  { method: 'post', path: '/api/sheets/:id/shares', access: 'designer', summary: 'Make a read-only share link (token shown once)', handler: createShare },
  { method: 'get', path: '/api/sheets/:id/shares', access: 'viewer', summary: "A sheet's share links", handler: listShares },
  { method: 'delete', path: '/api/sheets/:id/shares/:shareId', access: 'designer', summary: 'Revoke a share link', handler: revokeShare },
  { method: 'post', path: '/api/sheets/:id/shares/:shareId/email', access: 'designer', summary: 'E-mail a share link with a message', handler: emailShare },
  { method: 'get', path: '/api/shared/:token', access: 'public', summary: 'A shared sheet (issued revision, read-only)', handler: shared },
  { method: 'get', path: '/api/shared/:token/pdf', access: 'public', summary: 'A shared sheet as a PDF', handler: sharedPdf },
]
