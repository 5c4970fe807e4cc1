/** /api/workspaces and /api/workspace/…: switching, members, invitations. */
import { z } from 'zod'
import { ChangeRoleSchema, CreateWorkspaceSchema, InviteSchema, SwitchWorkspaceSchema } from '../../../shared/schemas/auth.schema'
import { NotFoundError } from '../../errors/app-error'
import { IdParams } from '../../lib/parse'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import type { User } from '../users/user.entity'
import { meResponse } from '../auth/me.service'
import * as settings from './workspace-settings.service'
import * as service from './workspaces.service'
import { findMembership } from './workspaces.repository'
import {
  InvitationAnswer,
  InvitationListAnswer,
  InvitationPreviewAnswer,
  MeAnswer,
  MemberListAnswer,
  MemberRoleAnswer,
  WorkspaceAnswer,
  WorkspaceListAnswer,
  WorkspaceNameAnswer,
  WorkspaceSettingsAnswer,
} from '../../../shared/schemas/answers/accounts'
import { WorkspaceSettingsPatchSchema } from '../../../shared/schemas/workspace-settings.schema'

const TokenParams = z.object({ token: z.string().min(10, 'is not a valid token').max(200) })

export const workspaceRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/workspaces',
    response: WorkspaceListAnswer,
    access: 'signed-in',
    summary: 'My workspaces and my role in each',
    handler: async (_input, req) => ({ workspaces: await service.myWorkspaces(req.ctx!.userId) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/workspaces',
    response: WorkspaceAnswer,
    access: 'signed-in',
    summary: 'Create a team workspace (you become its owner)',
    body: CreateWorkspaceSchema,
    status: 201,
    handler: async ({ body }, req) => {
      const ws = await service.createWorkspace(req.ctx!.userId, body.name)
      req.session.workspaceId = ws.id
      return ws
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/workspaces/switch',
    response: MeAnswer,
    access: 'signed-in',
    summary: 'Switch the current workspace',
    body: SwitchWorkspaceSchema,
    handler: async ({ body }, req) => {
      const m = await findMembership(body.workspaceId, req.ctx!.userId)
      if (!m) throw new NotFoundError('That workspace')
      req.session.workspaceId = body.workspaceId
      return meResponse(req)
    },
  }),
  defineRoute({
    method: 'patch',
    path: '/api/workspace',
    response: WorkspaceNameAnswer,
    access: 'owner',
    summary: 'Rename the current workspace',
    body: CreateWorkspaceSchema,
    handler: async ({ body }, req) => {
      const s = scope(req)
      await service.renameWorkspace(s.workspaceId, s.userId, body.name)
      return { id: s.workspaceId, name: body.name }
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/workspace/settings',
    response: WorkspaceSettingsAnswer,
    access: 'viewer',
    summary: "The workspace's settings: the currency of its prices and costs",
    handler: (_input, req) => settings.workspaceSettings(scope(req).workspaceId),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/workspace/settings',
    response: WorkspaceSettingsAnswer,
    access: 'owner',
    summary: "Choose the workspace's currency (null: the owner's region's)",
    body: WorkspaceSettingsPatchSchema,
    handler: ({ body }, req) => {
      const s = scope(req)
      return settings.updateWorkspaceSettings(s.workspaceId, s.userId, body)
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/workspace/members',
    response: MemberListAnswer,
    access: 'viewer',
    summary: 'Members of the current workspace',
    handler: async (_input, req) => ({ members: await service.members(scope(req).workspaceId) }),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/workspace/members/:id',
    response: MemberRoleAnswer,
    access: 'owner',
    summary: "Change a member's role",
    params: IdParams,
    body: ChangeRoleSchema,
    handler: async ({ params, body }, req) => {
      const s = scope(req)
      const m = await service.changeRole(s.workspaceId, s.userId, params.id, body.role)
      return { id: m.id, role: m.role }
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/workspace/members/:id',
    access: 'owner',
    summary: 'Remove a member',
    params: IdParams,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await service.removeMember(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/workspace/leave',
    access: 'viewer',
    summary: 'Leave the current workspace',
    body: false,
    produces: 'none',
    handler: async (_input, req, res) => {
      const s = scope(req)
      await service.leaveWorkspace(s.workspaceId, s.userId)
      req.session.workspaceId = undefined
      res.status(204).end()
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/workspace/invitations',
    response: InvitationListAnswer,
    access: 'owner',
    summary: 'Pending invitations',
    handler: async (_input, req) => ({ invitations: await service.pendingInvitations(scope(req).workspaceId) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/workspace/invitations',
    response: InvitationAnswer,
    access: 'owner',
    summary: 'Invite someone by e-mail',
    body: InviteSchema,
    status: 201,
    handler: ({ body }, req) => {
      const s = scope(req)
      return service.invite(s.workspaceId, s.userId, body.email, body.role)
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/api/workspace/invitations/:id',
    access: 'owner',
    summary: 'Withdraw an invitation',
    params: IdParams,
    produces: 'none',
    handler: async ({ params }, req, res) => {
      const s = scope(req)
      await service.revokeInvitation(s.workspaceId, s.userId, params.id)
      res.status(204).end()
    },
  }),
  // A malformed invitation token is a mistake in a link someone was sent: say so (400), not 404.
  defineRoute({
    method: 'get',
    path: '/api/invitations/:token',
    response: InvitationPreviewAnswer,
    access: 'public',
    summary: 'What an invitation link is for',
    params: TokenParams,
    invalid: { params: 400 },
    handler: ({ params }) => service.previewInvitation(params.token),
  }),
  defineRoute({
    method: 'post',
    path: '/api/invitations/:token/accept',
    response: MeAnswer,
    access: 'signed-in',
    summary: 'Accept an invitation',
    params: TokenParams,
    invalid: { params: 400 },
    body: false,
    handler: async ({ params }, req) => {
      const result = await service.acceptInvitation(params.token, req.user as User)
      req.session.workspaceId = result.workspaceId
      return meResponse(req)
    },
  }),
]
