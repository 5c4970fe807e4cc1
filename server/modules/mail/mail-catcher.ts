/**
 * A local stand-in for an SMTP service: accepts every message on loopback and keeps it as JSON in
 * the data folder, so development and tests never send real mail.
 */
import fs from 'node:fs'
import path from 'node:path'
import crypto from 'node:crypto'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'

export interface CaughtMail {
  id: string
  receivedAt: string
  from: string
  to: string[]
  subject: string
  text: string
  html: string
}

export interface MailCatcher {
  port: number
  close(): Promise<void>
}

export function startMailCatcher(dir: string, port: number): Promise<MailCatcher> {
  fs.mkdirSync(dir, { recursive: true })
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
          }
          fs.writeFileSync(path.join(dir, `${id}.json`), JSON.stringify(record, null, 2))
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
