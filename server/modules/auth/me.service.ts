/**
 * The answer to "who am I": the user, the current workspace and role, every workspace, and the
 * session's CSRF token. Sign-in, sign-up, profile changes, switching and accepting an invitation
 * all answer with it, so it lives here rather than in one router.
 */
import crypto from 'node:crypto'
import type { Request } from 'express'
import type { MeResponse } from '../../../shared/schemas/auth.schema'
import type { User } from '../users/user.entity'
import { workspaceSettings } from '../workspaces/workspace-settings.service'
import { myWorkspaces } from '../workspaces/workspaces.service'

export function ensureCsrfToken(req: Request): string {
  req.session.csrfToken ??= crypto.randomBytes(24).toString('base64url')
  return req.session.csrfToken
}

export async function meResponse(req: Request): Promise<MeResponse> {
  const user = req.user as User
  const workspaces = await myWorkspaces(user.id)
  let current: (typeof workspaces)[number] | null = workspaces.find((w) => w.id === req.session.workspaceId) ?? workspaces[0] ?? null
  if (req.ctx?.viaToken) current = workspaces.find((w) => w.id === req.ctx?.workspaceId) ?? null
  if (current && !req.ctx?.viaToken) req.session.workspaceId = current.id
  return {
    user: { id: user.id, email: user.email, name: user.name, units: user.units === 'us' ? 'us' : 'si' },
    workspace: current ? { id: current.id, name: current.name, currency: (await workspaceSettings(current.id)).currency } : null,
    role: req.ctx?.viaToken ? req.ctx.role : (current?.role ?? null),
    // A token knows only its own workspace.
    workspaces: req.ctx?.viaToken ? (current ? [current] : []) : workspaces,
    csrfToken: req.ctx?.viaToken ? '' : ensureCsrfToken(req),
  }
}
