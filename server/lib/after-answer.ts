/**
 * Work that must not shape the answer: it runs after the handler has answered, so the time and the
 * content of the answer are the same whether or not there was work to do (e.g. whether an e-mail
 * has an account). Failures are logged, never answered.
 */
import { errorForLog } from './log-redact'
import { logger } from './logger'

export function afterAnswer(what: string, work: () => Promise<unknown>): void {
  setImmediate(() => {
    work().catch((err: unknown) => logger.error({ err: errorForLog(err), what }, 'background work failed'))
  })
}
