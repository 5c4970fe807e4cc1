/**
 * Named prepared statements for the hottest reads. The query builder rebuilds its SQL on every call
 * and PostgreSQL parses and plans it again; a named statement is parsed and planned once per pooled
 * connection. Only for fixed SQL texts: the name must always stand for the same text.
 */
import { dataSource } from '../data-source'

interface Pool {
  query<R>(config: { name: string; text: string; values: unknown[] }): Promise<{ rows: R[] }>
}

export async function preparedRows<R>(name: string, text: string, values: unknown[]): Promise<R[]> {
  // TypeORM's own pg pool, so these reads share its connections and limits.
  const pool = (dataSource.driver as unknown as { master: Pool }).master
  try {
    return (await pool.query<R>({ name, text, values })).rows
  } catch (err) {
    // Shaped like TypeORM's errors, so the error handler reads the PostgreSQL code in one place.
    throw Object.assign(new Error((err as Error).message), { driverError: err })
  }
}
