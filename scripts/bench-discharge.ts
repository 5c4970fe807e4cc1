/**
 * Discharge-log benchmark. Run: node --import tsx scripts/bench-discharge.ts [rows]
 * Writes an invented 1,000,000-row log (elapsed seconds, pack volts, amps) to a temp folder, then,
 * each in a fresh process so their peak memory is their own:
 *   baseline — read the same file and split it into lines (the least any reader must do);
 *   server   — the upload route's own code: SHA-256 and preview of the staged file, then the
 *              analysis route's stream through papaparse into Float64Arrays, the engine, and the
 *              down-sampled curve.
 * Prints both times (wall clock and CPU, which a busy machine inflates less), their ratio and peak RSS. Each round is its own process (the median of 3
 * rounds is shown, with the highest peak RSS), so garbage from one round never counts against another.
 */
import { spawnSync } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { performance } from 'node:perf_hooks'

const ROUNDS = 3
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1]
const cpuOf = (start: NodeJS.CpuUsage) => {
  const used = process.cpuUsage(start)
  return (used.user + used.system) / 1000
}
const mb = (bytes: number) => `${(bytes / 2 ** 20).toFixed(0)} MB`

async function measure(mode: string, file: string) {
  const times: number[] = []
  let cpuMs = 0
  let detail = ''
  if (mode === 'baseline') {
    const start = performance.now()
    const cpu0 = process.cpuUsage()
    const lines = (await fs.promises.readFile(file, 'utf8')).split('\n')
    times.push(performance.now() - start)
    cpuMs = cpuOf(cpu0)
    detail = `${lines.length - 2} data lines`
  } else {
    // The server modules read config on import; keep them away from the real data folder.
    process.env.DATA_DIR = path.dirname(file)
    const { fingerprint, lookAtSample } = await import('../server/modules/discharge/log-parser')
    const { analyseStream } = await import('../server/modules/discharge/discharge.service')
    const { ColumnMappingSchema, DischargeOptionsSchema } = await import('../shared/schemas/discharge-log.schema')
    {
      const start = performance.now()
      const cpu0 = process.cpuUsage()
      const { size, sample } = await fingerprint(file)
      const look = lookAtSample(sample, size <= sample.length)
      const mapping = ColumnMappingSchema.parse({
        delimiter: look.delimiter,
        decimal: look.decimal,
        header: look.header,
        firstLine: look.firstLine,
        time: look.guess.time,
        voltage: look.guess.voltage,
        current: look.guess.current,
      })
      const options = DischargeOptionsSchema.parse({ chemistry: 'nicd', cellsInSeries: 4, ratedDuration: '3 h', ratedCapacity: '4 Ah' })
      const out = await analyseStream(fs.createReadStream(file, { highWaterMark: 64 * 1024 }), sample, size, { mapping, options, acceptBadRows: false })
      times.push(performance.now() - start)
      cpuMs = cpuOf(cpu0)
      detail = `${out.read.rows} rows, runtime ${out.result.runtimeH.toFixed(3)} h (${out.result.runtimeEnd}), ${out.result.deliveredAh?.toFixed(3)} Ah, curve ${out.curve.tH.length} points`
    }
  }
  const peak = process.resourceUsage().maxRSS * 1024
  console.log(JSON.stringify({ mode, ms: times[0], cpuMs, peakRss: peak, detail }))
}

function generate(file: string, rows: number) {
  // A 4-cell NiCd pack at 0.55 A: 5.2 V falling slowly, the knee after 3.2 h and the 4.0 V cut-off at about 3.45 h, one sample every 0.0125 s.
  const out = fs.openSync(file, 'w')
  let chunk = 'elapsed_s,pack_V,current_A\n'
  const step = (3.5 * 3600) / rows
  for (let k = 0; k < rows; k++) {
    const s = k * step
    const h = s / 3600
    const v = 5.2 - 0.12 * h - (h > 3.2 ? 9 * (h - 3.2) ** 2 : 0) + 0.004 * Math.sin(k / 37)
    const a = 0.55 + 0.003 * Math.sin(k / 91)
    chunk += `${s.toFixed(4)},${v.toFixed(4)},${a.toFixed(4)}\n`
    if (chunk.length > 1 << 20) {
      fs.writeSync(out, chunk)
      chunk = ''
    }
  }
  fs.writeSync(out, chunk)
  fs.closeSync(out)
}

async function main() {
  const [mode, file] = process.argv.slice(2)
  if (mode === 'baseline' || mode === 'server') return measure(mode, file)
  const rows = Number(mode ?? 1_000_000)
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-bench-discharge-'))
  const log = path.join(dir, 'log.csv')
  try {
    generate(log, rows)
    console.log(`log: ${rows.toLocaleString('en')} rows, ${mb(fs.statSync(log).size)} (${log})`)
    console.log(
      `load average now: ${os
        .loadavg()
        .map((x) => x.toFixed(1))
        .join(' ')} on ${os.cpus().length} CPUs`,
    )
    const results: Record<string, { ms: number; min: number; max: number; cpuMs: number; peakRss: number; detail: string }> = {}
    for (const m of ['baseline', 'server']) {
      const rounds: Array<{ ms: number; cpuMs: number; peakRss: number; detail: string }> = []
      for (let r = 0; r < ROUNDS; r++) {
        const run = spawnSync('node', ['--import', 'tsx', process.argv[1], m, log], { encoding: 'utf8', env: { ...process.env, LOG_LEVEL: 'silent' } })
        if (run.status !== 0) throw new Error(`${m} failed: ${run.stderr}`)
        rounds.push(JSON.parse(run.stdout.trim().split('\n').pop() as string))
      }
      const ms = rounds.map((x) => x.ms)
      results[m] = {
        ms: median(ms),
        min: Math.min(...ms),
        max: Math.max(...ms),
        cpuMs: median(rounds.map((x) => x.cpuMs)),
        peakRss: Math.max(...rounds.map((x) => x.peakRss)),
        detail: rounds[0].detail,
      }
    }
    const b = results.baseline
    const s = results.server
    console.log(
      `baseline (read + split lines): median ${b.ms.toFixed(0)} ms (min ${b.min.toFixed(0)}, max ${b.max.toFixed(0)}), CPU ${b.cpuMs.toFixed(0)} ms, peak RSS ${mb(b.peakRss)}; ${b.detail}`,
    )
    console.log(
      `server (hash + preview + papaparse stream + engine + curve): median ${s.ms.toFixed(0)} ms (min ${s.min.toFixed(0)}, max ${s.max.toFixed(0)}), CPU ${s.cpuMs.toFixed(0)} ms, peak RSS ${mb(s.peakRss)}; ${s.detail}`,
    )
    console.log(`ratio server / baseline: ${(s.ms / b.ms).toFixed(2)} wall, ${(s.cpuMs / b.cpuMs).toFixed(2)} CPU`)
    console.log(`targets: ≤ 2000 ms ${s.ms <= 2000 ? 'met' : 'NOT met'}; peak RSS < 300 MB ${s.peakRss < 300 * 2 ** 20 ? 'met' : 'NOT met'}`)
  } finally {
    fs.rmSync(dir, { recursive: true, force: true })
  }
}

await main()
