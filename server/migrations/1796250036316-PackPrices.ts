import type { MigrationInterface, QueryRunner } from 'typeorm'

/** A replacement-pack price per luminaire type (as the register names the type), set by the workspace for its pack budget. */
export class PackPrices1796250036316 implements MigrationInterface {
  name = 'PackPrices1796250036316'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE pack_prices (
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      type_label varchar(80) NOT NULL,
      price double precision NOT NULL CHECK (price >= 0 AND price <= 1000000),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      updated_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (workspace_id, type_label)
    )`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE pack_prices')
  }
}
