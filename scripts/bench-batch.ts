/**
 * Batch sizing against single calls, over HTTP to a real app process (its own throwaway database):
 *   500 × POST /api/calc/size?working=false one after another;
 *   the same 500 over 8 connections at once;
 *   1 × POST /api/calc/size/batch with the 500 items (working left out, as the batch does by default).
 * The inputs vary the load so no two items are the same. Each way runs ROUNDS times after one
 * unmeasured warm-up; the median wall time is printed, with the server's CPU for it (from /proc).
 * Run: node --import tsx scripts/bench-batch.ts
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { performance } from 'node:perf_hooks'
import { DEMO_PASSWORD } from '../server/scripts/demo-users'
import { ensurePostgresBinaries, findFreePort, startCluster } from './lib/setup.mjs'

const ITEMS = 500
const CONNECTIONS = 8
const ROUNDS = 3
const work = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-bench-batch-'))
fs.chmodSync(work, 0o755)
let cluster: { url: string; stop(): void } | null = null
let app: ChildProcess | null = null

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1]!
/** CPU time of a process so far, ms (utime + stime from /proc, 100 ticks a second). */
function cpuMsOf(pid: number): number {
  const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')
  return (Number(fields[11]) + Number(fields[12])) * 10
}

async function waitFor(url: string) {
  for (let i = 0; i < 1200; i++) {
    try {
      if ((await fetch(url)).ok) return
    } catch {
      // not yet
    }
    await new Promise((r) => setTimeout(r, 100))
  }
  throw new Error(`${url} did not answer`)
}

const input = (i: number) => ({
  chemistry: 'nicd',
  cellsInSeries: 4,
  duration: '3 h',
  load: { power: `${(1 + (i % 40) * 0.1).toFixed(1)} W` },
  driver: 'converter',
  driverEfficiency: 0.85,
  ambientMax: '30 degC',
})

async function main() {
  const bin = ensurePostgresBinaries()
  cluster = startCluster({ bin, dir: path.join(work, 'pg'), port: await findFreePort(57300), database: 'lampwright_bench' })
  const env = {
    ...process.env,
    NODE_ENV: 'production',
    DATABASE_URL: cluster.url,
    DATA_DIR: path.join(work, 'data'),
    JOBS: '0',
    LOG_LEVEL: 'silent',
    SMTP_CATCHER_PORT: '0',
  }
  for (const script of ['server/scripts/migrate.ts', 'server/scripts/seed.ts']) {
    const r = spawnSync('node', ['--import', 'tsx', script], { env, encoding: 'utf8' })
    if (r.status !== 0) throw new Error(r.stderr)
  }
  const port = await findFreePort(46300)
  app = spawn('node', ['--import', 'tsx', 'server/index.ts'], { env: { ...env, PORT: String(port) }, stdio: 'ignore' })
  const base = `http://127.0.0.1:${port}`
  await waitFor(`${base}/api/health`)
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'designer@tallowmere.example', password: DEMO_PASSWORD }),
  })
  if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status}`)
  const headers = {
    cookie: signIn.headers.get('set-cookie')!.split(';')[0]!,
    'x-csrf-token': ((await signIn.json()) as { csrfToken: string }).csrfToken,
    'content-type': 'application/json',
  }

  const single = async (i: number) => {
    const res = await fetch(`${base}/api/calc/size?working=false`, { method: 'POST', headers, body: JSON.stringify(input(i)) })
    if (res.status !== 200) throw new Error(`single: ${res.status} ${await res.text()}`)
    await res.arrayBuffer()
  }
  const ways: Record<string, () => Promise<void>> = {
    [`${ITEMS} single calls, one after another`]: async () => {
      for (let i = 0; i < ITEMS; i++) await single(i)
    },
    [`${ITEMS} single calls over ${CONNECTIONS} connections`]: async () => {
      let next = 0
      await Promise.all(
        Array.from({ length: CONNECTIONS }, async () => {
          while (next < ITEMS) await single(next++)
        }),
      )
    },
    [`1 batch of ${ITEMS}`]: async () => {
      const res = await fetch(`${base}/api/calc/size/batch`, {
        method: 'POST',
        headers,
        body: JSON.stringify({ items: Array.from({ length: ITEMS }, (_, i) => ({ input: input(i) })) }),
      })
      const body = (await res.json()) as { count: number; failed: number }
      if (res.status !== 200 || body.count !== ITEMS || body.failed) throw new Error(`batch: ${res.status} ${JSON.stringify(body).slice(0, 300)}`)
    },
  }
  console.log(
    `machine: ${os.cpus()[0]?.model ?? 'unknown CPU'} × ${os.cpus().length}, load average ${os
      .loadavg()
      .map((l) => l.toFixed(1))
      .join(' ')}, Node ${process.version}`,
  )
  for (const [name, run] of Object.entries(ways)) {
    await run() // warm-up, unmeasured
    const walls: number[] = []
    const cpus: number[] = []
    for (let r = 0; r < ROUNDS; r++) {
      const cpu0 = cpuMsOf(app.pid!)
      const t0 = performance.now()
      await run()
      walls.push(performance.now() - t0)
      cpus.push(cpuMsOf(app.pid!) - cpu0)
    }
    console.log(
      `${name.padEnd(44)} median ${median(walls).toFixed(0).padStart(6)} ms wall (rounds: ${walls.map((w) => w.toFixed(0)).join(', ')}), server CPU ${median(cpus).toFixed(0)} ms`,
    )
  }
}

main()
  .catch((err) => {
    console.error(err)
    process.exitCode = 1
  })
  .finally(async () => {
    if (app && app.exitCode === null) await new Promise((resolve) => (app!.once('exit', resolve), app!.kill('SIGTERM')))
    cluster?.stop()
    fs.rmSync(work, { recursive: true, force: true })
  })
