import type { RequestHandler } from 'express'
import { AppError } from '../errors/app-error'
import { withRequestToken } from '../lib/request-token'
import { authenticateToken } from '../modules/tokens/tokens.service'

/** The token of an `Authorization: Bearer …` header; the scheme name is case-insensitive (RFC 9110 §11.1). */
export function bearerToken(header: string | undefined): string | null {
  const m = /^bearer[ \t]+(\S+)\s*$/i.exec(header ?? '')
  return m ? m[1]! : null
}

/** `Authorization: Bearer lw_…` signs the request in as the token's user, workspace and role. */
export const apiTokenAuth: RequestHandler = async (req, _res, next) => {
  if (!/^bearer\b/i.test(req.headers.authorization ?? '')) return next()
  const secret = bearerToken(req.headers.authorization)
  const found = secret ? await authenticateToken(secret) : null
  if (!found) return next(new AppError(401, 'bad_token', 'This API token is not valid: it is unknown, revoked or expired.'))
  req.user = found.user
  req.ctx = found.ctx
  // The rest of the request runs with the token known, so the audit trail can name it.
  withRequestToken(found.token, () => next())
}
