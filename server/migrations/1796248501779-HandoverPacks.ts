import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Handover packs: a frozen copy of a site handed to its owner, numbered per site, with read-only links. */
export class HandoverPacks1796248501779 implements MigrationInterface {
  name = 'HandoverPacks1796248501779'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE handover_packs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      number integer NOT NULL CHECK (number >= 1),
      signed_by_name varchar(120) NOT NULL,
      signed_on date NOT NULL,
      content jsonb NOT NULL,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (site_id, number))`)
    await q.query(`CREATE INDEX handover_packs_workspace ON handover_packs (workspace_id, site_id)`)
    await q.query(`CREATE TABLE handover_links (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      pack_id uuid NOT NULL REFERENCES handover_packs(id) ON DELETE CASCADE,
      token_hash varchar(64) NOT NULL UNIQUE,
      expires_on date,
      revoked_at timestamptz,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE INDEX handover_links_pack ON handover_links (pack_id)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS handover_links`)
    await q.query(`DROP TABLE IF EXISTS handover_packs`)
  }
}
