import { describe, expect, it } from 'vitest'
import { unit } from 'mathjs'
import { formatDisplay, fromDisplay, toDisplay } from '../../../shared/engine/units'

describe('display units (mathjs as the reference library)', () => {
  it('converts lux to foot-candles: 1 fc = 10.7639 lx (1 lm/ft², NIST SP 811 conversion factor)', () => {
    expect(toDisplay('illuminance', 'us', 10.763910416709722)).toBeCloseTo(1, 9)
    expect(fromDisplay('illuminance', 'us', 0.1)).toBeCloseTo(1.0763910416709722, 9)
    // NFPA 101 7.9.2.1 quotes 1 fc as 10.8 lx and 0.1 fc as 1.1 lx (rounded).
    expect(fromDisplay('illuminance', 'us', 1)).toBeCloseTo(10.8, 1)
  })

  it('converts °C to °F like mathjs does', () => {
    expect(toDisplay('temperature', 'us', 25)).toBeCloseTo(unit(25, 'degC').toNumber('degF'), 9)
    expect(toDisplay('temperature', 'us', -40)).toBeCloseTo(-40, 9)
    expect(fromDisplay('temperature', 'us', 212)).toBeCloseTo(100, 9)
  })

  it('converts metres to feet (1 ft = 0.3048 m exactly, international foot)', () => {
    expect(toDisplay('length', 'us', 0.3048)).toBeCloseTo(1, 12)
    expect(fromDisplay('length', 'us', 10)).toBeCloseTo(3.048, 12)
  })

  it('leaves SI values alone and formats with the unit', () => {
    expect(toDisplay('length', 'si', 2.5)).toBe(2.5)
    expect(formatDisplay('illuminance', 'si', 1)).toBe('1 lx')
    expect(formatDisplay('temperature', 'us', 25)).toBe('77 °F')
  })
})
