import { describe, expect, it, test } from 'vitest'
import fc from 'fast-check'
import { unit, type Unit } from 'mathjs'
import {
  DIODE_FORWARD_VOLTAGE,
  chargeCurrent,
  fitChargerThevenin,
  planRetrofit,
  rechargeTimeHours,
  retrofitInput,
  retrofitTool,
  runtimeChangePctFor,
  type RetrofitResult,
} from '../../../shared/engine/retrofit'
import { E12, E24, STANDARD_RESISTOR_RATINGS_W, nearestPreferred, preferredValuesBetween, resistorRatingFor } from '../../../shared/engine/resistor-series'
import { runTool } from '../../../shared/engine/tool'
import { tools } from '../../../shared/engine/registry'
import { getChemistry } from '../../../shared/engine/chemistries'

// An invented charger: 12 V open-circuit behind 40 Ω, feeding 3 NiCd cells that sit at 4.35 V when full.
const VOC = 12
const RINT = 40
const VB = 4.35
const I1 = (VOC - VB) / RINT // 191.25 mA
const RT = 10
const I2 = (VOC - VB) / (RINT + RT) // 153 mA

const base = {
  chemistry: 'nicd',
  cellsInSeries: 3,
  capacity: '4 Ah',
  trickleCurrent: I1,
  batteryVoltage: VB,
  secondReading: { kind: 'test-resistor', resistance: RT, current: I2 },
  targetTrickleRateC: 1 / 30,
  diodeType: 'schottky',
  dischargeCurrent: '1 A',
  duration: '3 h',
}

function run(overrides: Record<string, unknown> = {}): RetrofitResult {
  const outcome = runTool(retrofitTool, { ...base, ...overrides })
  if (!outcome.ok) throw new Error(`unexpected field errors: ${JSON.stringify(outcome.fields)}`)
  return outcome.result
}

function errors(overrides: Record<string, unknown>, remove: string[] = []) {
  const raw: Record<string, unknown> = { ...base, ...overrides }
  for (const k of remove) delete raw[k]
  const outcome = runTool(retrofitTool, raw)
  if (outcome.ok) throw new Error('expected field errors')
  return outcome.fields
}

const codes = (r: RetrofitResult) => r.warnings.map((w) => w.code)

describe('charger as a Thévenin source (worked case: readings generated from a known charger)', () => {
  it('recovers R_int and V_oc within 1 % from a test-resistor reading', () => {
    const r = run()
    expect(Math.abs(r.chargerInternalResistanceOhm / RINT - 1)).toBeLessThan(0.01)
    expect(Math.abs(r.chargerOpenCircuitV / VOC - 1)).toBeLessThan(0.01)
  })

  it('recovers R_int within 1 % from the open-circuit voltage, with readings rounded as a meter shows them', () => {
    const r = run({ trickleCurrent: '191 mA', batteryVoltage: '4.35 V', secondReading: { kind: 'open-circuit', voltage: '12.0 V' } })
    expect(Math.abs(r.chargerInternalResistanceOhm / RINT - 1)).toBeLessThan(0.01)
    expect(r.chargerOpenCircuitV).toBe(12)
  })

  it('recovers R_int within 1 % from rounded test-resistor readings', () => {
    const r = run({ trickleCurrent: '191.3 mA', secondReading: { kind: 'test-resistor', resistance: '10 ohm', current: '153.0 mA' } })
    expect(Math.abs(r.chargerInternalResistanceOhm / RINT - 1)).toBeLessThan(0.01)
  })

  it('fitChargerThevenin reports non-physical readings with a field path', () => {
    expect(fitChargerThevenin(0.2, 4, { kind: 'test-resistor', resistance: 10, current: 0.2 })).toMatchObject({ ok: false, path: ['secondReading', 'current'] })
    expect(fitChargerThevenin(0.2, 4, { kind: 'open-circuit', voltage: 4 })).toMatchObject({ ok: false, path: ['secondReading', 'voltage'] })
  })
})

describe("Ohm's and Joule's laws (checked with mathjs units as the reference library)", () => {
  it('series resistance, new current and dissipation', () => {
    const r = run()
    const target = 4 / 30 // A: C/30 of 4 Ah
    expect(r.targetCurrentA).toBeCloseTo(target, 12)
    // R_s = (V_oc − V_b)/I − R_int, with mathjs doing the unit arithmetic
    const exact = (unit(VOC - VB, 'V').divide(unit(target, 'A')) as Unit).toNumber('ohm') - RINT
    expect(r.seriesResistanceOhm).toBeCloseTo(exact, 9)
    expect(r.e24?.ohm).toBe(18)
    expect(r.e12?.ohm).toBe(18)
    // I = V/R through the E24 resistor
    const current = (unit(VOC - VB, 'V').divide(unit(RINT + 18, 'ohm')) as Unit).toNumber('A')
    expect(r.e24?.currentA).toBeCloseTo(current, 12)
    expect(r.newTrickleCRate).toBeCloseTo(current / 4, 12)
    // P = I²R, worst case at the start of a recharge (pack at 3 × 1.0 V)
    const startCurrent = unit(VOC - 3, 'V').divide(unit(RINT + 18, 'ohm')) as Unit
    const dissipation = startCurrent.multiply(startCurrent).multiply(unit(18, 'ohm')).toNumber('W')
    expect(r.resistorDissipationW).toBeCloseTo(dissipation, 12)
    expect(r.e24?.dissipationAtTrickleW).toBeCloseTo(unit(current, 'A').multiply(unit(current, 'A')).multiply(unit(18, 'ohm')).toNumber('W'), 12)
    // ×2 margin, next stocked rating (common practice): 0.433 W × 2 → 1 W
    expect(r.resistorRatingW).toBe(1)
  })

  it('chargeCurrent never goes negative', () => {
    expect(chargeCurrent(5, 6, 10)).toBe(0)
    expect(chargeCurrent(6, 5, 10)).toBeCloseTo(0.1, 12)
  })
})

describe('IEC 60063 preferred values', () => {
  it('E12 is the full IEC 60063 list', () => {
    expect(preferredValuesBetween(10, 99, 'E12')).toEqual([10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82])
    expect(E12).toHaveLength(12)
  })

  it('E24 is the full IEC 60063 list', () => {
    expect(preferredValuesBetween(100, 999, 'E24')).toEqual([
      100, 110, 120, 130, 150, 160, 180, 200, 220, 240, 270, 300, 330, 360, 390, 430, 470, 510, 560, 620, 680, 750, 820, 910,
    ])
    expect(E24).toHaveLength(24)
  })

  it('every E12 value is in E24, and each value lies within 5 % of the geometric step 10^(k/n)', () => {
    for (const v of E12) expect(E24).toContain(v)
    E24.forEach((v, k) => expect(Math.abs(v / 10 ** (k / 24) - 1)).toBeLessThan(0.05))
    E12.forEach((v, k) => expect(Math.abs(v / 10 ** (k / 12) - 1)).toBeLessThan(0.05))
  })

  test.each([
    [17.4, 'E24', 18],
    [17.4, 'E12', 18],
    [4.5, 'E24', 4.7],
    [4.5, 'E12', 4.7],
    [96, 'E24', 100], // across the decade edge
    [9.6, 'E12', 10],
    [1234, 'E24', 1200],
    [0.52, 'E12', 0.56],
    [3.14, 'E24', 3.0],
  ] as const)('nearest to %s in %s is %s', (ohms, series, expected) => {
    expect(nearestPreferred(ohms, series)).toBe(expected)
  })

  it('a preferred value maps to itself in every decade', () => {
    for (const d of [-1, 0, 1, 2, 3, 4, 5]) {
      for (const v of E24) {
        const ohms = Number((v * 10 ** d).toPrecision(6))
        expect(nearestPreferred(ohms, 'E24')).toBe(ohms)
      }
    }
  })

  it('rejects non-positive resistances', () => {
    expect(() => nearestPreferred(0, 'E12')).toThrow(RangeError)
    expect(() => nearestPreferred(Number.POSITIVE_INFINITY, 'E12')).toThrow(RangeError)
  })

  it('stocked power ratings with a ×2 margin (common practice)', () => {
    expect(STANDARD_RESISTOR_RATINGS_W).toEqual([0.25, 0.5, 1, 2, 3, 5])
    expect(resistorRatingFor(0.1)).toBe(0.25)
    expect(resistorRatingFor(0.2)).toBe(0.5)
    expect(resistorRatingFor(1.2)).toBe(3)
    expect(resistorRatingFor(3)).toBeNull()
    expect(resistorRatingFor(3, 1)).toBe(3)
  })
})

describe('recharge after a full rated-duration discharge (24 h requirement, IEC 60598-2-22, from memory)', () => {
  // Closed form of the same linear model: t = k·C·R/ΔV · ln((V_oc − V₀)/(V_oc − V_full)).
  const closedForm = (R: number, q0: number) => {
    const dV = VB - 3
    const v0 = 3 + dV * q0
    return ((1.4 * 4 * R) / dV) * Math.log((VOC - v0) / (VOC - VB))
  }

  it('the fixed-step integration agrees with the closed form within 0.1 %', () => {
    const r = run()
    const q0 = 1 - 3 / 4 // 1 A for 3 h from 4 Ah
    expect(Math.abs(r.rechargeTimeBeforeH / closedForm(RINT, q0) - 1)).toBeLessThan(1e-3)
    expect(Math.abs(r.rechargeTimeAfterH / closedForm(RINT + 18, q0) - 1)).toBeLessThan(1e-3)
    expect(Math.abs((r.e12?.rechargeTimeH ?? 0) / closedForm(RINT + 18, q0) - 1)).toBeLessThan(1e-3)
  })

  it('uses the chemistry charge factor and is longer than charge ÷ starting current', () => {
    const h = rechargeTimeHours({
      openCircuitV: VOC,
      totalResistanceOhm: RINT,
      packFullV: VB,
      packEmptyV: 3,
      capacityAh: 4,
      dischargedAh: 3,
      chargeFactor: 1.4,
    })
    const startCurrent = (VOC - (3 + 1.35 * 0.25)) / RINT
    expect(h).toBeGreaterThan((1.4 * 3) / startCurrent)
    expect(getChemistry('nicd').chargeFactor.value).toBe(1.4)
  })

  it('before: within 24 h; after the E24 resistor: over 24 h, flagged as critical', () => {
    const r = run()
    expect(r.rechargeTimeBeforeH).toBeLessThan(24)
    expect(r.rechargeTimeAfterH).toBeGreaterThan(24)
    expect(r.rechargeWithin24h).toBe(false)
    expect(r.warnings.find((w) => w.code === 'recharge-over-24h')?.severity).toBe('critical')
    expect(r.working.find((s) => s.id === 'rechargeTime')?.explanation).toMatch(/falls as the pack voltage rises/)
    // The largest resistance that still meets 24 h, checked against the closed form.
    const rMax = r.maxSeriesResistanceFor24hOhm as number
    expect(rMax).toBeGreaterThan(0)
    expect(rMax).toBeLessThan(18)
    expect(closedForm(RINT + rMax, 0.25)).toBeCloseTo(24, 3)
    expect(r.warnings.find((w) => w.code === 'recharge-over-24h')?.message).toMatch(/below about/)
  })

  it('a gentler plan on a shorter duration passes', () => {
    const r = run({ duration: '1 h', targetTrickleRateC: 0.04 })
    expect(r.rechargeWithin24h).toBe(true)
    expect(codes(r)).not.toContain('recharge-over-24h')
  })

  it('says when the change makes no difference because it already failed', () => {
    const r = run({ dischargeCurrent: '1.3 A' })
    expect(r.rechargeTimeBeforeH).toBeGreaterThan(24)
    expect(r.warnings.find((w) => w.code === 'recharge-over-24h')?.message).toMatch(/already/)
    expect(r.maxSeriesResistanceFor24hOhm).toBeNull()
  })

  it('a discharge larger than the capacity is flagged and worked from empty', () => {
    const r = run({ dischargeCurrent: '2 A' })
    expect(codes(r)).toContain('discharge-exceeds-capacity')
    expect(Math.abs(r.rechargeTimeBeforeH / closedForm(RINT, 0) - 1)).toBeLessThan(1e-3)
  })
})

describe('bypass diode (forward voltages: common practice)', () => {
  it('Schottky ≈ 0.35 V, silicon ≈ 0.7 V', () => {
    expect(DIODE_FORWARD_VOLTAGE).toEqual({ silicon: 0.7, schottky: 0.35 })
  })

  it('load voltage, effective cut-off and runtime change with a Schottky diode', () => {
    const r = run()
    expect(r.diodeForwardV).toBe(0.35)
    expect(r.loadVoltageOnBatteryV).toBeCloseTo(3 * 1.2 - 0.35, 12)
    expect(r.effectiveCutoffCellV).toBeCloseTo((3 * 1.0 + 0.35) / 3, 12)
    expect(r.runtimeChangePct).toBeCloseTo((-100 * 0.35) / (VB - 3), 10)
    expect(r.diodeDissipationW).toBeCloseTo(0.35 * 1, 12)
    expect(codes(r)).toContain('runtime-loss')
  })

  it('a silicon diode costs more runtime than a Schottky one; no diode given means silicon, with a note', () => {
    const silicon = run({ diodeType: undefined })
    expect(silicon.diodeForwardV).toBe(0.7)
    expect(codes(silicon)).toContain('diode-assumed-silicon')
    expect(silicon.runtimeChangePct).toBeLessThan(run().runtimeChangePct)
  })

  it('an explicit forward voltage wins, and a tiny drop is only a warning', () => {
    const r = run({ diodeForwardVoltage: '0.1 V', diodeType: 'silicon' })
    expect(r.diodeForwardV).toBeCloseTo(0.1, 12)
    expect(r.warnings.find((w) => w.code === 'runtime-loss')?.severity).toBe('warning')
  })

  it('runtime loss is capped at 100 %', () => {
    expect(runtimeChangePctFor(2, 4.35, 3)).toBe(-100)
  })
})

describe('trickle rate, indicator and chemistry', () => {
  it('new trickle rate within the NiCd continuous range', () => {
    const r = run({ targetTrickleRateC: 0.04 }) // exact 7.8 Ω → E24 7.5 Ω (nearest by ratio) → 0.0403 C
    expect(r.permittedTrickleRangeC).toEqual(getChemistry('nicd').continuousChargeRangeC.value)
    expect(r.e24?.ohm).toBe(7.5)
    expect(r.trickleWithinLimit).toBe(true)
    expect(r.presentTrickleCRate).toBeCloseTo(I1 / 4, 12)
  })

  it('rounding to the nearest preferred value can land just outside the range, and says so', () => {
    const r = run() // C/30 asked; 18 Ω gives 0.0330 C, just under 1/30 C
    expect(r.newTrickleCRate).toBeLessThan(1 / 30)
    expect(r.trickleWithinLimit).toBe(false)
    expect(codes(r)).toContain('trickle-below-range')
  })

  it('too low a target is flagged below the range', () => {
    const r = run({ targetTrickleCurrent: '60 mA', targetTrickleRateC: undefined })
    expect(r.trickleWithinLimit).toBe(false)
    expect(codes(r)).toContain('trickle-below-range')
  })

  it('a target above the permitted range is flagged above the limit', () => {
    // R_int = (16.35 − 4.35)/0.3 = 40 Ω; 0.06 C of 4 Ah = 240 mA → 10 Ω → 0.06 C > 0.05 C
    const r = run({ targetTrickleRateC: 0.06, trickleCurrent: 0.3, secondReading: { kind: 'open-circuit', voltage: 16.35 } })
    expect(r.e24?.ohm).toBe(10)
    expect(codes(r)).toContain('trickle-above-limit')
  })

  test.each([
    ['150 mA', true],
    ['100 mA', false],
  ])('charge indicator threshold %s → may go out: %s', (threshold, expected) => {
    const r = run({ chargeIndicatorThreshold: threshold })
    expect(r.indicatorMayGoOut).toBe(expected)
    expect(codes(r).includes('indicator-may-go-out')).toBe(expected)
  })

  it('no threshold → unknown', () => {
    expect(run().indicatorMayGoOut).toBeNull()
  })

  it('lithium cells tolerate no trickle: critical', () => {
    const r = run({
      chemistry: 'li-ion',
      cellsInSeries: 1,
      batteryVoltage: 4.2,
      secondReading: { kind: 'open-circuit', voltage: 5 },
      trickleCurrent: 0.05,
      targetTrickleCurrent: 0.02,
      targetTrickleRateC: undefined,
    })
    expect(r.warnings.find((w) => w.code === 'no-trickle-chemistry')?.severity).toBe('critical')
  })

  it('lead-acid is voltage-limited: warned', () => {
    const r = run({
      chemistry: 'lead-acid',
      cellsInSeries: 3,
      batteryVoltage: 6.9,
      secondReading: { kind: 'open-circuit', voltage: 8 },
      trickleCurrent: 0.02,
      targetTrickleCurrent: 0.01,
      targetTrickleRateC: undefined,
    })
    expect(codes(r)).toContain('voltage-limited-chemistry')
  })

  it('a battery voltage far from the chemistry’s full-charge voltage is flagged', () => {
    const r = run({ batteryVoltage: 5.4, secondReading: { kind: 'open-circuit', voltage: 13 } })
    expect(r.warnings.find((w) => w.code === 'battery-voltage-unexpected')?.field).toBe('batteryVoltage')
  })

  it('a resistor that would run too hot is flagged', () => {
    const r = run({ trickleCurrent: 2, secondReading: { kind: 'open-circuit', voltage: 40 }, targetTrickleCurrent: 1, targetTrickleRateC: undefined })
    expect(r.resistorRatingW).toBeNull()
    expect(codes(r)).toContain('resistor-too-hot')
  })
})

describe('plans without a resistor', () => {
  it('reduce off and a target above the present current: a resistor cannot do it', () => {
    const r = run({ reduce: false, targetTrickleCurrent: '250 mA', targetTrickleRateC: undefined })
    expect(r.seriesResistanceOhm).toBeNull()
    expect(r.e12).toBeNull()
    expect(r.e24).toBeNull()
    expect(r.resistorDissipationW).toBeNull()
    expect(r.rechargeTimeAfterH).toBe(r.rechargeTimeBeforeH)
    expect(r.warnings.find((w) => w.code === 'cannot-raise-current')?.field).toBe('targetTrickleCurrent')
  })

  it('a target equal to the present current needs no resistor', () => {
    const r = run({ targetTrickleCurrent: I1, targetTrickleRateC: undefined })
    expect(r.seriesResistanceOhm).toBeNull()
    expect(codes(r)).toContain('no-resistor-needed')
  })
})

describe('cautions', () => {
  it('shows the certification, competent-person, retest and local-code cautions and the chemistry hazards', () => {
    const text = run().cautions.join(' ')
    expect(text).toMatch(/certification/)
    expect(text).toMatch(/warranty/)
    expect(text).toMatch(/competent/)
    expect(text).toMatch(/mains isolated/)
    expect(text).toMatch(/rated-duration test/)
    expect(text).toMatch(/local codes/)
    expect(run().cautions.length).toBeGreaterThan(4)
  })
})

describe('field errors for impossible readings', () => {
  test.each([
    [
      'current with the test resistor above the present current (negative R_int)',
      { secondReading: { kind: 'test-resistor', resistance: 10, current: 0.25 } },
      'secondReading.current',
      /negative internal resistance/,
    ],
    [
      'current unchanged with the test resistor (constant-current charger)',
      { secondReading: { kind: 'test-resistor', resistance: 10, current: I1 } },
      'secondReading.current',
      /constant-current/,
    ],
    [
      'open-circuit voltage below the battery voltage',
      { secondReading: { kind: 'open-circuit', voltage: 4 } },
      'secondReading.voltage',
      /negative internal resistance/,
    ],
    [
      'open-circuit voltage equal to the battery voltage',
      { secondReading: { kind: 'open-circuit', voltage: VB } },
      'secondReading.voltage',
      /zero driving voltage/,
    ],
    ['zero test resistance', { secondReading: { kind: 'test-resistor', resistance: 0, current: 0.1 } }, 'secondReading.resistance', /greater than zero/],
    ['an unknown reading kind', { secondReading: { kind: 'guess', voltage: 9 } }, 'secondReading.kind', /test-resistor/],
    ['target current above the present one', { targetTrickleCurrent: '250 mA', targetTrickleRateC: undefined }, 'targetTrickleCurrent', /only lower/],
    ['target rate above the present one', { targetTrickleRateC: 0.1 }, 'targetTrickleRateC', /only lower/],
    ['both targets', { targetTrickleCurrent: '100 mA' }, 'targetTrickleRateC', /not both/],
    ['battery voltage at or below cut-off', { batteryVoltage: 2.9, secondReading: { kind: 'open-circuit', voltage: 12 } }, 'batteryVoltage', /cut-off/],
    ['an unknown chemistry', { chemistry: 'zinc' }, 'chemistry', /nicd/],
    ['a fractional cell count', { cellsInSeries: 2.5 }, 'cellsInSeries', /whole number/],
    ['a capacity given as a current', { capacity: '4 A' }, 'capacity', /charge/],
    ['a reduce flag that is not a boolean', { reduce: 'yes' }, 'reduce', /true or false/],
    ['an unknown diode type', { diodeType: 'germanium' }, 'diodeType', /schottky/],
  ])('%s', (_name, overrides, path, reason) => {
    const fields = errors(overrides)
    const match = fields.find((f) => f.path === path)
    expect(match, JSON.stringify(fields)).toBeDefined()
    expect(match?.message).toMatch(reason)
  })

  it('no target at all', () => {
    expect(errors({}, ['targetTrickleRateC']).map((f) => f.path)).toEqual(['targetTrickleCurrent'])
  })

  it('a bad field does not cause a spurious cross-check error', () => {
    expect(errors({ trickleCurrent: 'lots' }).map((f) => f.path)).toEqual(['trickleCurrent'])
  })
})

describe('robustness', () => {
  it('never returns NaN or Infinity for valid readings (property test)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 4.5, max: 48, noNaN: true }), // V_oc
        fc.double({ min: 0.5, max: 2000, noNaN: true }), // R_int
        fc.double({ min: 1, max: 200, noNaN: true }), // R_test
        fc.double({ min: 0.05, max: 1, noNaN: true }), // target as a fraction of the present current
        fc.double({ min: 0.5, max: 20, noNaN: true }), // capacity, Ah
        fc.constantFrom('silicon', 'schottky'),
        (voc, rint, rt, fraction, ah, diode) => {
          const i1 = (voc - VB) / rint
          const i2 = (voc - VB) / (rint + rt)
          const outcome = runTool(retrofitTool, {
            ...base,
            capacity: `${ah} Ah`,
            trickleCurrent: i1,
            secondReading: { kind: 'test-resistor', resistance: rt, current: i2 },
            targetTrickleRateC: undefined,
            targetTrickleCurrent: i1 * fraction,
            diodeType: diode,
          })
          if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
          expect(outcome.result.rechargeTimeAfterH).toBeGreaterThanOrEqual(outcome.result.rechargeTimeBeforeH * 0.999)
        },
      ),
      { numRuns: 200 },
    )
  })

  it('planRetrofit refuses unvalidated impossible readings', () => {
    const parsed = retrofitInput.parse(base)
    expect(() => planRetrofit({ ...parsed, secondReading: { kind: 'open-circuit', voltage: 1 } })).toThrow(/validated/)
  })
})

describe('registry', () => {
  it('exposes the tool by name', () => {
    expect(tools.retrofit).toBe(retrofitTool)
    expect(tools.retrofit.name).toBe('retrofit')
  })
})
