// `npm run dev`: the private database, the API with reload (tsx watch), and Vite with hot reload
// proxying /api to it.
import { spawn } from 'node:child_process'
import path from 'node:path'
import { DATA_DIR, ROOT, ensureNodeModules, ensurePostgresBinaries, startCluster, run } from './lib/setup.mjs'

ensureNodeModules()
const env = { ...process.env, NODE_ENV: 'development', DATA_DIR, PORT: process.env.PORT ?? '8420' }
let cluster = null
if (!process.env.DATABASE_URL) {
  cluster = startCluster({
    bin: ensurePostgresBinaries(),
    dir: path.join(DATA_DIR, 'pg'),
    port: Number(process.env.LAMPWRIGHT_PG_PORT ?? 54320),
    database: 'lampwright',
  })
  env.DATABASE_URL = cluster.url
}
run('node', ['--import', 'tsx', 'server/scripts/migrate.ts'], { env })
run('node', ['--import', 'tsx', 'server/scripts/seed.ts'], { env })
const children = [
  spawn('npx', ['tsx', 'watch', 'server/index.ts'], { cwd: ROOT, env, stdio: 'inherit' }),
  spawn('npx', ['vite', '--port', '5173'], { cwd: ROOT, env, stdio: 'inherit' }),
]
const stop = () => {
  for (const c of children) c.kill('SIGTERM')
  cluster?.stop()
  process.exit(0)
}
process.on('SIGINT', stop)
process.on('SIGTERM', stop)
