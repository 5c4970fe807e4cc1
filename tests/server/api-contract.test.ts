/**
 * The API's error contract: every error is RFC 9457 problem details; undeclared body fields and
 * query parameters are refused with their JSON Pointer (RFC 6901) on every route, generated from
 * the route table and its working examples; a wrong method answers 405 with Allow (RFC 9110
 * §15.5.6), a wrong media type 415 (RFC 9110 §15.5.16), a missing or bad credential 401 with
 * WWW-Authenticate: Bearer (RFC 6750 §3), and the auth scheme name is case-insensitive (RFC 9110 §11.1).
 * Reads carry an ETag and answer If-None-Match with 304 (RFC 9110 §13.1.2), answers are compressed
 * when the client accepts gzip (RFC 9110 §12.5.3), and the version is /api/v1 or the API-Version header.
 */
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import type { RouteSpec } from '../../server/policy/route'
import { jsonPointer, pointerToPath } from '../../shared/schemas/problem.schema'
import { anonymous, closeTestApp, getTestApp, makeTeam, signIn, type Client } from '../helpers/test-app'
import { routeExamples } from './route-examples'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

const UNKNOWN = 'notAFieldOfThisRoute'

function send(client: Client, route: RouteSpec, path: string, body?: unknown) {
  switch (route.method) {
    case 'get':
      return client.get(path)
    case 'post':
      return client.post(path, body ?? {})
    case 'put':
      return client.put(path, body ?? {})
    case 'patch':
      return client.patch(path, body ?? {})
    case 'delete':
      return client.delete(path)
  }
}

/** The example body with one undeclared field added, and the pointer it must be refused at. */
function withUnknownField(body: unknown): { body: unknown; pointer: string } {
  if (Array.isArray(body) && body.length && typeof body[0] === 'object')
    return { body: [{ ...body[0], [UNKNOWN]: 1 }, ...body.slice(1)], pointer: `/0/${UNKNOWN}` }
  return { body: { ...((body as object | undefined) ?? {}), [UNKNOWN]: 1 }, pointer: `/${UNKNOWN}` }
}

function expectProblem(res: supertest.Response, status: number, code: string) {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/)
  expect(res.body).toMatchObject({ type: `/api/problems/${code}`, status, code, title: expect.any(String), detail: expect.any(String) })
}

describe('strict input, generated from the route table', async () => {
  const table = (await getTestApp()).routeTable
  const bodyRoutes = table.filter((r) => r.body && r.body !== false)

  it('finds body routes to check (the generator is not looking at an empty table)', () => {
    expect(bodyRoutes.length).toBeGreaterThan(30)
  })

  for (const route of bodyRoutes) {
    const key = `${route.method} ${route.path}`
    it(`${key} refuses an undeclared body field with its pointer`, async () => {
      const team = await makeTeam('Strict team')
      const other = await makeTeam('Strict other')
      const owner = await signIn(built.app, team.users.owner.email)
      const example = await routeExamples[key]!({ team, other, role: 'owner', callerEmail: team.users.owner.email })
      const { body, pointer } = withUnknownField(example.body)
      const res = await send(owner, route, example.path, body)
      expectProblem(res, 400, 'invalid_input')
      expect(res.body.errors).toContainEqual({ pointer, code: 'unknown_field', detail: expect.any(String) })
    })
  }

  for (const route of table) {
    const key = `${route.method} ${route.path}`
    it(`${key} refuses an undeclared query parameter`, async () => {
      const team = await makeTeam('Strict query team')
      const other = await makeTeam('Strict query other')
      const owner = await signIn(built.app, team.users.owner.email)
      const example = await routeExamples[key]!({ team, other, role: 'owner', callerEmail: team.users.owner.email })
      const path = `${example.path}${example.path.includes('?') ? '&' : '?'}${UNKNOWN}=1`
      const res = await send(owner, route, path, example.body)
      if (route.invalid?.query === 404) {
        expectProblem(res, 404, 'not_found')
        return
      }
      expectProblem(res, 400, 'invalid_input')
      expect(res.body.errors).toContainEqual({ pointer: `/${UNKNOWN}`, code: 'unknown_parameter', in: 'query', detail: expect.any(String) })
    })
  }
})

describe('problem details', () => {
  it('names a nested undeclared field by its full pointer, and a misspelt field beside the missing one', async () => {
    const team = await makeTeam('Problem team')
    const designer = await signIn(built.app, team.users.designer.email)
    const res = await designer.post('/api/calc/size', { chemistry: 'nicd', durationn: '3 h', load: { power: '1 W', capacity_ah: 4 } })
    expectProblem(res, 400, 'invalid_input')
    expect(res.body.errors).toEqual(
      expect.arrayContaining([
        { pointer: '/durationn', code: 'unknown_field', detail: expect.any(String) },
        { pointer: '/load/capacity_ah', code: 'unknown_field', detail: expect.any(String) },
      ]),
    )
  })

  it('writes pointers as RFC 6901 says: "~" as ~0 and "/" as ~1, and reads them back', () => {
    expect(jsonPointer(['a/b', 'm~n', 0])).toBe('/a~1b/m~0n/0')
    expect(pointerToPath('/records/2/note')).toBe('records.2.note')
    expect(pointerToPath('')).toBe('(body)')
  })

  it('answers a route that does not exist with a problem', async () => {
    const res = await anonymous(built.app).get('/api/no-such-thing')
    expectProblem(res, 404, 'no_route')
  })

  it('answers unreadable JSON with a problem', async () => {
    const res = await supertest(built.app).post('/api/auth/sign-in').set('Content-Type', 'application/json').send('{"email": ')
    expectProblem(res, 400, 'invalid_json')
  })
})

describe('405, 415 and 401 forms', () => {
  it('answers a method the path does not take with 405 and Allow', async () => {
    const res = await supertest(built.app).delete('/api/health')
    expectProblem(res, 405, 'method_not_allowed')
    expect(res.headers.allow).toBe('GET, HEAD')
    const sites = await supertest(built.app).put('/api/sites')
    expectProblem(sites, 405, 'method_not_allowed')
    expect(sites.headers.allow?.split(', ')).toEqual(expect.arrayContaining(['GET', 'POST']))
  })

  it('answers a body in another media type with 415 and the type it reads', async () => {
    const team = await makeTeam('Media team')
    const designer = await signIn(built.app, team.users.designer.email)
    const res = await designer.agent.post('/api/sites').set('X-CSRF-Token', designer.csrf).set('Content-Type', 'text/plain').send('name=Depot')
    expectProblem(res, 415, 'unsupported_media_type')
    expect(res.headers['accept-post']).toBe('application/json')
    const form = await designer.agent.post('/api/sites').set('X-CSRF-Token', designer.csrf).type('form').send({ name: 'Depot' })
    expectProblem(form, 415, 'unsupported_media_type')
  })

  it('answers a missing credential with 401 and WWW-Authenticate: Bearer', async () => {
    const res = await supertest(built.app).get('/api/sites')
    expectProblem(res, 401, 'unauthorized')
    expect(res.headers['www-authenticate']).toMatch(/^Bearer\b/)
  })

  it('answers a bad token with 401, WWW-Authenticate naming invalid_token, whatever the case of the scheme', async () => {
    for (const scheme of ['Bearer', 'bearer', 'BEARER']) {
      const res = await supertest(built.app).get('/api/sites').set('Authorization', `${scheme} lw_not-a-real-token`)
      expectProblem(res, 401, 'bad_token')
      expect(res.headers['www-authenticate']).toMatch(/^Bearer .*error="invalid_token"/)
    }
  })

  it('accepts a good token whatever the case of the scheme', async () => {
    const team = await makeTeam('Scheme team')
    const owner = await signIn(built.app, team.users.owner.email)
    const made = await owner.post('/api/tokens', { name: 'scheme check', role: 'viewer' })
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    for (const scheme of ['Bearer', 'bearer', 'bEaReR']) {
      const res = await supertest(built.app).get('/api/sites').set('Authorization', `${scheme} ${made.body.token}`)
      expect(res.status, scheme).toBe(200)
    }
  })
})

describe('caching, compression and version', () => {
  it('answers a read with an ETag and a repeat with If-None-Match with 304 and no body', async () => {
    const first = await supertest(built.app).get('/api/openapi.json')
    expect(first.status).toBe(200)
    expect(first.headers.etag).toMatch(/^W\/"/)
    const again = await supertest(built.app).get('/api/openapi.json').set('If-None-Match', first.headers.etag!)
    expect(again.status).toBe(304)
    expect(again.text ?? '').toBe('')
    const other = await supertest(built.app).get('/api/openapi.json').set('If-None-Match', 'W/"something-else"')
    expect(other.status).toBe(200)
  })

  it('compresses a large answer for a client that accepts gzip, and not for one that does not', async () => {
    const gz = await supertest(built.app).get('/api/openapi.json').set('Accept-Encoding', 'gzip')
    expect(gz.headers['content-encoding']).toBe('gzip')
    expect(gz.body.openapi).toBe('3.1.0')
    const plain = await supertest(built.app).get('/api/openapi.json').set('Accept-Encoding', 'identity')
    expect(plain.headers['content-encoding']).toBeUndefined()
  })

  it('serves the same routes under /api/v1, says API-Version: 1, and refuses another version asked for', async () => {
    const v1 = await supertest(built.app).get('/api/v1/health')
    expect(v1.status).toBe(200)
    expect(v1.headers['api-version']).toBe('1')
    const bare = await supertest(built.app).get('/api/health')
    expect(bare.headers['api-version']).toBe('1')
    const wrongMethod = await supertest(built.app).delete('/api/v1/health')
    expectProblem(wrongMethod, 405, 'method_not_allowed')
    const v2 = await supertest(built.app).get('/api/health').set('API-Version', '2')
    expectProblem(v2, 400, 'invalid_input')
    expect(v2.body.errors).toEqual([expect.objectContaining({ pointer: '/API-Version', in: 'header' })])
  })
})
