import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Staged discharge-log uploads move from a JSON file beside each upload to a table, so every app
 * process sees them, each workspace's staged bytes can be summed against its storage quota, and an
 * upload expires after an hour. The bytes stay in the shared folder DATA_DIR/discharge-uploads.
 * A workspace may carry its own quota (NULL: the server's default, STORAGE_QUOTA_MB).
 */
export class StagedUploads1796223702801 implements MigrationInterface {
  name = 'StagedUploads1796223702801'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE staged_uploads (
      id uuid PRIMARY KEY,
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      user_id uuid REFERENCES users(id) ON DELETE SET NULL,
      original_name varchar(200) NOT NULL DEFAULT '',
      sha256 char(64) NOT NULL,
      size bigint NOT NULL CHECK (size >= 0),
      created_at timestamptz NOT NULL DEFAULT now(),
      expires_at timestamptz NOT NULL
    )`)
    await q.query(`CREATE INDEX staged_uploads_workspace ON staged_uploads (workspace_id, expires_at)`)
    await q.query(`CREATE INDEX staged_uploads_expires ON staged_uploads (expires_at)`)
    await q.query(`ALTER TABLE workspaces ADD COLUMN storage_quota_bytes bigint CHECK (storage_quota_bytes IS NULL OR storage_quota_bytes >= 0)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE workspaces DROP COLUMN storage_quota_bytes`)
    await q.query(`DROP TABLE staged_uploads`)
  }
}
