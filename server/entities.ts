/** Every TypeORM entity, listed by hand (no globs): a missing one fails loudly at start-up. */
import { AuditEvent } from './modules/audit/audit-event.entity'
import { PasswordReset } from './modules/auth/password-reset.entity'
import { AreaEntity } from './modules/register/area.entity'
import { LuminaireEntity } from './modules/register/luminaire.entity'
import { ReminderSendEntity } from './modules/register/reminder-send.entity'
import { SiteEntity } from './modules/register/site.entity'
import { TestRecordEntity } from './modules/register/test-record.entity'
import { ShareLink } from './modules/sheets/share-link.entity'
import { SpecRevision } from './modules/sheets/spec-revision.entity'
import { SpecSheet } from './modules/sheets/spec-sheet.entity'
import { User } from './modules/users/user.entity'
import { Invitation } from './modules/workspaces/invitation.entity'
import { Membership } from './modules/workspaces/membership.entity'
import { Workspace } from './modules/workspaces/workspace.entity'

export const entities = [User, Workspace, Membership, Invitation, PasswordReset, AuditEvent, SpecSheet, SpecRevision, ShareLink, SiteEntity, AreaEntity, LuminaireEntity, TestRecordEntity, ReminderSendEntity]
