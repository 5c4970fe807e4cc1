import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { closeTestApp, getTestApp, makeTeam, signIn } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

describe('API tokens', () => {
  it('work for scripts without a session or CSRF token, and give 401 once revoked', async () => {
    const team = await makeTeam()
    const designer = await signIn(built.app, team.users.designer.email)
    const made = await designer.post('/api/tokens', { name: 'nightly export', role: 'technician' })
    expect(made.status).toBe(201)
    expect(made.body.token).toMatch(/^lw_/)
    const bearer = `Bearer ${made.body.token}`
    const me = await supertest(built.app).get('/api/auth/me').set('Authorization', bearer)
    expect(me.status).toBe(200)
    expect(me.body.role).toBe('technician')
    const calc = await supertest(built.app)
      .post('/api/calc/size')
      .set('Authorization', bearer)
      .send({ chemistry: 'nicd', duration: '3 h', load: { power: '1 W' } })
    expect(calc.status).toBe(200)
    // The token's role caps what it can do: an owner-only route is forbidden.
    const members = await supertest(built.app).get('/api/workspace/invitations').set('Authorization', bearer)
    expect(members.status).toBe(403)
    const revoke = await designer.delete(`/api/tokens/${made.body.id}`)
    expect(revoke.status).toBe(204)
    const after = await supertest(built.app).get('/api/auth/me').set('Authorization', bearer)
    expect(after.status).toBe(401)
  })

  it('cannot be made with a role above the maker', async () => {
    const team = await makeTeam()
    const tech = await signIn(built.app, team.users.technician.email)
    const res = await tech.post('/api/tokens', { name: 'too much', role: 'owner' })
    expect(res.status).toBe(403)
  })

  it('answers an unknown token with 401', async () => {
    const res = await supertest(built.app).get('/api/auth/me').set('Authorization', 'Bearer lw_not-a-real-token')
    expect(res.status).toBe(401)
  })
})
