/** Migrations in the order they run. Add new ones at the end. */
import { Accounts1764633600000 } from './1764633600000-Accounts'

export const migrations = [Accounts1764633600000]
