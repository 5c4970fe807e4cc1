/**
 * Ending a user's sessions at once, in every app process, however busy they are. Deleting session
 * rows alone is not enough: a request in flight (or a session read from the two-second cache)
 * writes its session back afterwards. So each user carries a "sessions valid after" stamp, each
 * session the moment it signed in, and every request compares the two.
 */
import type { EntityManager } from 'typeorm'
import { LRUCache } from 'lru-cache'
import { dataSource } from '../../data-source'
import { forgetUser } from './users.repository'

declare module 'express-session' {
  interface SessionData {
    /** When this session signed in (ms since the epoch). */
    signedInAt?: number
  }
}

/** How long one process trusts its copy of a stamp: a change made elsewhere is seen within this. */
export const STAMP_TTL_MS = 500

const stamps = new LRUCache<string, { at: number }>({ max: 10_000, ttl: STAMP_TTL_MS })

/** The moment before which this user's sessions are void (0: none are). */
export async function sessionsValidAfter(userId: string): Promise<number> {
  const hit = stamps.get(userId)
  if (hit) return hit.at
  const rows: Array<{ at: Date | null }> = await dataSource.query('SELECT sessions_valid_after AS at FROM users WHERE id = $1', [userId])
  const at = rows[0]?.at ? rows[0].at.getTime() : 0
  stamps.set(userId, { at })
  return at
}

/** A session is valid when it signed in at or after its user's stamp. */
export function sessionStillValid(signedInAt: number | undefined, validAfter: number): boolean {
  return (signedInAt ?? 0) >= validAfter
}

/**
 * Ends every session of the user that signed in before now, except `keepSid` (the session making
 * the change, which the caller re-stamps). Returns the stamp.
 */
export async function endSessions(userId: string, opts: { keepSid?: string; manager?: EntityManager } = {}): Promise<number> {
  const q = opts.manager ?? dataSource.manager
  const at = new Date()
  await q.query('UPDATE users SET sessions_valid_after = $2 WHERE id = $1', [userId, at])
  // The stamp alone ends them; deleting the rows keeps the table small.
  await q.query(`DELETE FROM session WHERE (sess::jsonb -> 'passport' ->> 'user') = $1 AND sid <> $2`, [userId, opts.keepSid ?? ''])
  stamps.set(userId, { at: at.getTime() })
  forgetUser(userId)
  return at.getTime()
}
