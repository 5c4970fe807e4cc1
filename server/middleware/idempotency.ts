/**
 * `Idempotency-Key` on POST routes: the first request with a key runs and its answer is kept for a
 * day; a retry with the same key and the same body gets that answer again (marked
 * `Idempotent-Replayed: true`) without running twice; the same key with another body is refused
 * with 422; a retry while the first is still running answers 409. A server error (5xx) is not kept,
 * so the retry runs. Keys belong to one caller (user and workspace). The conventions follow the
 * IETF httpapi draft "The Idempotency-Key HTTP Header Field" (from memory: draft-ietf-httpapi-idempotency-key-header).
 */
import crypto from 'node:crypto'
import type { Request, RequestHandler, Response } from 'express'
import { dataSource } from '../data-source'
import { AppError, ConflictError, UnprocessableError } from '../errors/app-error'

/** How long an answer is kept for replay (common practice: a day). */
export const IDEMPOTENCY_KEEP_HOURS = 24

const KEY_SHAPE = /^[\x21-\x7e]{1,255}$/

/** Object keys sorted, so the same body written in another key order has the same fingerprint. */
function canonical(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(canonical)
  if (value && typeof value === 'object' && !(value instanceof Date)) {
    return Object.fromEntries(
      Object.keys(value as object)
        .sort()
        .map((k) => [k, canonical((value as Record<string, unknown>)[k])]),
    )
  }
  return value
}

function fingerprintOf(req: Request, body: unknown): string {
  return crypto
    .createHash('sha256')
    .update(`${req.method} ${req.originalUrl}\n${JSON.stringify(canonical(body) ?? null)}`)
    .digest('hex')
}

let lastPurge = 0

/** Answers past their keeping time are never replayed; drop them at most once an hour per process. */
function purgeOldKeys() {
  if (Date.now() - lastPurge < 3600_000) return
  lastPurge = Date.now()
  void dataSource.query('DELETE FROM idempotency_keys WHERE created_at < now() - make_interval(hours => $1)', [IDEMPOTENCY_KEEP_HOURS]).catch(() => undefined)
}

async function keep(id: string, status: number, body: string | null) {
  if (status >= 500) await dataSource.query('DELETE FROM idempotency_keys WHERE id = $1', [id])
  else await dataSource.query('UPDATE idempotency_keys SET status = $2, body = $3 WHERE id = $1', [id, status, body])
}

/** Holds the answer back until it is stored, so a retry that arrives at once finds it. */
function storeAnswerOf(res: Response, id: string) {
  const json = res.json.bind(res)
  const end = res.end.bind(res) as (...args: unknown[]) => Response
  let stored = false
  res.json = (body: unknown) => {
    if (stored) return json(body)
    stored = true
    keep(id, res.statusCode, JSON.stringify(body ?? null)).then(
      () => json(body),
      () => json(body),
    )
    return res
  }
  res.end = ((...args: unknown[]) => {
    if (stored) return end(...args)
    stored = true
    keep(id, res.statusCode, null).then(
      () => end(...args),
      () => end(...args),
    )
    return res
  }) as Response['end']
}

/**
 * Runs after validation (the body is the parsed one). `secret`: the answer carries a secret shown
 * once, which must not be kept, so a key is refused rather than ignored.
 */
export function idempotency(opts: { secret?: boolean } = {}): RequestHandler {
  return async (req, res, next) => {
    const key = req.get('idempotency-key')
    if (key === undefined) return next()
    const header = (message: string) =>
      new AppError(400, 'invalid_input', `Idempotency-Key ${message}`, [
        { path: 'Idempotency-Key', pointer: '/Idempotency-Key', in: 'header', code: 'invalid', message },
      ])
    if (opts.secret) return next(header('is not taken here: this answer carries a secret shown once, which is never stored.'))
    if (!KEY_SHAPE.test(key)) return next(header('must be 1 to 255 visible ASCII characters.'))
    const caller = `${req.ctx?.userId ?? 'anonymous'}|${req.ctx?.workspaceId ?? ''}`
    const fingerprint = fingerprintOf(req, req.body)
    // A new key (or one older than the keeping time) is taken; otherwise the kept row is read.
    const claimed: Array<{ id: string }> = await dataSource.query(
      `INSERT INTO idempotency_keys (caller, key, fingerprint) VALUES ($1, $2, $3)
       ON CONFLICT (caller, key) DO UPDATE SET fingerprint = EXCLUDED.fingerprint, status = NULL, body = NULL, created_at = now()
         WHERE idempotency_keys.created_at < now() - make_interval(hours => $4)
       RETURNING id`,
      [caller, key, fingerprint, IDEMPOTENCY_KEEP_HOURS],
    )
    if (claimed[0]) {
      purgeOldKeys()
      storeAnswerOf(res, claimed[0].id)
      return next()
    }
    const [kept]: Array<{ fingerprint: string; status: number | null; body: string | null }> = await dataSource.query(
      'SELECT fingerprint, status, body FROM idempotency_keys WHERE caller = $1 AND key = $2',
      [caller, key],
    )
    if (!kept) return next(new ConflictError('A request with this Idempotency-Key was still running; try again.'))
    if (kept.fingerprint !== fingerprint) {
      return next(
        new UnprocessableError(
          'This Idempotency-Key was already used for a request with another body or path; use a new key for a new request.',
          [{ path: 'Idempotency-Key', pointer: '/Idempotency-Key', in: 'header', code: 'invalid', message: 'was used for another request' }],
          'idempotency_key_reused',
        ),
      )
    }
    if (kept.status === null) return next(new ConflictError('A request with this Idempotency-Key is still running; try again shortly.'))
    res.set('Idempotent-Replayed', 'true')
    res.status(kept.status)
    if (kept.body === null) res.end()
    else res.type(kept.status >= 400 ? 'application/problem+json' : 'application/json').send(kept.body)
  }
}
