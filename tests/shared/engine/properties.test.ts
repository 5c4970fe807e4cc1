/** Properties the battery engine must hold for any valid input (fast-check). */
import { describe, expect, test } from 'vitest'
import fc from 'fast-check'
import { CHEMISTRY_IDS } from '../../../shared/engine/chemistries'
import { chargeTool } from '../../../shared/engine/charge'
import { compareTool } from '../../../shared/engine/compare'
import { sizePack, sizeTool, type SizeInput } from '../../../shared/engine/size'
import { runTool } from '../../../shared/engine/tool'

const chemistry = fc.constantFrom(...CHEMISTRY_IDS)
const temperature = fc.double({ min: -40, max: 85, noNaN: true })
const fractionArb = fc.double({ min: 0.05, max: 1, noNaN: true })

/** Any valid pre-parsed `size` input (numbers in base units). */
const sizeInput: fc.Arbitrary<SizeInput> = fc
  .record({
    chemistry,
    durationH: fc.double({ min: 0.1, max: 24, noNaN: true }),
    power: fc.double({ min: 0.05, max: 200, noNaN: true }),
    driver: fc.constantFrom('direct' as const, 'converter' as const),
    ledVoltage: fc.double({ min: 1, max: 60, noNaN: true }),
    ledCurrent: fc.double({ min: 0.001, max: 10, noNaN: true }),
    driverEfficiency: fractionArb,
    endOfLifeCapacity: fractionArb,
    depthOfDischarge: fc.option(fractionArb, { nil: undefined }),
    designMargin: fc.double({ min: 0, max: 1, noNaN: true }),
    t1: temperature,
    t2: temperature,
    cellsInSeries: fc.option(fc.integer({ min: 1, max: 400 }), { nil: undefined }),
    capacityAh: fc.option(fc.double({ min: 0.01, max: 1000, noNaN: true }), { nil: undefined }),
    peukertExponent: fc.option(fc.double({ min: 1, max: 2, noNaN: true }), { nil: undefined }),
    ratedHours: fc.option(fc.double({ min: 0.1, max: 1000, noNaN: true }), { nil: undefined }),
    designLifeYears: fc.double({ min: 0.5, max: 50, noNaN: true }),
  })
  .map((r) => ({
    chemistry: r.chemistry,
    duration: r.durationH * 3600,
    load: r.driver === 'direct' ? { ledVoltage: r.ledVoltage, ledCurrent: r.ledCurrent } : { power: r.power },
    driver: r.driver,
    driverEfficiency: r.driverEfficiency,
    endOfLifeCapacity: r.endOfLifeCapacity,
    depthOfDischarge: r.depthOfDischarge,
    designMargin: r.designMargin,
    ambientMin: Math.min(r.t1, r.t2),
    ambientMax: Math.max(r.t1, r.t2),
    cellsInSeries: r.cellsInSeries,
    capacity: r.capacityAh === undefined ? undefined : r.capacityAh * 3600,
    peukertExponent: r.peukertExponent,
    ratedHours: r.ratedHours,
    designLifeYears: r.designLifeYears,
  }))

const allFinite = (value: unknown): boolean => {
  if (typeof value === 'number') return Number.isFinite(value)
  if (Array.isArray(value)) return value.every(allFinite)
  if (value && typeof value === 'object') return Object.values(value).every(allFinite)
  return true
}

describe('size properties', () => {
  test('a longer duration never needs less capacity', () => {
    fc.assert(
      fc.property(sizeInput, fc.double({ min: 1, max: 4, noNaN: true }), (input, stretch) => {
        const longer = { ...input, duration: Math.min(input.duration * stretch, 100 * 3600) }
        expect(sizePack(longer).requiredCapacityAh).toBeGreaterThanOrEqual(sizePack(input).requiredCapacityAh * (1 - 1e-12))
      }),
    )
  })

  test('a lower end-of-life fraction never needs less capacity', () => {
    fc.assert(
      fc.property(sizeInput, fc.double({ min: 0.1, max: 1, noNaN: true }), (input, shrink) => {
        const harsher = { ...input, endOfLifeCapacity: input.endOfLifeCapacity * shrink }
        expect(sizePack(harsher).requiredCapacityAh).toBeGreaterThanOrEqual(sizePack(input).requiredCapacityAh * (1 - 1e-12))
      }),
    )
  })

  test('more cells in series never draw more current for the same power (converter)', () => {
    fc.assert(
      fc.property(sizeInput, fc.integer({ min: 1, max: 100 }), fc.integer({ min: 1, max: 100 }), (input, a, b) => {
        const converter = { ...input, driver: 'converter' as const, load: { power: 5 } }
        const few = sizePack({ ...converter, cellsInSeries: Math.min(a, b) })
        const many = sizePack({ ...converter, cellsInSeries: Math.max(a, b) })
        expect(many.averageCurrentA).toBeLessThanOrEqual(few.averageCurrentA * (1 + 1e-12))
      }),
    )
  })

  test('a chosen pack always covers the duration at end of life', () => {
    fc.assert(
      fc.property(sizeInput, (input) => {
        const r = sizePack({ ...input, capacity: undefined })
        expect(r.selectedCapacityAh).toBeGreaterThanOrEqual(r.requiredCapacityAh * (1 - 1e-9))
        expect(r.runtimeEndOfLifeH).toBeGreaterThanOrEqual((input.duration / 3600) * (1 - 1e-9))
      }),
    )
  })

  test('no finite valid input yields NaN or Infinity (size)', () => {
    fc.assert(
      fc.property(sizeInput, (input) => {
        expect(allFinite(sizePack(input))).toBe(true)
      }),
      { numRuns: 300 },
    )
  })
})

describe('units do not change the answer', () => {
  test('mA vs A and min vs h give the same sizing (mathjs conversions)', () => {
    fc.assert(
      fc.property(chemistry, fc.integer({ min: 10, max: 5000 }), fc.integer({ min: 30, max: 600 }), (id, milliamps, minutes) => {
        const a = runTool(sizeTool, {
          chemistry: id,
          driver: 'direct',
          cellsInSeries: 4,
          load: { ledVoltage: '2.5 V', ledCurrent: `${milliamps} mA` },
          duration: `${minutes} min`,
        })
        const b = runTool(sizeTool, {
          chemistry: id,
          driver: 'direct',
          cellsInSeries: 4,
          load: { ledVoltage: '2.5 V', ledCurrent: `${milliamps / 1000} A` },
          duration: `${minutes / 60} h`,
        })
        expect(a.ok && b.ok).toBe(true)
        if (a.ok && b.ok) {
          expect(a.result.requiredCapacityAh).toBeCloseTo(b.result.requiredCapacityAh, 9)
          expect(a.result.selectedCapacityAh).toBe(b.result.selectedCapacityAh)
          expect(a.result.runtimeH).toBeCloseTo(b.result.runtimeH, 9)
        }
      }),
      { numRuns: 60 },
    )
  })
})

describe('charge and compare stay finite', () => {
  test('no finite valid input yields NaN or Infinity (charge)', () => {
    fc.assert(
      fc.property(
        chemistry,
        fc.double({ min: 0.01, max: 500, noNaN: true }),
        fc.double({ min: 0.001, max: 50, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.double({ min: 0.5, max: 100, noNaN: true }),
        fc.constantFrom('pack', 'cell'),
        temperature,
        (id, capacityAh, chargeA, trickleA, volts, basis, ambient) => {
          const outcome = runTool(chargeTool, {
            chemistry: id,
            capacity: `${capacityAh} Ah`,
            duration: '3 h',
            load: { power: 3 },
            chargeCurrent: chargeA,
            trickleCurrent: trickleA,
            floatVoltage: volts,
            voltageBasis: basis,
            ambient,
          })
          // runTool throws on a non-finite number; a field error is acceptable only for the cut-off rule
          if (outcome.ok) expect(allFinite(outcome.result)).toBe(true)
        },
      ),
      { numRuns: 200 },
    )
  })

  test('no finite valid input yields NaN or Infinity (compare)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 200, noNaN: true }),
        fc.double({ min: 0.1, max: 24, noNaN: true }),
        temperature,
        temperature,
        fc.record({
          life: fc.double({ min: 0, max: 1, noNaN: true }),
          trickle: fc.double({ min: 0.01, max: 1, noNaN: true }),
          size: fc.double({ min: 0, max: 1, noNaN: true }),
          restrictions: fc.double({ min: 0, max: 1, noNaN: true }),
        }),
        (power, h, t1, t2, weights) => {
          const outcome = runTool(compareTool, { load: { power }, duration: `${h} h`, ambientMin: Math.min(t1, t2), ambientMax: Math.max(t1, t2), weights })
          expect(outcome.ok).toBe(true)
          if (outcome.ok) expect(allFinite(outcome.result)).toBe(true)
        },
      ),
      { numRuns: 100 },
    )
  })
})
