import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Site register and test log book: sites, areas, luminaires, test records, and the reminder claims. */
export class Register1764633800000 implements MigrationInterface {
  name = 'Register1764633800000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE sites (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      name varchar(120) NOT NULL,
      address varchar(400) NOT NULL DEFAULT '',
      responsible_name varchar(120) NOT NULL DEFAULT '',
      responsible_email varchar(254) NOT NULL DEFAULT '',
      regime varchar(16) NOT NULL CHECK (regime IN ('en50172','nfpa101')),
      ceiling_temperature_c double precision NOT NULL DEFAULT 25,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE INDEX sites_workspace ON sites (workspace_id, name)`)
    await q.query(`CREATE TABLE areas (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      name varchar(120) NOT NULL,
      notes varchar(400) NOT NULL DEFAULT '',
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE UNIQUE INDEX areas_site_name ON areas (site_id, lower(name))`)
    // luminaire_type_id links to a luminaire type; that feature adds its foreign key.
    await q.query(`CREATE TABLE luminaires (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      area_id uuid REFERENCES areas(id) ON DELETE SET NULL,
      tag varchar(40) NOT NULL,
      location varchar(200) NOT NULL DEFAULT '',
      type_label varchar(80) NOT NULL DEFAULT '',
      purpose varchar(16) NOT NULL CHECK (purpose IN ('escape-route','open-area','high-risk','exit-sign')),
      mode varchar(16) NOT NULL CHECK (mode IN ('maintained','non-maintained')),
      rated_duration_h double precision NOT NULL CHECK (rated_duration_h > 0),
      chemistry varchar(16) NOT NULL,
      cells_in_series integer NOT NULL CHECK (cells_in_series > 0),
      capacity_ah double precision NOT NULL CHECK (capacity_ah > 0),
      pack_fitted_on date NOT NULL,
      spec_sheet_id uuid REFERENCES spec_sheets(id) ON DELETE SET NULL,
      luminaire_type_id uuid,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE UNIQUE INDEX luminaires_site_tag ON luminaires (site_id, lower(tag))`)
    await q.query(`CREATE INDEX luminaires_workspace ON luminaires (workspace_id)`)
    await q.query(`CREATE TABLE test_records (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      luminaire_id uuid NOT NULL REFERENCES luminaires(id) ON DELETE CASCADE,
      client_id uuid NOT NULL,
      kind varchar(16) NOT NULL CHECK (kind IN ('functional','duration')),
      tested_on date NOT NULL,
      passed boolean NOT NULL,
      achieved_duration_h double precision CHECK (achieved_duration_h IS NULL OR achieved_duration_h >= 0),
      faults text NOT NULL DEFAULT '',
      remedial_action text NOT NULL DEFAULT '',
      discharge_log_id uuid,
      recorded_by uuid REFERENCES users(id) ON DELETE SET NULL,
      recorded_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now())`)
    // Retries of the same record (same client id) land on this key instead of adding a row.
    await q.query(`CREATE UNIQUE INDEX test_records_client ON test_records (workspace_id, client_id)`)
    await q.query(`CREATE INDEX test_records_luminaire ON test_records (luminaire_id, tested_on)`)
    // One reminder per site per day, claimed before the mail is sent.
    await q.query(`CREATE TABLE reminder_sends (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      day date NOT NULL,
      recipients jsonb NOT NULL DEFAULT '[]',
      luminaire_count integer NOT NULL DEFAULT 0,
      sent_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE UNIQUE INDEX reminder_sends_site_day ON reminder_sends (site_id, day)`)
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['reminder_sends', 'test_records', 'luminaires', 'areas', 'sites']) await q.query(`DROP TABLE IF EXISTS ${t}`)
  }
}
