/**
 * `npm run bench`: every benchmark in turn, each in its own process so one cannot warm up or
 * slow down another. Copy the figures into docs/benchmarks.md with the machine they ran on.
 */
import { spawnSync } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'

const BENCHES = [
  { file: 'scripts/bench-engine.ts', what: 'engine: size and compare all chemistries for 10,000 luminaires' },
  { file: 'scripts/bench-recalc.ts', what: 'pack bench: recalculation per keystroke' },
  { file: 'scripts/bench-bundle.ts', what: 'client: JavaScript and CSS loaded by the first page after sign-in (needs a build)' },
  { file: 'scripts/bench-discharge-engine.ts', what: 'engine: discharge analysis of 1,000,000 samples and spacing tables' },
  { file: 'scripts/bench-discharge.ts', what: 'discharge logs: a 1,000,000-row log parsed and analysed' },
]

console.log(`machine: ${os.cpus()[0]?.model ?? 'unknown CPU'} × ${os.cpus().length}, ${Math.round(os.totalmem() / 2 ** 30)} GiB, Node ${process.version}, ${os.platform()} ${os.release()}`)
let failed = 0
for (const bench of BENCHES) {
  if (!fs.existsSync(bench.file)) continue
  console.log(`\n== ${bench.what} (${bench.file})`)
  const r = spawnSync('node', ['--import', 'tsx', bench.file], { stdio: 'inherit' })
  if (r.status !== 0) failed++
}
process.exit(failed ? 1 : 0)
