/** Migrations in the order they run. Add new ones at the end. */
import { Accounts1764633600000 } from './1764633600000-Accounts'
import { Sheets1764633700000 } from './1764633700000-Sheets'
import { Register1764633800000 } from './1764633800000-Register'

export const migrations = [Accounts1764633600000, Sheets1764633700000, Register1764633800000]
