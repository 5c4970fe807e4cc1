/**
 * The demo workspace: an invented facilities contractor, its team and (as features land) its sites,
 * sheets and test history. Every step is idempotent, so `npm start` can run it on every start.
 */
import type { DataSource } from 'typeorm'
import { seedAccounts } from './accounts.demo'

export async function seedDemo(ds: DataSource): Promise<void> {
  await ds.transaction(async (m) => {
    // One seeding at a time, even with two processes starting together.
    await m.query('SELECT pg_advisory_xact_lock(7410001)')
    const ctx = await seedAccounts(m)
    void ctx
  })
}
