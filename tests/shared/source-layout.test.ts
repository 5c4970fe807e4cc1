/**
 * Rules of the source tree that a reviewer would otherwise have to remember: no source file over
 * 500 lines (migrations and generated files aside), every PostgreSQL pool opened through
 * server/lib/pools.ts so the connection budget it computes is the whole truth, ECharts set up in
 * one client module, and every client action with a spinner and an error run by useAsyncAction.
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

/** Where useAsyncAction itself raises its flag. */
const ASYNC_ACTION = 'src/composables/useAsyncAction.ts'
/** Flag names that say "an action is out" (pickBusy, isSaving and uploading as well as busy). */
const BUSY_NAME =
  /\b(\w*?(?:loading|busy|saving|pending|sending|working|deleting|removing|making|creating|updating|uploading|downloading|importing|exporting|fetching|submitting|analysing|analyzing|attaching|signing|running))(\.value)?\s*=\s*true\b/gi
/** A flag put down in a `finally` (`finally { x.value = false }`): the hand-rolled pair whatever its name. */
const RESET_IN_FINALLY = /finally\s*\{[^{}]*?\b([\w$.]+?)(?:\.value)?\s*=\s*false\b/g
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')

/**
 * Lines of client code that raise a pending flag by hand instead of through useAsyncAction: a
 * busy-sounding name set to true, or any flag set to true that a `finally` puts back to false.
 * A flag that says "done once" (`loaded`, set true in a finally) or a mode (`editing`, `showForm`)
 * is neither. The offline test queue's `sending` goes through useAsyncAction with `keepError`.
 */
function handRolledPending(text: string): string[] {
  const lines = text.split('\n')
  const hits = new Set<number>()
  const lineOf = (index: number) => text.slice(0, index).split('\n').length - 1
  for (const m of text.matchAll(BUSY_NAME)) hits.add(lineOf(m.index))
  for (const m of text.matchAll(RESET_IN_FINALLY)) {
    const raised = new RegExp(`(^|[^\\w$.])${escape(m[1])}(\\.value)?\\s*=\\s*true\\b`, 'g')
    for (const r of text.matchAll(raised)) hits.add(lineOf(r.index + r[1].length))
  }
  return [...hits].sort((a, b) => a - b).map((i) => `${i + 1}: ${lines[i].trim()}`)
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
    const registering = files.filter(
      (f) => f.startsWith('src/') && /from ['"]echarts\/core['"]|from ['"]vue-echarts['"]/.test(fs.readFileSync(path.join(ROOT, f), 'utf8')),
    )
    expect(registering).toEqual(['src/lib/echarts.ts'])
  })

  it('runs every client action with a pending flag through useAsyncAction (no hand-rolled loading/error pair)', () => {
    const client = files.filter((f) => f.startsWith('src/') && /\.(vue|ts)$/.test(f) && f !== ASYNC_ACTION)
    expect(client.length).toBeGreaterThan(50)
    const found = client.flatMap((f) => handRolledPending(fs.readFileSync(path.join(ROOT, f), 'utf8')).map((hit) => `${f}:${hit}`))
    expect(found).toEqual([])
    // useAsyncAction is where the flag does go up.
    expect(handRolledPending(fs.readFileSync(path.join(ROOT, ASYNC_ACTION), 'utf8'))).not.toEqual([])
  })

  it.each([
    [
      'a busy flag in a view',
      'async function save() {\n  busy.value = true\n  try { await put() } finally { busy.value = false }\n}',
      ['2: busy.value = true'],
    ],
    ['a prefixed name', 'pickBusy.value = true', ['1: pickBusy.value = true']],
    ['a plain let flag', 'let isSaving = false\nisSaving = true', ['2: isSaving = true']],
    ['any name put down in a finally', 'spinner.value = true\ntry {\n  await go()\n} finally {\n  spinner.value = false\n}', ['1: spinner.value = true']],
    ['a reactive field put down in a finally', 'state.spin = true\ntry { await go() } finally { state.spin = false }', ['1: state.spin = true']],
    ['a mode, not an action', 'editing.value = true\nshowForm.value = true', []],
    ['"loaded once", raised in a finally', 'try { await load() } finally {\n  loaded.value = true\n}', []],
    ['a flag put down, never raised', 'loading.value = false', []],
  ])('the pending-flag rule reads %s', (_what, text, expected) => {
    expect(handRolledPending(text)).toEqual(expected)
  })
})
