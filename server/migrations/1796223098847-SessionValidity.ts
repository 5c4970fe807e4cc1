import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Per-user "sessions valid after" stamp: a reset, a password change or a removal ends older sessions at once. */
export class SessionValidity1796223098847 implements MigrationInterface {
  name = 'SessionValidity1796223098847'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE users ADD COLUMN sessions_valid_after timestamptz`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE users DROP COLUMN IF EXISTS sessions_valid_after`)
  }
}
