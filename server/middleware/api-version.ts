/**
 * The API's version. `/api/v1/...` and `/api/...` are the same routes (the unversioned path is the
 * current version); every answer says `API-Version: 1`, and a request that asks for another version
 * with the `API-Version` header is refused rather than answered by a version it did not ask for.
 * The deprecation policy is in docs/api.md.
 */
import type { RequestHandler } from 'express'
import { AppError } from '../errors/app-error'

export const API_VERSION = '1'
const VERSIONED = /^\/api\/v1(?=\/|$|\?)/

export const apiVersion: RequestHandler = (req, res, next) => {
  if (VERSIONED.test(req.url)) req.url = req.url.replace(VERSIONED, '/api')
  if (!req.url.startsWith('/api')) return next()
  res.set('API-Version', API_VERSION)
  const asked = req.get('api-version')
  if (asked !== undefined && asked.trim() !== API_VERSION) {
    return next(
      new AppError(400, 'invalid_input', `This server speaks API version ${API_VERSION}, not "${asked}".`, [
        { path: 'API-Version', pointer: '/API-Version', in: 'header', code: 'not_allowed', message: `must be ${API_VERSION} (or left out)` },
      ]),
    )
  }
  next()
}
