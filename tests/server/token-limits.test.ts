/**
 * API tokens: an expiry after which the token answers 401, scopes (read, write, calc) checked with
 * 403 insufficient_scope as RFC 6750 §3.1 describes, every write made with a token recorded in
 * the audit trail with the token's name, and a request limit per token announced with the
 * RateLimit-Policy / RateLimit headers (IETF httpapi rate-limit headers draft-07 form, from memory)
 * and enforced with 429 and Retry-After (RFC 9110 §10.2.3).
 */
import crypto from 'node:crypto'
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { createApp } from '../../server/app'
import { closeTestApp, getTestApp, makeTeam, ROOMY_LIMITS, signIn, type Client, type TestTeam } from '../helpers/test-app'

let built: BuiltApp
let team: TestTeam
let designer: Client
beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Token team')
  designer = await signIn(built.app, team.users.designer.email)
})
afterAll(closeTestApp)

async function makeToken(body: Record<string, unknown>) {
  const res = await designer.post('/api/tokens', { role: 'designer', ...body })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body as { id: string; token: string; scopes: string[]; expiresAt: string | null }
}
const as = (token: string) => ({
  get: (path: string) => supertest(built.app).get(path).set('Authorization', `Bearer ${token}`),
  post: (path: string, body: object) => supertest(built.app).post(path).set('Authorization', `Bearer ${token}`).send(body),
})
const siteBody = (name: string) => ({ name, regime: 'en50172', ceilingTemperatureC: 22 })

describe('token expiry', () => {
  it('keeps the expiry it was given and stops working after it', async () => {
    const expiresAt = new Date(Date.now() + 3600_000).toISOString()
    const made = await makeToken({ name: 'expiring', expiresAt })
    expect(Date.parse(made.expiresAt!)).toBe(Date.parse(expiresAt))
    expect((await as(made.token).get('/api/sites')).status).toBe(200)
    await dataSource.query(`UPDATE api_tokens SET expires_at = now() - interval '1 second' WHERE id = $1`, [made.id])
    const late = await as(made.token).get('/api/sites')
    expect(late.status).toBe(401)
    expect(late.body.code).toBe('bad_token')
    expect(late.headers['www-authenticate']).toMatch(/error="invalid_token"/)
    const listed = await designer.get('/api/tokens')
    expect(listed.body.tokens.find((t: { id: string }) => t.id === made.id).expiresAt).not.toBeNull()
  })

  it('refuses an expiry in the past (422) and a misspelt expiry field (400 with its pointer)', async () => {
    const past = await designer.post('/api/tokens', { name: 'past', role: 'viewer', expiresAt: '2020-01-01T00:00:00Z' })
    expect(past.status).toBe(422)
    expect(past.body.errors).toEqual([expect.objectContaining({ pointer: '/expiresAt' })])
    const typo = await designer.post('/api/tokens', { name: 'typo', role: 'viewer', expiresAtt: '2030-01-01T00:00:00Z' })
    expect(typo.status).toBe(400)
    expect(typo.body.errors).toEqual([expect.objectContaining({ pointer: '/expiresAtt', code: 'unknown_field' })])
  })
})

describe('token scopes', () => {
  it('gives a token made without scopes all three, as before scopes existed', async () => {
    const made = await makeToken({ name: 'everything' })
    expect(made.scopes).toEqual(['read', 'write', 'calc'])
  })

  it('lets a read token read but not write, answering 403 insufficient_scope naming the scope', async () => {
    const made = await makeToken({ name: 'reader', scopes: ['read'] })
    expect((await as(made.token).get('/api/sites')).status).toBe(200)
    const write = await as(made.token).post('/api/sites', siteBody(`Read only ${crypto.randomUUID()}`))
    expect(write.status).toBe(403)
    expect(write.body.code).toBe('insufficient_scope')
    expect(write.headers['www-authenticate']).toBe('Bearer realm="api", error="insufficient_scope", scope="write"')
    const calc = await as(made.token).post('/api/calc/size', { chemistry: 'nicd', duration: '3 h', load: { power: '1 W' } })
    expect(calc.status).toBe(403)
  })

  it('lets a calc token run engine tools and nothing else', async () => {
    const made = await makeToken({ name: 'sizer', scopes: ['calc'] })
    expect((await as(made.token).post('/api/calc/size', { chemistry: 'nicd', duration: '3 h', load: { power: '1 W' } })).status).toBe(200)
    expect((await as(made.token).get('/api/sites')).status).toBe(403)
  })

  it('refuses an unknown scope and an empty list', async () => {
    expect((await designer.post('/api/tokens', { name: 'x', role: 'viewer', scopes: ['admin'] })).status).toBe(400)
    expect((await designer.post('/api/tokens', { name: 'x', role: 'viewer', scopes: [] })).status).toBe(400)
  })
})

describe('the audit trail of token writes', () => {
  it("names the token on the service's own event and records one event per write", async () => {
    const made = await makeToken({ name: 'schedule importer', scopes: ['read', 'write'] })
    const created = await as(made.token).post('/api/sites', siteBody(`Imported ${crypto.randomUUID()}`))
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const [event] = await dataSource.query(`SELECT actor_id, api_token_id, api_token_name FROM audit_events WHERE action = 'site.created' AND entity_id = $1`, [
      created.body.id,
    ])
    expect(event).toEqual({ actor_id: team.users.designer.id, api_token_id: made.id, api_token_name: 'schedule importer' })
    // The per-request event is written once the answer has gone out.
    await expect
      .poll(async () => dataSource.query(`SELECT data FROM audit_events WHERE action = 'api.write' AND api_token_id = $1`, [made.id]))
      .toEqual([{ data: { method: 'POST', path: '/api/sites', status: 201 } }])
  })

  it('leaves the token out of events made from a signed-in session', async () => {
    const created = await designer.post('/api/sites', siteBody(`By hand ${crypto.randomUUID()}`))
    const [event] = await dataSource.query(`SELECT api_token_id, api_token_name FROM audit_events WHERE action = 'site.created' AND entity_id = $1`, [
      created.body.id,
    ])
    expect(event).toEqual({ api_token_id: null, api_token_name: null })
  })
})

describe('the request limit per token', () => {
  it('announces the limit on each answer and refuses the request past it with 429 and Retry-After', async () => {
    const made = await makeToken({ name: 'busy script', scopes: ['read'] })
    const limited = createApp({ clientDir: null, limits: { ...ROOMY_LIMITS, tokenRequests: { max: 3, windowMs: 60_000 } } })
    try {
      const call = () => supertest(limited.app).get('/api/sites').set('Authorization', `Bearer ${made.token}`)
      const remaining: string[] = []
      for (let i = 0; i < 3; i++) {
        const res = await call()
        expect(res.status).toBe(200)
        expect(res.headers['ratelimit-policy']).toBe('3;w=60')
        remaining.push(/remaining=(\d+)/.exec(res.headers.ratelimit ?? '')?.[1] ?? '?')
      }
      expect(remaining).toEqual(['2', '1', '0'])
      const refused = await call()
      expect(refused.status).toBe(429)
      expect(refused.body.code).toBe('too_many_requests')
      expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0)
      expect(Number(refused.headers['retry-after'])).toBeLessThanOrEqual(60)
      // A signed-in session is not counted against the token's limit.
      expect((await supertest(limited.app).get('/api/health')).status).toBe(200)
    } finally {
      await limited.close()
      // Later files in this worker get the roomy limits back.
      createApp({ clientDir: null, limits: ROOMY_LIMITS })
    }
  })
})
