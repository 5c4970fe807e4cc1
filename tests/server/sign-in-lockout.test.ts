/**
 * Failed sign-ins: the per-account limit (ten wrong passwords for one e-mail from one address),
 * the per-address limit across accounts (one password sprayed over many accounts), and the slow
 * lane through a lockout (the right password gets in after a short wait; a guesser gets one try
 * per wait). Each client address is a documentation address (RFC 5737) sent in X-Forwarded-For,
 * as a reverse proxy in front of the app would.
 */
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp, type BuiltApp } from '../../server/app'
import { reset } from '../../server/lib/limits'
import { closeTestApp, getTestApp, makeTeam, ROOMY_LIMITS, TEST_PASSWORD, uniqueEmail } from '../helpers/test-app'

/** A wait far longer than any test runs: the test ends it itself (`endWait`), so no step depends on how long another took. */
const SLOW_LANE = { max: 1, windowMs: 10 * 60_000 }
let app: BuiltApp
let lastOctet = 10 + Math.floor(Math.random() * 200)
/** A fresh client address for each scenario, so the counters of one do not touch another. */
const nextAddress = () => `203.0.113.${lastOctet++ % 250}`

beforeAll(async () => {
  await getTestApp()
  app = createApp({
    clientDir: null,
    trustProxy: 1,
    signInWindowMs: 60_000,
    limits: { ...ROOMY_LIMITS, signInFailuresPerAddress: { max: 12, windowMs: 60_000 }, signInSlowLane: SLOW_LANE },
  })
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

/** The slow lane's wait runs out, as it would after its window: for one account at an address, or for the whole address. */
const endWait = (lane: `account|${string}` | `address|${string}`) => reset('sign-in-lane', lane, SLOW_LANE)
const signInFrom = (address: string, email: string, password: string) =>
  supertest(app.app).post('/api/auth/sign-in').set('X-Forwarded-For', address).send({ email, password })

describe('failed sign-ins from one address across many accounts', () => {
  it('refuses the attempt after the per-address limit, whichever accounts were tried', async () => {
    const address = nextAddress()
    const statuses: number[] = []
    for (let i = 0; i < 14; i++) statuses.push((await signInFrom(address, uniqueEmail(`spray-${i}`), 'Summer2026!Summer2026')).status)
    expect(statuses.slice(0, 12)).toEqual(Array(12).fill(401))
    expect(statuses.slice(12)).toEqual([429, 429])
  })

  it('does not slow a client at another address', async () => {
    const sprayer = nextAddress()
    for (let i = 0; i < 14; i++) await signInFrom(sprayer, uniqueEmail(`spray2-${i}`), 'Autumn2026!Autumn2026')
    const team = await makeTeam()
    const other = await signInFrom(nextAddress(), team.users.viewer.email, TEST_PASSWORD)
    expect(other.status).toBe(200)
  })
})

describe('the slow lane through a lockout', () => {
  it('lets the right password in after a short wait, while a burst of guesses is refused unchecked', async () => {
    const team = await makeTeam()
    const email = team.users.designer.email
    const address = nextAddress()
    const statuses: number[] = []
    for (let i = 0; i < 10; i++) statuses.push((await signInFrom(address, email, `wrong-${i}-password`)).status)
    expect(statuses).toEqual([401, 401, 401, 401, 401, 401, 401, 401, 401, 429])

    // Straight after the lockout even the right password waits its turn.
    const early = await signInFrom(address, email, TEST_PASSWORD)
    expect(early.status).toBe(429)
    expect(Number(early.headers['retry-after'])).toBeGreaterThanOrEqual(1)

    // After the wait, a wrong password uses the one try and is refused; the next try waits again.
    await endWait(`account|${address}|${email.toLowerCase()}`)
    expect((await signInFrom(address, email, 'still-the-wrong-one')).status).toBe(429)
    expect((await signInFrom(address, email, TEST_PASSWORD)).status).toBe(429)

    // After the next wait the right password signs in, and the counter for this account starts again.
    await endWait(`account|${address}|${email.toLowerCase()}`)
    expect((await signInFrom(address, email, TEST_PASSWORD)).status).toBe(200)
    expect((await signInFrom(address, email, 'one-more-wrong-password')).status).toBe(401)
  })

  it('lets a colleague behind a sprayed address in after a short wait', async () => {
    const address = nextAddress()
    for (let i = 0; i < 13; i++) await signInFrom(address, uniqueEmail(`spray3-${i}`), 'Winter2026!Winter2026')
    const team = await makeTeam()
    const early = await signInFrom(address, team.users.technician.email, TEST_PASSWORD)
    expect(early.status).toBe(429)
    await endWait(`address|${address}`)
    expect((await signInFrom(address, team.users.technician.email, TEST_PASSWORD)).status).toBe(200)
  })
})
