/** The local outbox: owners can read what the SMTP catcher caught (only when no real SMTP is set). */
import type { Request, Response } from 'express'
import { config } from '../../config'
import { NotFoundError } from '../../errors/app-error'
import type { RouteSpec } from '../../policy/access'
import { readCaughtMail } from './mail-catcher'

async function outbox(_req: Request, res: Response) {
  if (config().mail.smtpUrl) throw new NotFoundError('The outbox (mail goes to a real server)')
  res.json({ messages: readCaughtMail(config().mail.catcherDir).slice(0, 200) })
}

export const outboxRoutes: RouteSpec[] = [
  { method: 'get', path: '/api/outbox', access: 'owner', summary: 'Mail caught by the local SMTP catcher', handler: outbox },
]
