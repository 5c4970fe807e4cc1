/**
 * Nobody can tell from the answers which e-mail addresses have accounts (sign-up, sign-in,
 * forgot-password answer alike), and a new account confirms its address before it can sign in.
 * Timings are compared in `npm run bench` (docs/benchmarks.md), not here.
 */
import supertest from 'supertest'
import bcrypt from 'bcryptjs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { BCRYPT_COST, UNKNOWN_USER_HASH } from '../../server/modules/auth/auth.service'
import { useCatcherPort } from '../../server/modules/mail/mail.service'
import { User } from '../../server/modules/users/user.entity'
import { seedAccounts } from '../../server/demo/accounts.demo'
import { DEMO_USERS } from '../../server/scripts/demo-users'
import { anonymous, catcherPortInUse, closeTestApp, getTestApp, mailTo, makeTeam, signIn, uniqueEmail } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms))

async function linkIn(address: string, pattern: RegExp, count = 1): Promise<string> {
  for (let i = 0; i < 50; i++) {
    const found = mailTo(address)
      .map((m) => pattern.exec(m.text))
      .filter((m): m is RegExpExecArray => m !== null)
    if (found.length >= count) return decodeURIComponent(found[0][1])
    await sleep(100)
  }
  throw new Error(`no mail to ${address} matching ${pattern}`)
}

const CONFIRM_LINK = /confirm-email\?token=([\w%-]+)/
const signUpBody = (email: string) => ({ email, password: 'a long enough passphrase', name: 'New Person', workspaceName: 'New team' })

describe('answers do not reveal which e-mails have accounts', () => {
  it('sign-up answers a taken address exactly as a new one', async () => {
    const team = await makeTeam()
    const taken = await supertest(built.app).post('/api/auth/sign-up').send(signUpBody(team.users.viewer.email))
    const fresh = await supertest(built.app)
      .post('/api/auth/sign-up')
      .send(signUpBody(uniqueEmail('fresh')))
    expect(taken.status).toBe(fresh.status)
    expect(taken.body).toEqual(fresh.body)
    expect(taken.headers['set-cookie']).toEqual(fresh.headers['set-cookie'])
    // The owner of the taken address is told by mail instead.
    expect(await linkIn(team.users.viewer.email, /(forgot-password)/)).toBe('forgot-password')
  })

  it('the stand-in hash for an unknown e-mail costs what a real one costs', () => {
    expect(bcrypt.getRounds(UNKNOWN_USER_HASH)).toBe(BCRYPT_COST)
  })

  it('forgot-password answers alike for a known and an unknown address even when mail cannot be sent', async () => {
    const team = await makeTeam()
    // Nothing listens here: sending fails. The answer must not wait for, or depend on, the mail.
    useCatcherPort(1)
    try {
      const known = await supertest(built.app).post('/api/auth/forgot-password').send({ email: team.users.viewer.email })
      const unknown = await supertest(built.app)
        .post('/api/auth/forgot-password')
        .send({ email: uniqueEmail('ghost') })
      expect(known.status).toBe(202)
      expect(unknown.status).toBe(202)
      expect(known.body).toEqual(unknown.body)
    } finally {
      useCatcherPort(catcherPortInUse())
    }
  })
})

describe('a new account confirms its e-mail address', () => {
  it('cannot sign in before confirming; the link in the mail confirms it; then sign-in works', async () => {
    const email = uniqueEmail('confirm')
    const res = await supertest(built.app).post('/api/auth/sign-up').send(signUpBody(email))
    expect(res.status).toBe(202)
    expect(res.body.message).toMatch(/confirm/i)

    const early = await supertest(built.app).post('/api/auth/sign-in').send({ email, password: 'a long enough passphrase' })
    expect(early.status).toBe(403)
    expect(early.body.code).toBe('email_unconfirmed')
    const wrong = await supertest(built.app).post('/api/auth/sign-in').send({ email, password: 'not the passphrase at all' })
    expect(wrong.status).toBe(401)

    const token = await linkIn(email, CONFIRM_LINK)
    const confirmed = await anonymous(built.app).post('/api/auth/confirm-email', { token })
    expect(confirmed.status).toBe(200)
    const again = await anonymous(built.app).post('/api/auth/confirm-email', { token })
    expect(again.status).toBe(400)
    expect(again.body.fields).toEqual([expect.objectContaining({ path: 'token' })])

    const client = await signIn(built.app, email, 'a long enough passphrase')
    const me = await client.get('/api/auth/me')
    expect(me.body).toMatchObject({ user: { email }, role: 'owner', workspace: { name: 'New team' } })
  })

  it('an invitation accepted by sign-up confirms the address and joins at once', async () => {
    const team = await makeTeam()
    const owner = await signIn(built.app, team.users.owner.email)
    const email = uniqueEmail('invited')
    expect((await owner.post('/api/workspace/invitations', { email, role: 'technician' })).status).toBe(201)
    const token = await linkIn(email, /invitation\?token=([\w%-]+)/)
    const agent = supertest.agent(built.app)
    const res = await agent.post('/api/auth/sign-up').send({ email, password: 'joining the crew today', name: 'New Hire', invitation: token })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ role: 'technician', workspace: { id: team.workspaceId } })
    const stored = await dataSource.getRepository(User).findOneByOrFail({ email })
    expect(stored.emailConfirmedAt).toBeInstanceOf(Date)
  })

  it('an invitation cannot be used to sign up another address', async () => {
    const team = await makeTeam()
    const owner = await signIn(built.app, team.users.owner.email)
    const email = uniqueEmail('invited')
    await owner.post('/api/workspace/invitations', { email, role: 'viewer' })
    const token = await linkIn(email, /invitation\?token=([\w%-]+)/)
    const other = uniqueEmail('interloper')
    const res = await supertest(built.app)
      .post('/api/auth/sign-up')
      .send({ email: other, password: 'joining the crew today', name: 'Interloper', invitation: token })
    expect(res.status).toBe(403)
    expect(await dataSource.getRepository(User).findOneBy({ email: other })).toBeNull()
  })

  it('the demo users are confirmed', async () => {
    await dataSource.transaction((m) => seedAccounts(m))
    for (const u of DEMO_USERS) {
      const stored = await dataSource.getRepository(User).findOneByOrFail({ email: u.email })
      expect(stored.emailConfirmedAt, u.email).toBeInstanceOf(Date)
    }
  })
})
