/** /api/sheets (workspace sheets, revisions, issue, shares, PDF) and /api/shared/:token (public, read-only). */
import type { Response } from 'express'
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
import { formatPrefsOf } from '../../lib/format-prefs'
import { Uuid, uuidParams } from '../../lib/parse'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import { Workspace } from '../workspaces/workspace.entity'
import { auditsForSheet } from '../audits/audits.service'
import { withWattageAudits } from '../audits/audit-pdf-section'
import { logsForSheet } from '../discharge/discharge.service'
import { withDischargeLogs } from '../discharge/discharge-pdf-section'
import { buildSheetPdf, cautionsSection, SHEET_SECTIONS } from './sheet-pdf'
import * as shareLinks from './share-links.service'
import * as service from './sheets.service'
import {
  NewShareAnswer,
  RevisionAnswer,
  RevisionListAnswer,
  SentAnswer,
  SharedSheetAnswer,
  ShareListAnswer,
  SheetAnswer,
  SheetAuthorsAnswer,
  SheetPageAnswer,
} from '../../../shared/schemas/answers/sheets'

const RevisionNumber = z.coerce.number().int().min(1).max(1_000_000)
const SheetParams = uuidParams('id')
const RevisionParams = z.object({ id: Uuid, n: RevisionNumber })
const ShareParams = uuidParams('id', 'shareId')
const TokenParams = z.object({ token: z.string().min(20).max(200) })
const PdfQuery = z.object({ revision: RevisionNumber.optional() })

const fileName = (title: string, revision: number) =>
  `${
    title
      .replace(/[^\w.-]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'sheet'
  }-rev${revision}.pdf`

function sendPdf(res: Response, pdf: Buffer, name: string) {
  res.setHeader('Content-Type', 'application/pdf')
  res.setHeader('Content-Disposition', `attachment; filename="${name}"`)
  res.setHeader('Cache-Control', 'private, no-store')
  res.end(pdf)
}

export const sheetRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/sheets',
    response: SheetPageAnswer,
    access: 'viewer',
    summary: 'Specification sheets (paginated, sortable, searchable, filtered)',
    query: SheetListQuerySchema,
    handler: ({ query }, req) => service.listSheets(scope(req).workspaceId, query),
  }),
  defineRoute({
    method: 'get',
    path: '/api/sheets/authors',
    response: SheetAuthorsAnswer,
    access: 'viewer',
    summary: 'People who wrote sheets (for the author filter)',
    handler: async (_input, req) => ({ authors: await service.sheetAuthors(scope(req).workspaceId) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/sheets',
    response: SheetAnswer,
    access: 'designer',
    summary: 'Create a sheet (revision 1, draft)',
    body: SheetContentSchema,
    status: 201,
    handler: ({ body }, req) => {
      const s = scope(req)
      return service.createSheet(s.workspaceId, s.userId, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sheets/:id',
    response: SheetAnswer,
    access: 'viewer',
    summary: 'A sheet with its current content and results',
    params: SheetParams,
    // Stored JSON goes out as stored text, unparsed.
    handler: async ({ params }, req, res) => {
      res.type('json').send(await service.getSheetJson(scope(req).workspaceId, params.id))
    },
  }),
  defineRoute({
    method: 'put',
    path: '/api/sheets/:id',
    response: SheetAnswer,
    access: 'designer',
    summary: 'Save a sheet: a new revision; 409 when the version is stale',
    params: SheetParams,
    body: SheetSaveSchema,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return service.saveSheet(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sheets/:id/revisions',
    response: RevisionListAnswer,
    access: 'viewer',
    summary: "A sheet's revisions, newest first",
    params: SheetParams,
    handler: async ({ params }, req) => ({ revisions: await service.listRevisions(scope(req).workspaceId, params.id) }),
  }),
  defineRoute({
    method: 'get',
    path: '/api/sheets/:id/revisions/:n',
    response: RevisionAnswer,
    access: 'viewer',
    summary: 'One revision, as saved',
    params: RevisionParams,
    handler: ({ params }, req) => service.getRevision(scope(req).workspaceId, params.id, params.n),
  }),
  defineRoute({
    method: 'post',
    path: '/api/sheets/:id/issue',
    response: SheetAnswer,
    access: 'designer',
    summary: 'Issue the latest revision (supersedes the previous issue)',
    params: SheetParams,
    body: IssueSchema,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return service.issueSheet(s.workspaceId, s.userId, params.id, body.version)
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/sheets/:id/clone',
    response: SheetAnswer,
    access: 'designer',
    summary: 'Copy a sheet into a new draft',
    params: SheetParams,
    body: false,
    status: 201,
    handler: ({ params }, req) => {
      const s = scope(req)
      return service.cloneSheet(s.workspaceId, s.userId, params.id)
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/sheets/:id/archive',
    response: SheetAnswer,
    access: 'designer',
    summary: 'Archive a sheet (restorable)',
    params: SheetParams,
    body: false,
    handler: ({ params }, req) => {
      const s = scope(req)
      return service.setArchived(s.workspaceId, s.userId, params.id, true)
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/sheets/:id/restore',
    response: SheetAnswer,
    access: 'designer',
    summary: 'Restore an archived sheet',
    params: SheetParams,
    body: false,
    handler: ({ params }, req) => {
      const s = scope(req)
      return service.setArchived(s.workspaceId, s.userId, params.id, false)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sheets/:id/pdf',
    access: 'viewer',
    summary: 'The sheet as a PDF (current revision, or ?revision=n)',
    params: SheetParams,
    query: PdfQuery,
    produces: 'application/pdf',
    handler: async ({ params, query }, req, res) => {
      const s = scope(req)
      const data = await service.pdfData(s.workspaceId, params.id, query.revision)
      const ws = await dataSource.getRepository(Workspace).findOneBy({ id: s.workspaceId })
      const audits = await auditsForSheet(s.workspaceId, params.id)
      const dischargeLogs = await logsForSheet(s.workspaceId, params.id)
      const sections = withDischargeLogs(withWattageAudits(SHEET_SECTIONS, audits, cautionsSection), dischargeLogs, cautionsSection)
      sendPdf(res, await buildSheetPdf({ ...data, issuer: ws?.name, prefs: formatPrefsOf(req) }, sections), fileName(data.title, data.number))
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/sheets/:id/shares',
    response: NewShareAnswer,
    secretAnswer: true,
    access: 'designer',
    summary: 'Make a read-only share link (token shown once)',
    params: SheetParams,
    body: ShareCreateSchema,
    status: 201,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return shareLinks.createShare(s.workspaceId, s.userId, params.id, body.expiresAt ? new Date(body.expiresAt) : null)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sheets/:id/shares',
    response: ShareListAnswer,
    access: 'viewer',
    summary: "A sheet's share links",
    params: SheetParams,
    handler: async ({ params }, req) => ({ shares: await shareLinks.listShares(scope(req).workspaceId, params.id) }),
  }),
  defineRoute({
    method: 'delete',
    path: '/api/sheets/:id/shares/:shareId',
    access: 'designer',
    summary: 'Revoke a share link',
    params: ShareParams,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await shareLinks.revokeShare(s.workspaceId, s.userId, params.id, params.shareId)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/sheets/:id/shares/:shareId/email',
    response: SentAnswer,
    access: 'designer',
    summary: 'E-mail a share link with a message',
    params: ShareParams,
    body: ShareEmailSchema,
    status: 202,
    handler: async ({ params, body }, req) => {
      const s = scope(req)
      await shareLinks.emailShare(s.workspaceId, s.userId, params.id, params.shareId, body, formatPrefsOf(req))
      return { sent: true }
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/shared/:token',
    response: SharedSheetAnswer,
    access: 'public',
    summary: 'A shared sheet (issued revision, read-only)',
    params: TokenParams,
    handler: async ({ params }, _req, res) => {
      res.setHeader('Cache-Control', 'no-store')
      return shareLinks.sharedSheet(params.token)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/shared/:token/pdf',
    access: 'public',
    summary: 'A shared sheet as a PDF',
    params: TokenParams,
    produces: 'application/pdf',
    handler: async ({ params }, req, res) => {
      const view = await shareLinks.sharedSheet(params.token)
      sendPdf(res, await buildSheetPdf({ ...view, prefs: formatPrefsOf(req) }), fileName(view.title, view.number))
    },
  }),
]
