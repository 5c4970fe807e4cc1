import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * API tokens get an optional expiry and scopes (read, write, calc); tokens made before keep all
 * three, as they could do everything their role allowed. Audit events made through a token name it.
 */
export class TokenScopes1796249282893 implements MigrationInterface {
  name = 'TokenScopes1796249282893'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE api_tokens ADD COLUMN expires_at timestamptz`)
    await q.query(`ALTER TABLE api_tokens ADD COLUMN scopes text[] NOT NULL DEFAULT '{read,write,calc}'`)
    await q.query(`ALTER TABLE audit_events ADD COLUMN api_token_id uuid`)
    await q.query(`ALTER TABLE audit_events ADD COLUMN api_token_name varchar(80)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE audit_events DROP COLUMN IF EXISTS api_token_name`)
    await q.query(`ALTER TABLE audit_events DROP COLUMN IF EXISTS api_token_id`)
    await q.query(`ALTER TABLE api_tokens DROP COLUMN IF EXISTS scopes`)
    await q.query(`ALTER TABLE api_tokens DROP COLUMN IF EXISTS expires_at`)
  }
}
