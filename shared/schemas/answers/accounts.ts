/** Answers of /api/auth, /api/workspaces, /api/workspace, /api/invitations, /api/tokens and /api/outbox. */
import { z } from 'zod'
import { TokenScopeSchema } from '../token.schema'
import { RoleSchema } from '../roles'
import { Timestamp } from './common'

const WorkspaceRole = z.object({ id: z.string(), name: z.string(), role: RoleSchema })

/** Who am I: the user, the current workspace and role, every workspace, the session's CSRF token. */
export const MeAnswer = z.object({
  user: z.object({ id: z.string(), email: z.string(), name: z.string(), units: z.enum(['si', 'us']) }),
  /** The current workspace; `currency` is the one its prices and costs are written in (chosen, or the owner's region's). */
  workspace: z.object({ id: z.string(), name: z.string(), currency: z.string() }).nullable(),
  role: RoleSchema.nullable(),
  workspaces: z.array(WorkspaceRole),
  csrfToken: z.string(),
})

/** The session a page checks on load: the same as MeAnswer when signed in, none when not (200 either way). */
export const SessionAnswer = z.object({ me: MeAnswer.nullable() })

export const CsrfAnswer = z.object({ csrfToken: z.string() })
export const WorkspaceAnswer = WorkspaceRole
export const WorkspaceListAnswer = z.object({ workspaces: z.array(WorkspaceRole) })
export const WorkspaceNameAnswer = z.object({ id: z.string(), name: z.string() })
/** The workspace's settings: the currency in force, whether an owner chose it, and the owner's region's (used until one is chosen). */
export const WorkspaceSettingsAnswer = z.object({ currency: z.string(), currencyChosen: z.boolean(), regionCurrency: z.string() })

export const MemberAnswer = z.object({ id: z.string(), userId: z.string(), name: z.string(), email: z.string(), role: RoleSchema, since: Timestamp })
export const MemberListAnswer = z.object({ members: z.array(MemberAnswer) })
export const MemberRoleAnswer = z.object({ id: z.string(), role: RoleSchema })

export const InvitationAnswer = z.object({ id: z.string(), email: z.string(), role: RoleSchema, expiresAt: Timestamp })
export const InvitationListAnswer = z.object({ invitations: z.array(InvitationAnswer) })
export const InvitationPreviewAnswer = z.object({ workspace: z.string(), email: z.string(), role: RoleSchema, expiresAt: Timestamp })

export const ApiTokenAnswer = z.object({
  id: z.string(),
  name: z.string(),
  role: RoleSchema,
  prefix: z.string(),
  scopes: z.array(TokenScopeSchema),
  expiresAt: Timestamp.nullable(),
  createdAt: Timestamp,
  lastUsedAt: Timestamp.nullable(),
  revokedAt: Timestamp.nullable(),
})
export const ApiTokenListAnswer = z.object({ tokens: z.array(ApiTokenAnswer) })
/** Every member's tokens in a workspace, as its owners see them (never the secret). */
export const MemberTokenListAnswer = z.object({
  tokens: z.array(ApiTokenAnswer.extend({ userId: z.string().uuid(), userName: z.string(), userEmail: z.string() })),
})
/** A new API token: the secret is shown this once. */
export const NewApiTokenAnswer = ApiTokenAnswer.pick({ id: true, name: true, role: true, prefix: true, scopes: true, expiresAt: true, createdAt: true }).extend(
  { token: z.string() },
)

export const CaughtMailAnswer = z.object({ id: z.string(), receivedAt: Timestamp, to: z.array(z.string()), subject: z.string(), text: z.string() })
export const OutboxAnswer = z.object({ messages: z.array(CaughtMailAnswer) })
