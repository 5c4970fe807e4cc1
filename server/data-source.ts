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
  // A small pool that gives up quickly when the database is away, so requests fail with 503 instead of hanging.
  extra: { max: 10, connectionTimeoutMillis: 3000, idleTimeoutMillis: 10000 },
})
