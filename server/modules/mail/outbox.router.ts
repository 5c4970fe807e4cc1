/**
 * The local outbox: what the SMTP catcher caught for this workspace (only when no real SMTP is set).
 * An owner sees mail sent on behalf of the current workspace and mail addressed to them; account
 * mail is read by the operator in data/mail/ only.
 */
import type { Request } from 'express'
import { config } from '../../config'
import { NotFoundError } from '../../errors/app-error'
import { defineRoute, scope, type RouteSpec } from '../../policy/access'
import type { User } from '../users/user.entity'
import { readCaughtMail, visibleMail } from './mail-catcher'
import { OutboxAnswer } from '../../../shared/schemas/answers/accounts'

function outbox(req: Request) {
  if (config().mail.smtpUrl) throw new NotFoundError('The outbox (mail goes to a real server)')
  const { workspaceId } = scope(req)
  const email = (req.user as User).email
  const messages = visibleMail(readCaughtMail(config().mail.catcherDir), { email, workspaceId })
  return { messages: messages.slice(0, 200).map(({ id, receivedAt, to, subject, text }) => ({ id, receivedAt, to, subject, text })) }
}

export const outboxRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/outbox',
    response: OutboxAnswer,
    access: 'owner',
    summary: 'Mail caught by the local SMTP catcher',
    handler: (_input, req) => outbox(req),
  }),
]
