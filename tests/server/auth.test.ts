import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { createApp, type BuiltApp } from '../../server/app'
import { User } from '../../server/modules/users/user.entity'
import { anonymous, closeTestApp, ROOMY_LIMITS, getTestApp, mailTo, makeTeam, signIn, SIGN_IN_WINDOW_MS, TEST_PASSWORD, uniqueEmail } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

async function waitForMail(address: string) {
  // The catcher writes the file after the SMTP transaction; poll briefly for it.
  for (let i = 0; i < 50; i++) {
    const mail = mailTo(address)
    if (mail.length) return mail
    await new Promise((r) => setTimeout(r, 100))
  }
  return []
}

describe('sign-up and sign-in', () => {
  it('creates an account with its own workspace, hashes the password with bcrypt cost 12, and signs in once confirmed', async () => {
    const email = uniqueEmail('signup')
    const res = await supertest(built.app)
      .post('/api/auth/sign-up')
      .send({ email, password: 'a sentence as a password', name: 'Ada Example', workspaceName: 'Example crew' })
    expect(res.status).toBe(202)
    const stored = await dataSource.getRepository(User).findOneByOrFail({ email })
    expect(stored.passwordHash).toMatch(/^\$2[aby]\$12\$/)
    const [mail] = await waitForMail(email)
    const token = decodeURIComponent(/confirm-email\?token=([\w%-]+)/.exec(mail.text)![1])
    expect((await supertest(built.app).post('/api/auth/confirm-email').send({ token })).status).toBe(200)
    const agent = supertest.agent(built.app)
    const signedIn = await agent.post('/api/auth/sign-in').send({ email, password: 'a sentence as a password' })
    expect(signedIn.status).toBe(200)
    expect(signedIn.body).toMatchObject({ user: { email }, role: 'owner', workspace: { name: 'Example crew' } })
    expect(signedIn.headers['set-cookie']?.[0]).toMatch(/lw\.sid=.*HttpOnly.*SameSite=Lax/i)
    const me = await agent.get('/api/auth/me')
    expect(me.status).toBe(200)
  })

  it('refuses a short password with the field and the reason', async () => {
    const res = await supertest(built.app)
      .post('/api/auth/sign-up')
      .send({ email: uniqueEmail('short'), password: 'short', name: 'X' })
    expect(res.status).toBe(400)
    expect(res.body.fields).toEqual([expect.objectContaining({ path: 'password', message: expect.stringMatching(/at least 12/) })])
  })

  it('regenerates the session id at sign-in', async () => {
    const team = await makeTeam()
    const agent = supertest.agent(built.app)
    const before = await agent.get('/api/auth/csrf')
    const cookieBefore = String(before.headers['set-cookie']?.[0] ?? '').split(';')[0]
    const res = await agent
      .post('/api/auth/sign-in')
      .set('X-CSRF-Token', before.body.csrfToken)
      .send({ email: team.users.viewer.email, password: TEST_PASSWORD })
    expect(res.status).toBe(200)
    const cookieAfter = String(res.headers['set-cookie']?.[0] ?? '').split(';')[0]
    expect(cookieBefore).not.toBe('')
    expect(cookieAfter).not.toBe(cookieBefore)
  })

  it('answers a wrong password with 401 and a plain message', async () => {
    const team = await makeTeam()
    const res = await supertest(built.app).post('/api/auth/sign-in').send({ email: team.users.viewer.email, password: 'wrong password here' })
    expect(res.status).toBe(401)
    expect(res.body.error).toBe('E-mail or password is wrong.')
  })
})

describe('the session check a page makes on load', () => {
  it('answers 200 with no one for a signed-out visitor, so a public page logs no failed request', async () => {
    const res = await anonymous(built.app).get('/api/auth/session')
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ me: null })
  })

  it('answers with the signed-in user, their workspace and role, as /api/auth/me does', async () => {
    const team = await makeTeam('Session check team')
    const designer = await signIn(built.app, team.users.designer.email)
    const res = await designer.get('/api/auth/session')
    expect(res.status).toBe(200)
    expect(res.body.me.user.email).toBe(team.users.designer.email)
    expect(res.body.me.role).toBe('designer')
    expect(res.body.me.csrfToken).toBeTruthy()
  })
})

describe('failed sign-in limit', () => {
  it('refuses the tenth wrong password in a row with 429 and when to retry; the right password works after the window', async () => {
    const team = await makeTeam()
    const email = team.users.designer.email
    const statuses: number[] = []
    for (let i = 0; i < 10; i++) {
      const res = await supertest(built.app)
        .post('/api/auth/sign-in')
        .send({ email, password: `wrong-${i}-password` })
      statuses.push(res.status)
      if (i === 9) {
        expect(res.body.error).toMatch(/Try again in \d+ (seconds|minutes)/)
        expect(Number(res.headers['retry-after'])).toBeGreaterThan(0)
      }
    }
    expect(statuses).toEqual([401, 401, 401, 401, 401, 401, 401, 401, 401, 429])
    await new Promise((r) => setTimeout(r, SIGN_IN_WINDOW_MS + 200))
    const ok = await supertest(built.app).post('/api/auth/sign-in').send({ email, password: TEST_PASSWORD })
    expect(ok.status).toBe(200)
  })

  it('counts failures across app processes: five on one and four on another, the tenth is refused on either', async () => {
    const team = await makeTeam()
    const email = team.users.viewer.email
    // A second app on the same database, as a second process behind a load balancer would be.
    const second = createApp({ signInWindowMs: 60_000, clientDir: null, limits: ROOMY_LIMITS })
    try {
      const statuses: number[] = []
      for (let i = 0; i < 9; i++) {
        const app = i < 5 ? built.app : second.app
        statuses.push(
          (
            await supertest(app)
              .post('/api/auth/sign-in')
              .send({ email, password: `wrong-${i}-password` })
          ).status,
        )
      }
      const tenth = await supertest(second.app).post('/api/auth/sign-in').send({ email, password: 'wrong-9-password' })
      expect(statuses).toEqual([401, 401, 401, 401, 401, 401, 401, 401, 401])
      expect(tenth.status).toBe(429)
      // Nothing readable is kept: the counter's key is a hash, not the e-mail.
      const rows: Array<{ key: string }> = await dataSource.query('SELECT key FROM rate_limit_hits')
      expect(rows.some((r) => r.key.includes(email))).toBe(false)
      expect(rows.every((r) => /^[0-9a-f]{64}$/.test(r.key))).toBe(true)
    } finally {
      await second.close()
    }
  })
})

describe('password reset', () => {
  it('mails a single-use link that works once, then fails with a clear message', async () => {
    const team = await makeTeam()
    const email = team.users.technician.email
    const req = await supertest(built.app).post('/api/auth/forgot-password').send({ email })
    expect(req.status).toBe(202)
    const [mail] = await waitForMail(email)
    expect(mail.subject).toMatch(/Reset/)
    expect(mail.html).toContain('reset-password?token=')
    const token = decodeURIComponent(/reset-password\?token=([\w%-]+)/.exec(mail.text)![1])
    expect(Buffer.from(token, 'base64url').length).toBeGreaterThanOrEqual(16)
    const stored = await dataSource.query('SELECT token_hash FROM password_resets WHERE user_id = $1', [team.users.technician.id])
    expect(stored[0].token_hash).not.toContain(token)

    const first = await supertest(built.app).post('/api/auth/reset-password').send({ token, password: 'a brand new passphrase' })
    expect(first.status).toBe(200)
    const again = await supertest(built.app).post('/api/auth/reset-password').send({ token, password: 'another new passphrase' })
    expect(again.status).toBe(400)
    expect(again.body.error).toMatch(/already been used/)
    const signInNew = await supertest(built.app).post('/api/auth/sign-in').send({ email, password: 'a brand new passphrase' })
    expect(signInNew.status).toBe(200)
  })

  it('refuses an expired link', async () => {
    const team = await makeTeam()
    const email = team.users.viewer.email
    await supertest(built.app).post('/api/auth/forgot-password').send({ email })
    const [mail] = await waitForMail(email)
    const token = decodeURIComponent(/reset-password\?token=([\w%-]+)/.exec(mail.text)![1])
    await dataSource.query(`UPDATE password_resets SET expires_at = now() - interval '1 minute' WHERE user_id = $1`, [team.users.viewer.id])
    const res = await supertest(built.app).post('/api/auth/reset-password').send({ token, password: 'a brand new passphrase' })
    expect(res.status).toBe(400)
    expect(res.body.error).toMatch(/expired/)
  })

  it('answers an unknown e-mail exactly like a known one (no account discovery)', async () => {
    const res = await supertest(built.app)
      .post('/api/auth/forgot-password')
      .send({ email: uniqueEmail('ghost') })
    expect(res.status).toBe(202)
  })
})

describe('CSRF protection', () => {
  it('refuses a state-changing request with the session cookie but no token', async () => {
    const team = await makeTeam()
    const client = await signIn(built.app, team.users.owner.email)
    const res = await client.agent.post('/api/workspaces').send({ name: 'Sneaky' })
    expect(res.status).toBe(403)
    expect(res.body.code).toBe('csrf')
  })

  it('refuses a request from a foreign Origin even with the token', async () => {
    const team = await makeTeam()
    const client = await signIn(built.app, team.users.owner.email)
    const res = await client.agent.post('/api/workspaces').set('X-CSRF-Token', client.csrf).set('Origin', 'https://evil.example').send({ name: 'Sneaky' })
    expect(res.status).toBe(403)
  })

  it('accepts the same request with the token', async () => {
    const team = await makeTeam()
    const client = await signIn(built.app, team.users.owner.email)
    const res = await client.post('/api/workspaces', { name: 'Fine' })
    expect(res.status).toBe(201)
  })
})

describe('members and invitations', () => {
  it('invites by e-mail; the invitee signs up with the link and joins with the invited role, once', async () => {
    const team = await makeTeam()
    const owner = await signIn(built.app, team.users.owner.email)
    const email = uniqueEmail('newhire')
    const inv = await owner.post('/api/workspace/invitations', { email, role: 'technician' })
    expect(inv.status).toBe(201)
    const [mail] = await waitForMail(email)
    const token = decodeURIComponent(/invitation\?token=([\w%-]+)/.exec(mail.text)![1])
    const agent = supertest.agent(built.app)
    const res = await agent.post('/api/auth/sign-up').send({ email, password: 'joining the crew today', name: 'New Hire', invitation: token })
    expect(res.status).toBe(201)
    expect(res.body.role).toBe('technician')
    expect(res.body.workspace.id).toBe(team.workspaceId)
    const reuse = await anonymous(built.app).get(`/api/invitations/${token}`)
    expect(reuse.status).toBe(400)
    expect(reuse.body.error).toMatch(/already been used/)
  })

  it('will not demote or remove the last owner', async () => {
    const team = await makeTeam()
    const owner = await signIn(built.app, team.users.owner.email)
    const members = (await owner.get('/api/workspace/members')).body.members as Array<{ id: string; role: string }>
    const me = members.find((m) => m.role === 'owner')!
    const demote = await owner.patch(`/api/workspace/members/${me.id}`, { role: 'designer' })
    expect(demote.status).toBe(409)
    const leave = await owner.post('/api/workspace/leave')
    expect(leave.status).toBe(409)
    const remove = await owner.delete(`/api/workspace/members/${me.id}`)
    expect(remove.status).toBe(409)
  })
})
