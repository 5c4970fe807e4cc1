/** /api/workspaces and /api/workspace/…: switching, members, invitations. */
import type { Request, Response } from 'express'
import { z } from 'zod'
import { ChangeRoleSchema, CreateWorkspaceSchema, InviteSchema, SwitchWorkspaceSchema } from '../../../shared/schemas/auth.schema'
import { NotFoundError } from '../../errors/app-error'
import { idParam, parse } from '../../lib/parse'
import { scope, type RouteSpec } from '../../policy/access'
import type { User } from '../users/user.entity'
import { meResponse } from '../auth/auth.router'
import * as service from './workspaces.service'
import { findMembership } from './workspaces.repository'

const TokenParams = z.object({ token: z.string().min(10, 'is not a valid token').max(200) })

async function list(req: Request, res: Response) {
  res.json({ workspaces: await service.myWorkspaces(req.ctx!.userId) })
}

async function create(req: Request, res: Response) {
  const { name } = parse(CreateWorkspaceSchema, req.body)
  const ws = await service.createWorkspace(req.ctx!.userId, name)
  req.session.workspaceId = ws.id
  res.status(201).json(ws)
}

async function switchTo(req: Request, res: Response) {
  const { workspaceId } = parse(SwitchWorkspaceSchema, req.body)
  const m = await findMembership(workspaceId, req.ctx!.userId)
  if (!m) throw new NotFoundError('That workspace')
  req.session.workspaceId = workspaceId
  res.json(await meResponse(req))
}

async function rename(req: Request, res: Response) {
  const s = scope(req)
  const { name } = parse(CreateWorkspaceSchema, req.body)
  await service.renameWorkspace(s.workspaceId, s.userId, name)
  res.json({ id: s.workspaceId, name })
}

async function members(req: Request, res: Response) {
  res.json({ members: await service.members(scope(req).workspaceId) })
}

async function changeRole(req: Request, res: Response) {
  const s = scope(req)
  const { role } = parse(ChangeRoleSchema, req.body)
  const m = await service.changeRole(s.workspaceId, s.userId, idParam(req), role)
  res.json({ id: m.id, role: m.role })
}

async function removeMember(req: Request, res: Response) {
  const s = scope(req)
  await service.removeMember(s.workspaceId, s.userId, idParam(req))
  res.status(204).end()
}

async function leave(req: Request, res: Response) {
  const s = scope(req)
  await service.leaveWorkspace(s.workspaceId, s.userId)
  req.session.workspaceId = undefined
  res.status(204).end()
}

async function invite(req: Request, res: Response) {
  const s = scope(req)
  const { email, role } = parse(InviteSchema, req.body)
  res.status(201).json(await service.invite(s.workspaceId, s.userId, email, role))
}

async function invitations(req: Request, res: Response) {
  res.json({ invitations: await service.pendingInvitations(scope(req).workspaceId) })
}

async function revokeInvitation(req: Request, res: Response) {
  const s = scope(req)
  await service.revokeInvitation(s.workspaceId, s.userId, idParam(req))
  res.status(204).end()
}

async function previewInvitation(req: Request, res: Response) {
  const { token } = parse(TokenParams, req.params)
  res.json(await service.previewInvitation(token))
}

async function acceptInvitation(req: Request, res: Response) {
  const { token } = parse(TokenParams, req.params)
  const result = await service.acceptInvitation(token, req.user as User)
  req.session.workspaceId = result.workspaceId
  res.json(await meResponse(req))
}

export const workspaceRoutes: RouteSpec[] = [
  { method: 'get', path: '/api/workspaces', access: 'signed-in', summary: 'My workspaces and my role in each', handler: list },
  { method: 'post', path: '/api/workspaces', access: 'signed-in', summary: 'Create a team workspace (you become its owner)', body: CreateWorkspaceSchema, handler: create },
  { method: 'post', path: '/api/workspaces/switch', access: 'signed-in', summary: 'Switch the current workspace', body: SwitchWorkspaceSchema, handler: switchTo },
  { method: 'patch', path: '/api/workspace', access: 'owner', summary: 'Rename the current workspace', body: CreateWorkspaceSchema, handler: rename },
  { method: 'get', path: '/api/workspace/members', access: 'viewer', summary: 'Members of the current workspace', handler: members },
  { method: 'patch', path: '/api/workspace/members/:id', access: 'owner', summary: "Change a member's role", body: ChangeRoleSchema, handler: changeRole },
  { method: 'delete', path: '/api/workspace/members/:id', access: 'owner', summary: 'Remove a member', handler: removeMember },
  { method: 'post', path: '/api/workspace/leave', access: 'viewer', summary: 'Leave the current workspace', handler: leave },
  { method: 'get', path: '/api/workspace/invitations', access: 'owner', summary: 'Pending invitations', handler: invitations },
  { method: 'post', path: '/api/workspace/invitations', access: 'owner', summary: 'Invite someone by e-mail', body: InviteSchema, handler: invite },
  { method: 'delete', path: '/api/workspace/invitations/:id', access: 'owner', summary: 'Withdraw an invitation', handler: revokeInvitation },
  { method: 'get', path: '/api/invitations/:token', access: 'public', summary: 'What an invitation link is for', handler: previewInvitation },
  { method: 'post', path: '/api/invitations/:token/accept', access: 'signed-in', summary: 'Accept an invitation', handler: acceptInvitation },
]
