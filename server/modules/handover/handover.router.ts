/** /api/sites/:id/handover-packs and /api/handover-links/:token: handover packs, their PDFs and read-only links. */
import type { Response } from 'express'
import { z } from 'zod'
import { HandoverLinkAnswer, HandoverPackAnswer, HandoverPackListAnswer, SharedHandoverAnswer } from '../../../shared/schemas/answers/handover'
import { HandoverLinkRequestSchema, HandoverRequestSchema } from '../../../shared/schemas/handover.schema'
import { formatPrefsOf } from '../../lib/format-prefs'
import { IdParams, Uuid } from '../../lib/parse'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import { buildHandoverPdf } from './handover-pdf'
import * as handover from './handover.service'

const PackParams = z.object({ id: Uuid, n: z.coerce.number().int().min(1).max(1_000_000) })
const TokenParams = z.object({ token: z.string().min(20).max(200) })

const fileName = (site: string, n: number) =>
  `${
    site
      .replace(/[^\w.-]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'site'
  }-handover-pack-${n}.pdf`

function sendPdf(res: Response, pdf: Buffer, name: string) {
  res.setHeader('Content-Type', 'application/pdf')
  res.setHeader('Content-Disposition', `attachment; filename="${name}"`)
  res.setHeader('Cache-Control', 'private, no-store')
  res.end(pdf)
}

export const handoverRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/handover-packs',
    response: HandoverPackListAnswer,
    access: 'viewer',
    summary: "A site's handover packs, newest first",
    params: IdParams,
    handler: ({ params }, req) => handover.listPacks(scope(req).workspaceId, params.id),
  }),
  defineRoute({
    method: 'post',
    path: '/api/sites/:id/handover-packs',
    response: HandoverPackAnswer,
    access: 'designer',
    summary: 'Make the next handover pack of a site (the site frozen as it is today)',
    params: IdParams,
    body: HandoverRequestSchema,
    status: 201,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return handover.makePack(s.workspaceId, s.userId, params.id, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/handover-packs/:n',
    response: HandoverPackAnswer,
    access: 'viewer',
    summary: 'One handover pack with its frozen content',
    params: PackParams,
    handler: ({ params }, req) => handover.getPack(scope(req).workspaceId, params.id, params.n),
  }),
  defineRoute({
    method: 'get',
    path: '/api/sites/:id/handover-packs/:n/pdf',
    access: 'viewer',
    summary: 'One handover pack as a PDF',
    params: PackParams,
    produces: 'application/pdf',
    handler: async ({ params }, req, res) => {
      const p = await handover.getPack(scope(req).workspaceId, params.id, params.n)
      sendPdf(
        res,
        await buildHandoverPdf({ number: p.number, createdAt: p.createdAt, content: p.content, prefs: formatPrefsOf(req) }),
        fileName(p.content.site.name, p.number),
      )
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/sites/:id/handover-packs/:n/links',
    response: HandoverLinkAnswer,
    secretAnswer: true,
    access: 'designer',
    summary: 'Make a read-only link to a handover pack (token shown once)',
    params: PackParams,
    body: HandoverLinkRequestSchema,
    status: 201,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return handover.createLink(s.workspaceId, s.userId, params.id, params.n, body.expiresOn)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/handover-links/:token',
    response: SharedHandoverAnswer,
    access: 'public',
    summary: 'A handover pack behind a read-only link',
    params: TokenParams,
    handler: async ({ params }, _req, res) => {
      res.setHeader('Cache-Control', 'no-store')
      return handover.sharedPack(params.token)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/handover-links/:token/pdf',
    access: 'public',
    summary: 'A handover pack behind a read-only link, as a PDF',
    params: TokenParams,
    produces: 'application/pdf',
    handler: async ({ params }, req, res) => {
      const p = await handover.sharedPack(params.token)
      sendPdf(
        res,
        await buildHandoverPdf({ number: p.number, createdAt: p.createdAt, content: p.content, prefs: formatPrefsOf(req) }),
        fileName(p.content.site.name, p.number),
      )
    },
  }),
]
