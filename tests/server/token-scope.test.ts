/**
 * An API token acts only inside its workspace and role; account-level actions need a signed-in
 * session. Owners see every member's tokens in their workspace and can revoke them.
 */
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { newToken } from '../../server/lib/tokens'
import { Invitation } from '../../server/modules/workspaces/invitation.entity'
import { closeTestApp, getTestApp, makeTeam, signIn } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

async function viewerToken() {
  const team = await makeTeam()
  const session = await signIn(built.app, team.users.viewer.email)
  const made = await session.post('/api/tokens', { name: 'script', role: 'viewer' })
  expect(made.status).toBe(201)
  return { team, session, id: made.body.id as string, bearer: `Bearer ${made.body.token as string}` }
}

describe('API token scope', () => {
  it('a viewer token cannot rename its user, create workspaces, switch, change the password or accept invitations', async () => {
    const { team, bearer } = await viewerToken()
    const call = (method: 'post' | 'patch', path: string, body: object) => supertest(built.app)[method](path).set('Authorization', bearer).send(body)
    expect((await call('patch', '/api/auth/me', { name: 'Renamed by a script' })).status).toBe(403)
    expect((await call('post', '/api/workspaces', { name: 'Made by a script' })).status).toBe(403)
    expect((await call('post', '/api/workspaces/switch', { workspaceId: team.workspaceId })).status).toBe(403)
    expect((await call('post', '/api/auth/password', { currentPassword: 'x', newPassword: 'a changed passphrase today' })).status).toBe(403)
    const other = await makeTeam()
    const { token, hash } = newToken()
    await dataSource.getRepository(Invitation).insert({
      workspaceId: other.workspaceId,
      email: team.users.viewer.email,
      role: 'owner',
      tokenHash: hash,
      invitedBy: other.users.owner.id,
      expiresAt: new Date(Date.now() + 3600_000),
      acceptedAt: null,
    })
    expect((await call('post', `/api/invitations/${token}/accept`, {})).status).toBe(403)
    const me = await supertest(built.app).get('/api/auth/me').set('Authorization', bearer)
    expect(me.status).toBe(200)
    expect(me.body.user.name).toBe('viewer person')
  })

  it('a token sees only its own workspace in /api/auth/me and /api/workspaces', async () => {
    const { team, session, bearer } = await viewerToken()
    expect((await session.post('/api/workspaces', { name: 'Another of mine' })).status).toBe(201)
    const me = await supertest(built.app).get('/api/auth/me').set('Authorization', bearer)
    expect(me.body.workspaces.map((w: { id: string }) => w.id)).toEqual([team.workspaceId])
    const list = await supertest(built.app).get('/api/workspaces').set('Authorization', bearer)
    expect(list.status).toBe(403)
  })

  it("owners see every member's tokens in their workspace and can revoke one; other workspaces' tokens answer 404", async () => {
    const { team, id, bearer } = await viewerToken()
    const owner = await signIn(built.app, team.users.owner.email)
    const list = await owner.get('/api/workspace/tokens')
    expect(list.status).toBe(200)
    expect(list.body.tokens).toEqual([
      expect.objectContaining({ id, userId: team.users.viewer.id, userName: 'viewer person', role: 'viewer', revokedAt: null }),
    ])
    expect(JSON.stringify(list.body)).not.toContain(bearer.slice(7))

    const outsider = await signIn(built.app, (await makeTeam()).users.owner.email)
    expect((await outsider.delete(`/api/workspace/tokens/${id}`)).status).toBe(404)

    expect((await owner.delete(`/api/workspace/tokens/${id}`)).status).toBe(204)
    expect((await supertest(built.app).get('/api/workspace/members').set('Authorization', bearer)).status).toBe(401)
  })
})
