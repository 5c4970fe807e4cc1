/**
 * Limits on what costs us mail or CPU (sign-up, password reset, mail sends), counted in PostgreSQL
 * like the sign-in limit, so every app process shares them. Each limit is a number of requests per
 * window for one key (a client address, or a target e-mail address); keys are stored hashed.
 */
import type { Request, RequestHandler } from 'express'
import { ipKeyGenerator } from 'express-rate-limit'
import { AppError } from '../errors/app-error'
import { PostgresHitStore } from './rate-limit-store'

export interface Limit {
  max: number
  windowMs: number
}

const HOUR = 60 * 60 * 1000

/** The defaults; `createApp({ limits })` and the tests change them. Each is counted per key. */
export const DEFAULT_LIMITS = {
  /** Sign-ups from one client address. */
  signUpPerAddress: { max: 10, windowMs: HOUR },
  /** Sign-ups naming one e-mail address (each sends that address a mail). */
  signUpPerEmail: { max: 3, windowMs: HOUR },
  /** Reset requests from one client address. */
  forgotPerAddress: { max: 20, windowMs: HOUR },
  /** Reset requests for one e-mail address (each sends it a mail). */
  forgotPerEmail: { max: 3, windowMs: HOUR },
  /** Reset and confirmation link attempts from one client address. */
  linkPerAddress: { max: 30, windowMs: HOUR },
  /** Mails to one recipient for invitations, shared sheets and account mail (reminders are not counted). */
  mailPerRecipient: { max: 5, windowMs: HOUR },
  /** Failed sign-ins from one client address, across every account. */
  signInFailuresPerAddress: { max: 20, windowMs: 15 * 60 * 1000 },
  /**
   * Through a sign-in lockout: one password check per window for the locked account (or, when the
   * address is locked, for the whole address). The right password gets in after this wait.
   */
  signInSlowLane: { max: 1, windowMs: 15 * 1000 },
  /** Requests made with one API token (common practice for a script: ten a second on average). */
  tokenRequests: { max: 600, windowMs: 60 * 1000 },
} satisfies Record<string, Limit>

export type Limits = typeof DEFAULT_LIMITS

function when(seconds: number) {
  return seconds >= 120 ? `${Math.ceil(seconds / 60)} minutes` : `${seconds} seconds`
}

export class TooManyError extends AppError {
  constructor(what: string, resetAt: Date) {
    const seconds = Math.max(1, Math.ceil((resetAt.getTime() - Date.now()) / 1000))
    super(429, 'too_many_requests', `${what} Try again in ${when(seconds)}.`, undefined, { retryAfterSeconds: seconds, retryAt: resetAt.toISOString() })
  }
}

const stores = new Map<string, PostgresHitStore>()
function store(bucket: string, windowMs: number) {
  const key = `${bucket}|${windowMs}`
  let s = stores.get(key)
  if (!s) {
    s = new PostgresHitStore(`${bucket}|`)
    s.windowMs = windowMs
    stores.set(key, s)
  }
  return s
}

/** Counts one use of `key` in `bucket`; throws 429 (with when to retry) past the limit. */
export async function spend(bucket: string, key: string, limit: Limit, what: string): Promise<void> {
  const hit = await store(bucket, limit.windowMs).increment(key)
  if (hit.totalHits > limit.max) throw new TooManyError(what, hit.resetTime ?? new Date(Date.now() + limit.windowMs))
}

/** How many uses are counted for `key` now (without counting one). */
export async function used(bucket: string, key: string, limit: Limit): Promise<{ hits: number; resetAt: Date | null }> {
  const info = await store(bucket, limit.windowMs).get(key)
  return { hits: info?.totalHits ?? 0, resetAt: info?.resetTime ?? null }
}

/** Counts one use of `key` in `bucket` and returns the count with this one, without refusing anything. */
export async function count(bucket: string, key: string, limit: Limit): Promise<{ hits: number; resetAt: Date | null }> {
  const hit = await store(bucket, limit.windowMs).increment(key)
  return { hits: hit.totalHits, resetAt: hit.resetTime ?? null }
}

/** Starts the count for `key` again. */
export async function reset(bucket: string, key: string, limit: Limit): Promise<void> {
  await store(bucket, limit.windowMs).resetKey(key)
}

export async function forget(bucket: string, key: string, limit: Limit): Promise<void> {
  await store(bucket, limit.windowMs).decrement(key)
}

export function clientAddress(req: Request): string {
  return ipKeyGenerator(req.ip ?? '0.0.0.0')
}

/** Middleware: one use per request from the client's address. */
export function perAddress(bucket: string, limit: Limit, what: string): RequestHandler {
  return (req, res, next) => {
    spend(bucket, clientAddress(req), limit, what).then(
      () => next(),
      (err: unknown) => {
        if (err instanceof TooManyError) res.set('Retry-After', String(err.details?.retryAfterSeconds ?? 60))
        next(err)
      },
    )
  }
}

/** Middleware: one use per request for the e-mail address in the body (counted whether or not it has an account). */
export function perEmail(bucket: string, limit: Limit, what: string): RequestHandler {
  return (req, res, next) => {
    const email = String((req.body as { email?: unknown } | undefined)?.email ?? '')
      .trim()
      .toLowerCase()
    if (!email) return next()
    spend(bucket, email, limit, what).then(
      () => next(),
      (err: unknown) => {
        if (err instanceof TooManyError) res.set('Retry-After', String(err.details?.retryAfterSeconds ?? 60))
        next(err)
      },
    )
  }
}
