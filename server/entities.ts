/** Every TypeORM entity, listed by hand (no globs): a missing one fails loudly at start-up. */
import { AuditEvent } from './modules/audit/audit-event.entity'
import { WattageAudit } from './modules/audits/wattage-audit.entity'
import { DischargeFile } from './modules/discharge/discharge-file.entity'
import { DischargeLog } from './modules/discharge/discharge-log.entity'
import { PasswordReset } from './modules/auth/password-reset.entity'
import { EmailConfirmation } from './modules/auth/email-confirmation.entity'
import { HandoverLink, HandoverPack } from './modules/handover/handover-pack.entity'
import { LogBookLink } from './modules/logbook/logbook-link.entity'
import { LuminaireType } from './modules/photometry/luminaire-type.entity'
import { PhotometricFile } from './modules/photometry/photometric-file.entity'
import { AreaEntity } from './modules/register/area.entity'
import { LuminaireEntity } from './modules/register/luminaire.entity'
import { RegisterSettingsEntity } from './modules/register/register-settings.entity'
import { PackPriceEntity } from './modules/register/pack-price.entity'
import { ReminderSendEntity } from './modules/register/reminder-send.entity'
import { SiteEntity } from './modules/register/site.entity'
import { TestPlanEntity } from './modules/register/test-plan.entity'
import { TestRecordEntity } from './modules/register/test-record.entity'
import { TestRoundEntity } from './modules/register/test-round.entity'
import { ShareLink } from './modules/sheets/share-link.entity'
import { SpecRevision } from './modules/sheets/spec-revision.entity'
import { SpecSheet } from './modules/sheets/spec-sheet.entity'
import { ApiToken } from './modules/tokens/api-token.entity'
import { User } from './modules/users/user.entity'
import { Invitation } from './modules/workspaces/invitation.entity'
import { Membership } from './modules/workspaces/membership.entity'
import { Workspace } from './modules/workspaces/workspace.entity'

export const entities = [
  User,
  Workspace,
  Membership,
  Invitation,
  PasswordReset,
  EmailConfirmation,
  AuditEvent,
  ApiToken,
  SpecSheet,
  SpecRevision,
  ShareLink,
  SiteEntity,
  AreaEntity,
  LuminaireEntity,
  TestRecordEntity,
  ReminderSendEntity,
  RegisterSettingsEntity,
  PackPriceEntity,
  TestRoundEntity,
  TestPlanEntity,
  WattageAudit,
  PhotometricFile,
  LuminaireType,
  DischargeFile,
  DischargeLog,
  HandoverPack,
  HandoverLink,
  LogBookLink,
]
