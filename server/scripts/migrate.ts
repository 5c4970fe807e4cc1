/** `npm run db:migrate` (or `-- --revert` to undo the last migration). */
import { dataSource } from '../data-source'

const revert = process.argv.includes('--revert')
await dataSource.initialize()
if (revert) {
  await dataSource.undoLastMigration({ transaction: 'each' })
  console.log('[lampwright] reverted the last migration')
} else {
  const ran = await dataSource.runMigrations({ transaction: 'each' })
  console.log(`[lampwright] migrations: ${ran.length} applied${ran.length ? ` (${ran.map((m) => m.name).join(', ')})` : ''}`)
}
await dataSource.destroy()
