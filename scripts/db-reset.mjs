// `npm run db:reset`: drops the private cluster's database and loads a fresh demo workspace.
import path from 'node:path'
import { execFileSync } from 'node:child_process'
import { DATA_DIR, ensurePostgresBinaries, log, run, startCluster } from './lib/setup.mjs'

if (process.env.DATABASE_URL) {
  console.error('DATABASE_URL is set: refusing to reset an external database. Unset it to reset the private cluster.')
  process.exit(2)
}
const bin = ensurePostgresBinaries()
const port = Number(process.env.LAMPWRIGHT_PG_PORT ?? 54320)
const cluster = startCluster({ bin, dir: path.join(DATA_DIR, 'pg'), port, database: 'postgres' })
execFileSync(path.join(bin, 'dropdb'), ['-h', '127.0.0.1', '-p', String(port), '-U', 'app', '--if-exists', '--force', 'lampwright'], { stdio: 'inherit' })
execFileSync(path.join(bin, 'createdb'), ['-h', '127.0.0.1', '-p', String(port), '-U', 'app', 'lampwright'], { stdio: 'inherit' })
const env = { ...process.env, DATABASE_URL: `postgres://app@127.0.0.1:${port}/lampwright` }
run('node', ['--import', 'tsx', 'server/scripts/migrate.ts'], { env })
run('node', ['--import', 'tsx', 'server/scripts/seed.ts'], { env })
log('database reset with a fresh demo workspace')
void cluster
