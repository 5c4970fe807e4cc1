/** The job runner starts on pg-boss, schedules the daily reminder and stops cleanly. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { REMINDER_CRON, REMINDER_QUEUE, startReminderJobs } from '../../server/modules/register/reminder-jobs'
import { closeTestApp, getTestApp } from '../helpers/test-app'

beforeAll(async () => {
  await getTestApp()
})
afterAll(closeTestApp)

describe('reminder job runner', () => {
  it('registers the daily schedule in PostgreSQL (two runners share one schedule)', async () => {
    const first = await startReminderJobs()
    const second = await startReminderJobs()
    try {
      const rows = await dataSource.query('SELECT name, cron FROM pgboss.schedule WHERE name = $1', [REMINDER_QUEUE])
      expect(rows).toEqual([{ name: REMINDER_QUEUE, cron: REMINDER_CRON }])
    } finally {
      await second.stop()
      await first.stop()
    }
  })
})
