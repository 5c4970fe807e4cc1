/** `charge` against charging rules from standards and cell makers' manuals. */
import { describe, expect, test } from 'vitest'
import { floatCellVoltage } from '../../../shared/engine/battery-models'
import { checkCharge, chargeTool, RECHARGE_LIMIT_H, type ChargeResult } from '../../../shared/engine/charge'
import { getChemistry } from '../../../shared/engine/chemistries'
import { runTool } from '../../../shared/engine/tool'

function charge(input: Record<string, unknown>): ChargeResult {
  const outcome = runTool(chargeTool, input)
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  return outcome.result
}
const codes = (r: ChargeResult) => r.warnings.map((w) => w.code)
/** A direct-driven load drawing exactly `amps`, so the discharge is known to the digit. */
const direct = (amps: number) => ({ driver: 'direct', cellsInSeries: 3, load: { ledVoltage: '2.9 V', ledCurrent: amps } })

describe('recharge after a rated-duration discharge', () => {
  test('NiMH standard charge 0.1 It × 16 h restores a full discharge (IEC 61951-2 capacity test condition)', () => {
    // 1.6 Ah taken out × 1.5 charge factor / 0.16 A = 15 h ≤ 16 h
    const r = charge({ chemistry: 'nimh', capacity: '1600 mAh', duration: '1 h', ...direct(1.6), chargeCurrent: '160 mA', trickleCurrent: '40 mA' })
    expect(r.chargeCRate).toBeCloseTo(0.1, 12)
    expect(r.dischargeAh).toBeCloseTo(1.6, 12)
    expect(r.rechargeTimeH).toBeCloseTo(15, 9)
    expect(r.rechargeTimeH).toBeLessThanOrEqual(16)
  })

  test.each<[string, number, string, boolean]>([
    // IEC 60598-2-22: the rated duration must be available again after a 24 h charge
    ['nicd', 1.0, '200 mA', true], // 3 Ah × 1.4 / 0.2 A = 21 h
    ['nicd', 1.0, '150 mA', false], // 28 h
    ['lead-acid', 1.5, '300 mA', true], // 4.5 Ah × 1.1 / 0.3 A = 16.5 h
    ['nimh', 1.0, '100 mA', false], // 3 Ah × 1.5 / 0.1 A = 45 h
  ])('%s, 3 h at %d A, charged at %s → within 24 h = %s', (chemistry, amps, chargeCurrent, within) => {
    const r = charge({ chemistry, capacity: '4.5 Ah', duration: '3 h', ...direct(amps), chargeCurrent, cellsInSeries: 3 })
    expect(r.rechargeWithin24h).toBe(within)
    expect(codes(r).includes('recharge-over-24h')).toBe(!within)
    expect(r.rechargeWithin24h).toBe(r.rechargeTimeH <= RECHARGE_LIMIT_H)
  })

  test('recharge factor of VRLA is 110 % of the charge taken out (VRLA maker manual)', () => {
    const r = charge({ chemistry: 'lead-acid', capacity: '7 Ah', duration: '1 h', ...direct(2), chargeCurrent: '0.5 A' })
    expect(r.rechargeTimeH).toBeCloseTo((2 * 1.1) / 0.5, 9)
  })
})

describe('float voltage of VRLA with temperature compensation', () => {
  test.each<[number, number, number]>([
    // −3 mV/°C/cell from 2.25 V at 25 °C (VRLA maker manual; 6-cell block values from the same rule)
    [15, 2.28, 13.68],
    [25, 2.25, 13.5],
    [35, 2.22, 13.32],
  ])('%d °C → %d V/cell, %d V per 6-cell block', (ambient, cell, block) => {
    const r = charge({
      chemistry: 'lead-acid',
      capacity: '7 Ah',
      duration: '1 h',
      ...direct(1),
      cellsInSeries: 6,
      load: { ledVoltage: '9 V', ledCurrent: 1 },
      chargeCurrent: '0.7 A',
      ambient,
    })
    expect(r.floatVoltageCheck?.expectedCellVoltageV).toBeCloseTo(cell, 9)
    expect(r.floatVoltageCheck?.expectedPackVoltageV).toBeCloseTo(block, 9)
    expect(codes(r)).toContain('float-voltage-expected')
  })

  test.each<[number, number]>([
    [0, 2.31], // compensation stops at 5 °C (VRLA maker manual: 2.31 V at ≤ 5 °C)
    [45, 2.205], // and at 40 °C (2.205 V at ≥ 40 °C)
  ])('%d °C is held at the compensation limit → %d V/cell', (ambient, cell) => {
    expect(floatCellVoltage(getChemistry('lead-acid'), ambient)).toBeCloseTo(cell, 9)
  })

  test.each<[string, string, number | null]>([
    ['13.5 V', 'pack', null], // 2.25 V/cell on a 6-cell block: in band
    ['2.28 V', 'cell', null],
    ['13.0 V', 'pack', 1], // 2.167 V/cell: low
    ['14.4 V', 'pack', 1], // 2.40 V/cell is a cycle-charge voltage, too high for float
  ])('float %s per %s at 25 °C: warnings %s', (floatVoltage, voltageBasis, expectWarning) => {
    const r = charge({
      chemistry: 'lead-acid',
      capacity: '7 Ah',
      duration: '1 h',
      driver: 'direct',
      cellsInSeries: 6,
      load: { ledVoltage: '9 V', ledCurrent: 1 },
      chargeCurrent: '0.7 A',
      floatVoltage,
      voltageBasis,
    })
    const floatWarnings = r.warnings.filter((w) => w.code === 'float-voltage-low' || w.code === 'float-voltage-high')
    expect(floatWarnings.length).toBe(expectWarning ?? 0)
    expect(r.floatVoltageCheck?.withinBand).toBe(expectWarning === null)
  })

  test('nickel packs are not floated: a float voltage is ignored with a note', () => {
    const r = charge({ chemistry: 'nicd', capacity: '4 Ah', duration: '1 h', ...direct(1), chargeCurrent: '200 mA', floatVoltage: '4.2 V' })
    expect(r.floatVoltageCheck).toBeNull()
    expect(codes(r)).toContain('float-not-used')
  })
})

describe('charge and trickle rates', () => {
  test.each<[string, string, boolean]>([
    ['1.35 A', '4.5 Ah', false], // 0.3 C: the VRLA maximum initial charge current (VRLA maker manual)
    ['1.6 A', '4.5 Ah', true],
  ])('VRLA charged at %s on %s: too high = %s', (chargeCurrent, capacity, high) => {
    const r = charge({ chemistry: 'lead-acid', capacity, duration: '1 h', ...direct(1), chargeCurrent })
    expect(codes(r).includes('charge-rate-high')).toBe(high)
  })

  test.each<[string, number, boolean, string | null]>([
    // NiCd: permanent charge C/30..C/20 for standard cells (Battery Reference Book, common practice)
    ['nicd', 1 / 30, true, null],
    ['nicd', 1 / 20, true, null],
    ['nicd', 1 / 10, false, 'trickle-above-limit'],
    ['nicd', 1 / 100, false, 'trickle-too-low'],
    // high-temperature NiCd cells take up to 0.1 It permanently (IEC 60285 practice, from memory)
    ['nicd-ht', 1 / 10, true, null],
    // NiMH: above about C/30 is life-limiting (NiMH maker handbooks, from memory)
    ['nimh', 1 / 40, true, null],
    ['nimh', 1 / 20, false, 'trickle-life-limiting'],
    // VRLA floats at about 1 mA/Ah; a fixed trickle of C/20 overcharges
    ['lead-acid', 1 / 20, false, 'trickle-above-limit'],
    // lithium: no trickle at full voltage (IEC 62133-2 practice)
    ['lifepo4', 1 / 50, false, 'lithium-trickle'],
    ['li-ion', 0, true, null],
  ])('%s trickle at %d C → within limit %s (%s)', (chemistry, rateC, within, code) => {
    const r = charge({ chemistry, capacity: '4 Ah', duration: '1 h', ...direct(0.5), chargeCurrent: '0.4 A', trickleCurrent: rateC * 4 })
    expect(r.trickleCRate).toBeCloseTo(rateC, 12)
    expect(r.trickleWithinLimit).toBe(within)
    if (code) expect(codes(r)).toContain(code)
  })

  test('nickel chargers keep their current on: trickle defaults to the charge current', () => {
    const r = charge({ chemistry: 'nicd', capacity: '4 Ah', duration: '1 h', ...direct(0.5), chargeCurrent: '0.2 A' })
    expect(r.trickleCurrentA).toBeCloseTo(0.2, 12)
    expect(r.trickleCRate).toBeCloseTo(0.05, 12)
  })

  // Common practice: a charger is taken to keep its current on unless the user says it stops (trickle 0);
  // an empty field must never hide a danger that the same current typed in would show.
  test.each(['nicd', 'nimh', 'lifepo4', 'li-ion', 'lead-acid'])(
    '%s: an empty trickle field reads as the charge current, same verdict as typing it',
    (chemistry) => {
      const base = { chemistry, capacity: '1.6 Ah', duration: '3 h', ...direct(0.3), cellsInSeries: 4, chargeCurrent: '120 mA' }
      const empty = charge(base)
      const typed = charge({ ...base, trickleCurrent: '120 mA' })
      expect(empty.trickleCurrentA).toBeCloseTo(0.12, 12)
      expect(empty.trickleCRate).toBeCloseTo(0.075, 12)
      expect(empty.trickleWithinLimit).toBe(typed.trickleWithinLimit)
      expect(codes(empty)).toEqual(codes(typed))
    },
  )

  test('lithium on a charger whose current stays on, trickle left empty: critical (lithium maker practice, IEC 62133-2)', () => {
    const r = charge({ chemistry: 'lifepo4', capacity: '1.6 Ah', duration: '3 h', ...direct(0.3), cellsInSeries: 1, chargeCurrent: '120 mA' })
    expect(r.warnings.find((w) => w.code === 'lithium-trickle')?.severity).toBe('critical')
  })

  test('a charger that stops when full is typed as trickle 0: no permanent charge for lithium', () => {
    const r = charge({ chemistry: 'li-ion', capacity: '3 Ah', duration: '1 h', ...direct(0.5), cellsInSeries: 1, chargeCurrent: '0.5 A', trickleCurrent: 0 })
    expect(r.trickleCurrentA).toBe(0)
    expect(codes(r)).not.toContain('lithium-trickle')
  })
})

describe('charge taken by a full test', () => {
  test('never more than the pack holds: 0.613 A × 3 h = 1.84 Ah from a 1.6 Ah pack counts 1.6 Ah and is flagged (charge balance, common practice)', () => {
    const r = charge({ chemistry: 'nicd', capacity: '1.6 Ah', duration: '3 h', ...direct(0.6133), cellsInSeries: 4, chargeCurrent: '120 mA' })
    expect(r.dischargeAh).toBeLessThanOrEqual(1.6)
    expect(r.dischargeAh).toBeCloseTo(1.6, 12)
    expect(r.rechargeTimeH).toBeCloseTo((1.6 * 1.4) / 0.12, 9)
    expect(r.warnings.find((w) => w.code === 'load-exceeds-pack')?.severity).toBe('critical')
  })
  test('a load the pack covers: Q = I · t exactly', () => {
    const r = charge({ chemistry: 'nicd', capacity: '1.6 Ah', duration: '3 h', ...direct(0.4), cellsInSeries: 4, chargeCurrent: '120 mA' })
    expect(r.dischargeAh).toBeCloseTo(1.2, 12)
    expect(codes(r)).not.toContain('load-exceeds-pack')
  })
})

describe('lithium, cut-off and temperature', () => {
  test('lithium is flagged as held at full charge; charging at −5 °C is forbidden; overvoltage is critical', () => {
    const r = charge({
      chemistry: 'li-ion',
      capacity: '3 Ah',
      duration: '1 h',
      driver: 'direct',
      cellsInSeries: 1,
      load: { ledVoltage: '2.8 V', ledCurrent: 0.5 },
      chargeCurrent: '0.5 A',
      ambient: -5,
      floatVoltage: '4.3 V',
    })
    expect(r.heldAtFullCharge).toBe(true)
    expect(codes(r)).toEqual(expect.arrayContaining(['lithium-held-full', 'charge-forbidden-cold', 'lithium-overvoltage', 'lithium-safety']))
    expect(r.warnings[0].severity).toBe('critical')
  })

  test.each<[string, string, string, boolean]>([
    ['lead-acid', '4.5 V', 'pack', true], // 1.5 V/cell < 1.6 V
    ['lead-acid', '5.25 V', 'pack', false], // 1.75 V/cell (VRLA maker manual end voltage)
    ['li-ion', '2.0 V', 'cell', true], // below 2.5 V/cell (lithium cell maker manual)
    ['nicd', '2.85 V', 'pack', false], // 0.95 V/cell
  ])('%s cut-off %s per %s → deep discharge %s', (chemistry, cutoffVoltage, voltageBasis, deep) => {
    const r = charge({ chemistry, capacity: '4 Ah', duration: '1 h', ...direct(0.5), chargeCurrent: '0.2 A', cutoffVoltage, voltageBasis })
    expect(r.deepDischarge).toBe(deep)
    expect(codes(r).includes('deep-discharge')).toBe(deep)
  })

  test('no cut-off given: the check is asked for; NiCd outside 0–40 °C warns', () => {
    const r = charge({ chemistry: 'nicd', capacity: '4 Ah', duration: '1 h', ...direct(0.5), chargeCurrent: '0.2 A', ambient: 45 })
    expect(r.deepDischarge).toBeNull()
    expect(codes(r)).toEqual(expect.arrayContaining(['deep-discharge-protection', 'charge-temperature-range', 'cadmium-restricted']))
  })

  test('converter load: pack current from power, efficiency and voltage; working ids present', () => {
    const input = chargeTool.input.parse({ chemistry: 'nicd', capacity: '4 Ah', duration: '3 h', load: { power: '3 W' }, chargeCurrent: '0.2 A' })
    const r = checkCharge(input)
    expect(r.averageCurrentA).toBeCloseTo(3 / 0.85 / 3.6, 12)
    expect(r.working.map((s) => s.id)).toEqual(['averageCurrentA', 'dischargeAh', 'rechargeTimeH', 'chargeCRate', 'trickleCRate'])
    expect(checkCharge(input, { explain: false }).working).toEqual([])
  })
})

describe('field errors name the field', () => {
  const ok = { chemistry: 'nicd', capacity: '4 Ah', duration: '3 h', load: { power: '3 W' }, chargeCurrent: '0.2 A' }
  test.each<[string, Record<string, unknown>, string]>([
    ['zero charge current', { chargeCurrent: 0 }, 'chargeCurrent'],
    ['charge current in volts', { chargeCurrent: '5 V' }, 'chargeCurrent'],
    ['negative trickle', { trickleCurrent: -0.01 }, 'trickleCurrent'],
    ['NaN trickle', { trickleCurrent: Number.NaN }, 'trickleCurrent'],
    ['ambient 100 °C', { ambient: 100 }, 'ambient'],
    ['unknown voltage basis', { voltageBasis: 'block' }, 'voltageBasis'],
    ['missing capacity', { capacity: undefined }, 'capacity'],
    ['cell cut-off above nominal', { cutoffVoltage: '1.3 V', voltageBasis: 'cell' }, 'cutoffVoltage'],
    ['Infinity float voltage', { floatVoltage: Number.POSITIVE_INFINITY }, 'floatVoltage'],
  ])('%s → %s', (_what, patch, path) => {
    const outcome = runTool(chargeTool, { ...ok, ...patch })
    expect(outcome.ok).toBe(false)
    if (!outcome.ok) expect(outcome.fields.map((f) => f.path)).toContain(path)
  })
})
