/** /api/workspace/storage: how much of its storage quota the current workspace uses. */
import type { Request, Response } from 'express'
import { scope, type RouteSpec } from '../../policy/access'
import { storageUse } from './storage.service'

async function read(req: Request, res: Response) {
  res.json(await storageUse(scope(req).workspaceId))
}

export const storageRoutes: RouteSpec[] = [
  { method: 'get', path: '/api/workspace/storage', access: 'viewer', summary: "The workspace's stored files and unsaved uploads against its storage quota, in bytes", handler: read },
]
