import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * The answer to a POST sent with an Idempotency-Key, kept for a day so a retry gets the same answer
 * instead of making the record twice. One key per caller (user and workspace).
 */
export class IdempotencyKeys1796249034800 implements MigrationInterface {
  name = 'IdempotencyKeys1796249034800'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE idempotency_keys (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      caller varchar(80) NOT NULL,
      key varchar(255) NOT NULL,
      fingerprint varchar(64) NOT NULL,
      status integer,
      body text,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (caller, key))`)
    await q.query(`CREATE INDEX idempotency_keys_created ON idempotency_keys (created_at)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS idempotency_keys`)
  }
}
