/**
 * Several app processes on one database and one data folder: a log uploaded through one process is
 * saved through another, and `server/cluster.ts` (what `npm start` runs) serves WEB_CONCURRENCY
 * processes behind one port and replaces one that dies.
 */
import { spawn, type ChildProcess } from 'node:child_process'
import fs from 'node:fs'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { findFreePort } from '../../scripts/lib/setup.mjs'
import { dataSource } from '../../server/data-source'
import { stagingDir } from '../../server/modules/discharge/discharge.service'
import { COMMA_MAPPING, logText, NICD_3H, PASSING } from '../helpers/discharge-fixtures'
import { closeTestApp, getTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'

const children: ChildProcess[] = []
let team: TestTeam

beforeAll(async () => {
  // The test process loads the config first: the session secret every process reads exists once.
  await getTestApp()
  team = await makeTeam('Two processes')
})
afterAll(async () => {
  for (const c of children) if (c.exitCode === null) c.kill('SIGTERM')
  await closeTestApp()
})

function env(port: number, extra: Record<string, string> = {}) {
  return { ...process.env, NODE_ENV: 'test', PORT: String(port), SMTP_CATCHER_PORT: '0', JOBS: '0', LOG_LEVEL: 'silent', TRUST_PROXY: '1', ...extra }
}

async function waitForHealth(port: number) {
  for (let i = 0; i < 600; i++) {
    try {
      if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) return
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 100))
  }
  throw new Error(`no app on port ${port}`)
}

function startProcess(entry: string, port: number, extra: Record<string, string> = {}) {
  const child = spawn('node', ['--import', 'tsx', entry], { env: env(port, extra), stdio: ['ignore', 'pipe', 'inherit'] })
  children.push(child)
  const lines: string[] = []
  child.stdout?.setEncoding('utf8').on('data', (chunk: string) => lines.push(...chunk.split('\n').filter(Boolean)))
  return { child, lines }
}

interface Session {
  cookie: string
  csrf: string
}

async function signInAt(port: number, email: string): Promise<Session> {
  // A client address of its own (TEST-NET-2 behind the trusted proxy hop): failed sign-ins of other
  // test files from 127.0.0.1 are counted in the same database and must not lock this client out.
  const res = await fetch(`http://127.0.0.1:${port}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Forwarded-For': '198.51.100.42' },
    body: JSON.stringify({ email, password: TEST_PASSWORD }),
  })
  expect(res.status).toBe(200)
  return { cookie: res.headers.get('set-cookie')!.split(';')[0], csrf: (await res.json()).csrfToken }
}

async function uploadAt(port: number, s: Session, text: string) {
  const form = new FormData()
  form.append('file', new Blob([text], { type: 'text/csv' }), 'two-processes.csv')
  // A fresh connection each time, so behind one port the cluster may hand it to any process.
  const res = await fetch(`http://127.0.0.1:${port}/api/discharge/uploads`, {
    method: 'POST',
    headers: { cookie: s.cookie, 'X-CSRF-Token': s.csrf, Connection: 'close' },
    body: form,
  })
  return { status: res.status, body: await res.json() }
}

async function saveAt(port: number, s: Session, uploadId: string) {
  const res = await fetch(`http://127.0.0.1:${port}/api/discharge/logs`, {
    method: 'POST',
    headers: { cookie: s.cookie, 'X-CSRF-Token': s.csrf, 'Content-Type': 'application/json', Connection: 'close' },
    body: JSON.stringify({ uploadId, title: 'Saved by another process', mapping: COMMA_MAPPING, options: NICD_3H }),
  })
  return { status: res.status, body: await res.json() }
}

describe('several app processes', () => {
  it('saves through one process a log uploaded through another', async () => {
    const [a, b] = [await findFreePort(44000 + Math.floor(Math.random() * 1000)), await findFreePort(45000 + Math.floor(Math.random() * 1000))]
    startProcess('server/index.ts', a)
    startProcess('server/index.ts', b)
    await Promise.all([waitForHealth(a), waitForHealth(b)])
    const s = await signInAt(a, team.users.technician.email)
    const up = await uploadAt(a, s, logText(PASSING))
    expect(up.status, JSON.stringify(up.body)).toBe(201)
    const saved = await saveAt(b, s, up.body.uploadId)
    expect(saved.status, JSON.stringify(saved.body)).toBe(201)
    expect(saved.body.summary.runtimeH).toBeCloseTo(3.2, 6)
    const rows: Array<{ n: number }> = await dataSource.query('SELECT count(*)::int AS n FROM discharge_logs WHERE workspace_id = $1', [team.workspaceId])
    expect(rows[0].n).toBe(1)
    expect(fs.existsSync(path.join(stagingDir(), `${up.body.uploadId}.upload`))).toBe(false)
  }, 120_000)

  it('npm start runs WEB_CONCURRENCY processes behind one port and replaces one that dies', async () => {
    const port = await findFreePort(46000 + Math.floor(Math.random() * 1000))
    const { child, lines } = startProcess('server/cluster.ts', port, { WEB_CONCURRENCY: '2', JOBS: '1' })
    const started = () => lines.map((l) => /started \(pid (\d+)\)/.exec(l)?.[1]).filter((p): p is string => !!p)
    await waitForHealth(port)
    while (started().length < 2) await new Promise((r) => setTimeout(r, 100))
    expect(lines.some((l) => /starting 2 app processes/.test(l))).toBe(true)

    // Upload and save on separate connections to the one port.
    const s = await signInAt(port, team.users.technician.email)
    const up = await uploadAt(port, s, logText({ ...PASSING, v0: 5.65 }))
    expect(up.status, JSON.stringify(up.body)).toBe(201)
    expect((await saveAt(port, s, up.body.uploadId)).status).toBe(201)

    const [first] = started()
    process.kill(Number(first), 'SIGKILL')
    while (started().length < 3) await new Promise((r) => setTimeout(r, 100))
    expect(lines.some((l) => new RegExp(`pid ${first}\\) exited`).test(l))).toBe(true)
    await waitForHealth(port)

    const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)))
    child.kill('SIGTERM')
    expect(await exited).toBe(0)
  }, 180_000)
})
