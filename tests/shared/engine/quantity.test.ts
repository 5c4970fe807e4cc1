/**
 * Unit handling at the engine's edge, checked against mathjs used directly as the reference
 * library (not through the engine's own wrapper).
 */
import { describe, expect, it, test } from 'vitest'
import { unit } from 'mathjs'
import { convert, parseQuantity, type Dimension } from '../../../shared/engine/quantity'
import { hours } from '../../../shared/engine/battery-inputs'
import { runTool } from '../../../shared/engine/tool'
import { sizeTool } from '../../../shared/engine/size'

describe('parseQuantity against mathjs', () => {
  // Reference: mathjs 15 unit conversions, computed independently of the engine.
  test.each<[string, Dimension, number]>([
    ['120 mA', 'current', unit('120 mA').toNumber('A')],
    ['1600 mAh', 'charge', unit('1600 mAh').toNumber('C')],
    ['4.5 Ah', 'charge', unit('4.5 Ah').toNumber('C')],
    ['90 min', 'time', unit('90 min').toNumber('s')],
    ['3 h', 'time', unit('3 h').toNumber('s')],
    ['25 degC', 'temperature', unit('25 degC').toNumber('degC')],
    ['6.9 V', 'voltage', unit('6.9 V').toNumber('V')],
    ['18 Wh', 'energy', unit('18 Wh').toNumber('J')],
  ])('%s as %s matches mathjs (mathjs reference)', (text, dimension, expected) => {
    const parsed = parseQuantity(text, dimension)
    expect(parsed.ok).toBe(true)
    if (parsed.ok) expect(parsed.value).toBeCloseTo(expected, 9)
  })

  test.each<[string, Dimension, number]>([
    ['120 mA', 'current', 0.12],
    ['1600 mAh', 'charge', 5760],
    ['90 min', 'time', 5400],
    ['25 °C', 'temperature', 25],
    ['-10 degC', 'temperature', -10],
  ])('%s reads as %d in the base unit (SI definitions: 1 Ah = 3600 C)', (text, dimension, expected) => {
    const parsed = parseQuantity(text, dimension)
    expect(parsed).toEqual({ ok: true, value: expect.closeTo(expected, 9) })
  })

  test.each<[unknown, Dimension]>([
    ['3 kg', 'current'],
    ['5 V', 'charge'],
    ['12 mA', 'time'],
    ['abc', 'current'],
    [Number.NaN, 'current'],
    [Number.POSITIVE_INFINITY, 'time'],
    ['Infinity', 'time'],
    [null, 'voltage'],
  ])('%s is rejected as a %s', (input, dimension) => {
    expect(parseQuantity(input, dimension).ok).toBe(false)
  })

  test('convert uses mathjs: 1 Ah = 3600 C, 1 h = 60 min (SI)', () => {
    expect(convert(1, 'Ah', 'C')).toBeCloseTo(3600, 9)
    expect(convert(1.5, 'h', 'min')).toBeCloseTo(90, 9)
  })
})

describe('hours field (capacity rating basis)', () => {
  test.each<[unknown, number]>([
    [20, 20],
    ['20', 20],
    ['20 h', 20],
    ['300 min', unit('300 min').toNumber('h')],
  ])('%s reads as %d h', (raw, expected) => {
    expect(hours().parse(raw)).toBeCloseTo(expected, 9)
  })

  test.each<[unknown]>([[0], [-5], ['20 V'], ['abc'], [Number.NaN], [Number.POSITIVE_INFINITY], [5000], [true]])('%s is rejected', (raw) => {
    expect(hours().safeParse(raw).success).toBe(false)
  })
})

describe('same answer whatever the unit', () => {
  test('a 4.5 Ah pack given in mAh, Ah and coulombs checks the same (mathjs conversions)', () => {
    const base = { chemistry: 'nicd', duration: '3 h', load: { power: '3 W' } }
    const results = ['4500 mAh', '4.5 Ah', `${unit('4.5 Ah').toNumber('C')} C`].map((capacity) => runTool(sizeTool, { ...base, capacity }))
    for (const r of results) expect(r.ok).toBe(true)
    const [a, b, c] = results.map((r) => (r.ok ? r.result.runtimeH : Number.NaN))
    expect(a).toBeCloseTo(b, 12)
    expect(b).toBeCloseTo(c, 12)
  })
})

describe('fast path for common units agrees with mathjs (the reference library)', () => {
  const cases: Array<[string, Dimension, string, string]> = [
    ['120 mA', 'current', 'mA', 'A'],
    ['0.12A', 'current', 'A', 'A'],
    ['1600 mAh', 'charge', 'mAh', 'C'],
    ['90 min', 'time', 'min', 's'],
    ['3 h', 'time', 'h', 's'],
    ['25 degC', 'temperature', 'degC', 'degC'],
    ['77 degF', 'temperature', 'degF', 'degC'],
    ['300 K', 'temperature', 'K', 'degC'],
    ['3.6 V', 'voltage', 'V', 'V'],
    ['4 W', 'power', 'W', 'W'],
    ['1.5 kWh', 'energy', 'kWh', 'J'],
    ['47 kohm', 'resistance', 'kohm', 'ohm'],
    ['2.5 m', 'length', 'm', 'm'],
    ['10 ft', 'length', 'ft', 'm'],
    ['1 fc', 'illuminance', 'fc', 'lx'],
    ['-1.5e2 mV', 'voltage', 'mV', 'V'],
  ]
  it.each(cases)('%s as %s', (text, dimension, _symbol, base) => {
    const parsed = parseQuantity(text, dimension)
    expect(parsed.ok).toBe(true)
    const [, value, symbol] = /^(.*\d)\s*([A-Za-z]+)$/.exec(text)!
    const reference = dimension === 'illuminance' ? Number(value) * 10.763910416709722 : unit(Number(value), symbol).toNumber(base)
    if (parsed.ok) expect(parsed.value).toBeCloseTo(reference, 9)
  })

  it('still refuses a unit of the wrong dimension on the fast path', () => {
    expect(parseQuantity('3 V', 'current').ok).toBe(false)
    expect(parseQuantity('3 kg', 'current').ok).toBe(false)
  })
})
