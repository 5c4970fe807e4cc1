/**
 * Bad-input fuzzing over every /api route in the route table (fast-check, fixed seed): wrong
 * types, missing and extra fields, huge strings and numbers, NaN/Infinity as strings, unicode,
 * deep nesting, wrong content types, truncated JSON and oversized bodies. Every answer must be
 * below 500, JSON, and free of stack traces; the server must be healthy afterwards.
 * `npm run fuzz` runs the same with FUZZ_REQUESTS=10000 or more.
 */
import fc from 'fast-check'
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import type { RouteSpec } from '../../server/policy/access'
import { anonymous, closeTestApp, getTestApp, makeTeam, signIn, type Client } from '../helpers/test-app'
import { routeExamples } from './route-examples'

const TOTAL = Number(process.env.FUZZ_REQUESTS ?? 400)
const SEED = Number(process.env.FUZZ_SEED ?? 20261201)
// Routes that end the caller's own session or membership: fuzzing them would only test sign-out.
const SKIP = new Set(['post /api/auth/sign-out', 'post /api/workspace/leave'])
// Routes that sign someone in start a new session (and a new CSRF token): fuzz them without a session.
const WITHOUT_SESSION = new Set(['post /api/auth/sign-in', 'post /api/auth/sign-up', 'post /api/auth/reset-password', 'post /api/auth/forgot-password'])

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

const nasty = fc.oneof(
  fc.constantFrom(
    'NaN',
    'Infinity',
    '-Infinity',
    '1e309',
    '-0',
    '',
    ' ',
    'null',
    'undefined',
    '__proto__',
    '3 kg',
    '120 mA mA',
    '∞ A',
    '½ h',
    '1,5 V',
    '0x10',
    '😀',
    '\u0000',
    '../../etc/passwd',
    "'; DROP TABLE users; --",
    '<script>alert(1)</script>',
    '=cmd|calc',
  ),
  fc.string({ maxLength: 40 }),
  fc.string({ unit: 'binary', maxLength: 20 }),
  fc.integer(),
  fc.double(),
  fc.constantFrom(Number.MAX_SAFE_INTEGER, -Number.MAX_SAFE_INTEGER, 1e308, -1e308, 5e-324, 0, -1),
  fc.boolean(),
  fc.constant(null),
  fc.array(fc.integer(), { maxLength: 5 }),
  fc.dictionary(fc.string({ maxLength: 6 }), fc.integer(), { maxKeys: 3 }),
  fc.constant('x'.repeat(100_000)),
)

function deepNest(depth: number): unknown {
  let v: unknown = 1
  for (let i = 0; i < depth; i++) v = i % 2 ? [v] : { a: v }
  return v
}

/** A mutation of a valid example body: one field broken, removed, or a stranger added. */
function mutate(base: unknown, rnd: () => number, value: unknown): unknown {
  if (!base || typeof base !== 'object' || Array.isArray(base)) return value
  const copy: Record<string, unknown> = structuredClone(base as Record<string, unknown>)
  const keys = Object.keys(copy)
  const key = keys[Math.floor(rnd() * keys.length)]
  const r = rnd()
  if (key === undefined || r < 0.15) copy[`extra${Math.floor(rnd() * 99)}`] = value
  else if (r < 0.3) delete copy[key]
  else if (r < 0.45 && copy[key] && typeof copy[key] === 'object') copy[key] = mutate(copy[key], rnd, value)
  else copy[key] = value
  return copy
}

type Shape = 'valid-mutated' | 'anything' | 'wrong-type' | 'truncated' | 'text' | 'form' | 'deep' | 'huge'

interface Plan {
  route: RouteSpec
  shape: Shape
  value: unknown
  pathNoise: string
  seedFraction: number
}

function planArbitrary(routes: RouteSpec[]) {
  return fc.record({
    route: fc.constantFrom(...routes),
    shape: fc.constantFrom<Shape>('valid-mutated', 'valid-mutated', 'valid-mutated', 'anything', 'wrong-type', 'truncated', 'text', 'form', 'deep', 'huge'),
    value: fc.oneof(nasty, fc.jsonValue({ maxDepth: 3 })),
    pathNoise: fc.oneof(
      fc.uuid(),
      fc.constantFrom('0', '-1', 'null', 'NaN', '%00', 'x'.repeat(300), '1;DROP', '..', '😀', '00000000-0000-0000-0000-000000000000'),
    ),
    seedFraction: fc.double({ min: 0, max: 1, noNaN: true }),
  })
}

/** Text of any generated value, including objects without a prototype. */
function str(v: unknown): string {
  try {
    return typeof v === 'object' && v !== null ? JSON.stringify(v) : String(v)
  } catch {
    return 'unprintable'
  }
}

function fillPath(route: RouteSpec, noise: string): string {
  return route.path.replace(/:(\w+)/g, (_m, name: string) =>
    name === 'tool' ? (noise.length % 3 === 0 ? 'size' : encodeURIComponent(noise)) : encodeURIComponent(noise),
  )
}

async function send(client: Client, plan: Plan, exampleBody: unknown) {
  const path = fillPath(plan.route, plan.pathNoise)
  const method = plan.route.method
  const t0 = client.agent[method](path).set('X-CSRF-Token', client.csrf)
  const asText = str(plan.value)
  if (method === 'get')
    return t0.query({
      page: asText.slice(0, 300),
      pageSize: asText.slice(0, 50),
      sort: asText.slice(0, 50),
      order: asText.slice(0, 10),
      q: asText.slice(0, 500),
      status: asText.slice(0, 20),
      from: asText.slice(0, 30),
    })
  let n = plan.seedFraction
  const rnd = () => {
    n = (n * 9301 + 0.49297) % 1
    return n
  }
  switch (plan.shape) {
    case 'valid-mutated':
      return t0.send(mutate(exampleBody ?? {}, rnd, plan.value) as object)
    case 'anything':
      return t0.set('Content-Type', 'application/json').send(JSON.stringify(plan.value ?? null))
    case 'wrong-type':
      return t0.set('Content-Type', 'application/json').send(JSON.stringify([plan.value, plan.value]))
    case 'truncated': {
      const text = JSON.stringify(exampleBody ?? { a: plan.value }) ?? '{}'
      return t0.set('Content-Type', 'application/json').send(text.slice(0, Math.max(1, Math.floor(text.length * rnd()))))
    }
    case 'text':
      return t0.set('Content-Type', 'text/plain').send(asText)
    case 'form':
      return t0.type('form').send({ email: asText, password: asText })
    case 'deep':
      return t0.send(deepNest(200 + Math.floor(rnd() * 3000)) as object)
    case 'huge':
      return t0.set('Content-Type', 'application/json').send(JSON.stringify({ blob: 'y'.repeat(1_200_000) }))
  }
}

describe('bad-input fuzzing of every /api route', () => {
  it(
    `answers ${TOTAL} generated bad requests with 4xx JSON (never 5xx, never a stack trace) and stays healthy`,
    { timeout: 60_000 + TOTAL * 150 },
    async () => {
      const team = await makeTeam('Fuzz team')
      const owner = await signIn(built.app, team.users.owner.email)
      const stranger = anonymous(built.app)
      const routes = built.routeTable.filter((r) => !SKIP.has(`${r.method} ${r.path}`))
      const examples = new Map<string, unknown>()
      for (const r of routes) {
        const key = `${r.method} ${r.path}`
        const ex = await routeExamples[key]?.({ team, other: team, role: 'owner', callerEmail: team.users.owner.email })
        examples.set(key, ex?.body)
      }
      const counts: Record<string, number> = {}
      const failures: string[] = []
      let sent = 0
      await fc.assert(
        fc.asyncProperty(planArbitrary(routes), async (plan) => {
          const key = `${plan.route.method} ${plan.route.path}`
          const res = await send(WITHOUT_SESSION.has(key) ? stranger : owner, plan, examples.get(key))
          sent++
          counts[String(res.status)] = (counts[String(res.status)] ?? 0) + 1
          const text = res.text ?? ''
          const bad =
            res.status >= 500 ||
            /\bat .+\.(ts|js):\d+|node_modules|stack/i.test(text) ||
            (res.status >= 400 && !/json/.test(String(res.headers['content-type'])))
          if (bad && failures.length < 10)
            failures.push(`${plan.route.method} ${fillPath(plan.route, plan.pathNoise)} [${plan.shape}] → ${res.status} ${text.slice(0, 200)}`)
          return true
        }),
        { numRuns: TOTAL, seed: SEED, endOnFailure: true },
      )
      console.log(`fuzz: ${sent} requests over ${routes.length} routes; statuses ${JSON.stringify(counts)}`)
      expect(failures).toEqual([])
      const health = await supertest(built.app).get('/api/health')
      expect(health.status).toBe(200)
    },
  )
})
