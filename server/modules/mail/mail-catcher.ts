/**
 * A local stand-in for an SMTP service: accepts every message on loopback and keeps it as JSON in
 * the data folder, so development and tests never send real mail.
 */
import fs from 'node:fs'
import path from 'node:path'
import crypto from 'node:crypto'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import { KIND_HEADER, WORKSPACE_HEADER, type MailKind } from './mail.service'

export interface CaughtMail {
  id: string
  receivedAt: string
  from: string
  to: string[]
  subject: string
  text: string
  html: string
  /** What the mail is and the workspace it was sent for (absent on mail caught before they were recorded). */
  kind?: MailKind
  workspaceId?: string | null
}

export interface MailCatcher {
  port: number
  close(): Promise<void>
}

function headerText(value: unknown): string | undefined {
  return typeof value === 'string' ? value.trim() : undefined
}

export function startMailCatcher(dir: string, port: number): Promise<MailCatcher> {
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 })
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const id = `${Date.now()}-${crypto.randomBytes(4).toString('hex')}`
          const record: CaughtMail = {
            id,
            receivedAt: new Date().toISOString(),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : '',
            kind: headerText(mail.headers.get(KIND_HEADER)) as MailKind | undefined,
            workspaceId: headerText(mail.headers.get(WORKSPACE_HEADER)) || null,
          }
          // Caught mail holds reset and invitation links: readable by the app's own user only.
          fs.writeFileSync(path.join(dir, `${id}.json`), JSON.stringify(record, null, 2), { mode: 0o600 })
          callback()
        })
        .catch((err: Error) => callback(err))
    },
  })
  return new Promise((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', () => {
      const address = server.server.address()
      const actual = typeof address === 'object' && address ? address.port : port
      resolve({ port: actual, close: () => new Promise((r) => server.close(() => r())) })
    })
  })
}

/** Caught messages, newest first. */
export function readCaughtMail(dir: string): CaughtMail[] {
  if (!fs.existsSync(dir)) return []
  return fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .reverse()
    .map((f) => JSON.parse(fs.readFileSync(path.join(dir, f), 'utf8')) as CaughtMail)
}

/**
 * What one signed-in person may read in the outbox: mail sent on behalf of their current workspace
 * (when they own it) or addressed to them, never account mail (password reset, e-mail confirmation),
 * and never mail without a recorded origin.
 */
export function visibleMail(all: CaughtMail[], viewer: { email: string; workspaceId: string }): CaughtMail[] {
  const me = viewer.email.toLowerCase()
  return all.filter((m) => {
    if (!m.kind || m.kind === 'account') return false
    return m.workspaceId === viewer.workspaceId || m.to.some((t) => t.toLowerCase() === me)
  })
}
