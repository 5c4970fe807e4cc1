import type { RequestHandler } from 'express'
import { loggablePath } from '../lib/log-redact'
import { logger } from '../lib/logger'

/** Logs one line per request when it finishes (no bodies, no cookies, no query strings, no tokens in the path). */
export const requestLog: RequestHandler = (req, res, next) => {
  const started = process.hrtime.bigint()
  res.on('finish', () => {
    const ms = Number(process.hrtime.bigint() - started) / 1e6
    logger.info({ method: req.method, path: loggablePath(req.originalUrl), status: res.statusCode, ms: Math.round(ms * 10) / 10 }, 'request')
  })
  next()
}
