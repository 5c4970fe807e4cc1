/**
 * `npm run bench`: every benchmark in turn, each in its own process so one cannot warm up or
 * slow down another. Copy the figures into docs/benchmarks.md with the machine they ran on.
 */
import { spawnSync } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'

const BENCHES = [
  { file: 'scripts/bench-engine.ts', what: 'engine: size and compare all chemistries for 10,000 luminaires' },
  { file: 'scripts/bench-recalc.ts', what: 'pack bench: recalculation per keystroke' },
  { file: 'scripts/bench-bundle.ts', what: 'client: JavaScript and CSS loaded by the first page after sign-in (needs a build)' },
  { file: 'scripts/bench-discharge-engine.ts', what: 'engine: discharge analysis of 1,000,000 samples and spacing tables' },
  { file: 'scripts/bench-discharge.ts', what: 'discharge logs: a 1,000,000-row log parsed and analysed' },
  { file: 'scripts/bench-batch.ts', what: 'API: 500 sizings in one batch request against 500 single calls (real app process and database)' },
]

console.log(
  `machine: ${os.cpus()[0]?.model ?? 'unknown CPU'} × ${os.cpus().length}, ${Math.round(os.totalmem() / 2 ** 30)} GiB, Node ${process.version}, ${os.platform()} ${os.release()}`,
)
let failed = 0
for (const bench of BENCHES) {
  if (!fs.existsSync(bench.file)) continue
  console.log(`\n== ${bench.what} (${bench.file})`)
  const r = spawnSync('node', ['--import', 'tsx', bench.file], { stdio: 'inherit' })
  if (r.status !== 0) failed++
  if (bench.file === 'scripts/bench-engine.ts') {
    // The same engine bundled by esbuild as the client build ships it (tsx, above, keeps function
    // names for stack traces, which costs the hot loops about a tenth).
    const bundle = path.join(os.tmpdir(), `lw-bench-engine-${process.pid}.mjs`)
    const built = spawnSync(
      'npx',
      ['--no-install', 'esbuild', bench.file, '--bundle', '--platform=node', '--format=esm', `--outfile=${bundle}`, '--log-level=warning'],
      { stdio: 'inherit' },
    )
    if (built.status === 0) {
      console.log(`\n== the same, bundled as the browser gets it (esbuild)`)
      const b = spawnSync('node', [bundle], { stdio: 'inherit' })
      if (b.status !== 0) failed++
      fs.rmSync(bundle, { force: true })
    } else console.log('(esbuild not available: bundled engine run skipped)')
  }
}
process.exit(failed ? 1 : 0)
