/**
 * The PostgreSQL connections one app process may hold, and how to tell a pool that is merely full
 * (every connection busy: answer 503 "busy", try again in a moment) from a database that is away.
 * Every pool is opened here or from here: TypeORM's (server/data-source.ts, sized by the same
 * config), the session store's and the job queue's. tests/shared/source-layout.test.ts fails on a
 * pool opened anywhere else.
 */
import pg from 'pg'
import PgBoss from 'pg-boss'
import type { AppConfig } from '../config'
import { dataSource } from '../data-source'

export interface ConnectionBudget {
  /** The main pool (TypeORM): every request's queries. */
  app: number
  /** The session store's pool. */
  sessions: number
  /** The job queue's pool (0 when JOBS=0). */
  jobs: number
  /** The most one process holds (the one that runs the jobs). */
  perProcess: number
  processes: number
  /** All app processes of one `npm start` together (jobs run in one of them). */
  total: number
}

export function connectionBudget(cfg: AppConfig, processes = cfg.webConcurrency): ConnectionBudget {
  const app = cfg.db.poolMax
  const sessions = cfg.db.sessionPoolMax
  const jobs = cfg.jobs ? cfg.db.jobsPoolMax : 0
  const perProcess = app + sessions + jobs
  return { app, sessions, jobs, perProcess, processes, total: (app + sessions) * processes + jobs }
}

/** The main pool of this process (pg.Pool under TypeORM), once the data source is up. */
export function appPool(): pg.Pool | null {
  if (!dataSource.isInitialized) return null
  return (dataSource.driver as unknown as { master?: pg.Pool }).master ?? null
}

const otherPools = new Set<pg.Pool>()
/** Pools besides the main one (the session store's) whose wait timeouts also mean "busy". */
export function registerPool(pool: pg.Pool): () => void {
  otherPools.add(pool)
  return () => otherPools.delete(pool)
}

/** The session store's pool, registered so that its wait timeouts also read as "busy". */
export function openSessionPool(cfg: AppConfig): { pool: pg.Pool; close: () => Promise<void> } {
  const pool = new pg.Pool({ connectionString: cfg.db.url, max: cfg.db.sessionPoolMax, connectionTimeoutMillis: cfg.db.poolWaitMs })
  // A dropped connection must not crash the process; the next query reconnects.
  pool.on('error', () => undefined)
  const unregister = registerPool(pool)
  return {
    pool,
    close: () => {
      unregister()
      return pool.end()
    },
  }
}

/** The job queue (pg-boss), which keeps its own pool of at most JOBS_POOL_MAX connections. */
export function openJobQueue(cfg: AppConfig): PgBoss {
  return new PgBoss({ connectionString: cfg.db.url, max: cfg.db.jobsPoolMax })
}

function isFull(pool: pg.Pool): boolean {
  const max = (pool as unknown as { options: { max: number } }).options.max
  return pool.totalCount >= max && pool.idleCount === 0
}

/** True when every connection of a pool is checked out: a wait that timed out now was a queue, not an outage. */
export function appPoolIsFull(): boolean {
  const pool = appPool()
  return (pool !== null && isFull(pool)) || [...otherPools].some(isFull)
}

/** The error pg-pool gives when no connection came free (or none could be made) within the wait. */
export function isPoolWaitTimeout(err: unknown): boolean {
  return /timeout exceeded when trying to connect/i.test(String((err as { message?: string })?.message ?? ''))
}

/** Compares what every process may hold with what the server allows; a sentence when it does not fit. */
export async function budgetWarning(budget: ConnectionBudget): Promise<string | null> {
  const rows: Array<{ max: string; reserved: string }> = await dataSource.query(
    `SELECT current_setting('max_connections') AS max, current_setting('superuser_reserved_connections') AS reserved`,
  )
  const allowed = Number(rows[0].max) - Number(rows[0].reserved)
  if (budget.total <= allowed) return null
  return `${budget.processes} app processes may hold ${budget.total} PostgreSQL connections (${budget.perProcess} each: app ${budget.app}, sessions ${budget.sessions}, jobs ${budget.jobs}) but the server allows ${allowed}; lower DB_POOL_MAX or WEB_CONCURRENCY, or raise max_connections.`
}
