/** Starts Lampwright: database, mail catcher, HTTP server; stops cleanly on SIGINT/SIGTERM. */
import { createApp } from './app'
import { config } from './config'
import { dataSource } from './data-source'
import { errorForLog } from './lib/log-redact'
import { logger } from './lib/logger'
import { budgetWarning, connectionBudget } from './lib/pools'
import { startMailCatcher, type MailCatcher } from './modules/mail/mail-catcher'
import { useCatcherPort } from './modules/mail/mail.service'
import { sweepStagedUploads } from './modules/discharge/discharge.service'
import { startReminderJobs, type JobRunner } from './modules/register/reminder-jobs'
import { DEMO_PASSWORD, DEMO_USERS } from './scripts/demo-users'

// Files the app writes (caught mail, uploads, anything logged to a file) are for its own user only.
process.umask(0o077)
const cfg = config()

process.on('unhandledRejection', (reason) => logger.error({ err: errorForLog(reason) }, 'unhandled rejection'))
process.on('uncaughtException', (err) => {
  logger.fatal({ err }, 'uncaught exception')
  process.exit(1)
})

async function initializeDatabase() {
  // Keep trying: the database may still be starting, or briefly away.
  for (let attempt = 1; ; attempt++) {
    try {
      await dataSource.initialize()
      return
    } catch (err) {
      if (attempt >= 30) throw err
      logger.warn({ attempt }, 'database not reachable yet; retrying')
      await new Promise((r) => setTimeout(r, 1000))
    }
  }
}

await initializeDatabase()
const budget = connectionBudget(cfg)
logger.info({ connections: budget }, 'PostgreSQL connections this process may hold')
const tooMany = await budgetWarning(budget).catch(() => null)
if (tooMany) logger.warn(tooMany)
let catcher: MailCatcher | null = null
if (!cfg.mail.smtpUrl) {
  catcher = await startMailCatcher(cfg.mail.catcherDir, cfg.mail.catcherPort)
  useCatcherPort(catcher.port)
}
// Background jobs (daily test reminders) only where JOBS=1; any number of processes may run them.
const jobs: JobRunner | null = cfg.jobs ? await startReminderJobs() : null
// Uploads nobody saved within the hour are removed even when no one uploads anything new.
const sweep = setInterval(() => void sweepStagedUploads().catch((err) => logger.warn({ err }, 'staged upload sweep failed')), 10 * 60 * 1000)
sweep.unref()
const { app, close } = createApp()
const server = app.listen(cfg.port, cfg.host, () => {
  // Several processes behind one port: the first one greets.
  if (cfg.workerSlot !== null && cfg.workerSlot > 0) return
  const lines = [
    '',
    `  Lampwright ${cfg.version} is running at ${cfg.origin}`,
    `  API health: ${cfg.origin}/api/health`,
    catcher
      ? `  Mail is caught locally (SMTP 127.0.0.1:${catcher.port}); owners read their workspace's mail at ${cfg.origin}/outbox, account mail is in ${cfg.mail.catcherDir}`
      : '  Mail goes to SMTP_URL',
    '',
    '  Demo sign-in (password for all: ' + DEMO_PASSWORD + ')',
    ...DEMO_USERS.map((u) => `    ${u.role.padEnd(10)} ${u.email}`),
    '',
    '  Press Ctrl-C to stop.',
    '',
  ]
  process.stdout.write(lines.join('\n') + '\n')
})

let shuttingDown = false
async function shutdown(signal: string) {
  if (shuttingDown) return
  shuttingDown = true
  logger.info({ signal }, 'shutting down')
  server.close()
  server.closeAllConnections?.()
  await jobs?.stop().catch(() => undefined)
  await catcher?.close().catch(() => undefined)
  await close().catch(() => undefined)
  await dataSource.destroy().catch(() => undefined)
  process.exit(0)
}
process.on('SIGINT', () => void shutdown('SIGINT'))
process.on('SIGTERM', () => void shutdown('SIGTERM'))
