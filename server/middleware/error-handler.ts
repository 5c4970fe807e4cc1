/**
 * The one place errors become responses. Body: { error, code, fields? }. Never a stack trace:
 * unexpected errors are logged and answered with a generic 500 message.
 */
import type { ErrorRequestHandler, RequestHandler } from 'express'
import { ZodError } from 'zod'
import { AppError } from '../errors/app-error'
import { errorForLog, loggablePath } from '../lib/log-redact'
import { logger } from '../lib/logger'
import { appPoolIsFull, isPoolWaitTimeout } from '../lib/pools'

const DB_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', '57P01', '57P02', '57P03', '08006', '08001', '08003'])

function isDatabaseDown(err: unknown): boolean {
  const e = err as { code?: string; message?: string; driverError?: { code?: string } }
  const code = e?.driverError?.code ?? e?.code
  if (code && DB_DOWN_CODES.has(code)) return true
  const msg = String(e?.message ?? '')
  return /Connection terminated|connect ECONNREFUSED|terminating connection|Client has encountered a connection error|timeout exceeded when trying to connect|Connection is not established|Cannot use a pool after calling end/i.test(msg)
}

export const notFoundApi: RequestHandler = (req, res) => {
  res.status(404).json({ error: `No API route ${req.method} ${req.originalUrl.split("?")[0]}.`, code: 'no_route' })
}

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return
  if (err instanceof ZodError) {
    const fields = err.issues.map((i) => ({ path: i.path.join('.') || '(body)', message: i.message }))
    res.status(400).json({ error: `Invalid input: ${fields.map((f) => `${f.path} ${f.message}`).slice(0, 3).join('; ')}`, code: 'invalid_input', fields })
    return
  }
  if (err instanceof AppError) {
    if (err.status === 429 && typeof err.details?.retryAfterSeconds === 'number') res.set('Retry-After', String(err.details.retryAfterSeconds))
    res.status(err.status).json({ error: err.message, code: err.code, ...(err.fields ? { fields: err.fields } : {}), ...(err.details ?? {}) })
    return
  }
  const e = err as { type?: string; status?: number; statusCode?: number; code?: string; message?: string; field?: string }
  // body-parser and multer errors carry a status and a type or code.
  if (e?.type === 'entity.parse.failed') {
    res.status(400).json({ error: 'The request body is not valid JSON.', code: 'invalid_json' })
    return
  }
  if (e?.type === 'entity.too.large' || e?.code === 'LIMIT_FILE_SIZE') {
    res.status(413).json({ error: e.code === 'LIMIT_FILE_SIZE' ? 'The file is larger than the upload limit.' : 'The request body is too large.', code: 'too_large' })
    return
  }
  if (typeof e?.code === 'string' && e.code.startsWith('LIMIT_')) {
    res.status(400).json({ error: `Upload refused: ${e.message}${e.field ? ` (field ${e.field})` : ''}.`, code: 'bad_upload' })
    return
  }
  const status = e?.status ?? e?.statusCode
  if (typeof status === 'number' && status >= 400 && status < 500) {
    res.status(status).json({ error: e.type === 'charset.unsupported' || e.type === 'encoding.unsupported' ? 'Unsupported body encoding.' : (e.message ?? 'Bad request.'), code: 'bad_request' })
    return
  }
  if (isPoolWaitTimeout(err) && appPoolIsFull()) {
    // Every connection is in use: the database is fine, this process is busy. Come back shortly.
    res.status(503).set('Retry-After', '2').json({ error: 'The server is busy right now; try again in a couple of seconds.', code: 'busy' })
    return
  }
  if (isDatabaseDown(err)) {
    res.status(503).set('Retry-After', '5').json({ error: 'The database is not answering; try again in a few seconds.', code: 'unavailable' })
    return
  }
  const pgCode = (err as { driverError?: { code?: string } })?.driverError?.code
  if (pgCode === '23503') {
    // Ids are checked before a handler runs; this is the race where the record went in between.
    const detail = String((err as { driverError?: { detail?: string } }).driverError?.detail ?? '')
    if (/still referenced/.test(detail)) {
      res.status(409).json({ error: 'Other records still refer to this one; remove or change them first.', code: 'conflict' })
      return
    }
    const column = /^Key \(([a-z_]+)\)=/.exec(detail)?.[1]
    const field = column?.replace(/_([a-z])/g, (_m, c: string) => c.toUpperCase())
    res.status(404).json({ error: 'A record this refers to was not found in this workspace.', code: 'not_found', ...(field ? { fields: [{ path: field, message: 'was not found in this workspace' }] } : {}) })
    return
  }
  if (pgCode === '22P02' || pgCode === '22003' || pgCode === '22021') {
    res.status(400).json({ error: 'A value in the request is not valid for its field.', code: 'bad_request' })
    return
  }
  logger.error({ err: errorForLog(err), path: loggablePath(req.originalUrl ?? req.path) }, 'unhandled error')
  res.status(500).json({ error: 'Something went wrong on our side. It has been logged.', code: 'internal' })
}
