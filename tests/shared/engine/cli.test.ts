/**
 * The command line (`npm run -s calc -- <tool>`) reads input the way the API does: a bare-number
 * duration is an input error, printed with the field named, and the process exits with status 2.
 */
import { spawnSync } from 'node:child_process'
import path from 'node:path'
import { describe, expect, it } from 'vitest'

const ROOT = path.resolve(__dirname, '../../..')
function calc(tool: string, input: unknown) {
  const run = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/calc.ts', tool], { cwd: ROOT, input: JSON.stringify(input), encoding: 'utf8' })
  return { status: run.status, out: run.stdout }
}

describe('calc CLI', () => {
  it('exits 2 and names the field for a bare-number duration', () => {
    const r = calc('size', { chemistry: 'nicd', duration: 3, load: { power: '3 W' } })
    expect(r.status).toBe(2)
    expect(JSON.parse(r.out).fields).toContainEqual({ path: 'duration', message: expect.stringContaining('needs a unit') })
  }, 60_000)

  it('exits 0 with the result for the same input written "3 h"', () => {
    const r = calc('size', { chemistry: 'nicd', duration: '3 h', load: { power: '3 W' } })
    expect(r.status).toBe(0)
    expect(JSON.parse(r.out).tool).toBe('size')
  }, 60_000)
})
