/**
 * A full connection pool is not a database outage: with every pooled connection checked out, a
 * request queues for one, gets it when one comes free, and otherwise answers 503 "busy" with a
 * Retry-After, never "the database is not answering". And what one process may hold is counted.
 */
import type pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { loadConfig } from '../../server/config'
import { dataSource } from '../../server/data-source'
import { appPool, connectionBudget } from '../../server/lib/pools'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client } from '../helpers/test-app'

let built: BuiltApp
let viewer: Client
let pool: pg.Pool
beforeAll(async () => {
  built = await getTestApp()
  const team = await makeTeam('Pool team')
  viewer = await signIn(built.app, team.users.viewer.email)
  pool = appPool() as pg.Pool
})
afterAll(closeTestApp)

const options = () => (pool as unknown as { options: { max: number; connectionTimeoutMillis: number } }).options

/** Checks out every connection of the main pool, as a thousand slow uploads would. */
async function holdAll(): Promise<pg.PoolClient[]> {
  const held: pg.PoolClient[] = []
  while (held.length < options().max) held.push(await pool.connect())
  return held
}

describe('a busy pool is not a database outage', () => {
  it('answers 503 busy with Retry-After when no connection comes free within the wait', async () => {
    const wait = options().connectionTimeoutMillis
    options().connectionTimeoutMillis = 300
    const held = await holdAll()
    try {
      // Past the two-second membership cache, so the request really needs a connection.
      await new Promise((r) => setTimeout(r, 2100))
      const res = await viewer.get('/api/sites')
      expect(res.status).toBe(503)
      expect(res.body.code).toBe('busy')
      expect(res.body.error).not.toMatch(/not answering/)
      expect(res.body.error).toMatch(/busy/)
      expect(Number(res.headers['retry-after'])).toBeGreaterThanOrEqual(1)
    } finally {
      for (const c of held) c.release()
      options().connectionTimeoutMillis = wait
    }
    expect((await viewer.get('/api/sites')).status).toBe(200)
  })

  it('queues a request until a connection comes free', async () => {
    const held = await holdAll()
    await new Promise((r) => setTimeout(r, 2100))
    const pending = viewer.get('/api/sites').then((r) => r)
    // Let the request reach the pool's queue, then free one connection.
    while ((pool as unknown as { waitingCount: number }).waitingCount === 0) await new Promise((r) => setTimeout(r, 10))
    held.pop()?.release()
    const res = await pending
    for (const c of held) c.release()
    expect(res.status).toBe(200)
  })

  it('health says busy, not unreachable, while the pool is full', async () => {
    const wait = options().connectionTimeoutMillis
    options().connectionTimeoutMillis = 300
    const held = await holdAll()
    try {
      const res = await viewer.get('/api/health')
      expect(res.body.database).toBe('busy')
    } finally {
      for (const c of held) c.release()
      options().connectionTimeoutMillis = wait
    }
  })
})

describe('connections one process may hold', () => {
  it('adds the main pool, the session store and the job queue, per process and for every process', () => {
    const cfg = loadConfig({
      DB_POOL_MAX: '7',
      SESSION_POOL_MAX: '3',
      JOBS_POOL_MAX: '2',
      JOBS: '1',
      WEB_CONCURRENCY: '4',
      SESSION_SECRET: 'x'.repeat(40),
      DATA_DIR: '/tmp',
    })
    // Jobs run in one process of the group (npm start gives JOBS=1 to the first only).
    expect(connectionBudget(cfg)).toEqual({ app: 7, sessions: 3, jobs: 2, perProcess: 12, processes: 4, total: 42 })
    const noJobs = loadConfig({ DB_POOL_MAX: '7', SESSION_POOL_MAX: '3', JOBS: '0', WEB_CONCURRENCY: '2', SESSION_SECRET: 'x'.repeat(40), DATA_DIR: '/tmp' })
    expect(connectionBudget(noJobs)).toMatchObject({ jobs: 0, perProcess: 10, total: 20 })
  })

  it('the pools are sized from config', () => {
    expect(options().max).toBe(loadConfig().db.poolMax)
    expect(dataSource.isInitialized).toBe(true)
  })
})
