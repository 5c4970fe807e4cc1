import type { MigrationInterface, QueryRunner } from 'typeorm'

/** The currency a workspace writes prices and costs in; null until an owner chooses one (the owner's region's applies). */
export class WorkspaceCurrency1796251600000 implements MigrationInterface {
  name = 'WorkspaceCurrency1796251600000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE workspaces ADD COLUMN currency char(3) NULL CHECK (currency ~ '^[A-Z]{3}$')`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE workspaces DROP COLUMN currency`)
  }
}
