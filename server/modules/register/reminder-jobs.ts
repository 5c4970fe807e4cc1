/**
 * Runs the daily reminder on pg-boss (a job queue kept in PostgreSQL): scheduled every morning, and
 * once at start-up in case the server was down at the scheduled time. Several processes may run
 * this; the per-site-per-day claim in runReminders keeps every mail single.
 */
import { config } from '../../config'
import { logger } from '../../lib/logger'
import { openJobQueue } from '../../lib/pools'
import { todayIso } from './register.service'
import { runReminders } from './reminders.service'

export const REMINDER_QUEUE = 'register-reminders'
/** 06:00 UTC every day. */
export const REMINDER_CRON = '0 6 * * *'

export interface JobRunner {
  stop(): Promise<void>
}

export async function startReminderJobs(): Promise<JobRunner> {
  const boss = openJobQueue(config())
  boss.on('error', (err) => logger.error({ err }, 'job queue error'))
  await boss.start()
  await boss.createQueue(REMINDER_QUEUE)
  await boss.schedule(REMINDER_QUEUE, REMINDER_CRON, {}, { tz: 'UTC' })
  await boss.work(REMINDER_QUEUE, async () => {
    const outcome = await runReminders(todayIso())
    logger.info({ day: outcome.day, sent: outcome.sent.length, alreadySent: outcome.alreadySent.length, failed: outcome.failed.length }, 'reminders run')
  })
  // Catch up after downtime; a singleton key keeps it to one queued job per day.
  await boss.send(REMINDER_QUEUE, {}, { singletonKey: `start-${todayIso()}` })
  return { stop: () => boss.stop({ graceful: true, timeout: 5000 }) }
}
