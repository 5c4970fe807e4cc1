/** The local outbox: owners can read what the SMTP catcher caught (only when no real SMTP is set). */
import { config } from '../../config'
import { NotFoundError } from '../../errors/app-error'
import { defineRoute, type RouteSpec } from '../../policy/access'
import { readCaughtMail } from './mail-catcher'

function outbox() {
  if (config().mail.smtpUrl) throw new NotFoundError('The outbox (mail goes to a real server)')
  return { messages: readCaughtMail(config().mail.catcherDir).slice(0, 200) }
}

export const outboxRoutes: RouteSpec[] = [
  defineRoute({ method: 'get', path: '/api/outbox', access: 'owner', summary: 'Mail caught by the local SMTP catcher', handler: outbox }),
]
