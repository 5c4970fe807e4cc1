/** Migrations in the order they run. Add new ones at the end. */
import { Accounts1764633600000 } from './1764633600000-Accounts'
import { Sheets1764633700000 } from './1764633700000-Sheets'
import { Register1764633800000 } from './1764633800000-Register'
import { DischargeLogs1764633900000 } from './1764633900000-DischargeLogs'
import { Photometry1764634000000 } from './1764634000000-Photometry'
import { WattageAudits1764634100000 } from './1764634100000-WattageAudits'
import { ApiTokens1764634200000 } from './1764634200000-ApiTokens'
import { SheetListFigures1764634300000 } from './1764634300000-SheetListFigures'
import { RateLimitHits1764634400000 } from './1764634400000-RateLimitHits'
import { StoredResultsLz41764634500000 } from './1764634500000-StoredResultsLz4'
import { SheetListOrder1764634600000 } from './1764634600000-SheetListOrder'
import { LogBookState1796222520139 } from './1796222520139-LogBookState'
import { SessionValidity1796223098847 } from './1796223098847-SessionValidity'
import { StagedUploads1796223702801 } from './1796223702801-StagedUploads'
import { EmailConfirmation1796225153018 } from './1796225153018-EmailConfirmation'
import { RegimeProfiles1796248597244 } from './1796248597244-RegimeProfiles'

export const migrations = [Accounts1764633600000, Sheets1764633700000, Register1764633800000, DischargeLogs1764633900000, Photometry1764634000000, WattageAudits1764634100000, ApiTokens1764634200000, SheetListFigures1764634300000, RateLimitHits1764634400000, StoredResultsLz41764634500000, SheetListOrder1764634600000, LogBookState1796222520139, SessionValidity1796223098847, StagedUploads1796223702801, EmailConfirmation1796225153018, RegimeProfiles1796248597244]
