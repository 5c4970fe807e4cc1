/** The pack bench's own rules on top of the engine: switching chemistry and the all-chemistries table. */
import { describe, expect, test } from 'vitest'
import { CHEMISTRY_IDS, type ChemistryId } from '../../shared/engine/chemistries'
import { changeChemistry, type BenchValues } from '../../src/lib/pack-bench-form'
import { recalcPack } from '../../src/lib/pack-recalc'

const luminaire = { duration: '3 h', driver: 'converter', load: { power: '2 W' }, driverEfficiency: '0.85', ambientMin: '5 °C', ambientMax: '25 °C' }

function volts(values: BenchValues) {
  const calc = recalcPack(values)
  if (!calc.result) throw new Error(JSON.stringify(calc.fields))
  return calc.result
}

describe('switching chemistry keeps the pack voltage or says so critically (common practice: a pack keeps the voltage the luminaire is marked for)', () => {
  const starts: BenchValues[] = [
    { ...luminaire, chemistry: 'nicd' }, // the usual 3-cell pack, 3.6 V
    { ...luminaire, chemistry: 'nicd', cellsInSeries: '4' }, // 4.8 V
    { ...luminaire, chemistry: 'nicd', cellsInSeries: '4', capacity: '1.6 Ah' },
    { ...luminaire, chemistry: 'nicd', nominalVoltage: '4.8 V' },
  ]
  test.each(starts.flatMap((start) => CHEMISTRY_IDS.map((next) => [start, next] as [BenchValues, ChemistryId])))('%o → %s', (start, next) => {
    const before = volts(start)
    const after = volts(changeChemistry(start, next, before))
    const sameVoltage = Math.abs(after.nominalVoltageV - before.nominalVoltageV) <= 0.01 * before.nominalVoltageV
    const critical = after.warnings.some((w) => w.code === 'pack-voltage-changed' && w.severity === 'critical')
    expect(sameVoltage || critical).toBe(true)
  })

  test('NiCd 4 cells (4.8 V) → NiMH keeps 4 cells; → LiFePO4 never 4 cells (12.8 V)', () => {
    const start = { ...luminaire, chemistry: 'nicd', cellsInSeries: '4' }
    const before = volts(start)
    expect(volts(changeChemistry(start, 'nimh', before)).cellsInSeries).toBe(4)
    const lfp = volts(changeChemistry(start, 'lifepo4', before))
    expect(lfp.cellsInSeries).not.toBe(4)
  })
})

describe('the all-chemistries table respects the pack (common practice)', () => {
  test('its chosen row is the pack in the results; every other row keeps the pack voltage or carries a critical warning', () => {
    const calc = recalcPack({ ...luminaire, chemistry: 'nicd', nominalVoltage: '4.8 V', capacity: '1.6 Ah' })
    const result = calc.result
    const rows = calc.comparison?.rows ?? []
    const chosen = rows.find((r) => r.chemistry === 'nicd')
    expect(chosen?.cellsInSeries).toBe(result?.cellsInSeries)
    expect(chosen?.selectedCapacityAh).toBe(result?.selectedCapacityAh)
    for (const row of rows) {
      const voltage = recalcPack({ ...luminaire, chemistry: row.chemistry, cellsInSeries: String(row.cellsInSeries) }).result?.nominalVoltageV ?? 0
      const critical = row.warnings.some((w) => w.severity === 'critical')
      expect(Math.abs(voltage - 4.8) <= 0.048 || critical).toBe(true)
    }
  })
})
