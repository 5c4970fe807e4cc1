/**
 * The demo workspace: an invented facilities contractor, its team and (as features land) its sites,
 * sheets and test history. Every step is idempotent, so `npm start` can run it on every start.
 */
import type { DataSource } from 'typeorm'
import { seedAccounts } from './accounts.demo'
import { seedAudits } from './audits.demo'
import { seedDischarge } from './discharge.demo'
import { seedPhotometry } from './photometry.demo'
import { seedRegister } from './register.demo'
import { seedSheets } from './sheets.demo'

export async function seedDemo(ds: DataSource): Promise<void> {
  await ds.transaction(async (m) => {
    // One seeding at a time, even with two processes starting together.
    await m.query('SELECT pg_advisory_xact_lock(7410001)')
    const ctx = await seedAccounts(m)
    await seedRegister(m, ctx)
    await seedAudits(m, ctx)
    await seedSheets(m, ctx)
    await seedPhotometry(m, ctx)
    await seedDischarge(m, ctx)
    void ctx
  })
}
