/**
 * What a first page loads: the entry chunk, the page's view chunk, every chunk they import
 * statically, and their CSS — read from Vite's manifest of the last build
 * (dist/.vite/manifest.json), each file gzipped (level 6, what servers usually send) and summed.
 * Measured for the public landing page, sign-in, and the first page after sign-in (Home, budget
 * 250 KB gzip). Run after `npx vite build`: npx tsx scripts/bench-bundle.ts
 */
import fs from 'node:fs'
import path from 'node:path'
import zlib from 'node:zlib'

interface ManifestChunk {
  file: string
  src?: string
  isEntry?: boolean
  imports?: string[]
  dynamicImports?: string[]
  css?: string[]
}

const DIST = path.resolve('dist')
const BUDGET_KB = 250
const manifestPath = path.join(DIST, '.vite', 'manifest.json')
if (!fs.existsSync(manifestPath)) {
  console.error('No dist/.vite/manifest.json: run `npx vite build` first (build.manifest is on in vite.config.ts).')
  process.exit(1)
}
const manifest = JSON.parse(fs.readFileSync(manifestPath, 'utf8')) as Record<string, ManifestChunk>

/** A chunk and everything it imports statically (what the browser fetches before it runs). */
function closure(key: string, files = new Set<string>()): Set<string> {
  const chunk = manifest[key]
  if (!chunk) throw new Error(`manifest has no chunk ${key}`)
  if (files.has(chunk.file)) return files
  files.add(chunk.file)
  for (const css of chunk.css ?? []) files.add(css)
  for (const imp of chunk.imports ?? []) closure(imp, files)
  return files
}

const entryKey = Object.keys(manifest).find((k) => manifest[k].isEntry)
if (!entryKey) throw new Error('no entry chunk in the manifest')
const keyOf = (source: string) => {
  const key = Object.keys(manifest).find((k) => k.endsWith(source))
  if (!key) throw new Error(`${source} chunk not found in the manifest`)
  return key
}
const kb = (n: number) => (n / 1024).toFixed(1)

/** A page's files: the entry, its view, and the layout it is drawn in when that loads on its own. */
function measure(page: string, sources: string[], opts: { list?: boolean } = {}): Set<string> {
  const files = sources.reduce((acc, source) => closure(keyOf(source), acc), closure(entryKey!))
  const rows = [...files].map((file) => {
    const raw = fs.readFileSync(path.join(DIST, file))
    return { file, raw: raw.length, gzip: zlib.gzipSync(raw, { level: 6 }).length }
  })
  rows.sort((a, b) => b.gzip - a.gzip)
  const total = rows.reduce((s, r) => s + r.gzip, 0)
  const js = rows.filter((r) => r.file.endsWith('.js')).reduce((s, r) => s + r.gzip, 0)
  const css = rows.filter((r) => r.file.endsWith('.css')).reduce((s, r) => s + r.gzip, 0)
  if (opts.list) for (const r of rows) console.log(`${kb(r.gzip).padStart(7)} KB gzip  ${kb(r.raw).padStart(8)} KB raw  ${r.file}`)
  console.log(`${page} loads ${rows.length} files: ${kb(total)} KB gzip (JavaScript ${kb(js)} KB, CSS ${kb(css)} KB)`)
  return files
}

measure('Landing', ['src/views/LandingView.vue'])
measure('Sign-in', ['src/views/SignInView.vue'])
// Home is drawn inside the signed-in shell, which loads on its own when present as a chunk.
const shell = Object.keys(manifest).some((k) => k.endsWith('src/layouts/AppShell.vue')) ? ['src/layouts/AppShell.vue'] : []
const files = measure('Home', ['src/views/HomeView.vue', ...shell], { list: true })
const homeTotal = [...files].reduce((s, f) => s + zlib.gzipSync(fs.readFileSync(path.join(DIST, f)), { level: 6 }).length, 0)
console.log(`Home budget ${BUDGET_KB} KB: ${homeTotal / 1024 <= BUDGET_KB ? 'within' : 'OVER'}`)

// The heavy parts must stay out of the first page.
const heavy = Object.values(manifest).filter(
  (c) => /echarts|mathjs|pdfkit/.test(c.file) || /node_modules\/(echarts|zrender|mathjs|vue-echarts)\//.test(c.src ?? ''),
)
const leaked = heavy.filter((c) => files.has(c.file))
console.log(leaked.length ? `Heavy chunks loaded by Home: ${leaked.map((c) => c.file).join(', ')}` : 'No chart, unit-parsing or PDF code in what Home loads.')
