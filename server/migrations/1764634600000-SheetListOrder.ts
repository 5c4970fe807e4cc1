import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * The sheet list's usual order (last changed first, id to break ties) read straight from an index,
 * so a page costs its own rows rather than a sort of the whole workspace.
 */
export class SheetListOrder1764634600000 implements MigrationInterface {
  name = 'SheetListOrder1764634600000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX IF EXISTS spec_sheets_workspace_updated`)
    await q.query(`CREATE INDEX spec_sheets_workspace_updated ON spec_sheets (workspace_id, updated_at DESC, id DESC)`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX IF EXISTS spec_sheets_workspace_updated`)
    await q.query(`CREATE INDEX spec_sheets_workspace_updated ON spec_sheets (workspace_id, updated_at DESC)`)
  }
}
