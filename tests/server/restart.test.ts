/** A session made with one app process still works after that process is replaced by a new one. */
import { spawn, type ChildProcess } from 'node:child_process'
import net from 'node:net'
import { afterAll, describe, expect, it } from 'vitest'
import { closeTestApp, getTestApp, makeTeam, TEST_PASSWORD } from '../helpers/test-app'

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer()
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as net.AddressInfo).port
      s.close(() => resolve(port))
    })
  })
}

async function startServer(port: number): Promise<ChildProcess> {
  const child = spawn('node', ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, PORT: String(port), SMTP_CATCHER_PORT: '0', JOBS: '0', TRUST_PROXY: '1' },
    stdio: 'ignore',
  })
  for (let i = 0; i < 100; i++) {
    try {
      const res = await fetch(`http://127.0.0.1:${port}/api/health`)
      if (res.ok) return child
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 150))
  }
  child.kill()
  throw new Error('server did not start')
}

function stop(child: ChildProcess) {
  return new Promise<void>((resolve) => {
    child.once('exit', () => resolve())
    child.kill('SIGTERM')
  })
}

afterAll(closeTestApp)

describe('sessions in PostgreSQL', () => {
  it('survive a restart of the app process', async () => {
    await getTestApp()
    const team = await makeTeam()
    const port = await freePort()
    let server = await startServer(port)
    const signIn = await fetch(`http://127.0.0.1:${port}/api/auth/sign-in`, {
      method: 'POST',
      // A client address of its own (TEST-NET-2 behind the trusted proxy hop): other files' failed
      // sign-ins from 127.0.0.1 count against loopback in the shared database, not against this client.
      headers: { 'Content-Type': 'application/json', 'X-Forwarded-For': '198.51.100.41' },
      body: JSON.stringify({ email: team.users.viewer.email, password: TEST_PASSWORD }),
    })
    expect(signIn.status).toBe(200)
    const cookie = signIn.headers.get('set-cookie')!.split(';')[0]
    await stop(server)
    server = await startServer(port)
    try {
      const me = await fetch(`http://127.0.0.1:${port}/api/auth/me`, { headers: { cookie } })
      expect(me.status).toBe(200)
      expect((await me.json()).user.email).toBe(team.users.viewer.email)
    } finally {
      await stop(server)
    }
  })
})
