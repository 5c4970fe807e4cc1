/**
 * Rules of the source tree that a reviewer would otherwise have to remember: no source file over
 * 500 lines (migrations and generated files aside), every PostgreSQL pool opened through
 * server/lib/pools.ts so the connection budget it computes is the whole truth, and ECharts set up in
 * one client module.
 */
import fs from 'node:fs'
import path from 'node:path'
import { describe, expect, it } from 'vitest'

const ROOT = path.resolve(__dirname, '../..')
const SOURCE_DIRS = ['src', 'server', 'shared', 'scripts', 'tests']
const SOURCE_FILE = /\.(ts|vue|mjs|js)$/
const MAX_LINES = 500

/** Files that are written by a tool or only ever appended in order. */
const isExempt = (rel: string) => rel.startsWith('server/migrations/') || rel.includes('/generated/') || /\.generated\.\w+$/.test(rel)

function sourceFiles(): string[] {
  const out: string[] = []
  const walk = (dir: string) => {
    for (const entry of fs.readdirSync(path.join(ROOT, dir), { withFileTypes: true })) {
      const rel = `${dir}/${entry.name}`
      if (entry.isDirectory()) {
        if (entry.name !== 'node_modules' && !entry.name.startsWith('.')) walk(rel)
      } else if (SOURCE_FILE.test(entry.name) && !isExempt(rel)) out.push(rel)
    }
  }
  for (const dir of SOURCE_DIRS) walk(dir)
  return out
}

const lineCount = (rel: string) => fs.readFileSync(path.join(ROOT, rel), 'utf8').split('\n').length - 1

describe('source layout', () => {
  const files = sourceFiles()

  it('finds the source tree', () => {
    expect(files).toContain('server/lib/pools.ts')
    expect(files.length).toBeGreaterThan(100)
  })

  it(`has no source file over ${MAX_LINES} lines outside migrations and generated files`, () => {
    const over = files.filter((f) => lineCount(f) > MAX_LINES).map((f) => `${f} (${lineCount(f)} lines)`)
    expect(over).toEqual([])
  })

  it('opens every PostgreSQL pool in server/lib/pools.ts (TypeORM’s in server/data-source.ts, sized from the same config)', () => {
    const opening = /new\s+(pg\.)?Pool\s*\(|new\s+PgBoss\s*\(|new\s+DataSource\s*\(/
    const openers = files.filter((f) => f.startsWith('server/') && opening.test(fs.readFileSync(path.join(ROOT, f), 'utf8')))
    expect(openers.sort()).toEqual(['server/data-source.ts', 'server/lib/pools.ts'])
  })

  it('registers ECharts in src/lib/echarts.ts only (charts import VChart from there)', () => {
    const registering = files.filter((f) => f.startsWith('src/') && /from ['"]echarts\/core['"]|from ['"]vue-echarts['"]/.test(fs.readFileSync(path.join(ROOT, f), 'utf8')))
    expect(registering).toEqual(['src/lib/echarts.ts'])
  })
})
