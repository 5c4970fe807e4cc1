/** /api/workspace/storage: how much of its storage quota the current workspace uses. */
import { StorageUseAnswer } from '../../../shared/schemas/answers/register'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import { storageUse } from './storage.service'

export const storageRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/workspace/storage',
    access: 'viewer',
    summary: "The workspace's stored files and unsaved uploads against its storage quota, in bytes",
    response: StorageUseAnswer,
    handler: (_input, req) => storageUse(scope(req).workspaceId),
  }),
]
