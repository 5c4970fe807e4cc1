/**
 * Runs WEB_CONCURRENCY app processes (default: the number of CPUs) behind one port with node's
 * cluster module. Each process is stateless: sessions, limits, jobs and staged uploads are in
 * PostgreSQL (the bytes of an upload in the shared DATA_DIR folder), so any process serves any
 * request. Background jobs run in the first process only. A process that dies is replaced.
 */
import cluster, { type Worker } from 'node:cluster'
import { config } from './config'

const say = (line: string) => process.stdout.write(`[lampwright] ${line}\n`)

if (cluster.isPrimary) {
  // Loading the config here first writes the session secret once, before any process reads it.
  const cfg = config()
  const count = cfg.webConcurrency
  const slots = new Map<number, number>()
  const restarts: number[] = []
  let stopping = false

  const fork = (slot: number): Worker => {
    // Jobs (reminders) in slot 0 only, unless they are off everywhere.
    const worker = cluster.fork({ LAMPWRIGHT_WORKER: String(slot), JOBS: slot === 0 && cfg.jobs ? '1' : '0' })
    slots.set(worker.id, slot)
    worker.once('online', () => say(`app process ${slot + 1} of ${count} started (pid ${worker.process.pid})`))
    return worker
  }

  say(`starting ${count} app process${count === 1 ? '' : 'es'} on ${cfg.origin}`)
  for (let slot = 0; slot < count; slot++) fork(slot)

  cluster.on('exit', (worker, code, signal) => {
    const slot = slots.get(worker.id) ?? 0
    slots.delete(worker.id)
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0)
      return
    }
    say(`app process ${slot + 1} (pid ${worker.process.pid}) exited (${signal ?? code}); starting a new one`)
    const now = Date.now()
    restarts.push(now)
    while (restarts.length && now - restarts[0] > 60_000) restarts.shift()
    if (restarts.length > 5 * count) {
      say('app processes keep exiting; stopping')
      process.exit(1)
    }
    fork(slot)
  })

  const stop = (signal: NodeJS.Signals) => {
    if (stopping) return
    stopping = true
    const workers = Object.values(cluster.workers ?? {}).filter((w): w is Worker => !!w)
    if (!workers.length) process.exit(0)
    for (const w of workers) w.process.kill(signal)
    // Each process closes its connections itself; do not wait for ever.
    setTimeout(() => process.exit(0), 10_000).unref()
  }
  process.on('SIGINT', () => stop('SIGINT'))
  process.on('SIGTERM', () => stop('SIGTERM'))
} else {
  await import('./index')
}
