/** /api/audits: saved wattage audits (claimed power against bench readings), and where they are attached. */
import { AuditListAnswer, SavedAuditAnswer } from '../../../shared/schemas/answers/audits'
import { AuditAttachSchema, AuditCreateSchema, AuditListQuerySchema } from '../../../shared/schemas/wattage-audit.schema'
import { IdParams } from '../../lib/parse'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import * as service from './audits.service'

const WHAT = 'That wattage audit'

// Recording readings is a technician's job, so technicians save and attach audits; removing one
// (it may back an issued sheet) is left to designers, like the other records a sheet rests on.
export const auditRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/audits',
    response: AuditListAnswer,
    access: 'viewer',
    summary: 'Wattage audits (newest first; by sheet, luminaire or a list of ids)',
    query: AuditListQuerySchema,
    handler: ({ query }, req) => service.listAudits(scope(req).workspaceId, query),
  }),
  defineRoute({
    method: 'post',
    path: '/api/audits',
    response: SavedAuditAnswer,
    access: 'technician',
    summary: 'Save a wattage audit (the engine computes its results)',
    body: AuditCreateSchema,
    status: 201,
    handler: ({ body }, req) => {
      const s = scope(req)
      return service.createAudit(s.workspaceId, s.userId, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/audits/:id',
    response: SavedAuditAnswer,
    access: 'viewer',
    summary: 'One wattage audit with its working',
    params: IdParams,
    notFound: WHAT,
    handler: ({ params }, req) => service.getAudit(scope(req).workspaceId, params.id),
  }),
  defineRoute({
    method: 'delete',
    path: '/api/audits/:id',
    access: 'designer',
    summary: 'Delete a wattage audit (its readings stay in the audit trail)',
    params: IdParams,
    notFound: WHAT,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await service.deleteAudit(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/audits/:id/attach',
    response: SavedAuditAnswer,
    access: 'technician',
    summary: 'Attach a wattage audit to a sheet or a luminaire (null detaches)',
    params: IdParams,
    notFound: WHAT,
    body: AuditAttachSchema,
    handler: ({ params, body }, req) => {
      const s = scope(req)
      return service.attachAudit(s.workspaceId, s.userId, params.id, body)
    },
  }),
]
