// `npm start`: set up whatever is missing, then serve Lampwright on 127.0.0.1.
import { spawn } from 'node:child_process'
import fs from 'node:fs'
import path from 'node:path'
import { DATA_DIR, ROOT, ensureNodeModules, ensurePostgresBinaries, log, run, startCluster } from './lib/setup.mjs'

const PG_PORT = Number(process.env.LAMPWRIGHT_PG_PORT ?? 54320)
const APP_PORT = Number(process.env.PORT ?? 8420)

function newestMtime(dir) {
  let newest = 0
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name)
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : fs.statSync(p).mtimeMs)
  }
  return newest
}

function clientIsStale() {
  const built = path.join(ROOT, 'dist', 'index.html')
  if (!fs.existsSync(built)) return true
  const builtAt = fs.statSync(built).mtimeMs
  const inputs = ['src', 'shared', 'index.html', 'vite.config.ts', 'public'].map((p) => path.join(ROOT, p)).filter((p) => fs.existsSync(p))
  return inputs.some((p) => (fs.statSync(p).isDirectory() ? newestMtime(p) : fs.statSync(p).mtimeMs) > builtAt)
}

async function main() {
  ensureNodeModules()
  fs.mkdirSync(DATA_DIR, { recursive: true })
  let cluster = null
  const env = { ...process.env, NODE_ENV: process.env.NODE_ENV ?? 'production', DATA_DIR, PORT: String(APP_PORT) }
  if (!process.env.DATABASE_URL) {
    const bin = ensurePostgresBinaries()
    cluster = startCluster({ bin, dir: path.join(DATA_DIR, 'pg'), port: PG_PORT, database: 'lampwright' })
    env.DATABASE_URL = cluster.url
  } else {
    log('DATABASE_URL is set: using that server, starting no local PostgreSQL')
  }

  let server = null
  let stopping = false
  const stop = (code = 0) => {
    if (stopping) return
    stopping = true
    log('stopping…')
    if (server && server.exitCode === null) server.kill('SIGTERM')
    const finish = () => {
      if (cluster) {
        cluster.stop()
        log('PostgreSQL stopped')
      }
      process.exit(code)
    }
    if (server && server.exitCode === null) server.once('exit', finish)
    else finish()
  }
  process.on('SIGINT', () => stop(0))
  process.on('SIGTERM', () => stop(0))

  try {
    run('node', ['--import', 'tsx', 'server/scripts/migrate.ts'], { env })
    run('node', ['--import', 'tsx', 'server/scripts/seed.ts'], { env })
    if (clientIsStale()) {
      log('building the client (vite build)…')
      run('npx', ['vite', 'build', '--logLevel', 'warn'], { env })
    }
  } catch (err) {
    console.error(`[lampwright] set-up failed: ${err.message}`)
    stop(1)
    return
  }

  // WEB_CONCURRENCY app processes (default: one per CPU) behind the one port; see server/cluster.ts.
  server = spawn('node', ['--import', 'tsx', 'server/cluster.ts'], { cwd: ROOT, env, stdio: 'inherit' })
  server.on('exit', (code) => {
    if (!stopping) {
      log(`server exited (${code}); stopping`)
      stop(code ?? 1)
    }
  })
}

main().catch((err) => {
  console.error(`[lampwright] ${err.stack ?? err}`)
  process.exit(1)
})
