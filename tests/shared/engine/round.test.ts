/**
 * roundToSignificant against the language's own decimal rounding: Number.prototype.toPrecision
 * (ECMA-262, 21.1.3.5), parsed back with Number. They must give the very same double.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { roundToSignificant } from '../../../shared/engine/round'

const reference = (x: number, digits: number) => Number(x.toPrecision(digits))

describe('roundToSignificant', () => {
  it('equals Number(x.toPrecision(d)) for a million values over 24 decades', () => {
    let state = 12345
    const next = () => (state = (Math.imul(state, 1103515245) + 12345) >>> 0) / 4294967296
    const misses: Array<[number, number]> = []
    for (let i = 0; i < 1_000_000; i++) {
      const x = (next() < 0.5 ? -1 : 1) * next() * 10 ** Math.floor(next() * 24 - 12)
      const digits = 1 + Math.floor(next() * 6)
      if (!Object.is(roundToSignificant(x, digits), reference(x, digits))) misses.push([x, digits])
    }
    expect(misses).toEqual([])
  })

  it('equals it at halves and next to powers of ten, where a shortcut would go wrong', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 99_999 }), fc.integer({ min: -8, max: 8 }), fc.integer({ min: 1, max: 6 }), (n, e, digits) => {
        for (const x of [(n + 0.5) * 10 ** e, n * 10 ** e, 10 ** e * (1 - 1e-15), 10 ** e * (1 + 1e-15), -(n + 0.5) * 10 ** e]) {
          expect(roundToSignificant(x, digits)).toBe(reference(x, digits))
        }
      }),
      { seed: 42, numRuns: 3000 },
    )
  })

  it('passes zero and non-finite numbers through', () => {
    expect(roundToSignificant(0)).toBe(0)
    expect(Object.is(roundToSignificant(-0), -0)).toBe(true)
    expect(roundToSignificant(Infinity)).toBe(Infinity)
    expect(roundToSignificant(NaN)).toBeNaN()
  })

  it('rounds as people expect (3 significant digits by default)', () => {
    expect(roundToSignificant(1.23456)).toBe(1.23)
    expect(roundToSignificant(0.0012345)).toBe(0.00123)
    expect(roundToSignificant(123456)).toBe(123000)
    expect(roundToSignificant(2.6666, 2)).toBe(2.7)
  })
})
