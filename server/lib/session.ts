/** express-session in PostgreSQL, so sessions survive restarts and work across app processes. */
import connectPgSimple from 'connect-pg-simple'
import session from 'express-session'
import pg from 'pg'
import type { AppConfig } from '../config'

export function createSessionMiddleware(cfg: AppConfig) {
  const PgStore = connectPgSimple(session)
  const pool = new pg.Pool({ connectionString: cfg.db.url, max: 5, connectionTimeoutMillis: 3000 })
  // A dropped connection must not crash the process; the next query reconnects.
  pool.on('error', () => undefined)
  const store = new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 60 * 15 })
  store.on?.('error', () => undefined)
  const middleware = session({
    name: cfg.session.cookieName,
    secret: cfg.session.secret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: cfg.trustProxy > 0,
    cookie: { httpOnly: true, sameSite: 'lax', secure: cfg.https, maxAge: 1000 * 60 * 60 * 24 * 14 },
  })
  return { middleware, close: () => { (store as unknown as { close?: () => void }).close?.(); return pool.end() } }
}
