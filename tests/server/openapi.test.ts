import SwaggerParser from '@apidevtools/swagger-parser'
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { closeTestApp, getTestApp } from '../helpers/test-app'

let built: BuiltApp

/** Routes answering JSON whose answer is not yet declared in shared/schemas/answers. */
const PENDING_ANSWER_SCHEMAS = [
  'get /api/openapi.json',
  'get /api/health',
  'get /api/calc',
  'post /api/calc/:tool',
  'get /api/register/settings',
  'patch /api/register/settings',
  'get /api/sites',
  'post /api/sites',
  'get /api/sites/:id',
  'patch /api/sites/:id',
  'post /api/sites/:id/areas',
  'patch /api/areas/:id',
  'post /api/sites/:id/luminaires',
  'get /api/luminaires/:id',
  'patch /api/luminaires/:id',
  'post /api/luminaires/:id/pack',
  'get /api/luminaires/:id/tests',
  'post /api/tests',
  'get /api/sites/:id/tests',
  'post /api/sites/:id/import/preview',
  'post /api/sites/:id/import',
  'get /api/sites/:id/export/:file',
  'get /api/audits',
  'post /api/audits',
  'get /api/audits/:id',
  'post /api/audits/:id/attach',
  'post /api/discharge/uploads',
  'post /api/discharge/logs',
  'get /api/discharge/logs',
  'get /api/discharge/logs/:id',
  'get /api/discharge/compare',
  'get /api/photometry',
  'post /api/photometry',
  'get /api/photometry/:id',
  'get /api/luminaire-types',
  'post /api/luminaire-types',
  'get /api/luminaire-types/:id',
  'patch /api/luminaire-types/:id',
  'post /api/route-spacing/select',
  'post /api/route-spacing/pick',
]
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

describe('GET /api/openapi.json', () => {
  it('is a valid OpenAPI document (checked with @apidevtools/swagger-parser) listing every /api route', async () => {
    const res = await supertest(built.app).get('/api/openapi.json')
    expect(res.status).toBe(200)
    const doc = res.body
    await expect(SwaggerParser.validate(structuredClone(doc))).resolves.toBeTruthy()
    for (const route of built.routeTable) {
      const path = route.path.replace(/:(\w+)/g, '{$1}')
      expect(doc.paths[path]?.[route.method], `${route.method} ${route.path}`).toBeTruthy()
    }
  })

  it('lists a request schema for every route that takes a body, and OpenAPI 3.1 schemas (no 3.0 nullable)', async () => {
    const doc = (await supertest(built.app).get('/api/openapi.json')).body
    expect(doc.openapi).toBe('3.1.0')
    for (const route of built.routeTable.filter((r) => r.body)) {
      const op = doc.paths[route.path.replace(/:(\w+)/g, '{$1}')][route.method]
      expect(op.requestBody?.content?.['application/json']?.schema, `${route.method} ${route.path}`).toBeTruthy()
    }
    expect(JSON.stringify(doc)).not.toMatch(/"nullable":/)
  })

  it('describes the answer of every JSON route from its declared schema (the routes still listed below have none yet)', async () => {
    // Shrinks as answers get their schema in shared/schemas/answers; a new route must declare one.
    const pending = new Set(PENDING_ANSWER_SCHEMAS)
    const missing = built.routeTable
      .filter((r) => r.produces === undefined && !r.response)
      .map((r) => `${r.method} ${r.path}`)
      .filter((k) => !pending.has(k))
    expect(missing).toEqual([])
    const doc = (await supertest(built.app).get('/api/openapi.json')).body
    const list = doc.paths['/api/sheets'].get.responses['200'].content['application/json'].schema
    expect(list.properties.items.items.properties.selectedCapacityAh.type).toEqual(['number', 'null'])
  })

  it('describes request bodies from the shared zod schemas', async () => {
    const doc = (await supertest(built.app).get('/api/openapi.json')).body
    const signIn = doc.paths['/api/auth/sign-in'].post.requestBody.content['application/json'].schema
    expect(signIn.required).toEqual(expect.arrayContaining(['email', 'password']))
  })
})
