/**
 * Requests made with an API token are counted per token (in PostgreSQL, so every app process
 * counts the same). Each answer says where the token stands with the `RateLimit-Policy` and
 * `RateLimit` headers of the IETF httpapi rate-limit header draft (the draft-07 form, from memory);
 * past the limit the answer is 429 with `Retry-After` (RFC 9110 §10.2.3). Sessions are not counted here.
 */
import type { RequestHandler } from 'express'
import { count, TooManyError, type Limit } from '../lib/limits'
import { requestToken } from '../lib/request-token'

export function tokenRateLimit(limit: Limit): RequestHandler {
  const windowSeconds = Math.round(limit.windowMs / 1000)
  return (req, res, next) => {
    const token = requestToken()
    if (!token) return next()
    count('api-token', token.id, limit).then(({ hits, resetAt }) => {
      const resetSeconds = Math.max(0, Math.ceil(((resetAt?.getTime() ?? Date.now() + limit.windowMs) - Date.now()) / 1000))
      res.set('RateLimit-Policy', `${limit.max};w=${windowSeconds}`)
      res.set('RateLimit', `limit=${limit.max}, remaining=${Math.max(0, limit.max - hits)}, reset=${resetSeconds}`)
      if (hits > limit.max)
        return next(
          new TooManyError(
            `This API token made more than ${limit.max} requests in ${windowSeconds} seconds.`,
            resetAt ?? new Date(Date.now() + limit.windowMs),
          ),
        )
      next()
    }, next)
  }
}
