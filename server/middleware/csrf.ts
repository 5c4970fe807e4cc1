/**
 * CSRF defence for cookie sessions (see docs/security.md). A state-changing request passes when
 * its Origin (or Referer) is this app's own origin, or when it carries the session's token in
 * X-CSRF-Token. A foreign Origin is always refused. Requests with an API token carry no ambient
 * credentials and are exempt; so are requests without any session cookie.
 */
import type { RequestHandler } from 'express'
import { AppError } from '../errors/app-error'
import { safeEqual } from '../lib/tokens'

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

function originOf(value: string | undefined): string | null {
  if (!value) return null
  try {
    return new URL(value).host
  } catch {
    return 'invalid'
  }
}

export function csrfProtection(cookieName: string, allowedOrigin: string): RequestHandler {
  const allowedHost = new URL(allowedOrigin).host
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next()
    if (/^bearer\b/i.test(req.headers.authorization ?? '')) return next()
    const originHost = originOf(req.headers.origin) ?? originOf(req.headers.referer)
    const sameOrigin = originHost !== null && (originHost === req.headers.host || originHost === allowedHost)
    if (originHost !== null && !sameOrigin) {
      return next(new AppError(403, 'csrf', 'Request refused: it came from another site (cross-site request protection).'))
    }
    if (sameOrigin) return next()
    const hasSessionCookie = (req.headers.cookie ?? '').split(';').some((c) => c.trim().startsWith(`${cookieName}=`))
    if (!hasSessionCookie) return next()
    const sent = req.get('x-csrf-token')
    const expected = req.session?.csrfToken
    if (sent && expected && safeEqual(sent, expected)) return next()
    next(new AppError(403, 'csrf', 'Request refused: missing or wrong X-CSRF-Token header (get one from GET /api/auth/csrf).'))
  }
}
