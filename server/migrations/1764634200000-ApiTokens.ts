import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Personal API tokens (hashed), scoped to a workspace and a role. */
export class ApiTokens1764634200000 implements MigrationInterface {
  name = 'ApiTokens1764634200000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE api_tokens (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      role varchar(16) NOT NULL CHECK (role IN ('viewer','technician','designer','owner')),
      name varchar(80) NOT NULL,
      token_hash varchar(64) NOT NULL UNIQUE,
      prefix varchar(16) NOT NULL,
      last_used_at timestamptz,
      revoked_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE INDEX api_tokens_user ON api_tokens (user_id, workspace_id)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS api_tokens`)
  }
}
