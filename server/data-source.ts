/** The one TypeORM DataSource. Schema changes only through migrations; synchronize stays off. */
import 'reflect-metadata'
import { DataSource } from 'typeorm'
import { config } from './config'
import { entities } from './entities'
import { migrations } from './migrations/index'

export const dataSource = new DataSource({
  type: 'postgres',
  url: config().db.url,
  entities,
  migrations,
  synchronize: false,
  migrationsTransactionMode: 'each',
  // Sized from config (DB_POOL_MAX). A request queues up to DB_POOL_WAIT_MS for a free connection;
  // past that it is answered 503 "busy" (server/lib/pools.ts tells a full pool from a database that is away).
  extra: { max: config().db.poolMax, connectionTimeoutMillis: config().db.poolWaitMs, idleTimeoutMillis: 10000 },
})
