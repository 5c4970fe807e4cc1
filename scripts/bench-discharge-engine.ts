/**
 * Discharge and spacing engine benchmark. Run: npx tsx scripts/bench-discharge-engine.ts
 * 1. analyseDischarge on a generated 1,000,000-sample log held in typed arrays (no parsing).
 * 2. The spacing search for a table of 10 mounting heights, for a generated downlight-like
 *    intensity table and for a uniform one (whose slow fall-off makes it the worst case).
 * 3. A 30 m route laid out for the same two tables.
 * 4. The same route with two points that need a luminaire within 2 m.
 * The data are invented. Medians of several rounds; the first round warms the JIT up.
 */
import { performance } from 'node:perf_hooks'
import { analyseDischarge } from '../shared/engine/discharge'
import { computeSpacing, spacingInput } from '../shared/engine/spacing'

const ROUNDS = 7
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1]

function time(label: string, run: () => void) {
  const times: number[] = []
  const cpu: number[] = []
  for (let r = 0; r < ROUNDS; r++) {
    const used = process.cpuUsage()
    const start = performance.now()
    run()
    times.push(performance.now() - start)
    const c = process.cpuUsage(used)
    cpu.push((c.user + c.system) / 1000)
  }
  // CPU time beside wall time: on a shared machine the wall time also counts waiting for a core.
  console.log(
    `${label}: median ${median(times).toFixed(1)} ms (min ${Math.min(...times).toFixed(1)}, max ${Math.max(...times).toFixed(1)}, ${ROUNDS} rounds; CPU median ${median(cpu).toFixed(1)} ms)`,
  )
}

// 1. A 10-cell NiCd pack, 0.9 A, falling 13.2 → 9.8 V over 3.3 h, sampled every 0.012 s, with a dropout.
const N = 1_000_000
const t = new Float64Array(N)
const v = new Float64Array(N)
const i = new Float64Array(N)
for (let k = 0; k < N; k++) {
  t[k] = k * 0.012
  const hours = t[k] / 3600
  const loaded = hours < 3.3
  v[k] = loaded ? 13.2 - 0.4 * hours - 0.02 * Math.sin(k / 50) - (hours > 3 ? 3 * (hours - 3) ** 2 : 0) : 12.1
  i[k] = loaded ? 0.9 + 0.01 * Math.sin(k / 70) : 0
}
time('discharge: analyseDischarge, 1,000,000 samples with current', () => {
  const r = analyseDischarge({ t, v, i }, { chemistry: 'nicd', cellsInSeries: 10, ratedDuration: 3 * 3600, thresholdsPerCell: [1.1, 1.05] })
  if (!r.ok) throw new Error('bench log rejected')
})
time('discharge: analyseDischarge, 1,000,000 samples, voltage only, assumed power', () => {
  const r = analyseDischarge({ t, v }, { chemistry: 'nicd', cellsInSeries: 10, ratedDuration: 3 * 3600, assumedPower: 11 })
  if (!r.ok) throw new Error('bench log rejected')
})

// 2. Spacing tables for 10 heights.
const downlight = {
  verticalAngles: [0, 10, 20, 30, 40, 50, 60, 70, 80, 90],
  horizontalAngles: [0, 45, 90],
  candela: [
    [180, 178, 172, 160, 140, 110, 70, 30, 8, 0],
    [180, 176, 168, 152, 130, 98, 60, 25, 6, 0],
    [180, 175, 165, 148, 122, 90, 52, 20, 5, 0],
  ],
}
const uniform = { verticalAngles: [0, 90], horizontalAngles: [0], candela: [[10, 10]] }
const heights = [2, 2.5, 3, 3.5, 4, 4.5, 5, 6, 7, 8]
for (const [name, photometry] of [
  ['downlight-like table', downlight],
  ['uniform 10 cd (worst case)', uniform],
] as const) {
  for (const criteria of ['en1838-route', 'en1838-open-area', 'nfpa101'] as const) {
    const input = spacingInput.parse({
      photometry,
      mountingHeight: 2.5,
      emergencyOutputFactor: criteria === 'nfpa101' ? 1 : 0.5,
      criteria,
      routeWidth: 2,
      heights,
    })
    time(`spacing: ${criteria}, ${name}, 10 heights`, () => computeSpacing(input))
  }
}

// 3. A 30 m route laid out (fewest luminaires, end distance chosen with the spacing), one height.
for (const [name, photometry] of [
  ['downlight-like table', downlight],
  ['uniform 10 cd (worst case)', uniform],
] as const) {
  for (const criteria of ['en1838-route', 'nfpa101'] as const) {
    const input = spacingInput.parse({
      photometry,
      mountingHeight: 2.5,
      emergencyOutputFactor: criteria === 'nfpa101' ? 1 : 0.5,
      criteria,
      routeWidth: 2,
      routeLength: 30,
    })
    time(`route layout: ${criteria}, ${name}, 30 m`, () => computeSpacing(input))
  }
}

// 4. The same 30 m route with an exit door at the far end and a call point at 12 m that the even row misses.
for (const [name, photometry] of [
  ['downlight-like table', downlight],
  ['uniform 10 cd (worst case)', uniform],
] as const) {
  const input = spacingInput.parse({
    photometry,
    mountingHeight: 2.5,
    emergencyOutputFactor: 0.5,
    criteria: 'en1838-route',
    routeWidth: 2,
    routeLength: 30,
    points: [
      { kind: 'exit-door', at: 30 },
      { kind: 'call-point', at: 12 },
    ],
  })
  time(`route layout with two marked points: en1838-route, ${name}, 30 m`, () => computeSpacing(input))
}
