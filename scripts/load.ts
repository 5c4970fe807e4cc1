/**
 * `npm run load`: drives a real Lampwright process on loopback with autocannon through a realistic
 * mix (list sheets, open a sheet, compute a size, save a revision; sign-in separately since bcrypt is
 * deliberately slow) at 50 and 200 connections, and the same tool against a bare Express handler on
 * the same machine in the same run, so the ratio holds on a noisy machine. Bounded in time.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import autocannon from 'autocannon'
import { DEMO_PASSWORD } from '../server/scripts/demo-users'
import { LAYERS } from './load-layers'
import { accountScenario, printAccountFigures } from './load-accounts'
import { ensurePostgresBinaries, findFreePort, startCluster } from './lib/setup.mjs'

const DURATION_S = Number(process.env.LOAD_SECONDS ?? 8)
/** LOAD_PROFILE_DIR=/some/dir writes a V8 CPU profile of the app process there (open it in Chrome's DevTools). */
const PROFILE_DIR = process.env.LOAD_PROFILE_DIR
/** LOAD_CONNECTIONS=50 runs one connection count instead of 50 and 200. */
const CONNECTIONS = process.env.LOAD_CONNECTIONS ? process.env.LOAD_CONNECTIONS.split(',').map(Number) : [50, 200]
/**
 * LOAD_SCENARIOS=compute,reads runs only those (of bare, reads, compute, lean, mix, sign-in, processes, accounts, layers);
 * the ratios need bare. `layers` (not in the default run) serves the compute route through the app's
 * middleware one layer at a time and prints what each costs.
 */
const SCENARIOS = new Set((process.env.LOAD_SCENARIOS ?? 'bare,reads,compute,lean,mix,sign-in,processes,accounts').split(','))
/** `processes`: the reads through `server/cluster.ts` with 1 and with N app processes (WEB_CONCURRENCY, default one per CPU). */
const PROCESSES = Number(process.env.WEB_CONCURRENCY ?? Math.max(1, os.availableParallelism()))
const work = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-load-'))
fs.chmodSync(work, 0o755)
const children: ChildProcess[] = []
let cluster: { url: string; stop(): void } | null = null

async function waitFor(url: string) {
  // Up to two minutes: on a busy machine tsx alone can take most of a minute to start a process.
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

type Result = autocannon.Result
function once(opts: autocannon.Options): Promise<Result> {
  return new Promise((resolve, reject) => {
    autocannon({ duration: DURATION_S, timeout: 10, ...opts }, (err, res) => (err ? reject(err) : resolve(res)))
  })
}

/** CPU time (user + system, ms) of some processes, from /proc: what a scenario really costs each side. */
function cpuMs(pids: number[]): number {
  let ticks = 0
  for (const pid of pids) {
    try {
      const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ')
      ticks += Number(fields[11]) + Number(fields[12])
    } catch {
      // gone meanwhile
    }
  }
  return (ticks * 1000) / 100
}

/** The postmaster of the load cluster and its backends. */
function postgresPids(pgDir: string): number[] {
  const postmaster = Number(fs.readFileSync(path.join(pgDir, 'postmaster.pid'), 'utf8').split('\n')[0])
  const pids = [postmaster]
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue
    try {
      if (Number(fs.readFileSync(`/proc/${entry}/stat`, 'utf8').split(') ')[1].split(' ')[1]) === postmaster) pids.push(Number(entry))
    } catch {
      // gone meanwhile
    }
  }
  return pids
}

let pgDir = ''

/** Two seconds of the same load first, not counted, so the figures are of warmed-up code on both sides. */
async function run(opts: autocannon.Options, server: ChildProcess | number[]): Promise<Result> {
  await once({ ...opts, duration: 2 })
  const pids = Array.isArray(server) ? server : [server.pid!]
  const pg = pgDir ? postgresPids(pgDir) : []
  const before = { app: cpuMs(pids), pg: cpuMs(pg) }
  const result = await once(opts)
  cpuPerRequest.set(result, { app: (cpuMs(pids) - before.app) / result.requests.total, pg: (cpuMs(pg) - before.pg) / result.requests.total })
  return result
}

/** `server/cluster.ts` with `count` app processes on a port of its own; the pids of the primary and every process. */
async function startGroup(env: NodeJS.ProcessEnv, count: number): Promise<{ base: string; pids: number[]; stop: () => Promise<void> }> {
  const port = await findFreePort(49000 + count * 100)
  const group = spawn('node', ['--import', 'tsx', 'server/cluster.ts'], {
    env: { ...env, PORT: String(port), WEB_CONCURRENCY: String(count) },
    stdio: ['ignore', 'pipe', 'inherit'],
  })
  children.push(group)
  const pids: number[] = [group.pid!]
  group.stdout!.setEncoding('utf8').on('data', (chunk: string) => {
    for (const m of chunk.matchAll(/started \(pid (\d+)\)/g)) pids.push(Number(m[1]))
  })
  const base = `http://127.0.0.1:${port}`
  await waitFor(`${base}/api/health`)
  while (pids.length < count + 1) await new Promise((r) => setTimeout(r, 100))
  return { base, pids, stop: () => new Promise((resolve) => (group.once('exit', () => resolve()), group.kill('SIGTERM'))) }
}
const cpuPerRequest = new WeakMap<Result, { app: number; pg: number }>()

function row(label: string, r: Result) {
  const lat = r.latency as unknown as Record<string, number>
  const p95 = lat.p95 ?? lat.p97_5
  return {
    scenario: label,
    'req/s': Math.round(r.requests.average),
    'p50 ms': lat.p50,
    'p95 ms': p95,
    'p99 ms': lat.p99,
    errors: r.errors + r.timeouts,
    non2xx: r.non2xx,
    requests: r.requests.total,
    'server CPU ms/req': cpuPerRequest.has(r) ? cpuPerRequest.get(r)!.app.toFixed(2) : '',
    'PostgreSQL CPU ms/req': cpuPerRequest.has(r) && pgDir ? cpuPerRequest.get(r)!.pg.toFixed(2) : '',
  }
}

async function main() {
  const bin = ensurePostgresBinaries()
  const pgPort = await findFreePort(57000)
  pgDir = path.join(work, 'pg')
  cluster = startCluster({ bin, dir: pgDir, port: pgPort, database: 'lampwright_load' })
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
  const appPort = await findFreePort(46000)
  const barePort = await findFreePort(47000)
  const profile = PROFILE_DIR ? ['--cpu-prof', `--cpu-prof-dir=${path.resolve(PROFILE_DIR)}`] : []
  const app = spawn('node', [...profile, '--import', 'tsx', 'server/index.ts'], { env: { ...env, PORT: String(appPort) }, stdio: 'ignore' })
  const bareServer = spawn(
    'node',
    [
      '-e',
      `const e=require('express');const a=e();a.get('/bare',(q,s)=>s.json({ok:true}));a.post('/bare',e.json(),(q,s)=>s.json({ok:true,n:q.body&&q.body.n}));a.listen(${barePort},'127.0.0.1')`,
    ],
    { stdio: 'ignore' },
  )
  children.push(app, bareServer)
  const base = `http://127.0.0.1:${appPort}`
  await waitFor(`${base}/api/health`)
  await waitFor(`http://127.0.0.1:${barePort}/bare`)

  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'designer@tallowmere.example', password: DEMO_PASSWORD }),
  })
  if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status}`)
  const cookie = signIn.headers.get('set-cookie')!.split(';')[0]
  const csrf = (await signIn.json()).csrfToken as string
  const headers = { cookie, 'x-csrf-token': csrf, 'content-type': 'application/json' }

  // One sheet per connection for saves, so revisions do not collide.
  const sizeBody = JSON.stringify({
    chemistry: 'nicd',
    duration: '3 h',
    load: { ledVoltage: '3.2 V', ledCurrent: '250 mA' },
    driver: 'converter',
    driverEfficiency: 0.85,
    ambientMax: '35 degC',
  })
  const sheets: Array<{ id: string; version: number }> = []
  for (let i = 0; i < 200; i++) {
    const res = await fetch(`${base}/api/sheets`, { method: 'POST', headers, body: JSON.stringify({ title: `Load sheet ${i}`, inputs: JSON.parse(sizeBody) }) })
    if (res.status !== 201) throw new Error(`create sheet: ${res.status} ${await res.text()}`)
    const body = await res.json()
    sheets.push({ id: body.id ?? body.sheet?.id, version: body.version ?? body.sheet?.version ?? 1 })
  }

  // One request at a time first: what each route costs with no queueing, the floor under the loaded figures.
  const single = async (label: string, path: string, init: RequestInit = {}) => {
    const times: number[] = []
    for (let i = 0; i < 60; i++) {
      const start = performance.now()
      const res = await fetch(`${base}${path}`, { headers, ...init })
      await res.arrayBuffer()
      if (i >= 10) times.push(performance.now() - start)
    }
    times.sort((a, b) => a - b)
    console.log(`unloaded ${label.padEnd(34)} median ${times[times.length >> 1].toFixed(2)} ms`)
  }
  await single('GET /api/sheets', '/api/sheets?page=1&pageSize=20')
  await single('GET /api/sheets/:id', `/api/sheets/${sheets[0].id}`)
  await single('POST /api/calc/size', '/api/calc/size', { method: 'POST', body: sizeBody })
  await single('POST /api/calc/size?working=false', '/api/calc/size?working=false', { method: 'POST', body: sizeBody })
  await single('GET /api/health', '/api/health')

  const results: ReturnType<typeof row>[] = []
  for (const connections of CONNECTIONS) {
    // Like with like: reads against the bare GET, the compute route against a bare POST of the same JSON body.
    let bareGet: Result | null = null
    let barePost: Result | null = null
    if (SCENARIOS.has('bare')) {
      bareGet = await run({ url: `http://127.0.0.1:${barePort}/bare`, connections }, bareServer)
      results.push(row(`bare Express GET, ${connections} conn`, bareGet))
      barePost = await run(
        { url: `http://127.0.0.1:${barePort}/bare`, method: 'POST', connections, headers: { 'content-type': 'application/json' }, body: sizeBody },
        bareServer,
      )
      results.push(row(`bare Express POST (same body), ${connections} conn`, barePost))
    }

    if (SCENARIOS.has('reads')) {
      const reads = await run(
        {
          url: base,
          connections,
          headers,
          requests: [
            { method: 'GET', path: '/api/sheets?page=1&pageSize=20' },
            { method: 'GET', setupRequest: (req) => ({ ...req, path: `/api/sheets/${sheets[Math.floor(Math.random() * sheets.length)].id}` }) },
          ],
        },
        app,
      )
      results.push(row(`reads (list + open sheet), ${connections} conn`, reads))
    }

    const ratio = (r: Result, bare: Result | null) => (bare ? (r.requests.average / bare.requests.average).toFixed(2) : 'n/a')
    for (const [scenario, query, label] of [
      ['compute', '', 'compute POST /api/calc/size'],
      ['lean', '?working=false', 'compute, numbers only (?working=false)'],
    ] as const) {
      if (!SCENARIOS.has(scenario)) continue
      const r = await run({ url: `${base}/api/calc/size${query}`, method: 'POST', connections, headers, body: sizeBody }, app)
      results.push(row(`${label}, ${connections} conn`, r))
      console.log(
        `${label} / bare throughput at ${connections} connections: ${ratio(r, barePost)} against the bare POST, ${ratio(r, bareGet)} against the bare GET`,
      )
    }
    if (SCENARIOS.has('layers')) {
      for (let layer = 0; layer < LAYERS.length; layer++) {
        const port = await findFreePort(48000)
        const server = spawn('node', ['--import', 'tsx', 'scripts/load-layers.ts'], {
          env: { ...env, PORT: String(port), LAYERS: String(layer) },
          stdio: ['ignore', 'pipe', 'inherit'],
        })
        children.push(server)
        await new Promise((resolve) => server.stdout!.once('data', resolve))
        const r = await run({ url: `http://127.0.0.1:${port}/api/calc/size`, method: 'POST', connections, headers, body: sizeBody }, server)
        results.push(row(`layer ${layer}: ${LAYERS[layer]}, ${connections} conn`, r))
        await new Promise((resolve) => (server.once('exit', resolve), server.kill('SIGTERM')))
      }
    }
    if (!SCENARIOS.has('mix')) continue

    // The realistic mix: list, open, compute, open, save a revision (each connection its own sheet).
    let next = 0
    const mix = await run(
      {
        url: base,
        connections,
        headers,
        requests: [
          { method: 'GET', path: '/api/sheets?page=1&pageSize=20' },
          {
            method: 'GET',
            setupRequest: (req, ctx: object) => {
              const context = ctx as Record<string, unknown>
              context.sheet ??= sheets[next++ % sheets.length]
              return { ...req, path: `/api/sheets/${(context.sheet as { id: string }).id}` }
            },
            onResponse: (status, body, ctx: object) => {
              const context = ctx as Record<string, unknown>
              if (status === 200) {
                const parsed = JSON.parse(body)
                context.version = parsed.version ?? parsed.sheet?.version
              }
            },
          },
          { method: 'POST', path: '/api/calc/size', body: sizeBody },
          {
            method: 'PUT',
            setupRequest: (req, ctx: object) => {
              const context = ctx as Record<string, unknown>
              return {
                ...req,
                path: `/api/sheets/${(context.sheet as { id: string }).id}`,
                body: JSON.stringify({ title: 'Load sheet (saved)', inputs: JSON.parse(sizeBody), version: context.version }),
              }
            },
          },
        ],
      },
      app,
    )
    results.push(row(`mix (list, open, compute, save), ${connections} conn`, mix))
  }
  if (SCENARIOS.has('processes')) {
    // The same reads at the largest connection count through 1 and through N processes behind one port.
    const connections = Math.max(...CONNECTIONS)
    const side: Array<{ processes: number; r: Result; busy: number; unavailable: number }> = []
    for (const count of [...new Set([1, PROCESSES])]) {
      const group = await startGroup(env, count)
      const counts = { busy: 0, unavailable: 0 }
      const tally = (status: number, body: string) => {
        if (status !== 503) return
        if (body.includes('"busy"')) counts.busy++
        else counts.unavailable++
      }
      const r = await run(
        {
          url: group.base,
          connections,
          headers,
          requests: [
            { method: 'GET', path: '/api/sheets?page=1&pageSize=20', onResponse: tally },
            {
              method: 'GET',
              setupRequest: (req) => ({ ...req, path: `/api/sheets/${sheets[Math.floor(Math.random() * sheets.length)].id}` }),
              onResponse: tally,
            },
          ],
        },
        group.pids,
      )
      await group.stop()
      side.push({ processes: count, r, ...counts })
      results.push({
        ...row(`reads, ${count} app process${count === 1 ? '' : 'es'} (cluster), ${connections} conn`, r),
        'server CPU ms/req': `${cpuPerRequest.get(r)!.app.toFixed(2)} (all processes)`,
      })
    }
    const one = side[0]
    console.log('\nreads through server/cluster.ts, side by side:')
    console.table(
      side.map((s) => ({
        processes: s.processes,
        'req/s': Math.round(s.r.requests.average),
        'p95 ms': (s.r.latency as unknown as Record<string, number>).p95 ?? (s.r.latency as unknown as Record<string, number>).p97_5,
        'p99 ms': s.r.latency.p99,
        errors: s.r.errors + s.r.timeouts,
        non2xx: s.r.non2xx,
        '503 busy': s.busy,
        '503 other': s.unavailable,
      })),
    )
    for (const s of side.slice(1)) console.log(`throughput ${s.processes} processes / 1 process: ${(s.r.requests.average / one.r.requests.average).toFixed(2)}`)
  }
  if (SCENARIOS.has('sign-in')) {
    const signIns = await run(
      {
        url: `${base}/api/auth/sign-in`,
        method: 'POST',
        connections: 4,
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email: 'viewer@tallowmere.example', password: DEMO_PASSWORD }),
      },
      app,
    )
    results.push(row('sign-in (bcrypt cost 12), 4 conn', signIns))
  }

  if (SCENARIOS.has('accounts')) {
    // Its own app process, trusting one proxy hop, so each request can come from its own address.
    const port = await findFreePort(45000)
    const accounts = spawn('node', ['--import', 'tsx', 'server/index.ts'], { env: { ...env, PORT: String(port), TRUST_PROXY: '1' }, stdio: 'ignore' })
    children.push(accounts)
    await waitFor(`http://127.0.0.1:${port}/api/health`)
    printAccountFigures(await accountScenario(`http://127.0.0.1:${port}`))
  }

  console.log(`\nmachine: ${os.cpus()[0]?.model} × ${os.cpus().length}, Node ${process.version}; ${DURATION_S} s per scenario`)
  console.table(results)
}

main()
  .catch((err) => {
    console.error(err)
    process.exitCode = 1
  })
  .finally(async () => {
    // Let the app shut down by itself (it writes its CPU profile on the way out) before the database goes.
    await Promise.all(children.map((c) => new Promise((resolve) => (c.exitCode !== null ? resolve(null) : (c.once('exit', resolve), c.kill('SIGTERM'))))))
    cluster?.stop()
    fs.rmSync(work, { recursive: true, force: true })
  })
