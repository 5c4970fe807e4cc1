import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Read-only links to a site's log book, for an inspector or an owner without an account. */
export class LogBookLinks1796251500000 implements MigrationInterface {
  name = 'LogBookLinks1796251500000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE logbook_links (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      token_hash varchar(64) NOT NULL UNIQUE,
      expires_on date,
      revoked_at timestamptz,
      revoked_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE INDEX logbook_links_site ON logbook_links (workspace_id, site_id, created_at)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS logbook_links`)
  }
}
