/** `size` and the battery models against worked examples from standards and handbooks. */
import { describe, expect, test } from 'vitest'
import {
  annexADischargeFraction,
  annexAMaxCurrentA,
  capacityForRuntimeAh,
  coldCapacityFactor,
  cutoffCellVoltageAtRate,
  interpolate,
  peukertExponentFromTests,
  peukertRuntimeFromConstantH,
  peukertRuntimeH,
  runtimeH,
  serviceLifeYears,
} from '../../../shared/engine/battery-models'
import { getChemistry } from '../../../shared/engine/chemistries'
import { sizePack, sizeTool, type SizeResult } from '../../../shared/engine/size'
import { runTool } from '../../../shared/engine/tool'
import { tools } from '../../../shared/engine/registry'

function size(input: Record<string, unknown>): SizeResult {
  const outcome = runTool(sizeTool, input)
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  return outcome.result
}
const codes = (r: { warnings: { code: string }[] }) => r.warnings.map((w) => w.code)

describe('Peukert', () => {
  test('Cp = 100, k = 1.2, I = 5 A → 14.50 h (textbook worked example, constant form t = Cp/I^k)', () => {
    expect(peukertRuntimeFromConstantH(100, 5, 1.2)).toBeCloseTo(14.4956, 4)
  })
  test('C = 250, I = 20 A, n = 1.3 → 5.0886 h; delivered 101.77 Ah (published tutorial example)', () => {
    const t = peukertRuntimeFromConstantH(250, 20, 1.3)
    expect(t).toBeCloseTo(5.0886, 4)
    expect(t * 20).toBeCloseTo(101.77, 2)
  })
  test.each<[number, number, number, number, number]>([
    // rated-capacity form t = H·(C/(I·H))^k (battery handbooks); values derived by hand
    [100, 20, 1.2, 5, 20], // identity at the rated current
    [100, 20, 1.2, 10, 8.706],
    [100, 20, 1.1, 10, 9.33],
    [100, 20, 1.1, 20, 4.353],
  ])('C = %d Ah @ %d h, k = %d, I = %d A → %d h (rated-capacity form, derived)', (c, h, k, i, expected) => {
    expect(peukertRuntimeH(c, i, h, k)).toBeCloseTo(expected, 2)
  })
  test('two-test exponent: (10 A, 8.7055 h) and (5 A, 20 h) → k = 1.200 (battery-monitor manual formula)', () => {
    expect(peukertExponentFromTests(10, 8.7055, 5, 20)).toBeCloseTo(1.2, 3)
  })
  test.each<[number, number]>([
    [0.5, 1.1],
    [3, 1.25],
    [20, 1.15],
    [40, 1.05],
  ])('capacityForRuntimeAh inverts runtimeH (t = %d h, k = %d; derived)', (t, k) => {
    const c = capacityForRuntimeAh(2, t, 20, k)
    expect(runtimeH(c, 2, 20, k)).toBeCloseTo(t, 9)
  })
  test('no credit below the rated current: 100 Ah @ 20 h at 2 A runs 50 h, not more (common practice)', () => {
    expect(runtimeH(100, 2, 20, 1.2)).toBeCloseTo(50, 9)
    expect(peukertRuntimeH(100, 2, 20, 1.2)).toBeGreaterThan(50)
  })
})

describe('IEC 60598-2-22 Annex A discharge limit', () => {
  test.each<[number, number]>([
    [3, 1.125], // 4.5 Ah → 1 125 mA for 3 h (Annex A, as paraphrased in a trade article)
    [1.5, 1.8], // 4.5 Ah → 1 800 mA for 90 min
    [1, 2.7], // 60 % of 4.5 Ah for 1 h
  ])('4.5 Ah for %d h → %d A', (t, amps) => {
    expect(annexAMaxCurrentA(4.5, t)).toBeCloseTo(amps, 9)
  })
  test.each<[number, number]>([
    [0.5, 0.6],
    [2, 0.35],
    [2.25, 0.325],
    [6, 0.125],
  ])('fraction at %d h = %d (interpolated / extrapolated as documented; derived)', (t, f) => {
    expect(annexADischargeFraction(t)).toBeCloseTo(f, 9)
  })
  test.each<[string, boolean]>([
    ['1.2 A', true],
    ['1.1 A', false],
  ])('a 4.5 Ah NiCd pack for 3 h at %s: limit exceeded = %s (Annex A: 1.125 A)', (current, exceeded) => {
    const r = size({
      chemistry: 'nicd',
      capacity: '4.5 Ah',
      duration: '3 h',
      driver: 'direct',
      cellsInSeries: 3,
      load: { ledVoltage: '3 V', ledCurrent: current },
    })
    expect(codes(r).includes('annex-a-discharge-exceeded')).toBe(exceeded)
    expect(r.annexAMaxCurrentA).toBeCloseTo(1.125, 9)
  })
  test('a chosen pack always meets the Annex A limit (Annex A)', () => {
    const r = size({
      chemistry: 'lifepo4',
      duration: '1 h',
      load: { power: '10 W' },
      ambientMin: 25,
      endOfLifeCapacity: 1,
      designMargin: 0,
      depthOfDischarge: 1,
    })
    expect(r.averageCurrentA).toBeLessThanOrEqual(r.annexAMaxCurrentA + 1e-12)
    expect(codes(r)).toContain('annex-a-set-capacity')
  })
})

describe('rated durations', () => {
  test.each<[string, number, string]>([
    ['1 h', 1, 'EN 1838 minimum'],
    ['90 min', 1.5, 'NFPA 101 7.9.2.1'],
    ['3 h', 3, 'BS 5266-1 sleeping risk'],
  ])('%s (%s h, %s): chosen pack lasts the duration at end of life, no short-duration warning', (duration, h, _source) => {
    const r = size({ chemistry: 'nicd', duration, load: { power: '3 W' } })
    expect(r.runtimeEndOfLifeH).toBeGreaterThanOrEqual(h)
    expect(r.runtimeH).toBeGreaterThanOrEqual(r.runtimeEndOfLifeH)
    expect(codes(r)).not.toContain('duration-below-minimum')
  })
  test('30 min is below the EN 1838 minimum of 1 h', () => {
    expect(codes(size({ chemistry: 'nicd', duration: '30 min', load: { power: '3 W' } }))).toContain('duration-below-minimum')
  })
})

describe('capacity sizing worked examples', () => {
  // Fire-alarm panel practice (DIN VDE 0833-2, multiplicative factors): K = (I_R·t_R + I_A·t_A)·k_dis·k_age.
  // One average current over the whole time gives the same ampere-hours; a 1 h rating basis keeps Peukert out.
  test.each<[string, number, number, number, number, number]>([
    ['12 h standby + 0.5 h alarm', 0.9 * 12 + 3.5 * 0.5, 12.5, 0.1, 0.8, 17.256],
    ['24 h standby + 0.5 h alarm', 0.9 * 24 + 3.5 * 0.5, 24.5, 0, 0.8, 29.1875],
    ['72 h standby + 0.5 h alarm', 0.9 * 72 + 3.5 * 0.5, 72.5, 0, 1, 66.55],
  ])('%s → %d Ah × factors = %d Ah (DIN VDE 0833-2 panel-manual example)', (_case, ah, t, margin, eol, expected) => {
    const r = size({
      chemistry: 'lead-acid',
      driver: 'direct',
      cellsInSeries: 12,
      load: { ledVoltage: '12 V', ledCurrent: ah / t },
      duration: `${t} h`,
      ratedHours: 1,
      designMargin: margin,
      endOfLifeCapacity: eol,
      depthOfDischarge: 1,
      ambientMin: 25,
      ambientMax: 25,
    })
    expect(r.requiredCapacityAh).toBeCloseTo(expected, 3)
  })

  test('3 W converter NiCd for 3 h at 5 °C: every factor as in the method (derived by hand)', () => {
    const r = size({ chemistry: 'nicd', duration: '3 h', load: { power: '3 W' } })
    const p = 3 / 0.85
    const i = p / 3.6
    const cp = i * 5 * Math.pow(3 / 5, 1 / 1.1)
    const fT = 0.85 + (0.15 * 5) / 20
    expect(r.cellsInSeries).toBe(3)
    expect(r.averagePowerW).toBeCloseTo(p, 12)
    expect(r.averageCurrentA).toBeCloseTo(i, 12)
    expect(r.requiredCapacityAh).toBeCloseTo((cp * 1.1) / (1 * 0.8 * fT), 12)
    expect(r.selectedCapacityAh).toBe(5)
    expect(r.dischargeCRate).toBeCloseTo(i / 5, 12)
    expect(r.energyWh).toBeCloseTo(18, 12)
    expect(r.massKg).toEqual({ min: 18 / 60, max: 18 / 40 })
    expect(r.cutoffVoltageV).toBeCloseTo(3, 12)
    expect(r.working.map((s) => s.id)).toEqual(
      expect.arrayContaining([
        'requiredCapacityAh',
        'selectedCapacityAh',
        'runtimeH',
        'runtimeEndOfLifeH',
        'serviceLifeYears',
        'massKg',
        'volumeL',
        'cutoffVoltageV',
      ]),
    )
  })

  test('lead-acid cold factors follow the IEEE 485 correction table (from memory): 0.77 at 4.4 °C, 0.84 at 10 °C', () => {
    expect(coldCapacityFactor(getChemistry('lead-acid'), 4.4)).toBeCloseTo(0.77, 9)
    expect(coldCapacityFactor(getChemistry('lead-acid'), 10)).toBeCloseTo(0.84, 9)
    expect(
      interpolate(
        [
          [0, 0],
          [10, 1],
        ],
        -5,
      ),
    ).toBe(0)
    expect(
      interpolate(
        [
          [0, 0],
          [10, 1],
        ],
        15,
      ),
    ).toBe(1)
  })

  test.each<[number, number]>([
    [0.1, 1.75],
    [0.3, 1.7],
    [0.8, 1.55],
    [2, 1.3],
    [500, 1.3],
  ])('lead-acid end voltage at %d C = %d V/cell (VRLA maker manual table)', (rate, volts) => {
    expect(cutoffCellVoltageAtRate(getChemistry('lead-acid'), rate)).toBe(volts)
  })
})

describe('service life', () => {
  test.each<[number, number]>([
    [25, 10],
    [33, 5],
    [41, 2.5],
    [20, 10],
  ])('lead-acid 10 y at 25 °C → %d °C gives %d y (life halves per 8 °C, battery handbooks)', (t, years) => {
    expect(serviceLifeYears(10, 25, 8, t)).toBeCloseTo(years, 9)
  })
  test('size reports life at ambientMax and warns below the design life (IEC 60598-2-22: 4 years)', () => {
    const warm = size({ chemistry: 'lead-acid', duration: '3 h', load: { power: '3 W' }, ambientMax: 41 })
    expect(warm.serviceLifeYears).toBeCloseTo(5 / 4, 9)
    expect(codes(warm)).toContain('service-life-short')
    const cool = size({ chemistry: 'lead-acid', duration: '3 h', load: { power: '3 W' }, ambientMax: 25 })
    expect(codes(cool)).not.toContain('service-life-short')
  })
})

describe('cell count', () => {
  test.each<[string, string, number]>([
    // n · V_cut ≥ V_LED + 0.3 V for the current limiter.
    ['nicd', '2.7 V', 3], // 3 × 1.0 V reaches 2.7 + 0.3 V exactly
    ['nicd', '3.0 V', 4], // 3 × 1.0 V would leave the limiter nothing
    ['lead-acid', '4.95 V', 3], // 3 × 1.75 = 5.25 V
    ['lead-acid', '5 V', 4],
    ['lifepo4', '2.9 V', 2],
  ])('direct %s with a %s LED string → %d cells (string lit at its current to the cut-off; common practice)', (chemistry, ledVoltage, cells) => {
    const r = size({ chemistry, duration: '1 h', driver: 'direct', load: { ledVoltage, ledCurrent: '200 mA' } })
    expect(r.cellsInSeries).toBe(cells)
    expect(r.averageCurrentA).toBeCloseTo(0.2, 12)
  })
  test('converter window 5–9 V with NiCd → 5 cells (5 × 1.0 V ≥ 5 V; 5 × 1.45 V ≤ 9 V)', () => {
    const r = size({ chemistry: 'nicd', duration: '1 h', load: { power: '2 W' }, converterInput: { min: '5 V', max: '9 V' } })
    expect(r.cellsInSeries).toBe(5)
    expect(codes(r)).not.toContain('converter-window-high')
  })
  test('converter window that no cell count fits is flagged critical', () => {
    const r = size({ chemistry: 'lead-acid', duration: '1 h', load: { power: '2 W' }, converterInput: { min: '5 V', max: '6 V' } })
    expect(codes(r)).toContain('converter-window-high')
    expect(r.warnings[0].severity).toBe('critical')
  })
  test('given cells below the converter minimum input are critical', () => {
    const r = size({ chemistry: 'nicd', cellsInSeries: 3, duration: '1 h', load: { power: '2 W' }, converterInput: { min: '5 V' } })
    expect(r.warnings.find((w) => w.code === 'converter-window-low')?.severity).toBe('critical')
  })
  test('only a maximum input: the usual pack trimmed to fit; none: the usual pack', () => {
    expect(size({ chemistry: 'nicd', duration: '1 h', load: { power: '2 W' }, converterInput: { max: '3 V' } }).cellsInSeries).toBe(2)
    expect(size({ chemistry: 'lead-acid', duration: '1 h', load: { power: '2 W' } }).cellsInSeries).toBe(3)
  })
  test('given cells too few for the LED string are critical', () => {
    const r = size({ chemistry: 'nicd', duration: '1 h', driver: 'direct', cellsInSeries: 2, load: { ledVoltage: '3 V', ledCurrent: '0.2 A' } })
    expect(r.warnings.find((w) => w.code === 'led-string-drops-out')?.severity).toBe('critical')
  })
})

describe('checking an existing pack', () => {
  test.each<[string, string]>([
    ['0.8 Ah', 'pack-too-small'],
    ['1.5 Ah', 'pack-too-small-end-of-life'],
    ['1.7 Ah', 'margin-not-met'],
  ])('NiCd %s for 1 h at 1.1 A → %s', (capacity, code) => {
    const r = size({
      chemistry: 'nicd',
      capacity,
      duration: '1 h',
      driver: 'direct',
      cellsInSeries: 3,
      load: { ledVoltage: '3 V', ledCurrent: '1.1 A' },
      ambientMin: 20,
    })
    expect(codes(r)).toContain(code)
    expect(r.capacityGiven).toBe(true)
  })
  test('a big enough pack passes quietly and runs past the duration at end of life', () => {
    const r = size({
      chemistry: 'nicd',
      capacity: '4.5 Ah',
      duration: '1 h',
      driver: 'direct',
      cellsInSeries: 3,
      load: { ledVoltage: '2.7 V', ledCurrent: '1.1 A' },
      ambientMin: 20,
    })
    expect(r.warnings.filter((w) => w.severity !== 'info' && w.code !== 'cadmium-restricted')).toEqual([])
    expect(r.runtimeEndOfLifeH).toBeGreaterThan(1)
  })
  test('a load too large for the ladder picks a rounded capacity and says so', () => {
    const r = size({ chemistry: 'nimh', duration: '3 h', load: { power: '60 W' }, capacityLadder: ['1 Ah', '2 Ah'] })
    expect(codes(r)).toContain('beyond-ladder')
    expect(r.selectedCapacityAh).toBeGreaterThanOrEqual(r.requiredCapacityAh)
  })
  test('a custom ladder is used in ascending order', () => {
    const r = size({ chemistry: 'nimh', duration: '1 h', load: { power: '1 W' }, capacityLadder: ['10 Ah', '1000 mAh', '2.5 Ah'] })
    expect([1, 2.5, 10]).toContain(r.selectedCapacityAh)
  })
})

describe('temperature and safety warnings', () => {
  test.each<[string, number, boolean]>([
    ['lifepo4', -5, true],
    ['li-ion', -1, true],
    ['lifepo4', 0, false],
    ['nicd', -5, false],
  ])('%s at ambientMin %d °C: charge forbidden = %s (lithium cells: no charge below 0 °C)', (chemistry, t, forbidden) => {
    const r = size({ chemistry, duration: '1 h', load: { power: '2 W' }, ambientMin: t })
    expect(codes(r).includes('charge-forbidden-cold')).toBe(forbidden)
    if (forbidden) expect(r.warnings[0].severity).toBe('critical')
  })
  test('warnings are sorted critical → warning → info', () => {
    const r = size({
      chemistry: 'li-ion',
      duration: '30 min',
      load: { power: '2 W', mainsPower: '4 W' },
      ambientMin: -30,
      ambientMax: 70,
      designLifeYears: 2,
      cutoffCellVoltage: '2.2 V',
      peukertExponent: 1.5,
    })
    const order = { critical: 0, warning: 1, info: 2 }
    const seen = r.warnings.map((w) => order[w.severity])
    expect([...seen].sort((a, b) => a - b)).toEqual(seen)
    expect(codes(r)).toEqual(
      expect.arrayContaining([
        'charge-forbidden-cold',
        'charge-temperature-high',
        'discharge-temperature-range',
        'deep-discharge',
        'peukert-untypical',
        'maintained-heat',
        'design-life-below-4-years',
        'lithium-safety',
        'competent-person',
      ]),
    )
  })
  test.each<[string, string]>([
    ['nicd', 'cadmium-restricted'],
    ['nicd-ht', 'cadmium-restricted'],
    ['lead-acid', 'lead-acid-handling'],
    ['li-ion', 'lithium-safety'],
  ])('%s carries the %s note (EU 2023/1542, UN 38.3, lead recycling)', (chemistry, code) => {
    expect(codes(size({ chemistry, duration: '1 h', load: { power: '2 W' } }))).toContain(code)
  })
  test('nimh below its charge range warns; sizePack without working is identical in numbers', () => {
    const input = sizeTool.input.parse({ chemistry: 'nimh', duration: '1 h', load: { power: '2 W' }, ambientMin: -5 })
    const full = sizePack(input)
    const lean = sizePack(input, { explain: false })
    expect(codes(full)).toContain('charge-temperature-low')
    expect(lean.working).toEqual([])
    expect({ ...lean, working: [] }).toEqual({ ...full, working: [] })
  })
})

describe('field errors name the field', () => {
  const ok = { chemistry: 'nicd', duration: '3 h', load: { power: '3 W' } }
  test.each<[string, Record<string, unknown>, string]>([
    ['negative duration', { duration: -5 }, 'duration'],
    ['zero duration', { duration: 0 }, 'duration'],
    ['NaN duration', { duration: Number.NaN }, 'duration'],
    ['Infinity duration', { duration: Number.POSITIVE_INFINITY }, 'duration'],
    ['duration in kg', { duration: '3 kg' }, 'duration'],
    ['negative power', { load: { power: '-3 W' } }, 'load.power'],
    ['power given as a current', { load: { power: '3 A' } }, 'load.power'],
    ['LED current in kg', { load: { ledVoltage: '3 V', ledCurrent: '3 kg' } }, 'load.ledCurrent'],
    ['no load at all', { load: {} }, 'load.power'],
    ['load not an object', { load: 5 }, 'load'],
    ['LED voltage without current', { load: { ledVoltage: '3 V' } }, 'load.ledCurrent'],
    ['LED current without voltage', { load: { ledCurrent: '0.3 A' } }, 'load.ledVoltage'],
    ['direct without LED current', { driver: 'direct', load: { power: '3 W' } }, 'load.ledCurrent'],
    ['ambient below −40 °C', { ambientMin: -50 }, 'ambientMin'],
    ['ambient above +85 °C', { ambientMax: '90 degC' }, 'ambientMax'],
    ['ambientMin above ambientMax', { ambientMin: 30, ambientMax: 20 }, 'ambientMin'],
    ['cut-off above nominal', { cutoffCellVoltage: '1.3 V' }, 'cutoffCellVoltage'],
    ['average voltage below cut-off', { averageCellVoltage: '0.9 V' }, 'averageCellVoltage'],
    ['average voltage above full charge', { averageCellVoltage: '1.6 V' }, 'averageCellVoltage'],
    ['efficiency above 1', { driverEfficiency: 1.2 }, 'driverEfficiency'],
    ['efficiency zero', { driverEfficiency: 0 }, 'driverEfficiency'],
    ['end-of-life fraction above 1', { endOfLifeCapacity: 1.5 }, 'endOfLifeCapacity'],
    ['negative end-of-life fraction', { endOfLifeCapacity: -0.1 }, 'endOfLifeCapacity'],
    ['depth of discharge zero', { depthOfDischarge: 0 }, 'depthOfDischarge'],
    ['depth of discharge above 1', { depthOfDischarge: 2 }, 'depthOfDischarge'],
    ['negative design margin', { designMargin: -0.1 }, 'designMargin'],
    ['zero cells', { cellsInSeries: 0 }, 'cellsInSeries'],
    ['fractional cells', { cellsInSeries: 2.5 }, 'cellsInSeries'],
    ['zero capacity', { capacity: 0 }, 'capacity'],
    ['negative capacity', { capacity: '-4 Ah' }, 'capacity'],
    ['capacity in volts', { capacity: '4 V' }, 'capacity'],
    ['unknown chemistry', { chemistry: 'nicad' }, 'chemistry'],
    ['Peukert below 1', { peukertExponent: 0.9 }, 'peukertExponent'],
    ['rated hours zero', { ratedHours: 0 }, 'ratedHours'],
    ['rated hours in volts', { ratedHours: '20 V' }, 'ratedHours'],
    ['converter window upside down', { converterInput: { min: '9 V', max: '5 V' } }, 'converterInput.min'],
    ['empty ladder', { capacityLadder: [] }, 'capacityLadder'],
    ['ladder rung in volts', { capacityLadder: ['1 V'] }, 'capacityLadder.0'],
    ['design life zero', { designLifeYears: 0 }, 'designLifeYears'],
    ['unknown driver', { driver: 'pwm' }, 'driver'],
  ])('%s → %s', (_what, patch, path) => {
    const outcome = runTool(sizeTool, { ...ok, ...patch })
    expect(outcome.ok).toBe(false)
    if (!outcome.ok) {
      const hit = outcome.fields.find((f) => f.path === path)
      expect(hit, JSON.stringify(outcome.fields)).toBeDefined()
      expect(hit?.message.length).toBeGreaterThan(5)
    }
  })
  test('the registry exposes size, charge and compare', () => {
    expect(Object.keys(tools)).toEqual(expect.arrayContaining(['size', 'charge', 'compare']))
    expect(tools.size.name).toBe('size')
  })
})

describe('pack voltage, format and charger on the size tool', () => {
  test.each<[string, string, number, number, boolean]>([
    // IEC 61951-1: 1.2 V per NiCd/NiMH cell; LiFePO4 3.2 V per cell (makers' data); whole cells only (common practice)
    ['nicd', '4.8 V', 4, 4.8, false],
    ['nimh', '4.8 V', 4, 4.8, false],
    ['lifepo4', '4.8 V', 2, 6.4, true],
    ['lifepo4', '6.4 V', 2, 6.4, false],
    ['lead-acid', '6 V', 3, 6, false],
  ])('%s at a nominal %s → %d cells, %d V, voltage changed: %s', (chemistry, nominalVoltage, cells, volts, changed) => {
    const r = size({ chemistry, nominalVoltage, duration: '3 h', load: { power: '2 W' } })
    expect(r.cellsInSeries).toBe(cells)
    expect(r.nominalVoltageV).toBeCloseTo(volts, 9)
    expect(r.warnings.some((w) => w.code === 'pack-voltage-changed' && w.severity === 'critical')).toBe(changed)
  })

  test('four LiFePO4 cells given for a 4.8 V pack: 12.8 V, critical (common practice: keep the marked voltage)', () => {
    const r = size({ chemistry: 'lifepo4', cellsInSeries: 4, nominalVoltage: '4.8 V', duration: '3 h', load: { power: '2 W' } })
    expect(r.nominalVoltageV).toBeCloseTo(12.8, 9)
    expect(r.warnings.find((w) => w.code === 'pack-voltage-changed')?.severity).toBe('critical')
  })

  test('the cell format is carried to the result; a measured discharge current replaces the load (I = given)', () => {
    const r = size({ chemistry: 'nicd', cellsInSeries: 4, capacity: '1.6 Ah', cellFormat: 'sub-C', duration: '3 h', dischargeCurrent: '0.4 A' })
    expect(r.cellFormat).toBe('sub-C')
    expect(r.averageCurrentA).toBeCloseTo(0.4, 12)
    expect(r.averagePowerW).toBeCloseTo(0.4 * 4.8, 12)
  })

  test('load and measured current together, or neither, are refused with the field named', () => {
    const both = runTool(sizeTool, { chemistry: 'nicd', duration: '3 h', load: { power: '2 W' }, dischargeCurrent: '0.4 A' })
    expect(both.ok ? [] : both.fields.map((f) => f.path)).toContain('dischargeCurrent')
    const none = runTool(sizeTool, { chemistry: 'nicd', duration: '3 h' })
    expect(none.ok ? [] : none.fields.map((f) => f.path)).toContain('load.power')
  })

  test('a charger on the size input is checked against the selected pack (charge rules) and carried in the result', () => {
    const r = size({
      chemistry: 'nicd-ht',
      cellsInSeries: 4,
      capacity: '1.6 Ah',
      duration: '3 h',
      dischargeCurrent: '0.4 A',
      charger: { type: 'nickel-constant-current', chargeCurrent: '120 mA' },
    })
    expect(r.chargerCheck?.chargeCRate).toBeCloseTo(0.075, 12)
    expect(r.chargerCheck?.trickleCRate).toBeCloseTo(0.075, 12)
    expect(r.chargerCheck?.dischargeAh).toBeCloseTo(1.2, 12)
    expect(r.chargerCheck?.compatible).toBe('yes') // HT NiCd take up to 0.1 C permanently (IEC 60285 practice, from memory)
    expect(r.working.some((s) => s.id === 'charger.rechargeTimeH')).toBe(true)
  })

  test('lithium on a nickel constant-current charger: critical on the size result (lithium maker practice)', () => {
    const r = size({
      chemistry: 'lifepo4',
      cellsInSeries: 1,
      capacity: '1.5 Ah',
      duration: '3 h',
      dischargeCurrent: '0.3 A',
      charger: { type: 'nickel-constant-current', chargeCurrent: '120 mA' },
    })
    expect(r.chargerCheck?.compatible).toBe('no')
    expect(r.warnings.find((w) => w.code === 'charger-type-unsuitable')?.severity).toBe('critical')
  })
})
