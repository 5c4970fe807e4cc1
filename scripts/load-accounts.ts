/**
 * The `accounts` scenario of `npm run load`: what account work does to everyone else, and whether
 * its timings give away which e-mail addresses have accounts.
 * - /api/health latency (one request at a time) before and while 64 sign-ups run at once
 *   (password hashing must not hold the event loop);
 * - sign-in with a wrong password and forgot-password, 50 each for addresses with and without an
 *   account, interleaved, medians compared.
 * Each request comes from its own documentation address (RFC 5737) through X-Forwarded-For, to an
 * app started with TRUST_PROXY=1, so the per-address limits see many clients as they would in use.
 */
const RANGES = ['192.0.2', '198.51.100', '203.0.113']
let nextHost = 0
function clientAddress(): string {
  const n = nextHost++
  return `${RANGES[Math.floor(n / 250) % RANGES.length]}.${(n % 250) + 1}`
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1]
const percentile = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)]
}

async function timed(url: string, init: RequestInit = {}): Promise<{ ms: number; status: number }> {
  const start = performance.now()
  const res = await fetch(url, init)
  await res.arrayBuffer()
  return { ms: performance.now() - start, status: res.status }
}

function post(base: string, path: string, body: unknown) {
  return timed(`${base}${path}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-forwarded-for': clientAddress() },
    body: JSON.stringify(body),
  })
}

export interface AccountFigures {
  healthIdle: { p50: number; p95: number }
  healthDuringSignUps: { p50: number; p95: number; max: number; samples: number }
  signUps: { count: number; seconds: number; statuses: Record<number, number> }
  signIn: { known: number; unknown: number; differencePercent: number }
  forgot: { known: number; unknown: number; differencePercent: number }
}

export async function accountScenario(base: string): Promise<AccountFigures> {
  const stamp = Date.now().toString(36)
  const health = async (n: number) => {
    const times: number[] = []
    for (let i = 0; i < n; i++) times.push((await timed(`${base}/api/health`)).ms)
    return times
  }
  await health(20)
  const idle = await health(200)

  // 64 sign-ups at once, /api/health sampled one at a time until they are all answered.
  const emails = Array.from({ length: 64 }, (_, i) => `load-${stamp}-${i}@example.test`)
  const statuses: Record<number, number> = {}
  let done = false
  const started = performance.now()
  const signUps = Promise.all(
    emails.map((email, i) =>
      post(base, '/api/auth/sign-up', { email, password: 'a long load-test passphrase', name: `Load ${i}`, workspaceName: `Load crew ${i}` }),
    ),
  ).then((rs) => {
    done = true
    for (const r of rs) statuses[r.status] = (statuses[r.status] ?? 0) + 1
  })
  const during: number[] = []
  while (!done) during.push((await timed(`${base}/api/health`)).ms)
  await signUps
  const signUpSeconds = (performance.now() - started) / 1000

  // Known and unknown addresses interleaved, each address used once (so no limit is met). The pair's
  // order alternates and each request waits for the one before it to settle (a known address's mail
  // is sent after the answer), so neither side is measured against the other's background work.
  const settle = () => new Promise((r) => setTimeout(r, 40))
  const compare = async (path: string, body: (email: string) => unknown) => {
    const known: number[] = []
    const unknown: number[] = []
    for (let i = 0; i < 50; i++) {
      const pair = [
        async () => known.push((await post(base, path, body(emails[i]))).ms),
        async () => unknown.push((await post(base, path, body(`nobody-${stamp}-${path.length}-${i}@example.test`))).ms),
      ]
      for (const run of i % 2 ? pair.reverse() : pair) {
        await run()
        await settle()
      }
    }
    const k = median(known)
    const u = median(unknown)
    return { known: k, unknown: u, differencePercent: (Math.abs(k - u) / Math.max(k, u)) * 100 }
  }
  const signIn = await compare('/api/auth/sign-in', (email) => ({ email, password: 'not the right passphrase' }))
  const forgot = await compare('/api/auth/forgot-password', (email) => ({ email }))

  return {
    healthIdle: { p50: median(idle), p95: percentile(idle, 95) },
    healthDuringSignUps: { p50: median(during), p95: percentile(during, 95), max: Math.max(...during), samples: during.length },
    signUps: { count: emails.length, seconds: signUpSeconds, statuses },
    signIn,
    forgot,
  }
}

export function printAccountFigures(f: AccountFigures) {
  const ms = (x: number) => `${x.toFixed(1)} ms`
  console.log('\naccounts (each request from its own client address):')
  console.log(`  /api/health idle: p50 ${ms(f.healthIdle.p50)}, p95 ${ms(f.healthIdle.p95)}`)
  console.log(
    `  /api/health during ${f.signUps.count} sign-ups at once (${f.signUps.seconds.toFixed(1)} s, answers ${JSON.stringify(f.signUps.statuses)}): ` +
      `p50 ${ms(f.healthDuringSignUps.p50)}, p95 ${ms(f.healthDuringSignUps.p95)}, max ${ms(f.healthDuringSignUps.max)} over ${f.healthDuringSignUps.samples} requests (target p95 < 50 ms)`,
  )
  for (const [label, c] of [
    ['sign-in, wrong password', f.signIn],
    ['forgot-password', f.forgot],
  ] as const) {
    console.log(
      `  ${label}, medians of 50: known address ${ms(c.known)}, unknown ${ms(c.unknown)}, difference ${c.differencePercent.toFixed(1)} % (target < 10 %)`,
    )
  }
}
