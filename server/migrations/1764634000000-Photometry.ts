import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Photometric files (LM-63 text and its parsed intensity table) and the workspace's catalogue of luminaire types. */
export class Photometry1764634000000 implements MigrationInterface {
  name = 'Photometry1764634000000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE photometric_files (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      name varchar(120) NOT NULL,
      raw_text text NOT NULL,
      sha256 char(64) NOT NULL,
      parsed jsonb NOT NULL,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now())`)
    // The same file twice in one workspace is one file.
    await q.query(`CREATE UNIQUE INDEX photometric_files_workspace_sha ON photometric_files (workspace_id, sha256)`)
    await q.query(`CREATE INDEX photometric_files_workspace ON photometric_files (workspace_id, created_at)`)
    await q.query(`CREATE TABLE luminaire_types (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      name varchar(120) NOT NULL,
      photometric_file_id uuid REFERENCES photometric_files(id) ON DELETE SET NULL,
      emergency_output_factor double precision NOT NULL CHECK (emergency_output_factor > 0 AND emergency_output_factor <= 1),
      rated_duration_s double precision NOT NULL CHECK (rated_duration_s > 0),
      modes jsonb NOT NULL DEFAULT '["non-maintained"]',
      chemistry varchar(16) NOT NULL,
      cells_in_series integer NOT NULL CHECK (cells_in_series > 0),
      capacity_ah double precision CHECK (capacity_ah IS NULL OR capacity_ah > 0),
      emergency_power_w double precision NOT NULL CHECK (emergency_power_w > 0),
      input_power_w double precision NOT NULL CHECK (input_power_w >= 0),
      notes text NOT NULL DEFAULT '',
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE UNIQUE INDEX luminaire_types_workspace_name ON luminaire_types (workspace_id, lower(name))`)
    await q.query(`CREATE INDEX luminaire_types_file ON luminaire_types (photometric_file_id)`)
    // The register's luminaires name their type; until now nothing could be named, so any stray value goes.
    await q.query(`UPDATE luminaires SET luminaire_type_id = NULL WHERE luminaire_type_id IS NOT NULL`)
    await q.query(`ALTER TABLE luminaires ADD CONSTRAINT luminaires_luminaire_type_fk FOREIGN KEY (luminaire_type_id) REFERENCES luminaire_types(id) ON DELETE SET NULL`)
    await q.query(`CREATE INDEX luminaires_luminaire_type ON luminaires (luminaire_type_id)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX IF EXISTS luminaires_luminaire_type`)
    await q.query(`ALTER TABLE luminaires DROP CONSTRAINT IF EXISTS luminaires_luminaire_type_fk`)
    for (const t of ['luminaire_types', 'photometric_files']) await q.query(`DROP TABLE IF EXISTS ${t}`)
  }
}
