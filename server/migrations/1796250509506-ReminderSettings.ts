import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Who gets the daily reminder (the site contact, and members by role: owners included) and how many days ahead it looks. */
export class ReminderSettings1796250509506 implements MigrationInterface {
  name = 'ReminderSettings1796250509506'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE register_settings
      ADD COLUMN reminder_days_ahead integer NOT NULL DEFAULT 14 CHECK (reminder_days_ahead BETWEEN 1 AND 90),
      ADD COLUMN remind_site_contact boolean NOT NULL DEFAULT true,
      ADD COLUMN remind_roles text[] NOT NULL DEFAULT '{owner,technician}' CHECK (remind_roles <@ '{owner,designer,technician,viewer}'::text[])`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE register_settings DROP COLUMN reminder_days_ahead, DROP COLUMN remind_site_contact, DROP COLUMN remind_roles')
  }
}
