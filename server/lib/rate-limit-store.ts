/**
 * A hit counter for express-rate-limit kept in PostgreSQL, so every app process behind one
 * database counts the same failed sign-ins (a memory store would give each process its own ten).
 * Keys are stored as SHA-256 hashes: the table holds no e-mail or address.
 */
import crypto from 'node:crypto'
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit'
import { dataSource } from '../data-source'

const hash = (key: string) => crypto.createHash('sha256').update(key).digest('hex')

export class PostgresHitStore implements Store {
  windowMs = 60_000
  localKeys = false
  constructor(readonly prefix: string) {}

  init(options: Options) {
    this.windowMs = options.windowMs
    // Counters past their window are never read again; drop the old ones when an app starts.
    if (dataSource.isInitialized) void dataSource.query("DELETE FROM rate_limit_hits WHERE reset_at < now() - interval '1 day'").catch(() => undefined)
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const rows: Array<{ hits: number; reset_at: Date }> = await dataSource.query(
      'SELECT hits, reset_at FROM rate_limit_hits WHERE key = $1 AND reset_at > now()',
      [hash(this.prefix + key)],
    )
    return rows[0] ? { totalHits: rows[0].hits, resetTime: rows[0].reset_at } : undefined
  }

  /** One statement: a counter past its window starts again at 1 with a new window. */
  async increment(key: string): Promise<ClientRateLimitInfo> {
    const rows: Array<{ hits: number; reset_at: Date }> = await dataSource.query(
      `INSERT INTO rate_limit_hits (key, hits, reset_at) VALUES ($1, 1, now() + $2 * interval '1 millisecond')
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN rate_limit_hits.reset_at <= now() THEN 1 ELSE rate_limit_hits.hits + 1 END,
         reset_at = CASE WHEN rate_limit_hits.reset_at <= now() THEN EXCLUDED.reset_at ELSE rate_limit_hits.reset_at END
       RETURNING hits, reset_at`,
      [hash(this.prefix + key), this.windowMs],
    )
    return { totalHits: rows[0].hits, resetTime: rows[0].reset_at }
  }

  async decrement(key: string): Promise<void> {
    await dataSource.query('UPDATE rate_limit_hits SET hits = GREATEST(hits - 1, 0) WHERE key = $1', [hash(this.prefix + key)])
  }

  async resetKey(key: string): Promise<void> {
    await dataSource.query('DELETE FROM rate_limit_hits WHERE key = $1', [hash(this.prefix + key)])
  }
}
