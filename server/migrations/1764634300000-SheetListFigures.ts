import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * The two figures the sheet list shows, kept beside the results as stored generated columns, so a
 * list page reads a few bytes per row instead of de-TOASTing each sheet's results and working.
 */
export class SheetListFigures1764634300000 implements MigrationInterface {
  name = 'SheetListFigures1764634300000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE spec_sheets
      ADD COLUMN selected_capacity_ah float8 GENERATED ALWAYS AS ((results->>'selectedCapacityAh')::float8) STORED,
      ADD COLUMN required_capacity_ah float8 GENERATED ALWAYS AS ((results->>'requiredCapacityAh')::float8) STORED`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE spec_sheets DROP COLUMN IF EXISTS selected_capacity_ah, DROP COLUMN IF EXISTS required_capacity_ah`)
  }
}
