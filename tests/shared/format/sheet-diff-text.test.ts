/** The revision comparison in words: labels for paths, words for codes, units and rounding as on the sheet. */
import { describe, expect, it } from 'vitest'
import { diffSheets } from '../../../shared/schemas/sheet-diff'
import { changeRows } from '../../../shared/schemas/sheet-diff-text'
import { codesIn } from '../../helpers/pdf-checks'

const base = { title: 'Corridor pack', reference: 'R-1', client: 'Invented client', site: 'Invented site', luminaire: '' }

describe('changeRows', () => {
  const changes = diffSheets(
    {
      ...base,
      inputs: { chemistry: 'nicd', driver: 'direct', ambientMax: '35 degC', driverEfficiency: 0.82, load: { power: '3 W' } },
      results: { requiredCapacityAh: 1.23456, runtimeH: 3.4567 },
      engineVersion: '1.3.0',
    },
    {
      ...base,
      title: 'Corridor pack B',
      inputs: { chemistry: 'nicd-ht', driver: 'converter', ambientMax: '-10 degC', driverEfficiency: 0.8, load: { power: '3.5 W' } },
      results: { requiredCapacityAh: 1.6789, runtimeH: 3.1 },
      engineVersion: '1.4.0',
    },
  )
  const rows = changeRows(changes, { locale: 'en-GB', timeZone: 'UTC' })
  const byLabel = Object.fromEntries(rows.map((r) => [r.label, r]))

  it('names each field in words, never by its path', () => {
    expect(rows.map((r) => r.label)).toEqual(
      expect.arrayContaining([
        'Title',
        'Chemistry',
        'Driver',
        'Highest ambient',
        'Converter efficiency',
        'LED power in emergency mode',
        'Required rated capacity (result)',
        'Runtime, new pack (result)',
        'Calculation engine version',
      ]),
    )
    expect(rows.some((r) => /\./.test(r.label) && !/\s/.test(r.label))).toBe(false)
  })

  it('writes codes as words, units with their usual symbols, fractions as percentages', () => {
    expect(byLabel['Chemistry']).toEqual({ label: 'Chemistry', before: 'Nickel-cadmium (standard cells)', after: 'Nickel-cadmium (high-temperature cells)' })
    expect(byLabel['Driver'].after).toBe('Converter (DC-DC driver)')
    expect(byLabel['Highest ambient']).toMatchObject({ before: '35 °C', after: '−10 °C' })
    expect(byLabel['Converter efficiency']).toMatchObject({ before: '82 %', after: '80 %' })
  })

  it('rounds result figures to three significant digits with their unit', () => {
    expect(byLabel['Required rated capacity (result)']).toMatchObject({ before: '1.23 Ah', after: '1.68 Ah' })
    expect(byLabel['Runtime, new pack (result)']).toMatchObject({ before: '3.46 h', after: '3.1 h' })
  })

  it('leaves no enumeration code or engine unit name in the text', () => {
    expect(codesIn(rows.flatMap((r) => [r.label, r.before, r.after]))).toEqual([])
  })
})
