/**
 * Generated from the route table: every /api route is called anonymously, by each role, and by a
 * member of another workspace; the answer must be exactly what the route's declared access says.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { ROLES, roleAtLeast, type Role } from '../../shared/schemas/roles'
import type { RouteSpec } from '../../server/policy/access'
import { anonymous, closeTestApp, getTestApp, makeTeam, signIn, type Client } from '../helpers/test-app'
import { routeExamples } from './route-examples'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

function call(client: Client, route: RouteSpec, path: string, body?: unknown) {
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

function expectedFor(route: RouteSpec, role: Role | null): 'ok' | 401 | 403 {
  if (route.access === 'public') return 'ok'
  if (role === null) return 401
  if (route.access === 'signed-in') return 'ok'
  return roleAtLeast(role, route.access) ? 'ok' : 403
}

describe('access control, generated from the route table', async () => {
  const table = (await getTestApp()).routeTable

  it('has a working example for every route', () => {
    const missing = table.map((r) => `${r.method} ${r.path}`).filter((k) => !routeExamples[k])
    expect(missing).toEqual([])
  })

  for (const route of table) {
    const key = `${route.method} ${route.path}`
    it(`${key} (${route.access}) answers each caller as declared`, async () => {
      const example = routeExamples[key]
      if (!example) throw new Error(`no example for ${key}`)
      const team = await makeTeam('Route team')
      const other = await makeTeam('Other team')
      const callers: Array<{ role: Role | null; client: Client; email: string | null }> = [{ role: null, client: anonymous(built.app), email: null }]
      for (const role of ROLES) callers.push({ role, client: await signIn(built.app, team.users[role].email), email: team.users[role].email })

      for (const caller of callers) {
        const ex = await example({ team, other, role: caller.role, callerEmail: caller.email })
        const res = await call(caller.client, route, ex.path, ex.body)
        const expected = expectedFor(route, caller.role)
        const who = caller.role ?? 'anonymous'
        if (expected === 'ok') expect(res.status, `${who}: ${JSON.stringify(res.body)}`).toBeLessThan(400)
        else expect(res.status, `${who}: ${JSON.stringify(res.body)}`).toBe(expected)
        // Errors are always JSON; a successful download may be a PDF.
        expect(res.headers['content-type'] ?? 'application/json', who).toMatch(res.status < 400 ? /json|application\/pdf|^$/ : /json|^$/)
      }

      // Another workspace's owner must not learn that the record exists.
      const probe = await example({ team, other, role: 'owner', callerEmail: team.users.owner.email })
      if (probe.foreignPath) {
        const outsider = await signIn(built.app, other.users.owner.email)
        const res = await call(outsider, route, probe.path, probe.body)
        expect(res.status, `outsider on ${probe.path}`).toBe(404)
      }
    })
  }
})
