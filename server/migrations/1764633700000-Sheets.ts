import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Specification sheets, their revisions (one per save) and read-only share links. */
export class Sheets1764633700000 implements MigrationInterface {
  name = 'Sheets1764633700000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE spec_sheets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      title varchar(200) NOT NULL,
      reference varchar(80) NOT NULL DEFAULT '',
      client varchar(200) NOT NULL DEFAULT '',
      site varchar(200) NOT NULL DEFAULT '',
      luminaire text NOT NULL DEFAULT '',
      chemistry varchar(16) NOT NULL,
      inputs jsonb NOT NULL,
      results jsonb NOT NULL,
      engine_version varchar(20) NOT NULL,
      status varchar(16) NOT NULL DEFAULT 'draft' CHECK (status IN ('draft','issued')),
      current_revision integer NOT NULL DEFAULT 1,
      issued_revision integer,
      version integer NOT NULL DEFAULT 1,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      updated_by uuid REFERENCES users(id) ON DELETE SET NULL,
      archived_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE INDEX spec_sheets_workspace_updated ON spec_sheets (workspace_id, updated_at DESC)`)
    await q.query(`CREATE INDEX spec_sheets_workspace_filters ON spec_sheets (workspace_id, status, chemistry, created_by)`)
    await q.query(`CREATE TABLE spec_revisions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      sheet_id uuid NOT NULL REFERENCES spec_sheets(id) ON DELETE CASCADE,
      number integer NOT NULL,
      sheet_version integer NOT NULL,
      title varchar(200) NOT NULL,
      reference varchar(80) NOT NULL DEFAULT '',
      client varchar(200) NOT NULL DEFAULT '',
      site varchar(200) NOT NULL DEFAULT '',
      luminaire text NOT NULL DEFAULT '',
      inputs jsonb NOT NULL,
      results jsonb NOT NULL,
      engine_version varchar(20) NOT NULL,
      status varchar(16) NOT NULL DEFAULT 'draft' CHECK (status IN ('draft','issued','superseded')),
      author_id uuid REFERENCES users(id) ON DELETE SET NULL,
      issued_at timestamptz,
      issued_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE UNIQUE INDEX spec_revisions_sheet_number ON spec_revisions (sheet_id, number)`)
    await q.query(`CREATE TABLE share_links (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      sheet_id uuid NOT NULL REFERENCES spec_sheets(id) ON DELETE CASCADE,
      token_hash varchar(64) NOT NULL UNIQUE,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      expires_at timestamptz,
      revoked_at timestamptz,
      revoked_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE INDEX share_links_sheet ON share_links (sheet_id)`)
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['share_links', 'spec_revisions', 'spec_sheets']) await q.query(`DROP TABLE IF EXISTS ${t}`)
  }
}
