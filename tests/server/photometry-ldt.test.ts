/** EULUMDAT (.ldt) files go in where LM-63 files do: stored with their table, refused with the line when malformed. */
import { readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client } from '../helpers/test-app'

const ldt = readFileSync(new URL('../fixtures/photometry/corridor-module-both-planes.ldt', import.meta.url), 'utf8')
let built: BuiltApp
let designer: Client

beforeAll(async () => {
  built = await getTestApp()
  const team = await makeTeam('EULUMDAT team')
  designer = await signIn(built.app, team.users.designer.email)
})
afterAll(closeTestApp)

describe('EULUMDAT upload', () => {
  it('stores an .ldt file sent as a file, named from its luminaire line, with the stored quadrant as its table', async () => {
    const res = await designer.agent
      .post('/api/photometry')
      .set('X-CSRF-Token', designer.csrf)
      .attach('file', Buffer.from(ldt), { filename: 'corridor.ldt', contentType: 'application/octet-stream' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body.edition).toBe('EULUMDAT')
    expect(res.body.horizontalCount).toBe(7)
    expect(res.body.verticalCount).toBe(19)
    const one = await designer.get(`/api/photometry/${res.body.id}`)
    // 320 cd/klm straight down × 400 lm of the first lamp set.
    expect(one.body.parsed.candela[0][0]).toBeCloseTo(128, 9)
    expect(one.body.parsed.header.keywords.LUMINAIRE).toBe('Corridor module, 3 W emergency LED, opal lens (invented)')
  })
  it('refuses a malformed .ldt naming the format and the line, and stores nothing', async () => {
    const lines = ldt.split('\r\n')
    lines[3] = '22' // 22 C-planes cannot hold symmetry about both planes
    const res = await designer.post('/api/photometry', { name: 'Broken', text: lines.join('\r\n') })
    expect(res.status).toBe(400)
    expect(res.body.fields[0]).toMatchObject({ path: 'text', message: expect.stringMatching(/^line 4: .*multiple of 4/) })
    expect(JSON.stringify(res.body)).toMatch(/EULUMDAT file, line 4/)
  })
})
