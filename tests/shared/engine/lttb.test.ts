import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { lttb, lttbIndices } from '../../../shared/engine/lttb'

describe('Largest-Triangle-Three-Buckets (Steinarsson 2013)', () => {
  it('worked by hand: five points, three kept → first, the tallest of the middle bucket, last', () => {
    // Bucket size (5 − 2)/(3 − 2) = 3: points 1–3 compete; the next "bucket" is the last point (4, 0).
    // Doubled areas against (0,0) and (4,0): 4·|y| → 4, 0, 4; the first maximum (index 1) wins.
    expect(Array.from(lttbIndices([0, 1, 2, 3, 4], [0, 1, 0, 1, 0], 3))).toEqual([0, 1, 4])
    expect(Array.from(lttbIndices([0, 1, 2, 3, 4], [0, 0, 0, -2, 0], 3))).toEqual([0, 3, 4])
  })

  it('keeps a single spike in a long flat series', () => {
    const n = 100_000
    const x = Float64Array.from({ length: n }, (_, k) => k)
    const y = new Float64Array(n)
    y[31_337] = 5
    const kept = lttbIndices(x, y, 100)
    expect(kept).toContain(31_337)
    const { x: kx, y: ky } = lttb(x, y, 100)
    expect(Math.max(...ky)).toBe(5)
    expect(kx[0]).toBe(0)
    expect(kx[99]).toBe(n - 1)
  })

  it('returns every point when the threshold is not below the number of points', () => {
    expect(Array.from(lttbIndices([0, 1, 2], [3, 4, 5], 3))).toEqual([0, 1, 2])
    expect(Array.from(lttbIndices([0, 1], [3, 4], 1000))).toEqual([0, 1])
    expect(Array.from(lttbIndices([], [], 0))).toEqual([])
  })

  it('refuses thresholds it cannot honour, with a reason', () => {
    expect(() => lttbIndices([0, 1, 2, 3], [0, 1, 2, 3], 2)).toThrow(/at least 3/)
    expect(() => lttbIndices([0, 1, 2, 3], [0, 1, 2, 3], 2.5)).toThrow(/whole number/)
    expect(() => lttbIndices([0, 1, 2], [0, 1], 2)).toThrow(/x has 3 values but y has 2/)
  })

  it('property: exactly `threshold` ascending indexes, first and last kept, one per bucket', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 3, maxLength: 400 }),
        fc.integer({ min: 3, max: 50 }),
        (ys, threshold) => {
          const x = ys.map((_, k) => k)
          const kept = Array.from(lttbIndices(x, ys, threshold))
          const expected = Math.min(threshold, ys.length)
          expect(kept).toHaveLength(expected)
          expect(kept[0]).toBe(0)
          expect(kept[expected - 1]).toBe(ys.length - 1)
          for (let k = 1; k < kept.length; k++) expect(kept[k]).toBeGreaterThan(kept[k - 1])
          if (threshold < ys.length) {
            const every = (ys.length - 2) / (threshold - 2)
            for (let b = 0; b < threshold - 2; b++) {
              expect(kept[b + 1]).toBeGreaterThanOrEqual(Math.floor(b * every) + 1)
              expect(kept[b + 1]).toBeLessThan(Math.floor((b + 1) * every) + 1)
            }
          }
        },
      ),
      { seed: 2013, numRuns: 200 },
    )
  })
})
