import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * The log book as an inspector reads it: the workspace's repair window, the site's walking order,
 * the circuit and charger recharge time the test planner needs, the checklist and reasons stored
 * with a test record, signed-off rounds, stored test plans, and a discharge log that belongs to a
 * luminaire directly.
 */
export class LogBookState1796222520139 implements MigrationInterface {
  name = 'LogBookState1796222520139'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE register_settings (
      workspace_id uuid PRIMARY KEY REFERENCES workspaces(id) ON DELETE CASCADE,
      repair_window_days integer NOT NULL DEFAULT 14 CHECK (repair_window_days BETWEEN 1 AND 365),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`)
    await q.query(`ALTER TABLE luminaires
      ADD COLUMN walk_order integer NULL,
      ADD COLUMN circuit varchar(40) NOT NULL DEFAULT '',
      ADD COLUMN recharge_h double precision NULL CHECK (recharge_h IS NULL OR (recharge_h > 0 AND recharge_h <= 72))`)
    await q.query(`CREATE TABLE test_rounds (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      client_id uuid NOT NULL,
      signed_off_by_name varchar(120) NOT NULL,
      signed_off_on date NOT NULL,
      notes text NOT NULL DEFAULT '',
      recorded_by uuid NULL REFERENCES users(id) ON DELETE SET NULL,
      recorded_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (workspace_id, client_id)
    )`)
    await q.query(`CREATE INDEX test_rounds_site ON test_rounds (workspace_id, site_id, signed_off_on DESC)`)
    await q.query(`ALTER TABLE test_records
      ADD COLUMN checklist jsonb NOT NULL DEFAULT '{}'::jsonb,
      ADD COLUMN verdict_override_reason text NOT NULL DEFAULT '',
      ADD COLUMN runtime_note text NOT NULL DEFAULT '',
      ADD COLUMN round_client_id uuid NULL`)
    await q.query(`CREATE TABLE test_plans (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      input jsonb NOT NULL,
      plan jsonb NOT NULL,
      created_by uuid NULL REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    )`)
    await q.query(`CREATE INDEX test_plans_site ON test_plans (workspace_id, site_id, created_at DESC)`)
    await q.query(`ALTER TABLE discharge_logs ADD COLUMN luminaire_id uuid NULL REFERENCES luminaires(id) ON DELETE SET NULL`)
    await q.query(`CREATE INDEX discharge_logs_luminaire ON discharge_logs (workspace_id, luminaire_id) WHERE luminaire_id IS NOT NULL`)
    // Logs attached to a test record so far belong to that record's luminaire.
    await q.query(`UPDATE discharge_logs d SET luminaire_id = t.luminaire_id FROM test_records t WHERE t.id = d.test_record_id AND d.luminaire_id IS NULL`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX IF EXISTS discharge_logs_luminaire`)
    await q.query(`ALTER TABLE discharge_logs DROP COLUMN luminaire_id`)
    await q.query(`DROP TABLE test_plans`)
    await q.query(`ALTER TABLE test_records DROP COLUMN checklist, DROP COLUMN verdict_override_reason, DROP COLUMN runtime_note, DROP COLUMN round_client_id`)
    await q.query(`DROP TABLE test_rounds`)
    await q.query(`ALTER TABLE luminaires DROP COLUMN walk_order, DROP COLUMN circuit, DROP COLUMN recharge_h`)
    await q.query(`DROP TABLE register_settings`)
  }
}
