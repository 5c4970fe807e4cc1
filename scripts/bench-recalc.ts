/**
 * Per-keystroke cost of the pack bench: the calls the screen makes after each key, timed many times.
 * One keystroke = the form's schema check (vee-validate runs the engine schema once) + recalcPack
 * (schema again, size with working, compare all chemistries, runtime over 15 temperatures).
 * The target is one animation frame, 16 ms. Run: npx tsx scripts/bench-recalc.ts
 * The typed values are invented: a designer typing "2.75 W" one character at a time, and so on.
 */
import { performance } from 'node:perf_hooks'
import { sizeInputSchema } from '../shared/engine/size'
import { recalcPack } from '../src/lib/pack-recalc'

const BASE = {
  chemistry: 'nicd',
  duration: '3 h',
  driver: 'converter',
  load: { power: '2.5 W' },
  driverEfficiency: '0.85',
  ambientMin: '5 °C',
  ambientMax: '25 °C',
  endOfLifeCapacity: '0.8',
  designMargin: '0.1',
  designLifeYears: '4',
}

/** Successive states of the form while someone types, over several fields and chemistries. */
function keystrokes(): unknown[] {
  const states: unknown[] = []
  const type = (text: string, apply: (partial: string) => Record<string, unknown>) => {
    for (let i = 1; i <= text.length; i++) states.push({ ...BASE, ...apply(text.slice(0, i)) })
  }
  for (const chemistry of ['nicd', 'nicd-ht', 'nimh', 'lifepo4', 'lead-acid', 'li-ion']) {
    type('2.75 W', (p) => ({ chemistry, load: { power: p } }))
    type('90 min', (p) => ({ chemistry, duration: p }))
    type('-10 °C', (p) => ({ chemistry, ambientMin: p }))
    type('1.6 Ah', (p) => ({ chemistry, capacity: p }))
  }
  type('450 mA', (p) => ({ driver: 'direct', load: { ledVoltage: '3.2 V', ledCurrent: p } }))
  return states
}

function oneKeystroke(state: unknown) {
  sizeInputSchema.safeParse(state) // vee-validate's validation of the same form
  return recalcPack(state)
}

const states = keystrokes()
const valid = states.filter((s) => recalcPack(s).ok).length
// Warm-up so the JIT has settled, as it has in a browser tab that has been open a few seconds.
for (let i = 0; i < 3; i++) for (const s of states) oneKeystroke(s)

const ROUNDS = 20
const times: number[] = []
const perState: number[][] = states.map(() => [])
for (let r = 0; r < ROUNDS; r++) {
  states.forEach((s, i) => {
    const t0 = performance.now()
    oneKeystroke(s)
    const dt = performance.now() - t0
    times.push(dt)
    perState[i].push(dt)
  })
}
// Each state's median over the rounds: what that keystroke costs, without one-off pauses of a busy machine.
const stateMedians = perState.map((ts) => [...ts].sort((a, b) => a - b)[Math.floor(ts.length / 2)])
const slowest = stateMedians.indexOf(Math.max(...stateMedians))
times.sort((a, b) => a - b)
const q = (p: number) => times[Math.min(times.length - 1, Math.floor(p * times.length))]
const mean = times.reduce((a, b) => a + b, 0) / times.length
const fmt = (x: number) => `${x.toFixed(3)} ms`
console.log(`pack bench recalculation: ${states.length} keystroke states (${valid} complete enough to compute), ${ROUNDS} rounds = ${times.length} keystrokes`)
console.log(`per keystroke: mean ${fmt(mean)}, median ${fmt(q(0.5))}, p95 ${fmt(q(0.95))}, p99 ${fmt(q(0.99))}, max ${fmt(times[times.length - 1])}`)
console.log(`slowest keystroke state (its median over ${ROUNDS} rounds): ${fmt(stateMedians[slowest])} — ${JSON.stringify(states[slowest])}`)
console.log(
  `budget 16 ms (one frame at 60 Hz): slowest state ${stateMedians[slowest] <= 16 ? 'within' : 'OVER'}; p99 of all keystrokes ${q(0.99) <= 16 ? 'within' : 'OVER'}`,
)
