/**
 * Sign-up, password reset and mail sends are limited per client address and per target address,
 * in PostgreSQL, so every app process counts the same uses.
 */
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp, type BuiltApp } from '../../server/app'
import { DEFAULT_LIMITS } from '../../server/lib/limits'
import { closeTestApp, getTestApp, mailTo, makeTeam, ROOMY_LIMITS, signIn, uniqueEmail } from '../helpers/test-app'

const HOUR = 3600_000
const STRICT = {
  ...DEFAULT_LIMITS,
  // Sign-in failures are not this file's subject; loopback collects other files' failures.
  signInFailuresPerAddress: ROOMY_LIMITS.signInFailuresPerAddress!,
  signUpPerAddress: { max: 3, windowMs: HOUR },
  signUpPerEmail: { max: 2, windowMs: HOUR },
  forgotPerAddress: { max: 1000, windowMs: HOUR },
  forgotPerEmail: { max: 3, windowMs: HOUR },
  mailPerRecipient: { max: 4, windowMs: HOUR },
}

let strict: BuiltApp
let second: BuiltApp
beforeAll(async () => {
  await getTestApp()
  strict = createApp({ clientDir: null, limits: STRICT })
  // A second app on the same database, as another process would be.
  second = createApp({ clientDir: null, limits: STRICT })
})
afterAll(async () => {
  await strict.close()
  await second.close()
  // Later files in this worker get the roomy limits back.
  createApp({ clientDir: null, limits: ROOMY_LIMITS })
  await closeTestApp()
})

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms))

describe('limits', () => {
  it('25 reset requests for one address in a few seconds send at most three mails; the rest answer 429 with when to retry', async () => {
    const team = await makeTeam()
    const email = team.users.viewer.email
    const statuses: number[] = []
    for (let i = 0; i < 25; i++) {
      const app = i % 2 ? second.app : strict.app
      const res = await supertest(app).post('/api/auth/forgot-password').send({ email })
      statuses.push(res.status)
      if (res.status === 429) {
        expect(Number(res.headers['retry-after'])).toBeGreaterThan(0)
        expect(res.body.error).toMatch(/Try again in/)
      }
    }
    expect(statuses.filter((s) => s === 202)).toHaveLength(3)
    expect(statuses.filter((s) => s === 429)).toHaveLength(22)
    await sleep(1500)
    expect(mailTo(email).length).toBeLessThanOrEqual(3)
  })

  it('answers the same for an unknown address (the limit does not reveal accounts)', async () => {
    const ghost = uniqueEmail('ghost')
    const statuses: number[] = []
    for (let i = 0; i < 5; i++) statuses.push((await supertest(strict.app).post('/api/auth/forgot-password').send({ email: ghost })).status)
    expect(statuses).toEqual([202, 202, 202, 429, 429])
  })

  it('limits sign-ups from one client address across app processes', async () => {
    const statuses: number[] = []
    for (let i = 0; i < 8; i++) {
      const app = i % 2 ? second.app : strict.app
      statuses.push(
        (
          await supertest(app)
            .post('/api/auth/sign-up')
            .send({ email: uniqueEmail('burst'), password: 'a long enough passphrase', name: 'Burst', workspaceName: 'Burst' })
        ).status,
      )
    }
    // Other test files may sign up from this address at the same time: never more than three get through.
    expect(statuses.filter((s) => s === 202).length).toBeLessThanOrEqual(3)
    expect(statuses.slice(3).every((s) => s === 429)).toBe(true)
  })

  it('limits invitation mails to one recipient', async () => {
    const recipient = uniqueEmail('popular')
    const statuses: number[] = []
    for (let i = 0; i < 6; i++) {
      const team = await makeTeam()
      const owner = await signIn(strict.app, team.users.owner.email)
      statuses.push((await owner.post('/api/workspace/invitations', { email: recipient, role: 'viewer' })).status)
    }
    expect(statuses).toEqual([201, 201, 201, 201, 429, 429])
  })
})
