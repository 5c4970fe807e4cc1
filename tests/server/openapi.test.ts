import SwaggerParser from '@apidevtools/swagger-parser'
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { closeTestApp, getTestApp } from '../helpers/test-app'

let built: BuiltApp

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

  it('describes the answer of every JSON route from its declared schema', async () => {
    // A route answering JSON declares its answer in shared/schemas/answers, so the document and the client's types follow it.
    const missing = built.routeTable.filter((r) => r.produces === undefined && !r.response).map((r) => `${r.method} ${r.path}`)
    expect(missing).toEqual([])
    const doc = (await supertest(built.app).get('/api/openapi.json')).body
    const list = doc.paths['/api/sheets'].get.responses['200'].content['application/json'].schema
    expect(list.properties.items.items.properties.selectedCapacityAh.type).toEqual(['number', 'null'])
    const site = doc.paths['/api/sites/{id}'].get.responses['200'].content['application/json'].schema
    const luminaire = site.properties.luminaires.items
    expect(luminaire.properties.areaId.type).toEqual(['string', 'null'])
    expect(luminaire.properties.due.properties.state.enum).toEqual(['failed', 'overdue', 'due-now', 'due-soon', 'ok'])
  })

  it('describes request bodies from the shared zod schemas', async () => {
    const doc = (await supertest(built.app).get('/api/openapi.json')).body
    const signIn = doc.paths['/api/auth/sign-in'].post.requestBody.content['application/json'].schema
    expect(signIn.required).toEqual(expect.arrayContaining(['email', 'password']))
  })
})
