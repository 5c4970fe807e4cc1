/** The one way Lampwright sends mail: nodemailer to SMTP_URL, or to the local catcher. */
import nodemailer, { type Transporter } from 'nodemailer'
import { config } from '../../config'
import { DEFAULT_LIMITS, spend, type Limit } from '../../lib/limits'

let transport: Transporter | null = null
let catcherPort: number | null = null

/** Tells the mail layer where the local catcher listens (set at start-up and in tests). */
export function useCatcherPort(port: number) {
  catcherPort = port
  transport = null
}

function getTransport(): Transporter {
  if (transport) return transport
  const smtpUrl = config().mail.smtpUrl
  transport = smtpUrl
    ? nodemailer.createTransport(smtpUrl)
    : nodemailer.createTransport({ host: '127.0.0.1', port: catcherPort ?? config().mail.catcherPort, secure: false, ignoreTLS: true })
  return transport
}

export interface OutgoingMail {
  to: string | string[]
  subject: string
  /** Plain-text part; every mail has one. */
  text: string
  /** HTML part; every mail has one. */
  html: string
}

/**
 * What a mail is, for the local outbox: account mail (reset, confirmation) is only ever read by the
 * operator in data/mail/; the rest is shown to owners of the workspace it was sent for and to its addressee.
 */
export type MailKind = 'account' | 'invitation' | 'share' | 'reminder'
export interface MailOrigin {
  kind: MailKind
  /** The workspace the mail was sent on behalf of; null for account mail. */
  workspaceId: string | null
}

/** Headers the local catcher reads back; never added when mail goes to a real server. */
export const KIND_HEADER = 'x-lampwright-kind'
export const WORKSPACE_HEADER = 'x-lampwright-workspace'

let mailLimit: Limit = DEFAULT_LIMITS.mailPerRecipient
/** Set by createApp: how many mails one recipient may get per window (reminders not counted). */
export function setMailLimit(limit: Limit) {
  mailLimit = limit
}

export async function sendMail(mail: OutgoingMail, origin: MailOrigin): Promise<void> {
  // One address cannot be flooded through us (invitations, shares, resets, confirmations); daily reminders are bounded by their own schedule.
  if (origin.kind !== 'reminder') {
    for (const to of Array.isArray(mail.to) ? mail.to : [mail.to])
      await spend('mail-to', to.trim().toLowerCase(), mailLimit, `Too many mails to ${to} in a short time.`)
  }
  const headers = config().mail.smtpUrl ? undefined : { [KIND_HEADER]: origin.kind, [WORKSPACE_HEADER]: origin.workspaceId ?? '' }
  await getTransport().sendMail({ from: config().mail.from, ...mail, headers })
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)

/** Builds both parts of a simple mail: paragraphs and an optional action link. */
export function composeMail(paragraphs: string[], action?: { label: string; url: string }): { text: string; html: string } {
  const text = [...paragraphs, ...(action ? [`${action.label}: ${action.url}`] : []), '', '— Lampwright'].join('\n\n')
  const html = `<div style="font-family:sans-serif;font-size:15px;line-height:1.5">${paragraphs.map((p) => `<p>${esc(p)}</p>`).join('')}${
    action ? `<p><a href="${esc(action.url)}">${esc(action.label)}</a></p><p style="color:#666;font-size:13px">${esc(action.url)}</p>` : ''
  }<p style="color:#666">— Lampwright</p></div>`
  return { text, html }
}
