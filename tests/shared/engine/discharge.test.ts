import { describe, expect, it } from 'vitest'
import { analyseDischarge, dischargeTool, type DischargeOptions } from '../../../shared/engine/discharge'
import { runTool } from '../../../shared/engine/tool'

/** Samples every `step` seconds from 0 to `end` inclusive. */
function log(end: number, step: number, volts: (t: number) => number, amps?: (t: number) => number) {
  const n = Math.floor(end / step) + 1
  const t = new Float64Array(n)
  const v = new Float64Array(n)
  const i = amps ? new Float64Array(n) : undefined
  for (let k = 0; k < n; k++) {
    t[k] = k * step
    v[k] = volts(t[k])
    if (i && amps) i[k] = amps(t[k])
  }
  return { t, v, i }
}

function ok(samples: Parameters<typeof analyseDischarge>[0], options: DischargeOptions) {
  const outcome = analyseDischarge(samples, options)
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  return outcome.result
}

const H = 3600
const nicd5 = { chemistry: 'nicd', cellsInSeries: 5, ratedDuration: 3 * H } as const

describe('discharge: synthetic logs with known answers', () => {
  it('constant 0.5 A for exactly 3 h delivers exactly 1.5 Ah and, at a steady 6 V, 9 Wh', () => {
    const r = ok(
      log(
        3 * H,
        10,
        () => 6,
        () => 0.5,
      ),
      nicd5,
    )
    expect(r.deliveredAh).toBeCloseTo(1.5, 12)
    expect(r.deliveredWh).toBeCloseTo(9, 12)
    expect(r.estimated).toBe(false)
    expect(r.runtimeEnd).toBe('end-of-log')
    expect(r.cutoffTimeH).toBeNull()
    expect(r.dropoutTimeH).toBeNull()
    expect(r.runtimeH).toBe(3)
    expect(r.pass).toBe(true)
    expect(r.warnings.map((w) => w.code)).toContain('cutoff-not-reached')
  })

  it('a linear ramp 7.0 → 4.5 V over 4 h crosses the 5 × 1.0 V cut-off at exactly 3.2 h (algebra: (7 − 5)/(2.5/4))', () => {
    // Samples every 7 s, so the crossing falls between samples and is interpolated.
    const r = ok(
      log(
        4 * H,
        7,
        (t) => 7 - (2.5 * t) / (4 * H),
        () => 1,
      ),
      { ...nicd5, ratedCapacity: 4 * H, thresholdsPerCell: [1.1, 0.8] },
    )
    expect(r.cutoffVoltageV).toBe(5)
    expect(r.cutoffTimeH).toBeCloseTo(3.2, 9)
    expect(r.runtimeH).toBeCloseTo(3.2, 9)
    expect(r.runtimeEnd).toBe('cutoff')
    // 1 A for 3.2 h; energy ∫(7 − 0.625 t) dt over 0..3.2 h = 22.4 − 3.2 = 19.2 Wh.
    expect(r.deliveredAh).toBeCloseTo(3.2, 9)
    expect(r.deliveredWh).toBeCloseTo(19.2, 9)
    expect(r.midpointVoltageV).toBeCloseTo(6, 9) // at 1.6 h
    expect(r.pass).toBe(true)
    expect(r.marginH).toBeCloseTo(0.2, 9)
    expect(r.stateOfHealth).toBeCloseTo(0.8, 9)
    // 1.1 V per cell = 5.5 V, reached at (7 − 5.5)/0.625 = 2.4 h; 0.8 V per cell never.
    expect(r.thresholdCrossings).toEqual([
      { perCellV: 1.1, packV: 5.5, timeH: expect.closeTo(2.4, 9) },
      { perCellV: 0.8, packV: 4, timeH: null },
    ])
    expect(r.warnings.map((w) => w.code)).toContain('default-cutoff')
  })

  it('a load that drops out (voltage falls, then recovers sharply) is found without a current log', () => {
    // 10 NiCd cells, 13 V falling 1 V/h to 10.5 V at 2.5 h (above the 10 V cut-off), then recovering to 12 V.
    const r = ok(
      log(3 * H, 10, (t) => (t <= 2.5 * H ? 13 - t / H : 12)),
      { chemistry: 'nicd', cellsInSeries: 10, ratedDuration: 3 * H, assumedPower: 6 },
    )
    expect(r.dropoutTimeH).toBeCloseTo(2.5, 12)
    expect(r.cutoffTimeH).toBeNull()
    expect(r.runtimeEnd).toBe('dropout')
    expect(r.runtimeH).toBeCloseTo(2.5, 12)
    expect(r.pass).toBe(false)
    expect(r.marginH).toBeCloseTo(-0.5, 12)
    // Constant 6 W: Q = ∫ P/v dt = (P/b)·ln(a/(a − bT)) = 6·ln(13/10.5) Ah; E = 6 W × 2.5 h.
    expect(r.estimated).toBe(true)
    expect(r.deliveredAh).toBeCloseTo(6 * Math.log(13 / 10.5), 6)
    expect(r.deliveredWh).toBeCloseTo(15, 9)
    const codes = r.warnings.map((w) => w.code)
    expect(codes[0]).toBe('duration-not-met')
    expect(codes).toContain('estimated-delivery')
    expect(codes).toContain('dropout-before-cutoff')
  })

  it('a current log times the dropout at the last sample that still shows the load on (the log cannot show more)', () => {
    const r = ok(
      log(
        2 * H,
        10,
        (t) => (t <= H ? 6.5 - t / H : 6.2),
        (t) => (t <= H ? 1 : 0),
      ),
      { ...nicd5, ratedDuration: H },
    )
    expect(r.dropoutTimeH! * H).toBeCloseTo(3600, 9)
    expect(r.deliveredAh).toBeCloseTo(1, 12)
    expect(r.pass).toBe(true)
  })

  it('assumed resistance: i = v/R', () => {
    const r = ok(
      log(H, 1, () => 6),
      { ...nicd5, ratedDuration: H, assumedResistance: 12 },
    )
    expect(r.deliveredAh).toBeCloseTo(0.5, 12)
    expect(r.deliveredWh).toBeCloseTo(3, 12)
  })

  it('without current or an assumption there are no Ah/Wh figures, and a short log is inconclusive', () => {
    const r = ok(
      log(H, 10, () => 6.2),
      { ...nicd5, ratedCapacity: 7200 },
    )
    expect(r.deliveredAh).toBeNull()
    expect(r.deliveredWh).toBeNull()
    expect(r.stateOfHealth).toBeNull()
    expect(r.pass).toBeNull()
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['log-ended-early', 'no-current']))
  })

  it('a log that starts below the cut-off is flagged', () => {
    const r = ok(
      log(H, 10, () => 4.8),
      nicd5,
    )
    expect(r.cutoffTimeH).toBe(0)
    expect(r.pass).toBe(false)
    expect(r.warnings.filter((w) => w.severity === 'critical').map((w) => w.code)).toEqual(['duration-not-met', 'starts-below-cutoff'])
  })

  it('uses the chemistry’s own cut-off, or the one given, and warns below the safe voltage', () => {
    const lead = ok(
      log(H, 10, () => 12.5),
      { chemistry: 'lead-acid', cellsInSeries: 6, ratedDuration: H },
    )
    expect(lead.cutoffVoltageV).toBeCloseTo(6 * 1.75, 12)
    const deep = ok(
      log(H, 10, () => 6),
      { ...nicd5, cutoffPerCell: 0.8 },
    )
    expect(deep.cutoffVoltageV).toBe(4)
    expect(deep.warnings.map((w) => w.code)).toContain('cutoff-below-safe')
  })

  it('handles a million samples in one go', () => {
    const big = log(
      999_999,
      1,
      (t) => 6.5 - t / 1e6,
      () => 0.36,
    )
    expect(big.t.length).toBe(1_000_000)
    const r = ok(big, { ...nicd5, ratedDuration: 999_999 })
    expect(r.deliveredAh).toBeCloseTo((0.36 * 999_999) / 3600, 9)
    expect(r.samplesUsed).toBe(1_000_000)
    // A time limit for a loaded machine, not a speed target (that is in npm run bench).
  }, 60_000)
})

describe('discharge: sample issues are reported, not silently used', () => {
  it('duplicates and out-of-order samples are excluded and listed; gaps over 5 × the median interval are listed', () => {
    const t = new Float64Array([0, 10, 20, 20, 30, 25, 40, 50, 60, 200, 210, 220])
    // The excluded samples carry absurd voltages: if they were used, the cut-off would be crossed.
    const v = new Float64Array([6, 6, 6, 0.1, 6, 0.1, 6, 6, 6, 6, 6, 6])
    const r = ok({ t, v }, { ...nicd5, ratedDuration: 100 })
    expect(r.sampleIssues.duplicates).toEqual({ count: 1, items: [{ index: 3, t: 20 }] })
    expect(r.sampleIssues.outOfOrder).toEqual({ count: 1, items: [{ index: 5, t: 25, afterT: 30 }] })
    expect(r.sampleIssues.gaps).toEqual({ count: 1, items: [{ index: 9, fromT: 60, toT: 200, seconds: 140 }] })
    expect(r.samplesUsed).toBe(10)
    expect(r.cutoffTimeH).toBeNull()
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['samples-excluded', 'gaps']))
  })

  it('typed-array input: empty, mismatched lengths and NaN are field errors naming the sample', () => {
    const bad = (samples: Parameters<typeof analyseDischarge>[0], options: DischargeOptions = nicd5) => {
      const o = analyseDischarge(samples, options)
      if (o.ok) throw new Error('expected field errors')
      return o.fields
    }
    expect(bad({ t: new Float64Array(0), v: new Float64Array(0) })[0]).toEqual({ path: 'samples', message: expect.stringContaining('empty') })
    expect(bad({ t: new Float64Array(3), v: new Float64Array(2) })[0].path).toBe('samples.v')
    expect(bad({ t: new Float64Array(2), v: new Float64Array(2), i: new Float64Array(1) })[0].path).toBe('samples.i')
    expect(bad({ t: new Float64Array([0, 1, 2]), v: new Float64Array([6, NaN, 6]) })).toEqual([{ path: 'samples[1].v', message: 'must be a finite number' }])
    expect(bad({ t: new Float64Array([0, Infinity]), v: new Float64Array([6, 6]) })[0].path).toBe('samples[1].t')
    expect(bad({ t: new Float64Array([0, 1]), v: new Float64Array([6, 6]), i: new Float64Array([1, NaN]) })[0].path).toBe('samples[1].i')
    expect(bad({ t: new Float64Array([5, 5]), v: new Float64Array([6, 6]) })[0].message).toContain('two samples at different times')
    expect(bad({ t: new Float64Array([0, 1]), v: new Float64Array([6, 6]) }, { ...nicd5, cellsInSeries: 0 })[0].path).toBe('cellsInSeries')
    expect(bad({ t: new Float64Array([0, 1]), v: new Float64Array([6, 6]) }, { ...nicd5, ratedDuration: 0 })[0].path).toBe('ratedDuration')
  })
})

describe('discharge tool (JSON input)', () => {
  const samples = Array.from({ length: 361 }, (_, k) => ({ t: k * 10, v: 6.4 - k / 360, i: 0.9 }))
  const base = { samples, chemistry: 'nicd', cellsInSeries: 5, ratedDuration: '1 h', ratedCapacity: '1.2 Ah' }

  it('reads units and gives the same answer as the typed-array function', () => {
    const outcome = runTool(dischargeTool, base)
    if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
    expect(outcome.result.deliveredAh).toBeCloseTo(0.9, 12)
    expect(outcome.result.stateOfHealth).toBeCloseTo(0.75, 12)
    expect(outcome.result.pass).toBe(true)
    expect(outcome.result.working.map((w) => w.id)).toEqual([
      'cutoffVoltage',
      'runtime',
      'loadEvidence',
      'margin',
      'deliveredAh',
      'deliveredWh',
      'stateOfHealth',
    ])
  })

  it('time running backwards is a reported issue, not a field error', () => {
    const shuffled = [...samples.slice(0, 5), samples[2], ...samples.slice(5)]
    const outcome = runTool(dischargeTool, { ...base, samples: shuffled })
    expect(outcome.ok && outcome.result.sampleIssues.outOfOrder.count).toBe(1)
  })

  it('field errors: empty samples, NaN, a current on some samples only, two assumptions, bad chemistry', () => {
    const fields = (input: Record<string, unknown>) => {
      const o = runTool(dischargeTool, input)
      if (o.ok) throw new Error('expected field errors')
      return o.fields
    }
    expect(fields({ ...base, samples: [] })[0]).toEqual({ path: 'samples', message: 'needs at least two samples' })
    expect(
      fields({
        ...base,
        samples: [
          { t: 0, v: 6 },
          { t: 1, v: Number.NaN },
        ],
      })[0].path,
    ).toBe('samples.1.v')
    expect(
      fields({
        ...base,
        samples: [
          { t: 0, v: 6, i: 1 },
          { t: 1, v: 6 },
        ],
      })[0],
    ).toEqual({ path: 'samples.1.i', message: 'give the current on every sample or on none' })
    expect(fields({ ...base, assumedPower: '4 W', assumedResistance: 10 })[0].path).toBe('assumedResistance')
    expect(fields({ ...base, chemistry: 'unobtainium' })[0].path).toBe('chemistry')
    expect(fields({ ...base, ratedDuration: '3 V' })[0].path).toBe('ratedDuration')
  })

  it('an assumption given alongside a logged current is noted as unused', () => {
    const outcome = runTool(dischargeTool, { ...base, assumedPower: 5 })
    expect(outcome.ok && outcome.result.warnings.some((w) => w.code === 'assumption-unused')).toBe(true)
  })
})
