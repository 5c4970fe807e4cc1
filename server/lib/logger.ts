/** One pino logger for the server. Secrets never reach it: request logs carry method, path, status, time. */
import pino from 'pino'
import { config } from '../config'

export const logger = pino({
  level: config().logLevel,
  redact: {
    paths: [
      'password',
      '*.password',
      'req.headers.cookie',
      'req.headers.authorization',
      'token',
      '*.token',
      'err.parameters',
      'err.driverError',
      '*.parameters',
      'err.detail',
    ],
    censor: '[redacted]',
  },
})
