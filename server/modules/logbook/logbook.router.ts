/** /api/sites/:id/logbook-links (make, list, withdraw) and /api/logbook-links/:token (public, read-only): a site's log book shared by link. */
import { z } from 'zod'
import { LogBookLinkListAnswer, NewLogBookLinkAnswer, SharedLogBookAnswer } from '../../../shared/schemas/answers/logbook'
import { ReadOnlyLinkRequestSchema } from '../../../shared/schemas/link.schema'
import { formatPrefsOf } from '../../lib/format-prefs'
import { IdParams, uuidParams } from '../../lib/parse'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import * as logbook from './logbook-links.service'

const LinkParams = uuidParams('id', 'linkId')
const TokenParams = z.object({ token: z.string().min(20).max(200) })

export const logbookRoutes: RouteSpec[] = [
  defineRoute({
    method: 'post',
    path: '/api/sites/:id/logbook-links',
    response: NewLogBookLinkAnswer,
    secretAnswer: true,
    access: 'designer',
    summary: "Make a read-only link to a site's log book (token shown once)",
    params: IdParams,
    body: ReadOnlyLinkRequestSchema,
    status: 201,
    notFound: 'That site',
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return logbook.createLink(s.workspaceId, s.userId, params.id, body.expiresOn)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/logbook-links',
    response: LogBookLinkListAnswer,
    access: 'designer',
    summary: "A site's log book links, newest first (never their tokens)",
    params: IdParams,
    notFound: 'That site',
    handler: ({ params }, req) => logbook.listLinks(scope(req).workspaceId, params.id),
  }),
  defineRoute({
    method: 'delete',
    path: '/api/sites/:id/logbook-links/:linkId',
    access: 'designer',
    summary: 'Withdraw a log book link',
    params: LinkParams,
    produces: 'none',
    notFound: 'That log book link',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await logbook.revokeLink(s.workspaceId, s.userId, params.id, params.linkId)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/logbook-links/:token',
    response: SharedLogBookAnswer,
    access: 'public',
    summary: "A site's log book behind a read-only link: summary and entries",
    params: TokenParams,
    handler: async ({ params }, _req, res) => {
      res.setHeader('Cache-Control', 'no-store')
      return logbook.sharedLogBook(params.token)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/logbook-links/:token/pdf',
    access: 'public',
    summary: "A site's log book behind a read-only link, as a PDF (summary page first)",
    params: TokenParams,
    produces: 'application/pdf',
    handler: async ({ params }, req, res) => {
      const out = await logbook.sharedLogBookPdf(params.token, formatPrefsOf(req))
      res.setHeader('Content-Type', out.mediaType)
      res.setHeader('Content-Disposition', `attachment; filename="${out.filename}"`)
      res.setHeader('Cache-Control', 'private, no-store')
      res.setHeader('X-Content-Type-Options', 'nosniff')
      res.end(out.body)
    },
  }),
]
