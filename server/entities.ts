/** Every TypeORM entity, listed by hand (no globs): a missing one fails loudly at start-up. */
import { AuditEvent } from './modules/audit/audit-event.entity'
import { PasswordReset } from './modules/auth/password-reset.entity'
import { User } from './modules/users/user.entity'
import { Invitation } from './modules/workspaces/invitation.entity'
import { Membership } from './modules/workspaces/membership.entity'
import { Workspace } from './modules/workspaces/workspace.entity'

export const entities = [User, Workspace, Membership, Invitation, PasswordReset, AuditEvent]
