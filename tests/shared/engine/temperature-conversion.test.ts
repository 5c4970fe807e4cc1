/**
 * A temperature typed in °F must reach the engine as the same number a °C reader would type, so a
 * limit is judged on the value and never on the last bits of a floating-point conversion.
 * Reference: °C = (°F − 32) × 5/9 (NIST SP 811, B.8: exact definition of the Fahrenheit scale).
 */
import { describe, expect, it } from 'vitest'
import { parseQuantity } from '../../../shared/engine/quantity'
import { sizeTool } from '../../../shared/engine/size'
import { runTool } from '../../../shared/engine/tool'
import { readQuantity } from '../../../shared/format/input'

type Warned = { warnings: Array<{ code: string; message: string }> }
function size(input: Record<string, unknown>): Warned {
  const o = runTool(sizeTool as never, input)
  if (!o.ok) throw new Error(JSON.stringify(o.fields))
  return o.result as Warned
}

describe('°F read as the exact °C it stands for', () => {
  it.each([
    ['104 degF', 40],
    ['95 degF', 35],
    ['122 degF', 50],
    ['41 degF', 5],
    ['-40 degF', -40],
    ['32 degF', 0],
    ['77 degF', 25],
  ])('%s is %s °C exactly', (typed, celsius) => {
    expect(parseQuantity(typed, 'temperature')).toEqual({ ok: true, value: celsius })
  })

  it('as typed in a form ("104 °F", "104F")', () => {
    expect(readQuantity('104 °F', 'temperature')).toEqual({ ok: true, value: 40 })
    expect(readQuantity('104F', 'temperature')).toEqual({ ok: true, value: 40 })
    expect(readQuantity('104', 'temperature', { bareUnit: 'degF' })).toEqual({ ok: true, value: 40 })
  })

  it('lengths and illuminances converted from US units carry no conversion noise either (1 ft = 0.3048 m exactly)', () => {
    expect(parseQuantity('10 ft', 'length')).toEqual({ ok: true, value: 3.048 })
    expect(parseQuantity('7 in', 'length')).toEqual({ ok: true, value: 0.1778 })
  })

  it('a NiCd pack at exactly 104 °F raises the same warnings as at 40 °C, with 40 °C in their words', () => {
    const base = { chemistry: 'nicd', duration: '3 h', driver: 'converter', load: { power: '3 W' }, driverEfficiency: '0.85', ambientMin: '5 °C' }
    const inC = size({ ...base, ambientMax: '40 degC' })
    const inF = size({ ...base, ambientMax: '104 degF' })
    expect(inF.warnings.map((w) => w.code)).toEqual(inC.warnings.map((w) => w.code))
    expect(inF.warnings.map((w) => w.message)).toEqual(inC.warnings.map((w) => w.message))
    expect(inF.warnings.map((w) => w.message).join(' ')).not.toMatch(/\d\.\d{6,}/)
  })
})
