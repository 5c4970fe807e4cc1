// For development: a throwaway cluster, migrations, then `vitest run <args>` only (no type check,
// lint or build). Example: node scripts/test-quick.mjs --project server tests/server/sheets.test.ts
import { spawnSync } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { ROOT, ensurePostgresBinaries, findFreePort, startCluster } from './lib/setup.mjs'

const workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lampwright-quick-'))
fs.chmodSync(workDir, 0o755)
const port = await findFreePort(55000 + Math.floor(Math.random() * 2000))
const cluster = startCluster({ bin: ensurePostgresBinaries(), dir: path.join(workDir, 'pg'), port, database: 'lampwright_test' })
const env = {
  ...process.env,
  NODE_ENV: 'test',
  DATABASE_URL: cluster.url,
  DATA_DIR: path.join(workDir, 'data'),
  SMTP_CATCHER_PORT: '0',
  LOG_LEVEL: 'silent',
  PORT: '0',
}
let status = 1
try {
  const m = spawnSync('node', ['--import', 'tsx', 'server/scripts/migrate.ts'], { cwd: ROOT, env, stdio: 'inherit' })
  if (m.status === 0) status = spawnSync('npx', ['vitest', 'run', ...process.argv.slice(2)], { cwd: ROOT, env, stdio: 'inherit' }).status ?? 1
} finally {
  cluster.stop()
  fs.rmSync(workDir, { recursive: true, force: true })
}
process.exit(status)
