// Machine set-up shared by `npm start` and `npm test`. Plain Node (no packages): it runs
// before node_modules exists, installs what is missing, and manages private PostgreSQL clusters.
import { execFileSync, spawnSync } from 'node:child_process'
import fs from 'node:fs'
import net from 'node:net'
import path from 'node:path'
import { fileURLToPath } from 'node:url'

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..')
export const DATA_DIR = process.env.DATA_DIR ? path.resolve(process.env.DATA_DIR) : path.join(ROOT, 'data')
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0
const PG_OS_USER = process.env.PG_OS_USER ?? 'postgres'

export function log(msg) {
  process.stdout.write(`[lampwright] ${msg}\n`)
}

export function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: ROOT, ...opts })
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} exited with ${r.status ?? r.signal}`)
}

function quiet(cmd, args, opts = {}) {
  return spawnSync(cmd, args, { encoding: 'utf8', cwd: ROOT, ...opts })
}

/** npm packages: install when node_modules is missing or older than the lock file. */
export function ensureNodeModules() {
  const marker = path.join(ROOT, 'node_modules', '.package-lock.json')
  const lock = path.join(ROOT, 'package-lock.json')
  const stale = !fs.existsSync(marker) || fs.statSync(lock).mtimeMs > fs.statSync(marker).mtimeMs + 1000
  if (!stale) return
  log('installing npm packages (npm ci)…')
  run('npm', ['ci', '--no-audit', '--no-fund'])
}

/** Installs Debian packages as root, without letting their services start. */
function aptInstall(packages) {
  if (!isRoot) {
    throw new Error(`missing ${packages.join(', ')}: run as root (or install them: sudo apt-get install -y ${packages.join(' ')})`)
  }
  log(`installing Debian packages: ${packages.join(' ')} (apt-get)…`)
  // policy-rc.d 101 stops the package from starting its own server on port 5432.
  const policy = '/usr/sbin/policy-rc.d'
  const hadPolicy = fs.existsSync(policy)
  if (!hadPolicy) fs.writeFileSync(policy, '#!/bin/sh\nexit 101\n', { mode: 0o755 })
  try {
    const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
    run('apt-get', ['update', '-qq'], { env })
    run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...packages], { env })
  } finally {
    if (!hadPolicy) fs.rmSync(policy, { force: true })
  }
}

/** The PostgreSQL server binaries folder, installing Debian's postgresql when absent. */
export function ensurePostgresBinaries() {
  const find = () => {
    const base = '/usr/lib/postgresql'
    if (!fs.existsSync(base)) return null
    const versions = fs
      .readdirSync(base)
      .filter((v) => fs.existsSync(path.join(base, v, 'bin', 'initdb')))
      .sort((a, b) => Number(b) - Number(a))
    return versions.length ? path.join(base, versions[0], 'bin') : null
  }
  let bin = find()
  if (!bin) {
    aptInstall(['postgresql'])
    bin = find()
    if (!bin) throw new Error('PostgreSQL binaries still missing after apt-get install postgresql')
    // Debian may create a default cluster; make sure nothing of it runs on 5432.
    quiet('pg_ctlcluster', ['--force', '15', 'main', 'stop'])
  }
  return bin
}

/** Debian's Chromium for the end-to-end tests (never a browser download). */
export function ensureChromium() {
  if (fs.existsSync('/usr/bin/chromium')) return '/usr/bin/chromium'
  aptInstall(['chromium'])
  return '/usr/bin/chromium'
}

function ensureOsUser() {
  if (!isRoot) return
  if (quiet('id', ['-u', PG_OS_USER]).status === 0) return
  log(`creating OS user ${PG_OS_USER} to run PostgreSQL (it refuses to run as root)`)
  run('useradd', ['--system', '--no-create-home', '--shell', '/usr/sbin/nologin', PG_OS_USER])
}

/** Runs a PostgreSQL binary as the unprivileged user when we are root. */
function pgExec(bin, tool, args, { check = true } = {}) {
  const full = path.join(bin, tool)
  const r = isRoot ? quiet('runuser', ['-u', PG_OS_USER, '--', full, ...args], { cwd: '/tmp' }) : quiet(full, args, { cwd: '/tmp' })
  if (check && r.status !== 0) throw new Error(`${tool} failed: ${r.stderr || r.stdout}`)
  return r
}

export function portIsFree(port) {
  return new Promise((resolve) => {
    const srv = net.createServer()
    srv.once('error', () => resolve(false))
    srv.listen(port, '127.0.0.1', () => srv.close(() => resolve(true)))
  })
}

export async function findFreePort(start) {
  for (let p = start; p < start + 200; p++) if (await portIsFree(p)) return p
  throw new Error(`no free port near ${start}`)
}

/**
 * A private cluster: initdb once into `dir`, start it on 127.0.0.1:`port` only (no Unix socket),
 * create `database`. Returns { url, stop }.
 */
export function startCluster({ bin, dir, port, database }) {
  ensureOsUser()
  fs.mkdirSync(path.dirname(dir), { recursive: true })
  fs.chmodSync(path.dirname(dir), 0o755)
  if (!fs.existsSync(path.join(dir, 'PG_VERSION'))) {
    log(`creating PostgreSQL cluster in ${path.relative(ROOT, dir)}`)
    fs.mkdirSync(dir, { recursive: true, mode: 0o700 })
    if (isRoot) run('chown', ['-R', `${PG_OS_USER}:`, dir])
    pgExec(bin, 'initdb', ['-D', dir, '-U', 'app', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8'])
  }
  const status = pgExec(bin, 'pg_ctl', ['-D', dir, 'status'], { check: false })
  if (status.status !== 0) {
    const opts = `-c listen_addresses=127.0.0.1 -p ${port} -c unix_socket_directories=''`
    pgExec(bin, 'pg_ctl', ['-D', dir, '-l', path.join(dir, 'server.log'), '-o', opts, '-w', '-t', '30', 'start'])
    log(`PostgreSQL listening on 127.0.0.1:${port}`)
  } else {
    log('PostgreSQL already running for this data folder')
  }
  const exists = quiet(path.join(bin, 'psql'), [
    '-h',
    '127.0.0.1',
    '-p',
    String(port),
    '-U',
    'app',
    '-d',
    'postgres',
    '-tAc',
    `SELECT 1 FROM pg_database WHERE datname='${database}'`,
  ])
  if (exists.status !== 0) throw new Error(`cannot reach PostgreSQL on ${port}: ${exists.stderr}`)
  if (exists.stdout.trim() !== '1') execFileSync(path.join(bin, 'createdb'), ['-h', '127.0.0.1', '-p', String(port), '-U', 'app', database])
  return {
    url: `postgres://app@127.0.0.1:${port}/${database}`,
    stop() {
      pgExec(bin, 'pg_ctl', ['-D', dir, '-m', 'fast', '-w', 'stop'], { check: false })
    },
  }
}

/** The port a cluster in `dir` was last started on (kept in postmaster.opts), if any. */
export function clusterPort(dir) {
  try {
    const opts = fs.readFileSync(path.join(dir, 'postmaster.opts'), 'utf8')
    const m = opts.match(/-p"? "?(\d+)/)
    return m ? Number(m[1]) : null
  } catch {
    return null
  }
}
