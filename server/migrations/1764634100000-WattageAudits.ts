import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Wattage audits: a luminaire's claimed power against bench readings, optionally on a sheet or a luminaire. */
export class WattageAudits1764634100000 implements MigrationInterface {
  name = 'WattageAudits1764634100000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE wattage_audits (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      title varchar(200) NOT NULL,
      luminaire text NOT NULL DEFAULT '',
      inputs jsonb NOT NULL,
      results jsonb NOT NULL,
      claimed_power_w double precision NOT NULL CHECK (claimed_power_w > 0),
      engine_version varchar(20) NOT NULL,
      author_id uuid REFERENCES users(id) ON DELETE SET NULL,
      spec_sheet_id uuid REFERENCES spec_sheets(id) ON DELETE SET NULL,
      luminaire_id uuid REFERENCES luminaires(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE INDEX wattage_audits_workspace_created ON wattage_audits (workspace_id, created_at DESC)`)
    await q.query(`CREATE INDEX wattage_audits_sheet ON wattage_audits (spec_sheet_id) WHERE spec_sheet_id IS NOT NULL`)
    await q.query(`CREATE INDEX wattage_audits_luminaire ON wattage_audits (luminaire_id) WHERE luminaire_id IS NOT NULL`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS wattage_audits`)
  }
}
