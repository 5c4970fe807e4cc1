/** Chemistry data against handbook and standard values; every value must carry a source. */
import { describe, expect, test } from 'vitest'
import { CHEMISTRIES, CHEMISTRY_IDS, getChemistry, type Chemistry, type ChemistryId } from '../../../shared/engine/chemistries'
import type { Reference } from '../../../shared/engine/types'

const all = CHEMISTRY_IDS.map((id) => [id, CHEMISTRIES[id]] as [ChemistryId, Chemistry])
const BASES = ['published', 'common practice', 'from memory', 'derived']

function sourcedValues(c: Chemistry): Array<[string, Reference]> {
  const out: Array<[string, Reference]> = []
  for (const [key, value] of Object.entries(c)) {
    if (value && typeof value === 'object' && 'ref' in value) out.push([key, (value as { ref: Reference }).ref])
  }
  if (c.float)
    for (const [key, value] of Object.entries(c.float)) if (value && typeof value === 'object' && 'ref' in value) out.push([`float.${key}`, value.ref])
  return out
}

describe('every chemistry value carries a source', () => {
  test.each(all)('%s: all sourced values name a source and a basis', (_id, c) => {
    const refs = sourcedValues(c)
    expect(refs.length).toBeGreaterThanOrEqual(20)
    for (const [key, ref] of refs) {
      expect(ref.source.length, key).toBeGreaterThan(5)
      expect(BASES, key).toContain(ref.basis)
    }
  })

  test.each(all)('%s: voltages ordered min safe < cut-off < nominal < full charge', (_id, c) => {
    expect(c.minSafeCellVoltage.value).toBeLessThanOrEqual(c.cutoffCellVoltage.value)
    expect(c.cutoffCellVoltage.value).toBeLessThan(c.nominalCellVoltage.value)
    expect(c.nominalCellVoltage.value).toBeLessThan(c.fullChargeCellVoltage.value)
  })

  test.each(all)('%s: cold curve sorted, spans −40..85 °C, fractions in (0, 1], non-decreasing', (_id, c) => {
    const curve = c.coldCapacityCurve.value
    expect(curve[0][0]).toBe(-40)
    expect(curve[curve.length - 1][0]).toBe(85)
    for (let i = 1; i < curve.length; i++) {
      expect(curve[i][0]).toBeGreaterThan(curve[i - 1][0])
      expect(curve[i][1]).toBeGreaterThanOrEqual(curve[i - 1][1])
    }
    for (const [, f] of curve) expect(f > 0 && f <= 1).toBe(true)
  })

  test.each(all)('%s: capacity ladder ascending and positive; ranges ordered', (_id, c) => {
    const ladder = c.capacityLadderAh.value
    ladder.forEach((x, i) => {
      expect(x).toBeGreaterThan(i === 0 ? 0 : ladder[i - 1])
    })
    for (const r of [
      c.continuousChargeRangeC,
      c.chargeTemperatureC,
      c.dischargeTemperatureC,
      c.selfDischargePctPerMonth,
      c.peukertExponent,
      c.specificEnergyWhPerKg,
      c.energyDensityWhPerL,
    ]) {
      expect(r.value.min).toBeLessThanOrEqual(r.value.max)
    }
    expect(c.chargeFactor.value).toBeGreaterThanOrEqual(1)
    expect(c.disposal.length + c.regulatory.length + c.hazards.length).toBeGreaterThanOrEqual(3)
  })
})

describe('handbook and standard values', () => {
  test.each<[ChemistryId, number, number]>([
    ['nicd', 1.2, 1.0], // IEC 61951-1; Battery Reference Book: 1.2 V nominal, 1.0 V end of discharge
    ['nicd-ht', 1.2, 1.0], // IEC 61951-1 / IEC 60285 high-temperature cells, same electrochemistry
    ['nimh', 1.2, 1.0], // IEC 61951-2; NiMH maker's handbook
    ['lead-acid', 2.0, 1.75], // IEC 61056-1 nominal; VRLA maker's manual: 1.75 V/cell at ≤ 0.2 C
    ['lifepo4', 3.2, 2.5], // lithium iron phosphate cell makers' manuals
    ['li-ion', 3.6, 3.0], // IEC 61960-3 nominal 3.6 V; 3.0 V cut-off is common practice
  ])('%s: nominal %d V, cut-off %d V per cell', (id, nominal, cutoff) => {
    expect(getChemistry(id).nominalCellVoltage.value).toBe(nominal)
    expect(getChemistry(id).cutoffCellVoltage.value).toBe(cutoff)
  })

  test('NiMH standard charge 0.1 It (× 16 h) — IEC 61951-2, NiMH maker handbook', () => {
    expect(getChemistry('nimh').standardChargeRateC.value).toBe(0.1)
    expect(getChemistry('nicd').standardChargeRateC.value).toBe(0.1) // IEC 61951-1 (from memory)
  })

  test('VRLA float 2.25 V/cell at 25 °C, −3 mV/°C/cell, band 2.25–2.30 — VRLA maker manual', () => {
    const float = getChemistry('lead-acid').float
    expect(float?.cellVoltageAt25C.value).toBe(2.25)
    expect(float?.coefficientVPerC.value).toBe(-0.003)
    expect(float?.bandAt25C?.value).toEqual({ min: 2.25, max: 2.3 })
  })

  test('VRLA maximum initial charge current 0.3 C — VRLA maker manual', () => {
    expect(getChemistry('lead-acid').maxChargeRateC.value).toBe(0.3)
  })

  test('lead-acid life halves per 8 °C (battery handbooks); others use the 10 °C Arrhenius rule (common practice)', () => {
    expect(getChemistry('lead-acid').lifeHalvingIntervalC.value).toBe(8)
    for (const id of ['nicd', 'nimh', 'lifepo4', 'li-ion'] as const) expect(getChemistry(id).lifeHalvingIntervalC.value).toBe(10)
  })

  test('VRLA end voltage by rate: 1.75 / 1.70 / 1.55 / 1.30 V per cell — VRLA maker manual table', () => {
    expect(getChemistry('lead-acid').cutoffByDischargeRate?.value).toEqual([
      [0.2, 1.75],
      [0.5, 1.7],
      [1, 1.55],
      [100, 1.3],
    ])
  })

  test('lithium: no trickle, no charge below 0 °C; LiFePO4 3.6 V and NMC 4.2 V full — IEC 62133-2 practice, cell makers', () => {
    for (const id of ['lifepo4', 'li-ion'] as const) {
      const c = getChemistry(id)
      expect(c.continuousChargeRangeC.value.max).toBe(0)
      expect(c.noChargeBelowFreezing).toBe(true)
      expect(c.chargeTemperatureC.value.min).toBe(0)
    }
    expect(getChemistry('lifepo4').fullChargeCellVoltage.value).toBe(3.6)
    expect(getChemistry('li-ion').fullChargeCellVoltage.value).toBe(4.2)
    expect(getChemistry('li-ion').minSafeCellVoltage.value).toBe(2.5)
  })

  test('NiCd permanent charge from C/30 (Battery Reference Book); NiMH trickle capped at C/30 (maker handbooks, from memory)', () => {
    expect(getChemistry('nicd').continuousChargeRangeC.value.min).toBeCloseTo(1 / 30, 9)
    expect(getChemistry('nimh').continuousChargeRangeC.value.max).toBeCloseTo(1 / 30, 9)
    expect(getChemistry('nicd-ht').continuousChargeRangeC.value.max).toBeGreaterThan(getChemistry('nimh').continuousChargeRangeC.value.max)
  })

  test('NiCd cold capacity at −20 °C: 50–60 % standard, 40–50 % high-temperature — NiCd maker application manual', () => {
    const at = (c: Chemistry) => c.coldCapacityCurve.value.find(([t]) => t === -20)?.[1] ?? Number.NaN
    expect(at(getChemistry('nicd'))).toBeGreaterThanOrEqual(0.5)
    expect(at(getChemistry('nicd'))).toBeLessThanOrEqual(0.6)
    expect(at(getChemistry('nicd-ht'))).toBeGreaterThanOrEqual(0.4)
    expect(at(getChemistry('nicd-ht'))).toBeLessThanOrEqual(0.5)
  })

  test('cadmium: EU 2023/1542 0.002 % limit and an unsettled classification are flagged', () => {
    for (const id of ['nicd', 'nicd-ht'] as const) {
      const text = getChemistry(id).regulatory.join(' ')
      expect(text).toContain('0.002 %')
      expect(text).toMatch(/portable or an industrial/)
    }
    expect(getChemistry('li-ion').regulatory.join(' ')).toContain('UN 38.3')
    expect(getChemistry('lead-acid').disposal.join(' ')).toMatch(/lead/i)
  })

  test('getChemistry rejects an unknown id', () => {
    expect(() => getChemistry('nicad' as ChemistryId)).toThrow(/unknown chemistry/)
  })
})
