/**
 * Faults with real processes: PostgreSQL stopped and restarted while the app takes writes, and two
 * app processes on two ports sharing one database. Uses its own private cluster so the database of
 * the other tests is never stopped.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ensurePostgresBinaries, findFreePort, startCluster } from '../../scripts/lib/setup.mjs'

const work = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-faults-'))
fs.chmodSync(work, 0o755)
let cluster: { url: string; stop(): void }
let bin: string
let pgPort: number
const children: ChildProcess[] = []

function env(port: number) {
  return {
    ...process.env,
    NODE_ENV: 'test',
    DATABASE_URL: cluster.url,
    PORT: String(port),
    SMTP_CATCHER_PORT: '0',
    DATA_DIR: path.join(work, 'data'),
    JOBS: '0',
    LOG_LEVEL: 'silent',
  }
}

async function startApp(port: number): Promise<void> {
  const child = spawn('node', ['--import', 'tsx', 'server/index.ts'], { env: env(port), stdio: 'ignore' })
  children.push(child)
  for (let i = 0; i < 200; i++) {
    try {
      if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) return
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 100))
  }
  throw new Error('app did not start')
}

interface Session {
  cookie: string
  csrf: string
}

async function signUp(port: number, email: string): Promise<Session> {
  const res = await fetch(`http://127.0.0.1:${port}/api/auth/sign-up`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: 'a fault tolerant passphrase', name: 'Fault Tester', workspaceName: 'Faults' }),
  })
  expect(res.status).toBe(202)
  // The new account confirms its address with the link the app's mail catcher caught.
  const mailDir = path.join(work, 'data', 'mail')
  let token: string | undefined
  for (let i = 0; i < 100 && !token; i++) {
    for (const f of fs.existsSync(mailDir) ? fs.readdirSync(mailDir) : []) {
      const mail = JSON.parse(fs.readFileSync(path.join(mailDir, f), 'utf8')) as { to: string[]; text: string }
      const m = mail.to.includes(email) ? /confirm-email\?token=([\w%-]+)/.exec(mail.text) : null
      if (m) token = decodeURIComponent(m[1])
    }
    if (!token) await new Promise((r) => setTimeout(r, 100))
  }
  const post = (p: string, body: unknown) =>
    fetch(`http://127.0.0.1:${port}${p}`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(body) })
  expect((await post('/api/auth/confirm-email', { token })).status).toBe(200)
  const signedIn = await post('/api/auth/sign-in', { email, password: 'a fault tolerant passphrase' })
  expect(signedIn.status).toBe(200)
  return { cookie: signedIn.headers.get('set-cookie')!.split(';')[0], csrf: (await signedIn.json()).csrfToken }
}

function pgCtl(action: 'stop' | 'start') {
  const dir = path.join(work, 'pg')
  const args =
    action === 'stop'
      ? ['-D', dir, '-m', 'fast', '-w', 'stop']
      : ['-D', dir, '-l', path.join(dir, 'server.log'), '-o', `-c listen_addresses=127.0.0.1 -p ${pgPort} -c unix_socket_directories=''`, '-w', 'start']
  const cmd = process.getuid?.() === 0 ? ['runuser', ['-u', 'postgres', '--', path.join(bin, 'pg_ctl'), ...args]] : [path.join(bin, 'pg_ctl'), args]
  const r = spawnSync(cmd[0] as string, cmd[1] as string[], { cwd: '/tmp', encoding: 'utf8' })
  if (r.status !== 0) throw new Error(`pg_ctl ${action}: ${r.stderr}`)
}

beforeAll(async () => {
  bin = ensurePostgresBinaries()
  pgPort = await findFreePort(56500 + Math.floor(Math.random() * 400))
  cluster = startCluster({ bin, dir: path.join(work, 'pg'), port: pgPort, database: 'lampwright_faults' })
  const m = spawnSync('node', ['--import', 'tsx', 'server/scripts/migrate.ts'], { env: { ...process.env, DATABASE_URL: cluster.url }, encoding: 'utf8' })
  if (m.status !== 0) throw new Error(m.stderr)
}, 120_000)

afterAll(() => {
  for (const c of children) c.kill('SIGTERM')
  cluster?.stop()
  fs.rmSync(work, { recursive: true, force: true })
})

describe('faults', () => {
  it('two app processes share sessions through PostgreSQL', async () => {
    const [a, b] = [await findFreePort(41000 + Math.floor(Math.random() * 1000)), await findFreePort(43000 + Math.floor(Math.random() * 1000))]
    await Promise.all([startApp(a), startApp(b)])
    const s = await signUp(a, `two-${Date.now()}@test.example`)
    const me = await fetch(`http://127.0.0.1:${b}/api/auth/me`, { headers: { cookie: s.cookie } })
    expect(me.status).toBe(200)
    const write = await fetch(`http://127.0.0.1:${b}/api/workspaces`, {
      method: 'POST',
      headers: { cookie: s.cookie, 'X-CSRF-Token': s.csrf, 'Content-Type': 'application/json' },
      body: JSON.stringify({ name: 'Made on B' }),
    })
    expect(write.status).toBe(201)
  })

  it('keeps every acknowledged write across a database restart, answers 503 meanwhile, and recovers by itself', async () => {
    const port = await findFreePort(45000 + Math.floor(Math.random() * 1000))
    await startApp(port)
    const s = await signUp(port, `fault-${Date.now()}@test.example`)
    const acknowledged: string[] = []
    const statuses: Record<string, number> = {}
    let running = true
    let n = 0
    const writer = (async () => {
      while (running) {
        const name = `w-${n++}`
        try {
          const res = await fetch(`http://127.0.0.1:${port}/api/workspaces`, {
            method: 'POST',
            headers: { cookie: s.cookie, 'X-CSRF-Token': s.csrf, 'Content-Type': 'application/json' },
            body: JSON.stringify({ name }),
          })
          statuses[res.status] = (statuses[res.status] ?? 0) + 1
          if (res.status === 201) acknowledged.push((await res.json()).id)
          else await res.text()
        } catch {
          statuses.network = (statuses.network ?? 0) + 1
        }
      }
    })()
    // Let writes flow, then take the database away for a while.
    while (acknowledged.length < 20) await new Promise((r) => setTimeout(r, 20))
    pgCtl('stop')
    const before = acknowledged.length
    while ((statuses['503'] ?? 0) < 3) await new Promise((r) => setTimeout(r, 20))
    // Reads by prepared statement (the sheet list) fail the same clear way, and work again after.
    const readDuringOutage = await fetch(`http://127.0.0.1:${port}/api/sheets`, { headers: { cookie: s.cookie } })
    expect(readDuringOutage.status).toBe(503)
    expect((await readDuringOutage.json()).code).toBe('unavailable')
    pgCtl('start')
    const restartedAt = Date.now()
    while (acknowledged.length <= before + 5) await new Promise((r) => setTimeout(r, 20))
    const recoverySeconds = (Date.now() - restartedAt) / 1000
    running = false
    await writer
    console.log(
      `faults: ${acknowledged.length} acknowledged writes; statuses ${JSON.stringify(statuses)}; recovered ${recoverySeconds.toFixed(2)} s after restart`,
    )
    expect(statuses['500'] ?? 0).toBe(0)
    expect(statuses['503']).toBeGreaterThan(0)
    expect(recoverySeconds).toBeLessThan(10)
    const readAfter = await fetch(`http://127.0.0.1:${port}/api/sheets`, { headers: { cookie: s.cookie } })
    expect(readAfter.status).toBe(200)
    expect((await readAfter.json()).total).toBe(0)
    const client = new pg.Client({ connectionString: cluster.url })
    await client.connect()
    const found = await client.query('SELECT count(*)::int AS n FROM workspaces WHERE id = ANY($1::uuid[])', [acknowledged])
    await client.end()
    expect(found.rows[0].n).toBe(acknowledged.length)
  })
})
