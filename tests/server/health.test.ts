import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { closeTestApp, getTestApp } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

describe('GET /api/health', () => {
  it('answers 200 with the version and a reachable database', async () => {
    const res = await supertest(built.app).get('/api/health')
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ status: 'ok', database: 'reachable' })
    expect(res.body.version).toMatch(/^\d+\.\d+\.\d+$/)
  })
})

describe('bad requests', () => {
  it('answers malformed JSON with a JSON 400 and a clear message', async () => {
    const res = await supertest(built.app).post('/api/auth/sign-in').set('Content-Type', 'application/json').send('{"email": "a@b.c", ')
    expect(res.status).toBe(400)
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/)
    expect(res.body.detail).toMatch(/not valid JSON/)
  })

  it('answers an unknown /api route with a JSON 404 naming the route', async () => {
    const res = await supertest(built.app).get('/api/no-such-thing')
    expect(res.status).toBe(404)
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/)
    expect(res.body.detail).toContain('/api/no-such-thing')
  })

  it('turns a zod failure into 400 with the field and the reason', async () => {
    const res = await supertest(built.app).post('/api/auth/sign-in').send({ email: 'not-an-email', password: '' })
    expect(res.status).toBe(400)
    expect(res.body.fields).toEqual(expect.arrayContaining([expect.objectContaining({ path: 'email' }), expect.objectContaining({ path: 'password' })]))
  })

  it('refuses an oversized JSON body with 413, not 500', async () => {
    const res = await supertest(built.app)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'x'.repeat(2_000_000) }))
    expect(res.status).toBe(413)
    expect(res.body.error).toBeTruthy()
  })

  it('sends security headers (helmet) on API responses', async () => {
    const res = await supertest(built.app).get('/api/health')
    expect(res.headers['x-content-type-options']).toBe('nosniff')
    expect(res.headers['content-security-policy']).toContain("default-src 'self'")
    expect(res.headers['x-powered-by']).toBeUndefined()
    // Private data is not kept in browser or proxy caches (a weak ETag only lets a client that kept
    // an answer itself ask whether it changed).
    expect(res.headers['cache-control']).toBe('private, no-store')
  })
})
