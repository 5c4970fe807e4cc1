/**
 * The one place errors become responses: RFC 9457 problem details (server/errors/problem.ts).
 * Never a stack trace: unexpected errors are logged and answered with a generic 500 message.
 */
import type { ErrorRequestHandler, RequestHandler } from 'express'
import { ZodError } from 'zod'
import { AppError } from '../errors/app-error'
import { sendProblem, zodFields } from '../errors/problem'
import { errorForLog, loggablePath } from '../lib/log-redact'
import { logger } from '../lib/logger'
import { appPoolIsFull, isPoolWaitTimeout } from '../lib/pools'

const DB_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', '57P01', '57P02', '57P03', '08006', '08001', '08003'])

function isDatabaseDown(err: unknown): boolean {
  const e = err as { code?: string; message?: string; driverError?: { code?: string } }
  const code = e?.driverError?.code ?? e?.code
  if (code && DB_DOWN_CODES.has(code)) return true
  const msg = String(e?.message ?? '')
  return /Connection terminated|connect ECONNREFUSED|terminating connection|Client has encountered a connection error|timeout exceeded when trying to connect|Connection is not established|Cannot use a pool after calling end/i.test(
    msg,
  )
}

export const notFoundApi: RequestHandler = (req, res) => {
  sendProblem(res, { status: 404, code: 'no_route', detail: `No API route ${req.method} ${req.originalUrl.split('?')[0]}.` })
}

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return
  if (err instanceof ZodError) {
    const fields = zodFields(err)
    sendProblem(res, {
      status: 400,
      code: 'invalid_input',
      detail: `Invalid input: ${fields
        .map((f) => `${f.path} ${f.message}`)
        .slice(0, 3)
        .join('; ')}`,
      fields,
    })
    return
  }
  if (err instanceof AppError) {
    if (err.status === 429 && typeof err.details?.retryAfterSeconds === 'number') res.set('Retry-After', String(err.details.retryAfterSeconds))
    if (err.status === 401) res.set('WWW-Authenticate', err.code === 'bad_token' ? 'Bearer realm="api", error="invalid_token"' : 'Bearer realm="api"')
    sendProblem(res, { status: err.status, code: err.code, detail: err.message, fields: err.fields, extra: err.details })
    return
  }
  const e = err as { type?: string; status?: number; statusCode?: number; code?: string; message?: string; field?: string }
  // body-parser and multer errors carry a status and a type or code.
  if (e?.type === 'entity.parse.failed') {
    sendProblem(res, { status: 400, code: 'invalid_json', detail: 'The request body is not valid JSON.' })
    return
  }
  if (e?.type === 'entity.too.large' || e?.code === 'LIMIT_FILE_SIZE') {
    sendProblem(res, {
      status: 413,
      code: 'too_large',
      detail: e.code === 'LIMIT_FILE_SIZE' ? 'The file is larger than the upload limit.' : 'The request body is too large.',
    })
    return
  }
  if (typeof e?.code === 'string' && e.code.startsWith('LIMIT_')) {
    sendProblem(res, { status: 400, code: 'bad_upload', detail: `Upload refused: ${e.message}${e.field ? ` (field ${e.field})` : ''}.` })
    return
  }
  const status = e?.status ?? e?.statusCode
  if (typeof status === 'number' && status >= 400 && status < 500) {
    const unsupported = e.type === 'charset.unsupported' || e.type === 'encoding.unsupported'
    sendProblem(
      res,
      unsupported
        ? { status: 415, code: 'unsupported_media_type', detail: 'Unsupported body encoding or character set.' }
        : { status, code: 'bad_request', detail: e.message ?? 'Bad request.' },
    )
    return
  }
  if (isPoolWaitTimeout(err) && appPoolIsFull()) {
    // Every connection is in use: the database is fine, this process is busy. Come back shortly.
    res.set('Retry-After', '2')
    sendProblem(res, { status: 503, code: 'busy', detail: 'The server is busy right now; try again in a couple of seconds.' })
    return
  }
  if (isDatabaseDown(err)) {
    res.set('Retry-After', '5')
    sendProblem(res, { status: 503, code: 'unavailable', detail: 'The database is not answering; try again in a few seconds.' })
    return
  }
  const pgCode = (err as { driverError?: { code?: string } })?.driverError?.code
  if (pgCode === '23503') {
    // Ids are checked before a handler runs; this is the race where the record went in between.
    const detail = String((err as { driverError?: { detail?: string } }).driverError?.detail ?? '')
    if (/still referenced/.test(detail)) {
      sendProblem(res, { status: 409, code: 'conflict', detail: 'Other records still refer to this one; remove or change them first.' })
      return
    }
    const column = /^Key \(([a-z_]+)\)=/.exec(detail)?.[1]
    const field = column?.replace(/_([a-z])/g, (_m, c: string) => c.toUpperCase())
    sendProblem(res, {
      status: 404,
      code: 'not_found',
      detail: 'A record this refers to was not found in this workspace.',
      fields: field ? [{ path: field, code: 'not_found', message: 'was not found in this workspace' }] : undefined,
    })
    return
  }
  if (pgCode === '22P02' || pgCode === '22003' || pgCode === '22021') {
    sendProblem(res, { status: 400, code: 'bad_request', detail: 'A value in the request is not valid for its field.' })
    return
  }
  logger.error({ err: errorForLog(err), path: loggablePath(req.originalUrl ?? req.path) }, 'unhandled error')
  sendProblem(res, { status: 500, code: 'internal', detail: 'Something went wrong on our side. It has been logged.' })
}
