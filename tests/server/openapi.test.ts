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

  it('describes request bodies from the shared zod schemas', async () => {
    const doc = (await supertest(built.app).get('/api/openapi.json')).body
    const signIn = doc.paths['/api/auth/sign-in'].post.requestBody.content['application/json'].schema
    expect(signIn.required).toEqual(expect.arrayContaining(['email', 'password']))
  })
})
