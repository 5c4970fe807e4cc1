import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * A luminaire may carry the key an outside schedule knows it by (so a schedule can be imported
 * again and update it), and the last tests done before this register kept its log book (so a first
 * import does not show every luminaire as never tested).
 */
export class LuminaireImportKeys1796249023378 implements MigrationInterface {
  name = 'LuminaireImportKeys1796249023378'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE luminaires
      ADD COLUMN external_id varchar(80),
      ADD COLUMN last_functional_test_on date,
      ADD COLUMN last_duration_test_on date`)
    await q.query(`CREATE UNIQUE INDEX luminaires_site_external_id ON luminaires (site_id, external_id) WHERE external_id IS NOT NULL`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX IF EXISTS luminaires_site_external_id`)
    await q.query(`ALTER TABLE luminaires DROP COLUMN IF EXISTS external_id, DROP COLUMN IF EXISTS last_functional_test_on, DROP COLUMN IF EXISTS last_duration_test_on`)
  }
}
