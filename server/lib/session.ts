/** express-session in PostgreSQL, so sessions survive restarts and work across app processes. */
import connectPgSimple from 'connect-pg-simple'
import session from 'express-session'
import type { AppConfig } from '../config'
import { hotCache } from './hot-cache'
import { openSessionPool } from './pools'

export function createSessionMiddleware(cfg: AppConfig) {
  const PgStore = connectPgSimple(session)
  const { pool, close: closePool } = openSessionPool(cfg)
  const store = new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 60 * 15, disableTouch: true })
  store.on?.('error', () => undefined)
  cacheSessions(store)
  const middleware = session({
    name: cfg.session.cookieName,
    secret: cfg.session.secret,
    store,
    resave: false,
    saveUninitialized: false,
    // No rolling refresh: an unmodified session is neither re-sent nor written back on every request.
    rolling: false,
    proxy: cfg.trustProxy > 0,
    cookie: { httpOnly: true, sameSite: 'lax', secure: cfg.https, maxAge: 1000 * 60 * 60 * 24 * 14 },
  })
  return {
    middleware,
    close: () => {
      ;(store as unknown as { close?: () => void }).close?.()
      return closePool()
    },
  }
}

type Callback = (err?: unknown, value?: unknown) => void
type StoreLike = {
  get(sid: string, cb: Callback): void
  set(sid: string, sess: unknown, cb?: Callback): void
  destroy(sid: string, cb?: Callback): void
}

/** Reads of a session are served from a two-second cache; writes and destroys go through and update it. */
function cacheSessions(store: StoreLike) {
  const cache = hotCache<{ json: string }>()
  const get = store.get.bind(store)
  const set = store.set.bind(store)
  const destroy = store.destroy.bind(store)
  store.get = (sid, cb) => {
    const hit = cache.get(sid)
    // A copy each time: express-session mutates the object it is given.
    if (hit) return cb(null, JSON.parse(hit.json))
    get(sid, (err, sess) => {
      if (!err && sess) cache.set(sid, { json: JSON.stringify(sess) })
      cb(err, sess)
    })
  }
  store.set = (sid, sess, cb) => {
    cache.delete(sid)
    set(sid, sess, (err) => {
      if (!err) cache.set(sid, { json: JSON.stringify(sess) })
      cb?.(err)
    })
  }
  store.destroy = (sid, cb) => {
    cache.delete(sid)
    destroy(sid, cb)
  }
}
