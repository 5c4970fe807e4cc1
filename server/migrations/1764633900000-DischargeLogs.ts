import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Discharge-test logs: each raw file once per workspace (by SHA-256), and the logs read from them
 * (column mapping, options, the engine's summary and a down-sampled curve), attached to a
 * specification sheet or to a luminaire's test record.
 */
export class DischargeLogs1764633900000 implements MigrationInterface {
  name = 'DischargeLogs1764633900000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE discharge_files (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      sha256 varchar(64) NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
      original_name varchar(200) NOT NULL DEFAULT '',
      bytes bytea NOT NULL,
      size integer NOT NULL CHECK (size > 0),
      uploaded_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE UNIQUE INDEX discharge_files_workspace_sha ON discharge_files (workspace_id, sha256)`)
    await q.query(`CREATE TABLE discharge_logs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      file_id uuid NOT NULL REFERENCES discharge_files(id) ON DELETE RESTRICT,
      title varchar(200) NOT NULL,
      notes text NOT NULL DEFAULT '',
      mapping jsonb NOT NULL,
      options jsonb NOT NULL,
      summary jsonb NOT NULL,
      curve jsonb NOT NULL,
      engine_version varchar(20) NOT NULL,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      spec_sheet_id uuid REFERENCES spec_sheets(id) ON DELETE SET NULL,
      test_record_id uuid REFERENCES test_records(id) ON DELETE SET NULL)`)
    await q.query(`CREATE INDEX discharge_logs_workspace_created ON discharge_logs (workspace_id, created_at DESC)`)
    await q.query(`CREATE INDEX discharge_logs_sheet ON discharge_logs (spec_sheet_id) WHERE spec_sheet_id IS NOT NULL`)
    await q.query(`CREATE INDEX discharge_logs_test_record ON discharge_logs (test_record_id) WHERE test_record_id IS NOT NULL`)
    await q.query(`CREATE INDEX discharge_logs_file ON discharge_logs (file_id)`)
    // The log book's column waits for this table; a deleted log leaves the test record standing.
    await q.query(`ALTER TABLE test_records ADD CONSTRAINT test_records_discharge_log_fk FOREIGN KEY (discharge_log_id) REFERENCES discharge_logs(id) ON DELETE SET NULL`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE test_records DROP CONSTRAINT IF EXISTS test_records_discharge_log_fk`)
    await q.query(`DROP TABLE IF EXISTS discharge_logs`)
    await q.query(`DROP TABLE IF EXISTS discharge_files`)
  }
}
