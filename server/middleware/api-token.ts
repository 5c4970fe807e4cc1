import type { RequestHandler } from 'express'
import { AppError } from '../errors/app-error'
import { authenticateToken } from '../modules/tokens/tokens.service'

/** `Authorization: Bearer lw_…` signs the request in as the token's user, workspace and role. */
export const apiTokenAuth: RequestHandler = async (req, _res, next) => {
  const header = req.headers.authorization
  if (!header?.startsWith('Bearer ')) return next()
  const found = await authenticateToken(header.slice(7).trim())
  if (!found) return next(new AppError(401, 'bad_token', 'This API token is not valid or has been revoked.'))
  req.user = found.user
  req.ctx = found.ctx
  next()
}
