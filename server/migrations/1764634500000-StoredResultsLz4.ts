import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Large stored results (a sheet's working, a discharge curve, a parsed photometric file) are
 * compressed with lz4 instead of pglz: reading a sheet back costs PostgreSQL about half the CPU.
 * Existing values are rewritten so they take the new method. Skipped where the server was built
 * without lz4 (Debian's packages have it).
 */
const COLUMNS: Array<[table: string, column: string]> = [
  ['spec_sheets', 'inputs'],
  ['spec_sheets', 'results'],
  ['spec_revisions', 'inputs'],
  ['spec_revisions', 'results'],
  ['discharge_logs', 'curve'],
  ['photometric_files', 'parsed'],
  ['wattage_audits', 'results'],
]

async function lz4Available(q: QueryRunner): Promise<boolean> {
  const rows = await q.query(`SELECT 1 FROM pg_settings WHERE name = 'default_toast_compression' AND 'lz4' = ANY(enumvals)`)
  return rows.length > 0
}

export class StoredResultsLz41764634500000 implements MigrationInterface {
  name = 'StoredResultsLz41764634500000'

  async up(q: QueryRunner): Promise<void> {
    if (!(await lz4Available(q))) return
    for (const [table, column] of COLUMNS) {
      await q.query(`ALTER TABLE ${table} ALTER COLUMN ${column} SET COMPRESSION lz4`)
      // A value only takes the new method when it is written anew.
      await q.query(`UPDATE ${table} SET ${column} = (${column}::text)::jsonb`)
    }
  }

  async down(q: QueryRunner): Promise<void> {
    for (const [table, column] of COLUMNS) await q.query(`ALTER TABLE ${table} ALTER COLUMN ${column} SET COMPRESSION default`)
  }
}
