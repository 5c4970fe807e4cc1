/**
 * The register for integrators: lists across sites paged by cursor (GET /api/luminaires,
 * GET /api/tests), sizing many luminaires in one request and changing many in one request.
 */
import { LuminaireBulkAnswer, LuminaireBulkSchema, SizeBatchAnswer, SizeBatchSchema } from '../../../shared/schemas/batch.schema'
import { LuminaireListQuery, TestListQuery } from '../../../shared/schemas/list.schema'
import { LuminaireListAnswer, TestListAnswer } from '../../../shared/schemas/answers/register-lists'
import { linkNext } from '../../lib/list-page'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import { sizeBatch, updateLuminaires } from './batch.service'
import { listLuminaires, listTests } from './lists.service'

export const collectionRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/luminaires',
    access: 'viewer',
    summary: 'Luminaires across sites with their due state; ?state=overdue,failed,due-soon, siteId, updatedSince; paged by cursor (Link rel="next")',
    query: LuminaireListQuery,
    response: LuminaireListAnswer,
    handler: async ({ query }, req, res) => {
      const page = await listLuminaires(scope(req).workspaceId, query)
      linkNext(req, res, page.nextCursor)
      return page
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/tests',
    access: 'viewer',
    summary: 'The log book across sites, oldest first; from/to (days, both included), siteId, luminaireId, updatedSince; paged by cursor (Link rel="next")',
    query: TestListQuery,
    response: TestListAnswer,
    handler: async ({ query }, req, res) => {
      const page = await listTests(scope(req).workspaceId, query)
      linkNext(req, res, page.nextCursor)
      return page
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/calc/size/batch',
    access: 'viewer',
    summary: 'Size many packs in one request, by value or by register luminaire; each item answered with its result or its own errors',
    body: SizeBatchSchema,
    response: SizeBatchAnswer,
    handler: ({ body }, req) => sizeBatch(scope(req).workspaceId, body),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/luminaires',
    access: 'designer',
    summary: 'Change many luminaires in one request; each item answered with the luminaire or its own errors',
    body: LuminaireBulkSchema,
    response: LuminaireBulkAnswer,
    handler: ({ body }, req) => {
      const s = scope(req)
      return updateLuminaires(s.workspaceId, s.userId, body)
    },
  }),
]
