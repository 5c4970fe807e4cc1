/** /api/audits: saved wattage audits (claimed power against bench readings), and where they are attached. */
import type { Request, Response } from 'express'
import { AuditAttachSchema, AuditCreateSchema, AuditListQuerySchema } from '../../../shared/schemas/wattage-audit.schema'
import { idParam, parse } from '../../lib/parse'
import { scope, type RouteSpec } from '../../policy/access'
import * as service from './audits.service'


async function list(req: Request, res: Response) {
  res.json(await service.listAudits(scope(req).workspaceId, parse(AuditListQuerySchema, req.query)))
}

async function create(req: Request, res: Response) {
  const s = scope(req)
  res.status(201).json(await service.createAudit(s.workspaceId, s.userId, parse(AuditCreateSchema, req.body)))
}

async function read(req: Request, res: Response) {
  res.json(await service.getAudit(scope(req).workspaceId, idParam(req, 'That wattage audit')))
}

async function attach(req: Request, res: Response) {
  const s = scope(req)
  const id = idParam(req, 'That wattage audit')
  res.json(await service.attachAudit(s.workspaceId, s.userId, id, parse(AuditAttachSchema, req.body)))
}

async function remove(req: Request, res: Response) {
  const s = scope(req)
  await service.deleteAudit(s.workspaceId, s.userId, idParam(req, 'That wattage audit'))
  res.status(204).end()
}

// Recording readings is a technician's job, so technicians save and attach audits; removing one
// (it may back an issued sheet) is left to designers, like the other records a sheet rests on.
export const auditRoutes: RouteSpec[] = [
  { method: 'get', path: '/api/audits', access: 'viewer', summary: 'Wattage audits (newest first; by sheet, luminaire or a list of ids)', handler: list },
  { method: 'post', path: '/api/audits', access: 'technician', summary: 'Save a wattage audit (the engine computes its results)', body: AuditCreateSchema, handler: create },
  { method: 'get', path: '/api/audits/:id', access: 'viewer', summary: 'One wattage audit with its working', handler: read },
  { method: 'delete', path: '/api/audits/:id', access: 'designer', summary: 'Delete a wattage audit (its readings stay in the audit trail)', handler: remove },
  { method: 'post', path: '/api/audits/:id/attach', access: 'technician', summary: 'Attach a wattage audit to a sheet or a luminaire (null detaches)', body: AuditAttachSchema, handler: attach },
]
