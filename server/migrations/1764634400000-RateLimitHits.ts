import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Failed sign-in counters shared by every app process (keys are hashes). */
export class RateLimitHits1764634400000 implements MigrationInterface {
  name = 'RateLimitHits1764634400000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE rate_limit_hits (
      key varchar(64) PRIMARY KEY,
      hits integer NOT NULL,
      reset_at timestamptz NOT NULL)`)
    await q.query(`CREATE INDEX rate_limit_hits_reset ON rate_limit_hits (reset_at)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS rate_limit_hits`)
  }
}
