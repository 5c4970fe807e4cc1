/**
 * Input rules every engine tool shares (docs/engine.md, "Bare numbers and magnitudes"): a time or a
 * charge given as a bare number is refused with the field named (a bare 3 could be seconds, minutes or
 * hours; coulombs, mAh or Ah), and an absurd magnitude (1e300) is a field error in every field of every
 * tool, never a result or a crash. Common practice: refuse what cannot be read unambiguously.
 */
import { describe, expect, it, test } from 'vitest'
import { tools, type ToolName } from '../../../shared/engine/registry'
import { runTool } from '../../../shared/engine/tool'

const samples = Array.from({ length: 40 }, (_, k) => ({ t: k * 300, v: 6.3 - k * 0.008, i: 0.5 }))

/** A valid input per tool, with every field a user might type. */
const VALID: Record<string, Record<string, unknown>> = {
  size: {
    chemistry: 'nicd',
    duration: '3 h',
    load: { power: '3 W' },
    driver: 'converter',
    driverEfficiency: 0.85,
    capacity: '4.5 Ah',
    ratedHours: 5,
    peukertExponent: 1.1,
    endOfLifeCapacity: 0.8,
    designMargin: 0.1,
    designLifeYears: 4,
    ambientMin: '5 °C',
    ambientMax: '25 °C',
    averageCellVoltage: '1.2 V',
  },
  charge: {
    chemistry: 'nicd',
    capacity: '4 Ah',
    duration: '3 h',
    load: { power: '3 W' },
    chargeCurrent: '0.2 A',
    trickleCurrent: '0.12 A',
    cutoffVoltage: '3 V',
    ambient: '25 °C',
  },
  compare: {
    duration: '3 h',
    load: { power: '3 W' },
    ambientMin: '5 °C',
    ambientMax: '25 °C',
    weights: { life: 0.4, trickle: 0.2, size: 0.2, restrictions: 0.2 },
  },
  audit: {
    claimedPower: '3 W',
    supplyVoltage: '230 V',
    measuredPower: '3.2 W',
    measuredCurrent: '25 mA',
    mode: 'maintained',
    hoursPerDay: 24,
    tariffPerKWh: 0.3,
    ledVoltageMains: '9 V',
    ledCurrentMains: '0.2 A',
  },
  retrofit: {
    chemistry: 'nicd',
    cellsInSeries: 3,
    capacity: '4 Ah',
    trickleCurrent: '0.2 A',
    batteryVoltage: '4.35 V',
    secondReading: { kind: 'open-circuit', voltage: '12 V' },
    targetTrickleCurrent: '0.12 A',
    dischargeCurrent: '0.9 A',
    duration: '3 h',
  },
  discharge: { samples, chemistry: 'nicd', cellsInSeries: 5, ratedDuration: '3 h', ratedCapacity: '4 Ah', assumedPower: '3 W' },
  spacing: {
    photometry: { verticalAngles: [0, 45, 90], horizontalAngles: [0], candela: [[100, 80, 10]] },
    mountingHeight: '2.5 m',
    emergencyOutputFactor: 0.5,
    criteria: 'en1838-route',
    routeWidth: '2 m',
    routeLength: '20 m',
  },
}

/** Every leaf path of a JSON value whose value is a number or a string starting with a digit. */
function numericLeaves(value: unknown, path: Array<string | number> = []): Array<Array<string | number>> {
  if (typeof value === 'number') return [path]
  if (typeof value === 'string') return /^[\d.+-]/.test(value) ? [path] : []
  if (Array.isArray(value)) return value.flatMap((v, k) => numericLeaves(v, [...path, k]))
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => numericLeaves(v, [...path, k]))
  return []
}

function withValue(input: unknown, path: Array<string | number>, value: unknown): unknown {
  const copy = structuredClone(input) as Record<string | number, unknown>
  let at = copy
  for (const key of path.slice(0, -1)) at = at[key] as Record<string | number, unknown>
  at[path[path.length - 1]] = value
  return copy
}

describe('each base input is valid', () => {
  test.each(Object.keys(VALID))('%s', (name) => {
    const outcome = runTool(tools[name as ToolName], VALID[name])
    if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  })
})

describe('bare-number durations and capacities are refused in every tool, naming the field', () => {
  test.each<[string, string, unknown]>([
    ['size', 'duration', 3],
    ['size', 'duration', '3'],
    ['size', 'capacity', 4.5],
    ['charge', 'duration', 3],
    ['charge', 'capacity', 4],
    ['compare', 'duration', 3],
    ['retrofit', 'duration', 3],
    ['retrofit', 'capacity', 4],
    ['discharge', 'ratedDuration', 3],
    ['discharge', 'ratedCapacity', 1.6],
  ])('%s: %s = %j', (name, field, bare) => {
    const outcome = runTool(tools[name as ToolName], { ...VALID[name], [field]: bare })
    expect(outcome.ok).toBe(false)
    if (!outcome.ok) expect(outcome.fields).toContainEqual({ path: field, message: expect.stringMatching(/^needs a unit: .* could be/) })
  })

  it('a field whose name carries its unit keeps taking a bare number (ratedHours is hours)', () => {
    const outcome = runTool(tools.size, { ...VALID.size, ratedHours: 20 })
    expect(outcome.ok).toBe(true)
  })
})

describe('absurd magnitudes are field errors in every field of every tool', () => {
  const cases = Object.entries(VALID).flatMap(([name, input]) => numericLeaves(input).map((path) => [name, path.join('.'), path] as const))
  test.each(cases)('%s: %s = 1e300', (name, dotted, path) => {
    for (const absurd of [
      1e300,
      -1e300,
      '1e300',
      typeof path.reduce<unknown>((o, k) => (o as Record<string | number, unknown>)[k], VALID[name]) === 'string'
        ? `1e300 ${String(path.reduce<unknown>((o, k) => (o as Record<string | number, unknown>)[k], VALID[name])).replace(/^[\d.+-]+\s*/, '')}`
        : 1e300,
    ]) {
      const outcome = runTool(tools[name as ToolName], withValue(VALID[name], path, absurd))
      expect(outcome.ok, `${dotted} = ${String(absurd)}`).toBe(false)
      if (!outcome.ok) expect(outcome.fields.map((f) => f.path)).toContain(dotted)
    }
  })
})
