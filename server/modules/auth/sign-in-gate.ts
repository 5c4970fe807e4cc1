/**
 * The gate in front of the password check. Three counters, all in PostgreSQL so every app process
 * shares them:
 * - failures for one e-mail from one address: the tenth in a row locks that account for that address;
 * - failures from one address across every account: past the limit the address is locked, so one
 *   password sprayed over many accounts is stopped as well as many passwords against one;
 * - the slow lane: while locked, one attempt per short window is let through to the password
 *   check (per account, or per address when the address is locked). The right password signs in
 *   after that wait; a guesser gets one try per window instead of a stream of them.
 * An attempt is counted when it arrives (so a body that fails the schema counts, and two parallel
 * attempts cannot both slip under the limit) and given back when it signs in. An attempt refused
 * unchecked during a wait is given back too, so a person retrying cannot lock their whole office.
 */
import type { Request, Response, RequestHandler } from 'express'
import { AppError } from '../../errors/app-error'
import { clientAddress, count, forget, reset, type Limit, type Limits } from '../../lib/limits'

/** Nine failures are allowed; the tenth attempt in a row meets the lock. */
export const SIGN_IN_FAILURES_PER_ACCOUNT = 9

type LockedBy = 'account' | 'address'

function lockedError(by: LockedBy, seconds: number) {
  const when = seconds >= 120 ? `${Math.ceil(seconds / 60)} minutes` : `${seconds} second${seconds === 1 ? '' : 's'}`
  const message =
    by === 'account'
      ? `Too many failed sign-ins for this e-mail. Try again in ${when}, or reset your password.`
      : `Too many failed sign-ins from your network. Try again in ${when}.`
  return new AppError(429, 'too_many_attempts', message, undefined, {
    retryAfterSeconds: seconds,
    retryAt: new Date(Date.now() + seconds * 1000).toISOString(),
  })
}

const secondsUntil = (at: Date | null, fallbackMs: number) => Math.max(1, Math.ceil(((at?.getTime() ?? Date.now() + fallbackMs) - Date.now()) / 1000))

export function signInGate(accountWindowMs: number, limits: Limits): RequestHandler {
  const perAccount: Limit = { max: SIGN_IN_FAILURES_PER_ACCOUNT, windowMs: accountWindowMs }
  const perAddress = limits.signInFailuresPerAddress
  const lane = limits.signInSlowLane

  async function gate(req: Request, res: Response): Promise<void> {
    const address = clientAddress(req)
    const email = String((req.body as { email?: unknown } | undefined)?.email ?? '')
      .trim()
      .toLowerCase()
    const accountKey = `${address}|${email}`
    const account = await count('sign-in', accountKey, perAccount)
    const wide = await count('sign-in-address', address, perAddress)
    const giveBack = () => Promise.all([forget('sign-in', accountKey, perAccount), forget('sign-in-address', address, perAddress)])

    const by: LockedBy | null = wide.hits > perAddress.max ? 'address' : account.hits > perAccount.max ? 'account' : null
    if (by) {
      const laneKey = by === 'address' ? `address|${address}` : `account|${accountKey}`
      const justLocked = by === 'address' ? wide.hits === perAddress.max + 1 : account.hits === perAccount.max + 1
      if (justLocked) {
        // The attempt that meets the lock is refused, stays counted, and starts the first wait.
        const turn = await count('sign-in-lane', laneKey, lane)
        throw lockedError(by, secondsUntil(turn.resetAt, lane.windowMs))
      }
      const turn = await count('sign-in-lane', laneKey, lane)
      if (turn.hits > lane.max) {
        await giveBack()
        throw lockedError(by, secondsUntil(turn.resetAt, lane.windowMs))
      }
      // This attempt's turn: on to the password check; a wrong password is still answered as locked.
      res.locals.signInLockedBy = { by, seconds: Math.ceil(lane.windowMs / 1000) }
    }
    // Signed in: this attempt was no failure, and the account's run of failures is over. Done before
    // the answer leaves (signInSucceeded), so the client's next request already sees the counters cleared.
    res.locals.signInSucceeded = () => Promise.all([forget('sign-in-address', address, perAddress), reset('sign-in', accountKey, perAccount)])
  }

  return (req, res, next) => {
    gate(req, res).then(
      () => next(),
      (err: unknown) => {
        if (err instanceof AppError && err.status === 429) res.set('Retry-After', String(err.details?.retryAfterSeconds ?? 60))
        next(err)
      },
    )
  }
}

/** A wrong password that came through the slow lane: still locked, with the next wait. */
export function stillLocked(res: Response): AppError | null {
  const locked = res.locals.signInLockedBy as { by: LockedBy; seconds: number } | undefined
  return locked ? lockedError(locked.by, locked.seconds) : null
}

/** Clears the failures the gate counted for this attempt; the sign-in route awaits it before it answers. */
export async function signInSucceeded(res: Response): Promise<void> {
  await (res.locals.signInSucceeded as (() => Promise<unknown>) | undefined)?.()
}
