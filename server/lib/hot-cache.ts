/**
 * Short-lived read caches in front of PostgreSQL for what every request needs (its session, its
 * user, its membership). Two seconds is long enough to spare the database under load and short
 * enough that a change made on another app process (a sign-out, a role change) takes effect almost
 * at once; changes made in this process clear the entry immediately. See docs/security.md.
 */
import { LRUCache } from 'lru-cache'

export const HOT_TTL_MS = 2000

export function hotCache<V extends object>(max = 5000) {
  return new LRUCache<string, V>({ max, ttl: HOT_TTL_MS })
}
