import type { Response } from 'express'
import type { z } from 'zod'
import { HealthAnswer } from '../../../shared/schemas/answers/system'
import { APP_VERSION } from '../../config'
import { dataSource } from '../../data-source'
import { appPoolIsFull, isPoolWaitTimeout } from '../../lib/pools'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import { defineRoute, type RouteSpec } from '../../policy/access'

async function health(res: Response): Promise<z.input<typeof HealthAnswer>> {
  let database: 'reachable' | 'unreachable' | 'busy' = 'unreachable'
  try {
    if (dataSource.isInitialized) {
      await dataSource.query('SELECT 1')
      database = 'reachable'
    }
  } catch (err) {
    // Every pooled connection in use is a busy process, not a database that is away.
    database = isPoolWaitTimeout(err) && appPoolIsFull() ? 'busy' : 'unreachable'
  }
  if (database !== 'reachable') res.set('Retry-After', database === 'busy' ? '2' : '5')
  res.status(database === 'reachable' ? 200 : 503)
  return { status: database === 'reachable' ? 'ok' : database === 'busy' ? 'busy' : 'degraded', version: APP_VERSION, engineVersion: ENGINE_VERSION, database }
}

export const healthRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/health',
    access: 'public',
    summary: 'Version and whether the database answers',
    response: HealthAnswer,
    handler: (_input, _req, res) => health(res),
  }),
]
