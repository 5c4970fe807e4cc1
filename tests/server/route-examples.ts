/**
 * One working request per route in the route table, used by the generated access-control test.
 * Each example builds fresh rows, so it can run once per role. A route without an example fails
 * that test: adding a route means adding its example here.
 */
import { dataSource } from '../../server/data-source'
import { newToken } from '../../server/lib/tokens'
import { ApiToken } from '../../server/modules/tokens/api-token.entity'
import { PasswordReset } from '../../server/modules/auth/password-reset.entity'
import { EmailConfirmation } from '../../server/modules/auth/email-confirmation.entity'
import { Invitation } from '../../server/modules/workspaces/invitation.entity'
import { Membership } from '../../server/modules/workspaces/membership.entity'
import { Workspace } from '../../server/modules/workspaces/workspace.entity'
import type { Role } from '../../shared/schemas/roles'
import { makeTeam, TEST_PASSWORD, uniqueEmail, type TestTeam } from '../helpers/test-app'
import { sheetRouteExamples } from './sheet-examples'
import { registerRouteExamples } from './register-examples'
import { auditRouteExamples } from './audit-examples'
import { dischargeRouteExamples } from './discharge-examples'
import { photometryRouteExamples } from './photometry-examples'
import { handoverRouteExamples } from './handover-examples'
import { logbookRouteExamples } from './logbook-examples'

export interface ExampleContext {
  /** The workspace the caller belongs to (the caller's role is `role`). */
  team: TestTeam
  /** Another workspace: its ids must answer 404 to the team's members. */
  other: TestTeam
  /** The caller's role, or null for an anonymous caller. */
  role: Role | null
  callerEmail: string | null
}

export interface Example {
  path: string
  body?: unknown
  /** The same route aimed at a record of the other workspace (routes with ids). */
  foreignPath?: string
}

type ExampleFn = (ctx: ExampleContext) => Promise<Example>

async function extraMember(team: TestTeam, role: Role = 'technician') {
  const t = await makeTeam('extra')
  const userId = t.users.viewer.id
  const m = await dataSource.getRepository(Membership).save(dataSource.getRepository(Membership).create({ workspaceId: team.workspaceId, userId, role }))
  return m.id
}

async function invitationIn(workspaceId: string, invitedBy: string, email = uniqueEmail('invitee')) {
  const { token, hash } = newToken()
  const inv = await dataSource
    .getRepository(Invitation)
    .save(
      dataSource
        .getRepository(Invitation)
        .create({ workspaceId, email, role: 'viewer', tokenHash: hash, invitedBy, expiresAt: new Date(Date.now() + 3600_000), acceptedAt: null }),
    )
  return { id: inv.id, token }
}

/** A token row belonging to a team member; revoking it must work for any role (it is the caller's own). */
async function tokenFor(team: TestTeam, role: Role) {
  const { hash } = newToken()
  const row = await dataSource.getRepository(ApiToken).save(
    dataSource.getRepository(ApiToken).create({
      userId: team.users[role].id,
      workspaceId: team.workspaceId,
      role: 'viewer',
      name: 't',
      tokenHash: hash,
      prefix: 'lw_x',
      lastUsedAt: null,
      revokedAt: null,
    }),
  )
  return row.id
}

export const SIZE_EXAMPLE = {
  chemistry: 'nicd',
  cellsInSeries: 4,
  duration: '3 h',
  load: { ledVoltage: '3.2 V', ledCurrent: '250 mA' },
  driver: 'converter',
  driverEfficiency: 0.8,
  ambientMin: '5 degC',
  ambientMax: '30 degC',
}

export const routeExamples: Record<string, ExampleFn> = {
  'get /api/health': async () => ({ path: '/api/health' }),
  'get /api/openapi.json': async () => ({ path: '/api/openapi.json' }),
  'post /api/auth/sign-up': async () => ({
    path: '/api/auth/sign-up',
    body: { email: uniqueEmail('new'), password: 'a long enough passphrase', name: 'New Person', workspaceName: 'New team' },
  }),
  'post /api/auth/confirm-email': async () => {
    const stranger = await makeTeam('stranger')
    const { token, hash } = newToken()
    await dataSource
      .getRepository(EmailConfirmation)
      .insert({ userId: stranger.users.viewer.id, tokenHash: hash, expiresAt: new Date(Date.now() + 3600_000), usedAt: null })
    return { path: '/api/auth/confirm-email', body: { token } }
  },
  'post /api/auth/sign-in': async ({ team }) => ({ path: '/api/auth/sign-in', body: { email: team.users.viewer.email, password: 'correct-horse-lamp-42' } }),
  'post /api/auth/sign-out': async () => ({ path: '/api/auth/sign-out' }),
  'get /api/auth/me': async () => ({ path: '/api/auth/me' }),
  'get /api/auth/session': async () => ({ path: '/api/auth/session' }),
  'patch /api/auth/me': async () => ({ path: '/api/auth/me', body: { units: 'us' } }),
  'post /api/auth/password': async () => ({ path: '/api/auth/password', body: { currentPassword: TEST_PASSWORD, newPassword: 'a changed passphrase today' } }),
  'get /api/auth/csrf': async () => ({ path: '/api/auth/csrf' }),
  'post /api/auth/forgot-password': async ({ team }) => ({ path: '/api/auth/forgot-password', body: { email: team.users.viewer.email } }),
  'post /api/auth/reset-password': async () => {
    // A user outside the calling team: a reset signs its user out everywhere.
    const stranger = await makeTeam('stranger')
    const { token, hash } = newToken()
    await dataSource
      .getRepository(PasswordReset)
      .insert({ userId: stranger.users.viewer.id, tokenHash: hash, expiresAt: new Date(Date.now() + 3600_000), usedAt: null })
    return { path: '/api/auth/reset-password', body: { token, password: 'correct-horse-lamp-42' } }
  },
  'get /api/workspaces': async () => ({ path: '/api/workspaces' }),
  'post /api/workspaces': async () => ({ path: '/api/workspaces', body: { name: 'Second team' } }),
  'post /api/workspaces/switch': async ({ team }) => ({ path: '/api/workspaces/switch', body: { workspaceId: team.workspaceId } }),
  'patch /api/workspace': async () => ({ path: '/api/workspace', body: { name: 'Renamed team' } }),
  'get /api/workspace/settings': async () => ({ path: '/api/workspace/settings' }),
  'patch /api/workspace/settings': async () => ({ path: '/api/workspace/settings', body: { currency: 'GBP' } }),
  'get /api/workspace/members': async () => ({ path: '/api/workspace/members' }),
  'patch /api/workspace/members/:id': async ({ team, other }) => ({
    path: `/api/workspace/members/${await extraMember(team)}`,
    body: { role: 'viewer' },
    foreignPath: `/api/workspace/members/${await extraMember(other)}`,
  }),
  'delete /api/workspace/members/:id': async ({ team, other }) => ({
    path: `/api/workspace/members/${await extraMember(team)}`,
    foreignPath: `/api/workspace/members/${await extraMember(other)}`,
  }),
  'post /api/workspace/leave': async ({ team, role }) => {
    // The last owner may not leave: give the workspace a second owner first.
    if (role === 'owner') await extraMember(team, 'owner')
    return { path: '/api/workspace/leave' }
  },
  'get /api/workspace/invitations': async () => ({ path: '/api/workspace/invitations' }),
  'post /api/workspace/invitations': async () => ({ path: '/api/workspace/invitations', body: { email: uniqueEmail('invited'), role: 'viewer' } }),
  'delete /api/workspace/invitations/:id': async ({ team, other }) => ({
    path: `/api/workspace/invitations/${(await invitationIn(team.workspaceId, team.users.owner.id)).id}`,
    foreignPath: `/api/workspace/invitations/${(await invitationIn(other.workspaceId, other.users.owner.id)).id}`,
  }),
  'get /api/invitations/:token': async ({ team }) => ({ path: `/api/invitations/${(await invitationIn(team.workspaceId, team.users.owner.id)).token}` }),
  'post /api/invitations/:token/accept': async ({ team, callerEmail }) => {
    const ws = await dataSource.getRepository(Workspace).save(dataSource.getRepository(Workspace).create({ name: 'Inviting team' }))
    const { token } = await invitationIn(ws.id, team.users.owner.id, callerEmail ?? uniqueEmail('nobody'))
    return { path: `/api/invitations/${token}/accept` }
  },
  'get /api/outbox': async () => ({ path: '/api/outbox' }),
  'get /api/workspace/storage': async () => ({ path: '/api/workspace/storage' }),
  'get /api/calc': async () => ({ path: '/api/calc' }),
  'get /api/tokens': async () => ({ path: '/api/tokens' }),
  'post /api/tokens': async () => ({ path: '/api/tokens', body: { name: 'script', role: 'viewer' } }),
  'delete /api/tokens/:id': async ({ team, other, role }) => ({
    path: `/api/tokens/${await tokenFor(team, role ?? 'viewer')}`,
    foreignPath: `/api/tokens/${await tokenFor(other, 'viewer')}`,
  }),
  'get /api/workspace/tokens': async () => ({ path: '/api/workspace/tokens' }),
  'delete /api/workspace/tokens/:id': async ({ team, other }) => ({
    path: `/api/workspace/tokens/${await tokenFor(team, 'viewer')}`,
    foreignPath: `/api/workspace/tokens/${await tokenFor(other, 'viewer')}`,
  }),
  'post /api/calc/:tool': async () => ({ path: '/api/calc/size', body: SIZE_EXAMPLE }),
  ...sheetRouteExamples,
  ...registerRouteExamples,
  ...auditRouteExamples,
  ...photometryRouteExamples,
  ...dischargeRouteExamples,
  ...handoverRouteExamples,
  ...logbookRouteExamples,
}
