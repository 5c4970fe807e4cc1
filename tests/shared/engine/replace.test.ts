/** `replace`: a replacement pack from the old pack's label, each rule against its source. */
import { describe, expect, test } from 'vitest'
import { capacityForRuntimeAh } from '../../../shared/engine/battery-models'
import { tools } from '../../../shared/engine/registry'
import { replaceTool, type ReplaceResult } from '../../../shared/engine/replace'
import { runTool } from '../../../shared/engine/tool'

function replace(input: Record<string, unknown>): ReplaceResult {
  const outcome = runTool(replaceTool, input)
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  return outcome.result
}
const codes = (r: ReplaceResult) => r.warnings.map((w) => w.code)
/** The label of the worked example: 4-cell NiCd, 4.8 V, 1.6 Ah, sub-C; a 3 h non-maintained luminaire; nickel charger at 120 mA. */
const LABEL = {
  oldPack: { chemistry: 'nicd', nominalVoltage: '4.8 V', capacity: '1.6 Ah', cellFormat: 'sub-C' },
  duration: '3 h',
  mode: 'non-maintained',
  charger: { type: 'nickel-constant-current', chargeCurrent: '120 mA' },
}

describe('the worked example from the label', () => {
  test('4 × NiCd 1.6 Ah sub-C on a 120 mA nickel charger → 4 × high-temperature NiCd 1.6 Ah sub-C, 4.8 V (C/13 permanent: HT cells take up to 0.1 C, IEC 60285 practice, from memory; standard cells C/20, common practice)', () => {
    const r = replace(LABEL)
    expect(r.oldPackNominalVoltageV).toBeCloseTo(4.8, 12) // 4 × 1.2 V (IEC 61951-1)
    expect(r.recommended).not.toBeNull()
    const best = r.candidates[r.recommended as number]
    expect(best).toMatchObject({
      chemistry: 'nicd-ht',
      cellsInSeries: 4,
      cellFormat: 'sub-C',
      chargerCompatible: 'yes',
      sameVoltage: true,
      meetsDuration: true,
    })
    expect(best.capacityAh).toBeCloseTo(1.6, 12)
    expect(best.trickleCRate).toBeCloseTo(0.075, 12) // 0.12 A / 1.6 Ah
    const standard = r.candidates.find((c) => c.chemistry === 'nicd')
    expect(standard?.chargerCompatible).toBe('conditional')
    expect(r.dischargeSource).toBe('label')
    expect(codes(r)).toContain('discharge-current-assumed')
  })

  test('proposes one or more packs per chemistry when none are given (common practice)', () => {
    const r = replace(LABEL)
    for (const id of ['nicd', 'nicd-ht', 'nimh', 'lifepo4', 'lead-acid', 'li-ion']) expect(r.candidates.some((c) => c.chemistry === id)).toBe(true)
  })

  test('after fitting: charge 24 h, then a full rated-duration test (IEC 60598-2-22 24 h recharge; common practice)', () => {
    const r = replace(LABEL)
    expect(r.warnings.find((w) => w.code === 'charge-then-test')?.message).toMatch(/24 h.*full rated-duration test/)
  })
})

describe('same nominal voltage as the old pack (common practice; IEC 60598-2-22 marks the battery voltage, from memory)', () => {
  test('four LiFePO4 cells (12.8 V) offered for a 4.8 V pack are flagged critical and never recommended', () => {
    const r = replace({
      ...LABEL,
      charger: { type: 'unknown', chargeCurrent: '120 mA' },
      candidates: [{ chemistry: 'lifepo4', cellsInSeries: 4, capacity: '1.5 Ah' }],
    })
    expect(r.candidates[0].nominalVoltageV).toBeCloseTo(12.8, 12) // 4 × 3.2 V
    expect(r.candidates[0].sameVoltage).toBe(false)
    expect(r.warnings.find((w) => w.code === 'candidate-voltage-differs')?.severity).toBe('critical')
    expect(r.recommended).toBeNull()
    expect(codes(r)).toContain('no-suitable-candidate')
  })

  test.each<[unknown, string]>([
    [{ chemistry: 'nicd', nominalVoltage: '5 V', capacity: '1.6 Ah' }, 'oldPack.nominalVoltage'], // 5 V is not whole 1.2 V cells
    [{ chemistry: 'nicd', nominalVoltage: '4.8 V', cellsInSeries: 3, capacity: '1.6 Ah' }, 'oldPack.cellsInSeries'],
    [{ chemistry: 'nicd', capacity: '1.6 Ah' }, 'oldPack.nominalVoltage'],
    [{ chemistry: 'nicd', nominalVoltage: '4.8 V' }, 'oldPack.capacity'],
  ])('an old pack that cannot be read is refused with the field named: %o', (oldPack, path) => {
    const outcome = runTool(replaceTool, { ...LABEL, oldPack })
    expect(outcome.ok).toBe(false)
    if (!outcome.ok) expect(outcome.fields.map((f) => f.path)).toContain(path)
  })
})

describe('charger fit', () => {
  test.each(['lifepo4', 'li-ion'])(
    '%s never on a nickel constant-current charger (lithium maker practice: stop at the charge voltage; IEC 62133-2)',
    (chemistry) => {
      const cells = chemistry === 'lifepo4' ? 2 : 1
      const r = replace({
        ...LABEL,
        oldPack: { chemistry: 'nicd', cellsInSeries: 3, capacity: '1.6 Ah' },
        candidates: [{ chemistry, cellsInSeries: cells, capacity: '2 Ah' }],
      })
      expect(r.candidates[0].chargerCompatible).toBe('no')
      expect(r.warnings.find((w) => w.code === 'candidate-charger-unsuitable')?.severity).toBe('critical')
    },
  )

  test('an empty trickle reads as the charge current; lithium on a nickel charger of unknown trickle is still refused', () => {
    const r = replace({ ...LABEL, candidates: [{ chemistry: 'lifepo4', cellsInSeries: 2, capacity: '1.5 Ah' }] })
    expect(r.candidates[0].trickleCRate).toBeCloseTo(0.08, 12)
    expect(r.candidates[0].chargerCompatible).toBe('no')
  })

  test.each<[string, string, 'yes' | 'no']>([
    // NiMH on a nickel charger only within its permanent-charge limit, about C/30 (NiMH maker handbooks, from memory)
    ['40 mA', '1.6 Ah', 'yes'], // C/40
    ['120 mA', '1.6 Ah', 'no'], // C/13
  ])('NiMH, permanent %s on %s → %s', (current, capacity, verdict) => {
    // a light load, so the recharge stays within 24 h at either current
    const r = replace({
      ...LABEL,
      dischargeCurrent: '0.1 A',
      charger: { type: 'nickel-constant-current', chargeCurrent: current },
      candidates: [{ chemistry: 'nimh', cellsInSeries: 4, capacity }],
    })
    expect(r.candidates[0].chargerCompatible).toBe(verdict)
  })

  test("lithium charger made for 2 × LiFePO4: the same pack yes, Li-ion no (3.65 vs 4.2 V per cell, makers' data), nickel no (common practice)", () => {
    const r = replace({
      oldPack: { chemistry: 'lifepo4', nominalVoltage: '6.4 V', capacity: '1.5 Ah' },
      duration: '3 h',
      mode: 'non-maintained',
      dischargeCurrent: '0.3 A',
      charger: { type: 'lithium-cc-cv', chargeCurrent: '300 mA', trickleCurrent: 0 },
      candidates: [
        { chemistry: 'lifepo4', cellsInSeries: 2, capacity: '1.5 Ah' },
        { chemistry: 'li-ion', cellsInSeries: 2, capacity: '1.5 Ah' },
        { chemistry: 'nimh', cellsInSeries: 5, capacity: '2 Ah' },
      ],
    })
    expect(r.candidates.map((c) => c.chargerCompatible)).toEqual(['yes', 'no', 'no'])
    expect(r.recommended).toBe(0)
  })

  test('nickel cells never on a lead-acid float charger (thermal runaway at constant voltage, common practice)', () => {
    const r = replace({
      ...LABEL,
      oldPack: { chemistry: 'lead-acid', nominalVoltage: '6 V', capacity: '4 Ah' },
      charger: { type: 'lead-acid-float', chargeCurrent: '400 mA' },
      candidates: [{ chemistry: 'nicd', cellsInSeries: 5, capacity: '4 Ah' }],
    })
    expect(r.candidates[0].chargerCompatible).toBe('no')
  })
})

describe('capacity for the rated duration at end of life', () => {
  test('required capacity: C_P / (DoD · f_T · f_EoL) with Peukert C_P = I·H·(t/H)^(1/k) (battery handbooks; IEEE 450 80 % end of life)', () => {
    const r = replace({ ...LABEL, dischargeCurrent: '0.4 A', ambientMin: '5 °C' })
    const fT = 0.85 + (1 - 0.85) * (5 / 20) // NiCd cold curve, linear between 0 °C and 20 °C (maker manual)
    const expected = capacityForRuntimeAh(0.4, 3, 5, 1.1) / (1 * fT * 0.8)
    expect(r.requiredCapacityAh).toBeCloseTo(expected, 9)
    expect(r.dischargeSource).toBe('measured')
  })

  test('a candidate short of the duration at end of life is flagged and not recommended', () => {
    const r = replace({
      ...LABEL,
      dischargeCurrent: '0.4 A',
      candidates: [
        { chemistry: 'nicd-ht', cellsInSeries: 4, capacity: '1.1 Ah' },
        { chemistry: 'nicd-ht', cellsInSeries: 4, capacity: '2.2 Ah' },
      ],
    })
    expect(r.candidates[0].meetsDuration).toBe(false)
    expect(r.candidates[0].runtimeEndOfLifeH).toBeLessThan(3)
    expect(r.warnings.find((w) => w.code === 'candidate-short-of-duration')?.severity).toBe('critical')
    expect(r.recommended).toBe(1)
  })

  test('from the load: converter drive, I = P / (η · V) at the old pack voltage (power balance, common practice)', () => {
    const r = replace({ ...LABEL, load: { power: '1.632 W' }, driverEfficiency: 0.85 })
    expect(r.dischargeCurrentA).toBeCloseTo(1.632 / 0.85 / 4.8, 12)
    expect(r.dischargeSource).toBe('load')
  })
})

describe('high-temperature cells for maintained luminaires or warm places (emergency NiCd practice; IEC 60285 long-term high-temperature charge)', () => {
  test.each<[string, number]>([
    ['maintained', 25],
    ['non-maintained', 35], // standard NiCd life 5 y · 2^(−10/10) = 2.5 y < 4 y (Arrhenius 10 °C rule, common practice)
  ])('%s at %d °C: standard cells do not suit, high-temperature cells are recommended', (mode, ambientMax) => {
    const r = replace({
      ...LABEL,
      mode,
      ambientMax,
      dischargeCurrent: '0.3 A',
      charger: { type: 'nickel-constant-current', chargeCurrent: '60 mA' },
      candidates: [
        { chemistry: 'nicd', cellsInSeries: 4, capacity: '1.6 Ah', cellFormat: 'sub-C' },
        { chemistry: 'nicd-ht', cellsInSeries: 4, capacity: '1.6 Ah', cellFormat: 'sub-C' },
      ],
    })
    expect(r.needsHighTemperature).toBe(true)
    expect(r.candidates[0].suitsTemperature).toBe(false)
    expect(r.recommended).toBe(1)
  })

  test('a label marked high-temperature NiCd reads as high-temperature cells', () => {
    const r = replace({ ...LABEL, oldPack: { ...LABEL.oldPack, highTemperature: true } })
    expect(r.oldPack.chemistry).toBe('nicd-ht')
  })
})

describe('cell format', () => {
  test('a different format is a warning to check the fit and the connector (common practice)', () => {
    const r = replace({ ...LABEL, dischargeCurrent: '0.3 A', candidates: [{ chemistry: 'nicd-ht', cellsInSeries: 4, capacity: '2.5 Ah', cellFormat: 'C' }] })
    expect(r.candidates[0].sameFormat).toBe(false)
    expect(r.candidates[0].reasons.join(' ')).toMatch(/fits the compartment.*connector/)
    expect(r.warnings.find((w) => w.code === 'cell-format-check')?.severity).toBe('warning')
  })
  test('"Sub C" and "sub-C" are the same format', () => {
    const r = replace({ ...LABEL, candidates: [{ chemistry: 'nicd-ht', cellsInSeries: 4, capacity: '1.6 Ah', cellFormat: 'Sub C' }] })
    expect(r.candidates[0].sameFormat).toBe(true)
  })
})

describe('the recommendation', () => {
  const variants: Array<Record<string, unknown>> = [
    LABEL,
    { ...LABEL, mode: 'maintained' },
    { ...LABEL, ambientMax: 40 },
    { ...LABEL, dischargeCurrent: '0.9 A' },
    { ...LABEL, charger: { type: 'unknown', chargeCurrent: '50 mA' } },
    {
      ...LABEL,
      oldPack: { chemistry: 'lead-acid', nominalVoltage: '6 V', capacity: '4 Ah' },
      charger: { type: 'lead-acid-float', chargeCurrent: '400 mA', trickleCurrent: '20 mA' },
    },
    {
      ...LABEL,
      oldPack: { chemistry: 'lifepo4', nominalVoltage: '3.2 V', capacity: '1.5 Ah' },
      charger: { type: 'lithium-cc-cv', chargeCurrent: '300 mA', trickleCurrent: 0 },
    },
  ]
  test.each(variants)('always meets the duration, keeps the voltage and is not refused by the charger: %o', (input) => {
    const r = replace(input)
    if (r.recommended === null) {
      expect(codes(r)).toContain('no-suitable-candidate')
      return
    }
    const c = r.candidates[r.recommended]
    expect(c.meetsDuration).toBe(true)
    expect(c.sameVoltage).toBe(true)
    expect(c.chargerCompatible).not.toBe('no')
  })

  test('is listed in the registry (CLI and POST /api/calc/replace)', () => {
    expect(tools.replace.name).toBe('replace')
  })
})
