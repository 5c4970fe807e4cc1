import { describe, expect, it, test } from 'vitest'
import fc from 'fast-check'
import { unit } from 'mathjs'
import {
  annualEnergyKWh,
  apparentPower,
  auditTool,
  computeAudit,
  auditInput,
  distortionFactor,
  euMinimumDisplacementFactor,
  powerFactorOf,
  truePowerFactor,
  type AuditResult,
} from '../../../shared/engine/audit'
import { runTool } from '../../../shared/engine/tool'
import { tools } from '../../../shared/engine/registry'

/** A plausible bench record for an invented 4 W maintained bulkhead. */
const base = {
  claimedPower: '4 W',
  supplyVoltage: '230 V',
  supplyFrequency: '50 Hz',
  measuredPower: '4.1 W',
  measuredCurrent: '35 mA',
  ledVoltageMains: '9.2 V',
  ledCurrentMains: '300 mA',
  ledVoltageBattery: '8.6 V',
  ledCurrentBattery: '110 mA',
  batteryVoltage: '3.9 V',
  batteryChargeCurrent: '120 mA',
  mode: 'maintained',
  hoursPerDay: 24,
  tariffPerKWh: 0.3,
  currency: 'EUR',
}

function run(overrides: Record<string, unknown> = {}): AuditResult {
  const outcome = runTool(auditTool, { ...base, ...overrides })
  if (!outcome.ok) throw new Error(`unexpected field errors: ${JSON.stringify(outcome.fields)}`)
  return outcome.result
}

function fieldErrors(overrides: Record<string, unknown>, remove: string[] = []) {
  const raw: Record<string, unknown> = { ...base, ...overrides }
  for (const k of remove) delete raw[k]
  const outcome = runTool(auditTool, raw)
  if (outcome.ok) throw new Error('expected field errors')
  return outcome.fields
}

const codes = (r: AuditResult) => r.warnings.map((w) => w.code)

describe('real power, apparent power and power factor (IEEE Std 1459-2010; IEC 60050-131 IEV 131-11-46, from memory)', () => {
  it('S = V·I and λ = P/S: 3.0 W at 230 V and 25 mA gives 5.75 VA and λ ≈ 0.522', () => {
    const r = run({ claimedPower: 3, measuredPower: '3.0 W', measuredCurrent: '25 mA', ledVoltageMains: undefined, ledCurrentMains: undefined })
    expect(r.apparentPowerVA).toBeCloseTo(5.75, 10)
    expect(r.powerFactor).toBeCloseTo(0.522, 3)
    // mathjs as the reference for the unit arithmetic: V × A → VA.
    expect(unit('230 V').multiply(unit('25 mA')).toNumber('VA')).toBeCloseTo(r.apparentPowerVA, 10)
    expect(
      r.working
        .find((s) => s.id === 'powerFactor')
        ?.references.map((x) => x.source)
        .join(' '),
    ).toContain('IEEE Std 1459')
  })

  it('a 60 W incandescent lamp at 230 V draws 0.26 A: power factor 1 (resistive load, worked example)', () => {
    const r = run({ claimedPower: '60 W', measuredPower: '60 W', measuredCurrent: '0.26 A', ledVoltageMains: undefined, ledCurrentMains: undefined })
    expect(r.apparentPowerVA).toBeCloseTo(59.8, 10)
    expect(r.powerFactor).toBeCloseTo(1, 2)
    // 60 / 59.8 is a hair above 1 because the worked current is rounded: flagged as meter error, not as nonsense.
    expect(codes(r)).toContain('power-factor-above-one')
    expect(codes(r)).not.toContain('power-current-inconsistent')
  })

  it('true power factor = cos φ1 / √(1 + THD²) (IEEE Std 1459-2010): cos φ1 = 0.90, THD = 80 % → 0.703', () => {
    expect(truePowerFactor(0.9, 0.8)).toBeCloseTo(0.703, 3)
    expect(distortionFactor(0)).toBe(1)
    expect(truePowerFactor(1, 0)).toBe(1)
    expect(() => truePowerFactor(1.2, 0.1)).toThrow(RangeError)
    expect(() => truePowerFactor(0.9, -0.1)).toThrow(RangeError)
    expect(() => truePowerFactor(0.9, Number.NaN)).toThrow(RangeError)
  })

  it('pure helpers agree with the definitions', () => {
    expect(apparentPower(230, 0.025)).toBeCloseTo(5.75, 12)
    expect(powerFactorOf(3, 5.75)).toBeCloseTo(3 / 5.75, 12)
  })

  it('finds the missing one of P, S and λ from the other two', () => {
    // P and λ → S = P/λ, I = S/V
    const a = run({ measuredPower: 3, measuredCurrent: undefined, powerFactor: 0.5 })
    expect(a.apparentPowerVA).toBeCloseTo(6, 10)
    expect(a.measuredCurrentA).toBeCloseTo(6 / 230, 12)
    expect(a.powerFactor).toBeCloseTo(0.5, 12)
    // S (from V·I) and λ → P = S·λ
    const b = run({ measuredPower: undefined, measuredCurrent: '25 mA', powerFactor: 0.6 })
    expect(b.measuredPowerW).toBeCloseTo(5.75 * 0.6, 10)
    expect(b.powerFactor).toBeCloseTo(0.6, 12)
    expect(b.working.find((s) => s.id === 'powerFactor')?.formula).toBe('P = S · λ')
    // S read from the meter and λ
    const c = run({ measuredPower: undefined, measuredCurrent: undefined, apparentPower: '8 VA', powerFactor: 0.5 })
    expect(c.measuredPowerW).toBeCloseTo(4, 12)
    expect(c.measuredCurrentA).toBeCloseTo(8 / 230, 12)
    expect(c.working.find((s) => s.id === 'apparentPower')?.formula).toContain('meter')
    // P and S from the meter
    const d = run({ measuredCurrent: undefined, apparentPower: '8 VA' })
    expect(d.powerFactor).toBeCloseTo(4.1 / 8, 12)
  })
})

describe('energy and cost over a year (arithmetic checked with mathjs units)', () => {
  it('maintained, lit 24 h: 4 W × 8760 h = 35.04 kWh', () => {
    const r = run({ measuredPower: '4 W', measuredCurrent: '40 mA', hoursPerDay: 24 })
    const reference = unit('4 W').multiply(unit('8760 h')).toNumber('kWh')
    expect(reference).toBeCloseTo(35.04, 10)
    expect(r.annualEnergyKWh).toBeCloseTo(reference, 10)
    expect(r.annualCost).toBeCloseTo(reference * 0.3, 10)
    expect(r.currency).toBe('EUR')
  })

  it('maintained, lit 8 h a day, the other 16 h at the charging power', () => {
    const r = run({ measuredPower: '4 W', measuredCurrent: '40 mA', hoursPerDay: 8, batteryVoltage: '4 V', batteryChargeCurrent: '125 mA' })
    expect(r.standbyChargePowerW).toBeCloseTo(0.5, 12)
    const lit = unit('4 W').multiply(unit('2920 h')).toNumber('kWh') // 8 h × 365 d
    const standby = unit('0.5 W').multiply(unit('5840 h')).toNumber('kWh') // 16 h × 365 d
    expect(r.annualEnergyKWh).toBeCloseTo(lit + standby, 10)
    expect(codes(r)).not.toContain('standby-power-unknown')
  })

  it('maintained with unknown standby power counts the unlit hours as zero and says so', () => {
    const r = run({ hoursPerDay: 12, batteryVoltage: undefined, batteryChargeCurrent: undefined })
    expect(r.standbyChargePowerW).toBeNull()
    expect(r.annualEnergyKWh).toBeCloseTo(unit('4.1 W').multiply(unit('4380 h')).toNumber('kWh'), 10)
    expect(codes(r)).toContain('standby-power-unknown')
  })

  it('non-maintained: the charging draw all year, hoursPerDay not used', () => {
    const r = run({
      mode: 'non-maintained',
      claimedPower: '1.5 W',
      measuredPower: '1.2 W',
      measuredCurrent: '20 mA',
      ledVoltageMains: undefined,
      ledCurrentMains: undefined,
      hoursPerDay: 3,
      tariffPerKWh: 0.25,
      currency: undefined,
    })
    const reference = unit('1.2 W').multiply(unit('8760 h')).toNumber('kWh')
    expect(r.annualEnergyKWh).toBeCloseTo(reference, 10)
    expect(r.annualCost).toBeCloseTo(reference * 0.25, 10)
    expect(r.currency).toBeNull()
    expect(codes(r)).toContain('hours-not-used')
    expect(r.working.find((s) => s.id === 'annualEnergy')?.formula).toBe('E = 8760 h · P')
  })

  it('annualEnergyKWh pure function: no standby given counts zero', () => {
    expect(annualEnergyKWh({ mode: 'maintained', measuredPowerW: 10, hoursPerDay: 0, standbyPowerW: null })).toBe(0)
  })
})

describe('what the claim describes', () => {
  test.each([
    ['input power', { claimedPower: '4 W' }, 'within tolerance'],
    ['LED power', { claimedPower: '2.8 W' }, 'above claim'], // LED on mains 9.2 V × 0.3 A = 2.76 W
    ['apparent power', { claimedPower: '8 W' }, 'below claim'], // S = 230 V × 35 mA = 8.05 VA
    ['something else', { claimedPower: '20 W' }, 'below claim'],
  ])('claim read as %s', (meaning, overrides, verdict) => {
    const r = run(overrides)
    expect(r.claimLikelyMeans).toBe(meaning)
    expect(r.claimVerdict).toBe(verdict)
    expect(r.claimExplanation.length).toBeGreaterThan(20)
  })

  it('uses the LED power on battery when there is no mains LED reading', () => {
    const r = run({
      mode: 'non-maintained',
      claimedPower: '1 W',
      measuredPower: '1.6 W',
      ledVoltageMains: undefined,
      ledCurrentMains: undefined,
      hoursPerDay: 0,
    })
    expect(r.claimLikelyMeans).toBe('LED power') // 8.6 V × 0.11 A = 0.946 W
    expect(r.claimExplanation).toContain('on battery')
  })

  it('deviation in W and %', () => {
    const r = run({ claimedPower: '4 W', measuredPower: '5 W' })
    expect(r.claimDeviationW).toBeCloseTo(1, 12)
    expect(r.claimDeviationPct).toBeCloseTo(25, 10)
    expect(r.claimVerdict).toBe('above claim')
  })

  it('a custom tolerance widens what counts as agreeing', () => {
    expect(run({ claimedPower: '4 W', measuredPower: '4.6 W' }).claimVerdict).toBe('above claim')
    expect(run({ claimedPower: '4 W', measuredPower: '4.6 W', claimTolerancePct: 20 }).claimVerdict).toBe('within tolerance')
  })

  it('compares a declared apparent power with the measured one', () => {
    const ok = run({ claimedApparentPower: '8 VA' })
    expect(ok.apparentClaimDeviationPct).toBeCloseTo((8.05 / 8 - 1) * 100, 10)
    expect(codes(ok)).not.toContain('apparent-claim-deviates')
    const off = run({ claimedApparentPower: '5 VA' })
    expect(codes(off)).toContain('apparent-claim-deviates')
    expect(run().apparentClaimDeviationPct).toBeNull()
  })
})

describe('d.c. side: LED power, emergency output ratio, driver efficiency, charging power (P = V·I)', () => {
  it('computes the LED powers and their ratio, marked as an approximation of the light ratio', () => {
    const r = run()
    expect(r.ledPowerMainsW).toBeCloseTo(9.2 * 0.3, 12)
    expect(r.ledPowerBatteryW).toBeCloseTo(8.6 * 0.11, 12)
    expect(r.emergencyOutputRatio).toBeCloseTo((8.6 * 0.11) / (9.2 * 0.3), 12)
    const step = r.working.find((s) => s.id === 'emergencyOutputRatio')
    expect(step?.explanation).toMatch(/approximation/)
    expect(step?.explanation).toMatch(/not proportional/)
    expect(r.driverEfficiency).toBeCloseTo((9.2 * 0.3) / 4.1, 12)
    expect(r.standbyChargePowerW).toBeCloseTo(3.9 * 0.12, 12)
  })

  it('leaves the ratio out when the mains LED power is zero or missing', () => {
    expect(run({ ledCurrentMains: 0 }).emergencyOutputRatio).toBeNull()
    const r = run({ ledVoltageMains: undefined, ledCurrentMains: undefined, ledVoltageBattery: undefined, ledCurrentBattery: undefined })
    expect(r.ledPowerMainsW).toBeNull()
    expect(r.ledPowerBatteryW).toBeNull()
    expect(r.driverEfficiency).toBeNull()
  })

  it('gives a note on billing (real power) and circuit sizing (current, VA)', () => {
    const r = run()
    expect(r.realVsApparentNote).toContain('4.1 W')
    expect(r.realVsApparentNote).toContain('8.05 VA')
    expect(r.realVsApparentNote).toContain('35 mA')
  })
})

describe('consistency checks are warnings that name the readings', () => {
  it('measured power and current that cannot both be right (P far above V·I)', () => {
    const r = run({ measuredPower: '10 W', measuredCurrent: '20 mA' })
    const w = r.warnings.find((x) => x.code === 'power-current-inconsistent')
    expect(w?.severity).toBe('critical')
    expect(w?.message).toContain('measuredPower')
    expect(w?.message).toContain('measuredCurrent')
    expect(r.warnings[0].severity).toBe('critical') // most severe first
  })

  it('names apparentPower when the S reading came from the meter', () => {
    const r = run({ measuredCurrent: undefined, apparentPower: '2 VA', measuredPower: '3 W' })
    expect(r.warnings.find((x) => x.code === 'power-current-inconsistent')?.message).toContain('apparentPower')
  })

  it('a given power factor that disagrees with P/(V·I)', () => {
    const r = run({ powerFactor: 0.9 })
    const w = r.warnings.find((x) => x.code === 'power-factor-disagrees')
    expect(w?.field).toBe('powerFactor')
    expect(codes(run({ powerFactor: 0.5 }))).not.toContain('power-factor-disagrees') // 4.1 / 8.05 = 0.509
  })

  it('an apparent power reading that disagrees with V·I', () => {
    expect(codes(run({ apparentPower: '12 VA' }))).toContain('apparent-power-disagrees')
    expect(codes(run({ apparentPower: '8 VA' }))).not.toContain('apparent-power-disagrees')
  })

  it('readings below the meter’s lowest reliable current and power', () => {
    const r = run({ meterMinCurrent: '50 mA', meterMinPower: '5 W' })
    const below = r.warnings.filter((x) => x.code === 'below-meter-range').map((x) => x.field)
    expect(below).toEqual(['measuredCurrent', 'measuredPower'])
    expect(codes(run({ meterMinCurrent: '10 mA', meterMinPower: '1 W' }))).not.toContain('below-meter-range')
  })

  it('LED power above input power', () => {
    const r = run({ ledCurrentMains: '500 mA' }) // 4.6 W at the LEDs from 4.1 W in
    const w = r.warnings.find((x) => x.code === 'led-power-above-input')
    expect(w?.severity).toBe('critical')
    expect(w?.message).toContain('ledCurrentMains')
    expect(r.driverEfficiency).toBeGreaterThan(1)
  })

  it('LED plus charging power above input power in maintained mode', () => {
    const r = run({ ledCurrentMains: '420 mA' }) // 3.86 W + 0.47 W > 4.1 W
    expect(codes(r)).toContain('outputs-exceed-input')
  })

  it('charging power above input power in non-maintained mode', () => {
    const r = run({ mode: 'non-maintained', hoursPerDay: 0, measuredPower: '0.4 W', ledVoltageMains: undefined, ledCurrentMains: undefined })
    expect(codes(r)).toContain('charge-power-above-input')
  })

  it('LED readings on mains for a non-maintained luminaire', () => {
    expect(codes(run({ mode: 'non-maintained', hoursPerDay: 0, measuredPower: '3.5 W' }))).toContain('mode-lit-on-mains')
  })

  it('EU 2019/2020 displacement-factor bands, information only (secondary source, from memory)', () => {
    expect(euMinimumDisplacementFactor(5)).toBeNull()
    expect(euMinimumDisplacementFactor(8)).toBe(0.5)
    expect(euMinimumDisplacementFactor(20)).toBe(0.7)
    expect(euMinimumDisplacementFactor(40)).toBe(0.9)
    const r = run({ claimedPower: '8 W', measuredPower: '8 W', measuredCurrent: '80 mA', ledCurrentMains: '100 mA' }) // λ = 0.435
    const w = r.warnings.find((x) => x.code === 'displacement-factor-band')
    expect(w?.severity).toBe('info')
    expect(codes(run())).not.toContain('displacement-factor-band') // 4.1 W: no requirement
  })
})

describe('field errors for impossible inputs', () => {
  test.each([
    ['negative measured power', { measuredPower: '-3 W' }, 'measuredPower'],
    ['negative claimed power', { claimedPower: -4 }, 'claimedPower'],
    ['power factor above 1', { powerFactor: 1.2 }, 'powerFactor'],
    ['power factor of 0', { powerFactor: 0 }, 'powerFactor'],
    ['negative power factor', { powerFactor: -0.5 }, 'powerFactor'],
    ['zero supply voltage', { supplyVoltage: '0 V' }, 'supplyVoltage'],
    ['hours per day above 24', { hoursPerDay: 25 }, 'hoursPerDay'],
    ['hours per day below 0', { hoursPerDay: -1 }, 'hoursPerDay'],
    ['a current given as a voltage', { measuredCurrent: '25 V' }, 'measuredCurrent'],
    ['an unknown mode', { mode: 'sometimes' }, 'mode'],
    ['an empty currency', { currency: '  ' }, 'currency'],
    ['a negative tariff', { tariffPerKWh: -0.1 }, 'tariffPerKWh'],
  ])('%s', (_name, overrides, path) => {
    const fields = fieldErrors(overrides)
    expect(fields.map((f) => f.path)).toContain(path)
    expect(fields.find((f) => f.path === path)?.message.length).toBeGreaterThan(5)
  })

  it('power factor messages say why', () => {
    expect(fieldErrors({ powerFactor: 1.2 }).find((f) => f.path === 'powerFactor')?.message).toMatch(/greater than 1/)
    expect(fieldErrors({ powerFactor: 0 }).find((f) => f.path === 'powerFactor')?.message).toMatch(/greater than 0/)
  })

  it('not enough mains readings to find P and λ', () => {
    expect(fieldErrors({}, ['measuredPower']).map((f) => f.path)).toEqual(['measuredPower'])
    expect(fieldErrors({}, ['measuredCurrent']).map((f) => f.path)).toEqual(['measuredCurrent'])
  })

  it('readings that come in pairs', () => {
    expect(fieldErrors({}, ['ledCurrentMains']).map((f) => f.path)).toEqual(['ledCurrentMains'])
    expect(fieldErrors({}, ['ledVoltageBattery']).map((f) => f.path)).toEqual(['ledVoltageBattery'])
    expect(fieldErrors({}, ['batteryChargeCurrent']).map((f) => f.path)).toEqual(['batteryChargeCurrent'])
  })
})

describe('robustness', () => {
  it('never returns NaN or Infinity for any valid input (property test)', () => {
    const positive = fc.double({ min: 1e-4, max: 1e4, noNaN: true })
    fc.assert(
      fc.property(
        positive,
        positive,
        fc.double({ min: 1, max: 1000, noNaN: true }),
        positive,
        fc.option(fc.double({ min: 0.01, max: 1, noNaN: true }), { nil: undefined }),
        fc.double({ min: 0, max: 24, noNaN: true }),
        fc.constantFrom('maintained', 'non-maintained'),
        fc.double({ min: 0, max: 10, noNaN: true }),
        (claimed, measured, volts, amps, pf, hours, mode, ledAmps) => {
          const outcome = runTool(auditTool, {
            claimedPower: claimed,
            supplyVoltage: volts,
            measuredPower: measured,
            measuredCurrent: amps,
            powerFactor: pf,
            ledVoltageMains: 10,
            ledCurrentMains: ledAmps,
            ledVoltageBattery: 10,
            ledCurrentBattery: ledAmps / 3,
            mode,
            hoursPerDay: hours,
            tariffPerKWh: 0.2,
          })
          expect(outcome.ok).toBe(true)
        },
      ),
      { numRuns: 300 },
    )
  })

  it('computeAudit works on parsed input directly', () => {
    const parsed = auditInput.parse(base)
    expect(computeAudit(parsed).measuredPowerW).toBeCloseTo(4.1, 12)
  })
})

describe('registry', () => {
  it('exposes the tool by name', () => {
    expect(tools.audit).toBe(auditTool)
    expect(tools.audit.name).toBe('audit')
  })
})
