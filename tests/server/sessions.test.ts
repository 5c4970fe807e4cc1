/**
 * A password reset, a password change and a removal from a workspace end the user's other sessions
 * at once, even a session that keeps changing itself; a reset also revokes the user's API tokens and
 * every older reset link.
 */
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { closeTestApp, getTestApp, mailTo, makeTeam, signIn, TEST_PASSWORD, type Client } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms))

async function resetLinks(address: string, count: number): Promise<string[]> {
  for (let i = 0; i < 50; i++) {
    const mail = mailTo(address).filter((m) => /reset-password\?token=/.test(m.text))
    if (mail.length >= count) return mail.map((m) => decodeURIComponent(/reset-password\?token=([\w%-]+)/.exec(m.text)![1]))
    await sleep(100)
  }
  throw new Error(`expected ${count} reset mails to ${address}`)
}

/**
 * Keeps a session busy: switches between two workspaces every 0.2 s (each switch writes the
 * session back) and records when its requests started answering 401.
 */
function keepBusy(client: Client, workspaceIds: string[]) {
  let stop = false
  let firstRefusedAt: number | null = null
  let acceptedAfterRefusal = 0
  const loop = (async () => {
    for (let i = 0; !stop; i++) {
      const res = await client.post('/api/workspaces/switch', { workspaceId: workspaceIds[i % workspaceIds.length] })
      if (res.status === 401) firstRefusedAt ??= Date.now()
      else if (firstRefusedAt !== null) acceptedAfterRefusal++
      await sleep(200)
    }
  })()
  return {
    async finish() {
      stop = true
      await loop
      return { firstRefusedAt, acceptedAfterRefusal }
    },
  }
}

async function twoWorkspaces(client: Client, first: string) {
  const second = await client.post('/api/workspaces', { name: 'Second team' })
  expect(second.status).toBe(201)
  return [first, second.body.id as string]
}

describe('sessions end when the password is reset', () => {
  it('a session that keeps writing itself back answers 401 within a second of a reset, and stays out', async () => {
    const team = await makeTeam()
    const email = team.users.designer.email
    const busy = await signIn(built.app, email)
    const spaces = await twoWorkspaces(busy, team.workspaceId)
    const worker = keepBusy(busy, spaces)
    await sleep(700)

    expect((await supertest(built.app).post('/api/auth/forgot-password').send({ email })).status).toBe(202)
    const [token] = await resetLinks(email, 1)
    const reset = await supertest(built.app).post('/api/auth/reset-password').send({ token, password: 'a new and different passphrase' })
    expect(reset.status).toBe(200)
    const resetAt = Date.now()
    await sleep(2500)
    const { firstRefusedAt, acceptedAfterRefusal } = await worker.finish()

    expect(firstRefusedAt, 'the busy session was never refused').not.toBeNull()
    expect(firstRefusedAt! - resetAt).toBeLessThan(1000)
    expect(acceptedAfterRefusal).toBe(0)
    expect((await busy.get('/api/auth/me')).status).toBe(401)
    // The new password works in a new session.
    expect((await signIn(built.app, email, 'a new and different passphrase').then((c) => c.get('/api/auth/me'))).status).toBe(200)
  })

  it("revokes the user's API tokens", async () => {
    const team = await makeTeam()
    const email = team.users.technician.email
    const session = await signIn(built.app, email)
    const made = await session.post('/api/tokens', { name: 'script', role: 'viewer' })
    expect(made.status).toBe(201)
    const bearer = `Bearer ${made.body.token as string}`
    expect((await supertest(built.app).get('/api/workspace/members').set('Authorization', bearer)).status).toBe(200)

    await supertest(built.app).post('/api/auth/forgot-password').send({ email })
    const [token] = await resetLinks(email, 1)
    expect((await supertest(built.app).post('/api/auth/reset-password').send({ token, password: 'a new and different passphrase' })).status).toBe(200)
    expect((await supertest(built.app).get('/api/workspace/members').set('Authorization', bearer)).status).toBe(401)
  })

  it('a new reset link makes every older link of that user invalid', async () => {
    const team = await makeTeam()
    const email = team.users.viewer.email
    await supertest(built.app).post('/api/auth/forgot-password').send({ email })
    await resetLinks(email, 1)
    await supertest(built.app).post('/api/auth/forgot-password').send({ email })
    const [newer, older] = await resetLinks(email, 2)
    const old = await supertest(built.app).post('/api/auth/reset-password').send({ token: older, password: 'a new and different passphrase' })
    expect(old.status).toBe(400)
    expect(old.body.fields).toEqual([expect.objectContaining({ path: 'token' })])
    expect((await supertest(built.app).post('/api/auth/reset-password').send({ token: newer, password: 'a new and different passphrase' })).status).toBe(200)
  })

  it('using a reset link makes every other link of that user invalid', async () => {
    const team = await makeTeam()
    const email = team.users.owner.email
    await supertest(built.app).post('/api/auth/forgot-password').send({ email })
    await resetLinks(email, 1)
    await supertest(built.app).post('/api/auth/forgot-password').send({ email })
    const [newer, older] = await resetLinks(email, 2)
    // Whichever was still valid: spend the newer one, then the older must fail too.
    expect((await supertest(built.app).post('/api/auth/reset-password').send({ token: newer, password: 'a new and different passphrase' })).status).toBe(200)
    expect((await supertest(built.app).post('/api/auth/reset-password').send({ token: older, password: 'yet another passphrase here' })).status).toBe(400)
  })
})

describe('sessions end when the password is changed', () => {
  it('ends every other session of the user at once and keeps the one that changed it', async () => {
    const team = await makeTeam()
    const email = team.users.designer.email
    const busy = await signIn(built.app, email)
    const spaces = await twoWorkspaces(busy, team.workspaceId)
    const worker = keepBusy(busy, spaces)
    await sleep(500)
    const me = await signIn(built.app, email)
    const change = await me.post('/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: 'a changed passphrase today' })
    expect(change.status).toBe(200)
    const changedAt = Date.now()
    await sleep(2500)
    const { firstRefusedAt, acceptedAfterRefusal } = await worker.finish()
    expect(firstRefusedAt).not.toBeNull()
    expect(firstRefusedAt! - changedAt).toBeLessThan(1000)
    expect(acceptedAfterRefusal).toBe(0)
    expect((await me.get('/api/auth/me')).status).toBe(200)
  })

  it('refuses a wrong current password with the field named', async () => {
    const team = await makeTeam()
    const me = await signIn(built.app, team.users.viewer.email)
    const res = await me.post('/api/auth/password', { currentPassword: 'not my password at all', newPassword: 'a changed passphrase today' })
    expect(res.status).toBe(400)
    expect(res.body.fields).toEqual([expect.objectContaining({ path: 'currentPassword' })])
  })
})

describe('sessions end when the user is removed from a workspace', () => {
  it("the removed member's busy session loses the workspace within a second", async () => {
    const team = await makeTeam()
    const removed = await signIn(built.app, team.users.technician.email)
    let stop = false
    let lostAt: number | null = null
    let regained = 0
    const loop = (async () => {
      while (!stop) {
        const res = await removed.get('/api/workspace/members')
        if (res.status === 401 || res.status === 403) lostAt ??= Date.now()
        else if (lostAt !== null) regained++
        await sleep(100)
      }
    })()
    await sleep(500)
    const owner = await signIn(built.app, team.users.owner.email)
    const members = (await owner.get('/api/workspace/members')).body.members as Array<{ id: string; userId: string }>
    const target = members.find((m) => m.userId === team.users.technician.id)!
    expect((await owner.delete(`/api/workspace/members/${target.id}`)).status).toBe(204)
    const removedAt = Date.now()
    await sleep(2500)
    stop = true
    await loop
    expect(lostAt).not.toBeNull()
    expect(lostAt! - removedAt).toBeLessThan(1000)
    expect(regained).toBe(0)
  })
})
