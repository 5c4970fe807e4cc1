/**
 * Property of the discharge tool (fast-check): a log in which the load goes off before the rated
 * duration — the current falls to zero, or, without a current log, the pack voltage recovers — is never
 * a pass, whatever the chemistry, cell count, sampling interval, noise or when it happens. Rule: the
 * full rated-duration test of EN 50172 / BS 5266-1 (the luminaire must stay lit for its rated duration).
 */
import { describe, expect, test } from 'vitest'
import fc from 'fast-check'
import { analyseDischarge } from '../../../shared/engine/discharge'
import { getChemistry, type ChemistryId } from '../../../shared/engine/chemistries'
import { seededRandom } from '../../../shared/lib/seeded-random'

const H = 3600
const chemistries: ChemistryId[] = ['nicd', 'nicd-ht', 'nimh', 'lead-acid', 'lifepo4', 'li-ion']

const scenario = fc.record({
  chemistry: fc.constantFrom(...chemistries),
  cells: fc.integer({ min: 1, max: 12 }),
  ratedH: fc.constantFrom(1, 1.5, 3, 8),
  /** Seconds between samples. */
  every: fc.integer({ min: 1, max: 120 }),
  /** When the load goes off, as a share of the rated duration. */
  offShare: fc.double({ min: 0.01, max: 0.99, noNaN: true }),
  /** Fall per cell over the rated duration while loaded, volts (above the cut-off or through it). */
  fallPerCell: fc.double({ min: 0, max: 0.6, noNaN: true }),
  /** Recovery per cell when the load goes off, volts (a pack on open circuit rises by tens of mV or more). */
  recoveryPerCell: fc.double({ min: 0.02, max: 0.2, noNaN: true }),
  /** Logger noise, volts per cell (a few mV). */
  noisePerCell: fc.double({ min: 0, max: 0.002, noNaN: true }),
  withCurrent: fc.boolean(),
  /** How far past the rated duration the log runs, as a share of it. */
  tailShare: fc.double({ min: 0, max: 0.5, noNaN: true }),
  seed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
})

describe('discharge: the load going off before the rated duration is never a pass (property)', () => {
  test('current to zero, or the voltage recovering, before the rated duration → pass is false or null', () => {
    fc.assert(
      fc.property(scenario, (s) => {
        const chem = getChemistry(s.chemistry)
        const rated = s.ratedH * H
        const off = s.offShare * rated
        const end = rated * (1 + s.tailShare) + s.every
        const n = Math.min(200_000, Math.floor(end / s.every) + 1)
        const random = seededRandom(s.seed)
        const start = s.cells * chem.nominalCellVoltage.value * 1.04
        const loaded = (time: number) => start - (s.cells * s.fallPerCell * time) / rated
        const t = new Float64Array(n)
        const v = new Float64Array(n)
        const i = s.withCurrent ? new Float64Array(n) : undefined
        for (let k = 0; k < n; k++) {
          t[k] = k * s.every
          const isOff = t[k] > off
          v[k] = (isOff ? loaded(off) + s.cells * s.recoveryPerCell : loaded(t[k])) + s.cells * s.noisePerCell * (random() - 0.5)
          if (i) i[k] = isOff ? 0.005 * (random() - 0.5) : 0.5 + 0.01 * (random() - 0.5)
        }
        const outcome = analyseDischarge({ t, v, i }, { chemistry: s.chemistry, cellsInSeries: s.cells, ratedDuration: rated })
        expect(outcome.ok).toBe(true)
        if (outcome.ok) expect(outcome.result.pass).not.toBe(true)
      }),
      { numRuns: 400, seed: 18 },
    )
  }, 120_000)
})
