import type { MigrationInterface, QueryRunner } from 'typeorm'

/** New accounts confirm their e-mail address before they can sign in; accounts made before this are confirmed. */
export class EmailConfirmation1796225153018 implements MigrationInterface {
  name = 'EmailConfirmation1796225153018'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE users ADD COLUMN email_confirmed_at timestamptz`)
    await q.query(`UPDATE users SET email_confirmed_at = created_at`)
    await q.query(`CREATE TABLE email_confirmations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      token_hash varchar(64) NOT NULL UNIQUE,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE INDEX email_confirmations_user ON email_confirmations (user_id)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS email_confirmations`)
    await q.query(`ALTER TABLE users DROP COLUMN IF EXISTS email_confirmed_at`)
  }
}
