import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Four testing regimes instead of two; the history of a site's regime (which profile and version
 * applied from which day, who changed it and why); and a test marked as recorded in error, kept
 * in the log book but left out of the luminaire's state.
 */
export class RegimeProfiles1796250931597 implements MigrationInterface {
  name = 'RegimeProfiles1796250931597'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE sites DROP CONSTRAINT IF EXISTS sites_regime_check`)
    await q.query(`ALTER TABLE sites ADD CONSTRAINT sites_regime_check CHECK (regime IN ('en50172','nfpa101','ca-nfc','asnzs2293'))`)
    await q.query(`CREATE TABLE site_regime_changes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      from_regime varchar(16) NULL,
      to_regime varchar(16) NOT NULL,
      profile_version varchar(16) NOT NULL,
      reason text NOT NULL DEFAULT '',
      changed_by uuid NULL REFERENCES users(id) ON DELETE SET NULL,
      changed_at timestamptz NOT NULL DEFAULT now()
    )`)
    await q.query(`CREATE INDEX site_regime_changes_site ON site_regime_changes (site_id, changed_at)`)
    // Every existing site starts its history with the regime it has now.
    await q.query(`INSERT INTO site_regime_changes (workspace_id, site_id, from_regime, to_regime, profile_version, changed_at)
      SELECT workspace_id, id, NULL, regime, '2026.1', created_at FROM sites`)
    await q.query(`ALTER TABLE test_records
      ADD COLUMN recorded_in_error_at timestamptz NULL,
      ADD COLUMN recorded_in_error_by uuid NULL REFERENCES users(id) ON DELETE SET NULL,
      ADD COLUMN recorded_in_error_reason text NOT NULL DEFAULT ''`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE test_records DROP COLUMN recorded_in_error_reason, DROP COLUMN recorded_in_error_by, DROP COLUMN recorded_in_error_at`)
    await q.query(`DROP TABLE site_regime_changes`)
    await q.query(`UPDATE sites SET regime = 'en50172' WHERE regime NOT IN ('en50172','nfpa101')`)
    await q.query(`ALTER TABLE sites DROP CONSTRAINT IF EXISTS sites_regime_check`)
    await q.query(`ALTER TABLE sites ADD CONSTRAINT sites_regime_check CHECK (regime IN ('en50172','nfpa101'))`)
  }
}
