/**
 * The daily reminder: one mail per site per day to whom the workspace chose (by default the site's
 * responsible person, the technicians and the owners), listing luminaires whose tests are overdue or
 * fall due within the days ahead it set (14 by default), and those with a failure not yet put
 * right, with the retest's deadline. "Once" holds across processes: a row in reminder_sends
 * with a unique (site_id, day) key is claimed inside a transaction before the mail goes out; a
 * second worker waits on that key and then finds it taken. If sending fails the transaction rolls
 * back and the claim is released for the next run.
 */
import { config } from '../../config'
import { dataSource } from '../../data-source'
import { logger } from '../../lib/logger'
import { composeMail, sendMail } from '../mail/mail.service'
import { SiteEntity } from './site.entity'
import { registerSettings, siteStatus, type LuminaireStatus, type ReminderRole } from './register.service'

/** Tests due within this many days are in the reminder, unless the workspace sets its own. */
export const REMINDER_WINDOW_DAYS = 14
/** Lines listed per section before "and N more". */
const MAX_LINES = 80

export interface ReminderOutcome {
  day: string
  sent: Array<{ siteId: string; to: string[]; luminaires: number }>
  /** Sites another run (or worker) had already claimed for the day. */
  alreadySent: string[]
  failed: Array<{ siteId: string; error: string }>
}

const where = (l: LuminaireStatus) => [l.areaName, l.location].filter(Boolean).join(', ')
const testName = (kind: 'functional' | 'duration') => (kind === 'functional' ? 'functional test' : 'full-duration test')

/** The luminaires a site's reminder is about, worst first. */
export function reminderItems(luminaires: LuminaireStatus[], daysAhead = REMINDER_WINDOW_DAYS) {
  const overdue: string[] = []
  const soon: string[] = []
  const failed: string[] = []
  const tags = new Set<string>()
  for (const l of luminaires) {
    const label = `${l.tag}${where(l) ? ` (${where(l)})` : ''}`
    for (const f of l.due.openFailures) {
      const retest = f.retestOverdue ? `retest overdue (was due by ${f.retestBy})` : `retest due now, by ${f.retestBy}`
      failed.push(
        `${label}: failed its ${testName(f.kind)} on ${f.testedOn}${f.faults ? ` (${f.faults})` : ''}; ${retest}${f.remedialAction ? `. Action: ${f.remedialAction}` : ''}`,
      )
      tags.add(l.tag)
    }
    for (const t of [l.due.functional, l.due.duration]) {
      if (t.reason === 'retest') continue // listed with its failure above
      const what = t.reason === 'commissioning' ? 'first full-duration test of the pack now fitted' : testName(t.kind)
      if (t.state === 'overdue') overdue.push(`${label}: ${what} overdue (was due by ${t.overdueAfter}, ${-t.daysUntilDue} days ago)`)
      else if (t.state === 'due-now') soon.push(`${label}: ${what} due now, by ${t.overdueAfter}`)
      else if ((t.state === 'due-soon' || t.state === 'scheduled') && t.daysUntilDue <= daysAhead)
        soon.push(`${label}: ${what} due ${t.nextDueOn}${t.daysUntilDue === 0 ? ' (today)' : ` (in ${t.daysUntilDue} days)`}`)
      else continue
      tags.add(l.tag)
    }
  }
  return { overdue, soon, failed, tags }
}

const capped = (lines: string[]) => (lines.length > MAX_LINES ? [...lines.slice(0, MAX_LINES), `… and ${lines.length - MAX_LINES} more`] : lines)

async function memberEmails(workspaceId: string, roles: ReminderRole[]): Promise<string[]> {
  if (!roles.length) return []
  const rows: Array<{ email: string }> = await dataSource.query(
    `SELECT u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.workspace_id = $1 AND m.role = ANY($2::text[]) ORDER BY u.email`,
    [workspaceId, roles],
  )
  return rows.map((r) => r.email)
}

export interface ReminderOptions {
  /** Only this workspace's sites (tests); all sites otherwise. */
  workspaceId?: string
}

/** Runs the reminder for one calendar day. Safe to call any number of times, from any number of processes. */
export async function runReminders(day: string, opts: ReminderOptions = {}): Promise<ReminderOutcome> {
  const outcome: ReminderOutcome = { day, sent: [], alreadySent: [], failed: [] }
  const sites = await dataSource
    .getRepository(SiteEntity)
    .find({ where: opts.workspaceId ? { workspaceId: opts.workspaceId } : {}, order: { createdAt: 'ASC' } })
  for (const site of sites) {
    const status = await siteStatus(site.workspaceId, site.id, day)
    const settings = await registerSettings(site.workspaceId)
    const items = reminderItems(status.luminaires, settings.reminderDaysAhead)
    if (!items.tags.size) continue
    const to = [
      ...new Set([settings.remindSiteContact ? site.responsibleEmail : '', ...(await memberEmails(site.workspaceId, settings.remindRoles))].filter(Boolean)),
    ]
    if (!to.length) continue
    try {
      const claimed = await dataSource.transaction(async (m) => {
        const rows: unknown[] = await m.query(
          `INSERT INTO reminder_sends (workspace_id, site_id, day, recipients, luminaire_count) VALUES ($1, $2, $3, $4, $5)
           ON CONFLICT (site_id, day) DO NOTHING RETURNING id`,
          [site.workspaceId, site.id, day, JSON.stringify(to), items.tags.size],
        )
        if (!rows.length) return false
        const paragraphs = [
          `Emergency lighting at ${site.name}: ${items.tags.size} luminaire${items.tags.size === 1 ? ' needs' : 's need'} attention (checked ${day}).`,
          ...(items.overdue.length ? ['Overdue:', ...capped(items.overdue)] : []),
          ...(items.soon.length ? [`Due within ${settings.reminderDaysAhead} days:`, ...capped(items.soon)] : []),
          ...(items.failed.length ? ['Failed, not yet put right by a passing retest:', ...capped(items.failed)] : []),
          'Before working on a luminaire, isolate the mains; a charged pack can still deliver a high current. Local codes and a competent, licensed person decide what the installation needs.',
        ]
        const subject = `Emergency lighting tests at ${site.name}: ${items.failed.length} failed, ${items.overdue.length} overdue, ${items.soon.length} due soon`
        await sendMail(
          { to, subject, ...composeMail(paragraphs, { label: 'Open the site', url: `${config().origin}/sites/${site.id}` }) },
          { kind: 'reminder', workspaceId: site.workspaceId },
        )
        return true
      })
      if (claimed) outcome.sent.push({ siteId: site.id, to, luminaires: items.tags.size })
      else outcome.alreadySent.push(site.id)
    } catch (err) {
      logger.error({ err, siteId: site.id, day }, 'reminder not sent')
      outcome.failed.push({ siteId: site.id, error: (err as Error).message })
    }
  }
  return outcome
}
