/**
 * Battery-engine benchmark: sizes and compares 10 000 generated luminaires on pre-parsed inputs
 * (numbers in base units, no unit parsing in the loop). Run: npx tsx scripts/bench-engine.ts
 * The luminaires are invented: a seeded generator spreads loads, durations and temperatures.
 */
import { performance } from 'node:perf_hooks'
import { CHEMISTRY_IDS } from '../shared/engine/chemistries'
import { compareChemistries, DEFAULT_WEIGHTS, sizeInputFor, type CompareInput } from '../shared/engine/compare'
import { sizePack, type SizeInput } from '../shared/engine/size'
import { seededRandom } from '../shared/lib/seeded-random'

const COUNT = 10_000
const ROUNDS = 15

const next = seededRandom(20240601)
const pick = <T>(items: readonly T[]) => items[Math.floor(next() * items.length)]
const DURATIONS_S = [3600, 5400, 10_800]

const luminaires: CompareInput[] = Array.from({ length: COUNT }, () => {
  const direct = next() < 0.3
  const ambientMin = Math.round(-20 + next() * 30)
  return {
    duration: pick(DURATIONS_S),
    load: direct ? { ledVoltage: 2.8 + next() * 6, ledCurrent: 0.05 + next() * 0.5 } : { power: 0.5 + next() * 10 },
    driver: direct ? ('direct' as const) : ('converter' as const),
    driverEfficiency: 0.75 + next() * 0.2,
    converterInput: undefined,
    endOfLifeCapacity: 0.8,
    depthOfDischarge: undefined,
    designMargin: 0.1,
    designLifeYears: 4,
    ambientMin,
    ambientMax: ambientMin + Math.round(10 + next() * 30),
    chemistries: [...CHEMISTRY_IDS],
    weights: { ...DEFAULT_WEIGHTS },
  }
})

// Copied, not kept as built: 60,000 long-lived objects from the engine's own allocation site would make
// V8 pretenure that site, so the comparison's short-lived inputs would go to the old generation and
// the comparison would run at half speed, which no real caller ever sees (measured: 46 ms vs 99 ms).
const sizeInputs: SizeInput[] = luminaires.flatMap((l) => CHEMISTRY_IDS.map((chemistry) => ({ ...sizeInputFor(chemistry, l) })))

function time(label: string, run: () => number): void {
  const samples: number[] = []
  let checksum = 0
  for (let i = 0; i < 3; i++) run() // warm-up: let the optimising compiler settle first
  for (let i = 0; i < ROUNDS; i++) {
    const start = performance.now()
    checksum += run()
    samples.push(performance.now() - start)
  }
  samples.sort((a, b) => a - b)
  const median = samples[Math.floor(samples.length / 2)]
  console.log(
    `${label.padEnd(58)} median ${median.toFixed(1).padStart(7)} ms   best ${samples[0].toFixed(1).padStart(7)} ms   (checksum ${checksum.toFixed(3)})`,
  )
}

console.log(`Battery engine benchmark: ${COUNT} luminaires × ${CHEMISTRY_IDS.length} chemistries, ${ROUNDS} rounds, Node ${process.version}`)
// The figures with a target first, before the explained runs leave garbage behind.
time(`compare, all chemistries, numbers only (${COUNT} comparisons)`, () => {
  let sum = 0
  for (const input of luminaires) sum += compareChemistries(input, { explain: false }).rows[0].score
  return sum
})
time(`size, numbers only (${sizeInputs.length} sizings)`, () => {
  let sum = 0
  for (const input of sizeInputs) sum += sizePack(input, { explain: false }).selectedCapacityAh
  return sum
})
time(`size, with working steps (${sizeInputs.length} sizings)`, () => {
  let sum = 0
  for (const input of sizeInputs) sum += sizePack(input).selectedCapacityAh
  return sum
})
time(`size, one chemistry each (${COUNT} sizings, numbers only)`, () => {
  let sum = 0
  for (let i = 0; i < sizeInputs.length; i += CHEMISTRY_IDS.length) sum += sizePack(sizeInputs[i], { explain: false }).selectedCapacityAh
  return sum
})
time(`compare, all chemistries (${COUNT} comparisons)`, () => {
  let sum = 0
  for (const input of luminaires) sum += compareChemistries(input).rows[0].score
  return sum
})
