/** The app under test: real PostgreSQL (from `npm test`), a local mail catcher, no client build. */
import crypto from 'node:crypto'
import bcrypt from 'bcryptjs'
import supertest from 'supertest'
import type { Express } from 'express'
import { createApp, type BuiltApp } from '../../server/app'
import { config } from '../../server/config'
import { DEFAULT_LIMITS, type Limits } from '../../server/lib/limits'
import { dataSource } from '../../server/data-source'
import { readCaughtMail, startMailCatcher, type MailCatcher } from '../../server/modules/mail/mail-catcher'
import { useCatcherPort } from '../../server/modules/mail/mail.service'
import { User } from '../../server/modules/users/user.entity'
import { Membership } from '../../server/modules/workspaces/membership.entity'
import { Workspace } from '../../server/modules/workspaces/workspace.entity'
import type { Role } from '../../shared/schemas/roles'

let catcher: MailCatcher | null = null
let built: BuiltApp | null = null

export const TEST_PASSWORD = 'correct-horse-lamp-42'
let passwordHash: string | null = null

/** Short sign-in window so the lock-out test can wait it out. */
export const SIGN_IN_WINDOW_MS = 2000

/**
 * Limits high enough that the many sign-ups and reset requests of a test run (all from 127.0.0.1,
 * counted in one database) never trip them; tests/server/limits.test.ts checks the limits themselves.
 */
export const ROOMY_LIMITS: Partial<Limits> = Object.fromEntries(
  // The per-account sign-in limit stays (it is not in this table); tests of the others build their own app.
  Object.entries(DEFAULT_LIMITS)
    .filter(([name]) => name !== 'signInSlowLane')
    .map(([name, l]) => [name, { ...l, max: 100_000 }]),
)

export async function getTestApp(): Promise<BuiltApp> {
  if (!dataSource.isInitialized) await dataSource.initialize()
  if (!catcher) {
    catcher = await startMailCatcher(config().mail.catcherDir, 0)
    useCatcherPort(catcher.port)
  }
  built ??= createApp({ signInWindowMs: SIGN_IN_WINDOW_MS, clientDir: null, limits: ROOMY_LIMITS })
  return built
}

/** The port of this test file's mail catcher (to point the mail layer back at it). */
export function catcherPortInUse(): number {
  if (!catcher) throw new Error('no mail catcher started')
  return catcher.port
}

export async function closeTestApp() {
  await built?.close()
  built = null
  await catcher?.close()
  catcher = null
  if (dataSource.isInitialized) await dataSource.destroy()
}

export function uniqueEmail(tag: string) {
  return `${tag}-${crypto.randomBytes(5).toString('hex')}@test.example`
}

export interface TestTeam {
  workspaceId: string
  users: Record<Role, { id: string; email: string }>
}

/** A fresh workspace with one user per role (the password is TEST_PASSWORD). */
export async function makeTeam(name = 'Test team'): Promise<TestTeam> {
  passwordHash ??= await bcrypt.hash(TEST_PASSWORD, 4)
  const ws = await dataSource.getRepository(Workspace).save(dataSource.getRepository(Workspace).create({ name }))
  const users = {} as TestTeam['users']
  for (const role of ['viewer', 'technician', 'designer', 'owner'] as Role[]) {
    const email = uniqueEmail(role)
    const user = await dataSource
      .getRepository(User)
      .save(dataSource.getRepository(User).create({ email, name: `${role} person`, passwordHash, emailConfirmedAt: new Date() }))
    await dataSource.getRepository(Membership).insert({ workspaceId: ws.id, userId: user.id, role })
    users[role] = { id: user.id, email }
  }
  return { workspaceId: ws.id, users }
}

/** A signed-in supertest agent that sends the CSRF token on every change. */
export interface Client {
  agent: ReturnType<typeof supertest.agent>
  csrf: string
  get(path: string): supertest.Test
  post(path: string, body?: unknown): supertest.Test
  put(path: string, body?: unknown): supertest.Test
  patch(path: string, body?: unknown): supertest.Test
  delete(path: string): supertest.Test
}

export function clientFor(agent: ReturnType<typeof supertest.agent>, csrf: string): Client {
  const send = (t: supertest.Test, body?: unknown) => (body === undefined ? t.set('X-CSRF-Token', csrf) : t.set('X-CSRF-Token', csrf).send(body as object))
  return {
    agent,
    csrf,
    get: (p) => agent.get(p),
    post: (p, b) => send(agent.post(p), b),
    put: (p, b) => send(agent.put(p), b),
    patch: (p, b) => send(agent.patch(p), b),
    delete: (p) => send(agent.delete(p)),
  }
}

export async function signIn(app: Express, email: string, password = TEST_PASSWORD): Promise<Client> {
  const agent = supertest.agent(app)
  const res = await agent.post('/api/auth/sign-in').send({ email, password })
  if (res.status !== 200) throw new Error(`sign-in failed for ${email}: ${res.status} ${JSON.stringify(res.body)}`)
  return clientFor(agent, res.body.csrfToken)
}

/** An agent with no session at all. */
export function anonymous(app: Express): Client {
  return clientFor(supertest.agent(app), '')
}

/** Caught mail to one address, newest first. */
export function mailTo(address: string) {
  return readCaughtMail(config().mail.catcherDir).filter((m) => m.to.includes(address))
}
