/**
 * The decisions around the arithmetic of a discharge log: when the load went off, when a dip below
 * the cut-off is the end and when it is noise, and when the log cannot tell. Logs are synthetic with
 * answers fixed by construction. The pass rule is the full rated-duration test of EN 50172 / BS 5266-1
 * (the luminaire must stay lit for its rated duration); the thresholds (30 s hold, 10 mV per cell
 * recovery, 1 % of nominal fall) are common practice, stated in docs/method.md.
 */
import { describe, expect, it } from 'vitest'
import { analyseDischarge, dischargeTool, type DischargeOptions } from '../../../shared/engine/discharge'
import { runTool } from '../../../shared/engine/tool'

const H = 3600

function log(end: number, step: number, volts: (t: number, k: number) => number, amps?: (t: number, k: number) => number) {
  const n = Math.floor(end / step) + 1
  const t = new Float64Array(n)
  const v = new Float64Array(n)
  const i = amps ? new Float64Array(n) : undefined
  for (let k = 0; k < n; k++) {
    t[k] = k * step
    v[k] = volts(t[k], k)
    if (i && amps) i[k] = amps(t[k], k)
  }
  return { t, v, i }
}

function ok(samples: Parameters<typeof analyseDischarge>[0], options: DischargeOptions) {
  const outcome = analyseDischarge(samples, options)
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  return outcome.result
}

const codes = (r: { warnings: Array<{ code: string }> }) => r.warnings.map((w) => w.code)
const nicd5 = { chemistry: 'nicd', cellsInSeries: 5, ratedDuration: 3 * H } as const
/** A flat NiCd plateau: 5 cells from 6.25 V losing 0.1 V/h, well above the 5.0 V cut-off for 3.5 h. */
const plateau = (t: number) => 6.25 - (0.1 * t) / H

describe('drop-out recognised from the voltage alone (common practice: recovery without load)', () => {
  it('a flat NiCd curve that steps up 50 mV per cell at 1.5 h and stays flat fails at 1.5 h', () => {
    const atDrop = plateau(1.5 * H)
    const r = ok(
      log(3.5 * H, 30, (t) => (t <= 1.5 * H ? plateau(t) : atDrop + 0.25)),
      nicd5,
    )
    expect(r.pass).toBe(false)
    expect(r.runtimeEnd).toBe('dropout')
    expect(r.endRule).toBe('voltage-recovery')
    expect(r.dropoutTimeH).toBeCloseTo(1.5, 9)
    expect(r.runtimeH).toBeCloseTo(1.5, 9)
    expect(codes(r)).toContain('duration-not-met')
    expect(r.working.find((w) => w.id === 'runtime')?.explanation).toContain('stepped up and stayed up')
  })

  it('the same step after the rated duration (mains restored at the end of the test) is a pass', () => {
    const atEnd = plateau(3 * H)
    const r = ok(
      log(3.5 * H, 30, (t) => (t <= 3 * H ? plateau(t) : atEnd + 0.4)),
      nicd5,
    )
    expect(r.pass).toBe(true)
    expect(r.dropoutTimeH).toBeCloseTo(3, 9)
    expect(r.loadEvidence).toBe('voltage-fall')
  })

  it('a voltage that never falls cannot show the load was on: not passed, and said so', () => {
    const r = ok(
      log(3.5 * H, 30, () => 6.3),
      nicd5,
    )
    expect(r.pass).toBeNull()
    expect(r.loadEvidence).toBe('none')
    expect(codes(r)).toContain('load-not-evident')
    expect(r.verdictReason).toMatch(/cannot show/)
  })

  it('a rise that falls back after the settling time is an interruption: not passed', () => {
    // Off for 20 min at 1 h (recovers 60 mV per cell), then the load comes back and the plateau resumes.
    const r = ok(
      log(3.5 * H, 30, (t) => (t > H && t < 1.33 * H ? plateau(t) + 0.3 : plateau(t))),
      nicd5,
    )
    expect(r.pass).toBeNull()
    expect(r.interruptionTimeH).toBeCloseTo(1, 1)
    expect(codes(r)).toContain('load-interrupted')
  })

  it('a lead-acid pack that dips and recovers in its first minutes (settling under load) still passes', () => {
    // 6 cells, 12.6 V dipping 0.12 V for the first 3 min, then falling 0.2 V/h: settling, not a drop-out.
    const volts = (t: number) => (t < 180 ? 12.48 : 12.6 - (0.2 * t) / H)
    const r = ok(log(3.2 * H, 20, volts), { chemistry: 'lead-acid', cellsInSeries: 6, ratedDuration: 3 * H })
    expect(r.pass).toBe(true)
    expect(r.interruptionTimeH).toBeNull()
  })

  it('a noisy voltage-only log cannot show a drop-out and is not passed', () => {
    let seed = 7
    const noise = () => ((seed = (seed * 16807) % 2147483647) / 2147483647 - 0.5) * 0.6
    const r = ok(
      log(3.5 * H, 30, (t) => plateau(t) + noise()),
      nicd5,
    )
    expect(r.pass).toBeNull()
    expect(codes(r)).toContain('voltage-too-noisy')
  })
})

describe('glitch rule: the voltage must stay below the cut-off for 30 s (common practice)', () => {
  const glitchAt = 1800 // one sample at 0.5 h falls to 4.6 V, below the 5.0 V cut-off
  const volts = (t: number) => (t === glitchAt ? 4.6 : plateau(t))

  it('a single sample below the cut-off with the current still flowing is noise', () => {
    const r = ok(
      log(3.5 * H, 10, volts, () => 0.5),
      nicd5,
    )
    expect(r.pass).toBe(true)
    expect(r.cutoffTimeH).toBeNull()
    expect(r.cutoffGlitches.count).toBe(1)
    expect(r.cutoffGlitches.items[0].fromS).toBeGreaterThan(glitchAt - 10)
    expect(codes(r)).toContain('cutoff-glitch-ignored')
    expect(r.working.find((w) => w.id === 'runtime')?.explanation).toContain('ignored')
  })

  it('the same single sample without a current log is noise too', () => {
    const r = ok(log(3.5 * H, 10, volts), nicd5)
    expect(r.pass).toBe(true)
    expect(r.cutoffGlitches.count).toBe(1)
    expect(r.loadEvidence).toBe('voltage-fall')
  })

  it('a dip that lasts the hold time is the cut-off', () => {
    const r = ok(
      log(
        3.5 * H,
        10,
        (t) => (t >= glitchAt && t <= glitchAt + 40 ? 4.6 : plateau(t)),
        () => 0.5,
      ),
      nicd5,
    )
    expect(r.pass).toBe(false)
    expect(r.endRule).toBe('cutoff-held')
    expect(r.cutoffTimeH).toBeCloseTo((glitchAt - 10 + (10 * (6.2 - 5)) / (6.2 - 4.6)) / H, 3)
  })

  it('a short dip that ends with the current stopping is the cut-off (the luminaire’s own protection acted)', () => {
    const r = ok(
      log(
        3.5 * H,
        10,
        (t) => (t === glitchAt ? 4.6 : t > glitchAt ? 6.3 : plateau(t)),
        (t) => (t <= glitchAt ? 0.5 : 0),
      ),
      nicd5,
    )
    expect(r.pass).toBe(false)
    expect(r.runtimeEnd).toBe('cutoff')
    expect(r.endRule).toBe('cutoff-then-dropout')
    expect(r.runtimeH).toBeLessThan(0.5)
  })
})

describe('current logs', () => {
  it('the load off for good after 1 h of a 3.5 h log fails at 1 h (the typical current is not dragged to zero)', () => {
    const r = ok(
      log(3.5 * H, 10, plateau, (t) => (t <= H ? 0.5 : 0)),
      nicd5,
    )
    expect(r.pass).toBe(false)
    expect(r.endRule).toBe('current-dropout')
    expect(r.dropoutTimeH).toBeCloseTo(1, 2)
  })

  it('the current off for 2 min and back is an interruption: not passed', () => {
    const r = ok(
      log(3.5 * H, 10, plateau, (t) => (t > H && t < H + 120 ? 0 : 0.5)),
      nicd5,
    )
    expect(r.pass).toBeNull()
    expect(codes(r)).toContain('load-interrupted')
  })

  it('a log written with discharge negative is turned round and still passes', () => {
    const r = ok(
      log(3.5 * H, 10, plateau, () => -0.5),
      nicd5,
    )
    expect(r.pass).toBe(true)
    expect(r.deliveredAh).toBeCloseTo(1.75, 9)
    expect(codes(r)).toContain('current-sign-flipped')
  })

  it('a current column of zeros does not show the load: not passed', () => {
    const r = ok(
      log(3.5 * H, 10, plateau, () => 0),
      nicd5,
    )
    expect(r.pass).toBeNull()
    expect(codes(r)).toContain('current-never-on')
  })
})

describe('a log that never reaches the cut-off', () => {
  it('runs to the end of the log and passes when that is past the rated duration with the current on', () => {
    const r = ok(
      log(3.25 * H, 10, plateau, () => 0.5),
      nicd5,
    )
    expect(r.runtimeEnd).toBe('end-of-log')
    expect(r.endRule).toBe('end-of-log')
    expect(r.runtimeH).toBeCloseTo(3.25, 9)
    expect(r.pass).toBe(true)
    expect(codes(r)).toContain('cutoff-not-reached')
  })

  it('neither passes nor fails when the log stops before the rated duration', () => {
    const r = ok(
      log(2 * H, 10, plateau, () => 0.5),
      nicd5,
    )
    expect(r.pass).toBeNull()
    expect(codes(r)).toContain('log-ended-early')
  })

  it('passes when the test ends at the rated duration with the charger taking over (current turns negative)', () => {
    const r = ok(
      log(
        3.5 * H,
        10,
        (t) => (t <= 3 * H ? plateau(t) : 6.9),
        (t) => (t <= 3 * H ? 0.5 : -0.16),
      ),
      nicd5,
    )
    expect(r.pass).toBe(true)
    expect(r.dropoutTimeH).toBeCloseTo(3, 2)
  })
})

describe('lead-acid end voltage: the makers’ rate table, one rule (VRLA maker’s application manual, published)', () => {
  it('at 0.6 C with current and capacity known the cut-off is 1.55 V per cell, with no deep-discharge warning', () => {
    const r = ok(
      log(
        2 * H,
        10,
        (t) => 12.4 - (1.5 * t) / H,
        () => 0.6 * 7,
      ),
      { chemistry: 'lead-acid', cellsInSeries: 6, ratedDuration: H, ratedCapacity: 7 * H },
    )
    expect(r.cutoffVoltageV).toBeCloseTo(6 * 1.55, 12)
    expect(codes(r)).not.toContain('cutoff-below-safe')
  })

  it('without a known rate it keeps the demanding 1.75 V per cell', () => {
    const r = ok(
      log(2 * H, 10, (t) => 12.4 - (1.5 * t) / H),
      { chemistry: 'lead-acid', cellsInSeries: 6, ratedDuration: H },
    )
    expect(r.cutoffVoltageV).toBeCloseTo(6 * 1.75, 12)
  })

  it('a given 1.6 V per cell at 0.1 C is below the table’s 1.75 V and warned about', () => {
    const r = ok(
      log(
        2 * H,
        10,
        (t) => 12.4 - (0.5 * t) / H,
        () => 0.7,
      ),
      { chemistry: 'lead-acid', cellsInSeries: 6, ratedDuration: H, ratedCapacity: 7 * H, cutoffPerCell: 1.6 },
    )
    expect(codes(r)).toContain('cutoff-below-safe')
  })
})

describe('the tool refuses a bare-number rated duration', () => {
  const samples = Array.from({ length: 20 }, (_, k) => ({ t: k * 600, v: 6.3 - k * 0.01, i: 0.5 }))
  it('ratedDuration: 3 is a field error naming the field, not 3 seconds', () => {
    const o = runTool(dischargeTool, { samples, chemistry: 'nicd', cellsInSeries: 5, ratedDuration: 3 })
    expect(o.ok).toBe(false)
    if (!o.ok) expect(o.fields).toEqual([{ path: 'ratedDuration', message: expect.stringContaining('needs a unit') }])
  })
})
