import { describe, expect, it } from 'vitest'
import { unit } from 'mathjs'
import { displayUnit, formatDisplay, fromDisplay, inUserUnits, regionDefaults, roundDefault, toDisplay, unitLabel } from '../../../shared/engine/units'
import { readQuantity } from '../../../shared/format/input'

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

describe('mass and volume (NIST SP 811 appendix B; mathjs as the reference library)', () => {
  it('1 lb = 0.45359237 kg exactly (international avoirdupois pound)', () => {
    expect(fromDisplay('mass', 'us', 1)).toBe(0.45359237)
    expect(toDisplay('mass', 'us', 0.45359237)).toBe(1)
    expect(toDisplay('mass', 'us', 0.3)).toBeCloseTo(unit(0.3, 'kg').toNumber('lb'), 9)
  })
  it('1 in³ = 16.387064 mL exactly (from 1 in = 25.4 mm)', () => {
    expect(fromDisplay('volume', 'us', 1)).toBe(0.016387064)
    expect(toDisplay('volume', 'us', 0.1)).toBeCloseTo(unit(0.1, 'L').toNumber('in^3'), 9)
    expect(formatDisplay('volume', 'us', 0.1)).toBe('6.1 in³')
  })
  it('labels and the unit a bare typed number is read in', () => {
    expect([unitLabel('mass', 'si'), unitLabel('mass', 'us'), unitLabel('volume', 'us'), unitLabel('temperature', 'us')]).toEqual(['kg', 'lb', 'in³', '°F'])
    expect(readQuantity('104', 'temperature', { bareUnit: displayUnit('temperature', 'us') })).toEqual({ ok: true, value: 40 })
    expect(readQuantity('10', 'length', { bareUnit: displayUnit('length', 'us') })).toEqual({ ok: true, value: 3.048 })
  })
})

describe('no floating-point noise in shown values', () => {
  it('writes converted values with the declared rounding only', () => {
    expect(formatDisplay('temperature', 'si', 35.00000000000015)).toBe('35 °C')
    expect(formatDisplay('temperature', 'us', 40)).toBe('104 °F')
    expect(formatDisplay('temperature', 'us', 40.3)).toBe('104.5 °F')
    expect(formatDisplay('length', 'us', 2.5)).toBe('8.2 ft')
    expect(formatDisplay('length', 'us', 30)).toBe('98.4 ft')
    expect(formatDisplay('illuminance', 'us', 1, 2)).toBe('0.093 fc')
    expect(formatDisplay('length', 'si', 1234.5678, 3, { locale: 'de-DE', timeZone: 'UTC' })).toBe('1230 m')
  })
})

describe('defaults as round numbers in the user’s units', () => {
  it.each([
    ['length', 2.5, 8],
    ['length', 2, 6.5],
    ['length', 30, 100],
    ['temperature', 25, 77],
    ['temperature', 5, 41],
    ['temperature', 30, 86],
  ] as const)('%s %s (SI) defaults to %s in US units', (kind, si, us) => {
    expect(roundDefault(kind, 'us', si)).toBe(us)
  })
  it('leaves metric defaults as they are', () => {
    expect(roundDefault('length', 'si', 2.5)).toBe(2.5)
    expect(roundDefault('temperature', 'si', 25)).toBe(25)
  })
  it('the round US default goes back to SI as what it shows (8 ft = 2.4384 m)', () => {
    expect(fromDisplay('length', 'us', roundDefault('length', 'us', 2.5))).toBe(2.4384)
  })
})

describe('regional defaults', () => {
  it('US: 120 V 60 Hz, dollars, Letter (NEC / ANSI C84.1 nominal 120 V, from memory); elsewhere 230 V 50 Hz (IEC 60038), euros, A4', () => {
    expect(regionDefaults('us')).toEqual({ supplyVoltage: '120 V', supplyFrequency: '60 Hz', currency: 'USD', paper: 'letter' })
    expect(regionDefaults('si')).toEqual({ supplyVoltage: '230 V', supplyFrequency: '50 Hz', currency: 'EUR', paper: 'a4' })
  })
})

describe('engine sentences in the reader’s units', () => {
  it.each([
    ['NiCd should be charged at 40 °C or below; the site reaches 45 °C.', 'NiCd should be charged at 104 °F or below; the site reaches 113 °F.'],
    ['specified for discharge between −20 and 50 °C', 'specified for discharge between −4 and 122 °F'],
    ['Rank 1: 5 Ah × 3 cells (0.3–0.45 kg), about 4 years at 25 °C', 'Rank 1: 5 Ah × 3 cells (0.661–0.992 lb), about 4 years at 77 °F'],
    ['Standby life halves for every 10 °C above 20 °C', 'Standby life halves for every 18 °F above 68 °F'],
    ['a 30 m route at 2.5 m, 1 lx on the floor, pack of 0.12 L', 'a 98.4 ft route at 8.2 ft, 0.0929 fc on the floor, pack of 7.32 in³'],
    ['lasts 3 min at 3 mA, 60 Hz; 1.6 Ah', 'lasts 3 min at 3 mA, 60 Hz; 1.6 Ah'],
  ])('%s', (si, us) => {
    expect(inUserUnits(si, 'us')).toBe(us)
    expect(inUserUnits(si, 'si')).toBe(si)
  })
})
