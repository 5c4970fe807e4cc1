/**
 * Limits that must agree with their own sources. Sources: the VRLA makers' final-voltage-by-rate table
 * (VRLA maker's application manual, published: ≤ 0.2 C 1.75 V, to 0.5 C 1.70 V, to 1 C 1.55 V, above
 * 1.30 V per cell); LiFePO4 charge voltage 3.60–3.65 V per cell and reduced charge current from 0 to 10 °C
 * (lithium cell and pack makers' manuals, published); NiMH charging range 0–45 °C (NiMH maker's
 * handbook, published); direct-drive limiter headroom about 0.3 V (common practice).
 */
import { describe, expect, it } from 'vitest'
import { chargeTool } from '../../../shared/engine/charge'
import { compareTool } from '../../../shared/engine/compare'
import { sizeTool } from '../../../shared/engine/size'
import { runTool } from '../../../shared/engine/tool'

function run<T>(tool: { name: string }, input: unknown): T {
  const o = runTool(tool as never, input)
  if (!o.ok) throw new Error(JSON.stringify(o.fields))
  return o.result as T
}
type Warned = { warnings: Array<{ code: string; severity: string; message: string }> }
const codes = (r: Warned) => r.warnings.map((w) => w.code)

describe('lead-acid end voltage: one rule from the makers’ rate table', () => {
  it('a pack discharged at about 0.5–1 C takes 1.55 V per cell from the table and is not called deep-discharged', () => {
    // 6 V block (3 cells), 10 W at 85 % ≈ 1.96 A from a 3.2 Ah block ≈ 0.61 C.
    const r = run<Warned & { cutoffCellVoltageV: number; dischargeCRate: number }>(sizeTool, {
      chemistry: 'lead-acid',
      duration: '1 h',
      load: { power: '10 W' },
      capacity: '3.2 Ah',
      cellsInSeries: 3,
    })
    expect(r.dischargeCRate).toBeGreaterThan(0.5)
    expect(r.dischargeCRate).toBeLessThanOrEqual(1)
    expect(r.cutoffCellVoltageV).toBe(1.55)
    expect(codes(r)).not.toContain('deep-discharge')
  })

  it('a given 1.6 V per cell cut-off at 0.1 C is below the table’s 1.75 V: deep discharge', () => {
    const r = run<Warned>(sizeTool, {
      chemistry: 'lead-acid',
      duration: '3 h',
      load: { power: '2 W' },
      capacity: '7 Ah',
      cellsInSeries: 3,
      cutoffCellVoltage: '1.6 V',
    })
    expect(codes(r)).toContain('deep-discharge')
  })

  it('the charge check applies the same table: a 1.55 V per cell disconnect at 0.6 C is fine', () => {
    const r = run<Warned & { deepDischarge: boolean | null }>(chargeTool, {
      chemistry: 'lead-acid',
      cellsInSeries: 3,
      capacity: '3.2 Ah',
      duration: '1 h',
      load: { power: '10 W' },
      chargeCurrent: '0.4 A',
      cutoffVoltage: '4.65 V',
    })
    expect(r.deepDischarge).toBe(false)
  })
})

describe('LiFePO4 charging', () => {
  const base = { chemistry: 'lifepo4', cellsInSeries: 1, capacity: '3 Ah', duration: '3 h', load: { power: '2 W' }, chargeCurrent: '0.3 A' }
  it('held at 3.65 V per cell is the top of the charge band, not a critical overvoltage', () => {
    const r = run<Warned>(chargeTool, { ...base, floatVoltage: '3.65 V' })
    expect(codes(r)).not.toContain('lithium-overvoltage')
  })
  it('3.8 V per cell is a critical overvoltage', () => {
    const r = run<Warned>(chargeTool, { ...base, floatVoltage: '3.8 V' })
    expect(r.warnings.find((w) => w.code === 'lithium-overvoltage')?.severity).toBe('critical')
  })
  it('1 C at 2 °C is warned about (makers reduce charge current to 0.1 C below 10 °C)', () => {
    const r = run<Warned>(chargeTool, { ...base, chargeCurrent: '3 A', ambient: '2 °C' })
    expect(codes(r)).toContain('charge-current-cold')
  })
  it('0.1 C at 2 °C and 1 C at 20 °C are not', () => {
    expect(codes(run<Warned>(chargeTool, { ...base, ambient: '2 °C' }))).not.toContain('charge-current-cold')
    expect(codes(run<Warned>(chargeTool, { ...base, chargeCurrent: '3 A', ambient: '20 °C' }))).not.toContain('charge-current-cold')
  })
})

describe('NiMH in the cold is penalised in the ranking', () => {
  it('for a −10 °C warehouse NiMH is halved and ranks below chemistries that can be charged there', () => {
    const r = run<{ rows: Array<{ chemistry: string; rank: number; score: number; verdict: string }> }>(compareTool, {
      duration: '3 h',
      load: { power: '3 W' },
      ambientMin: '-10 °C',
      ambientMax: '20 °C',
    })
    const nimh = r.rows.find((x) => x.chemistry === 'nimh')!
    const lead = r.rows.find((x) => x.chemistry === 'lead-acid')!
    expect(nimh.rank).toBeGreaterThan(lead.rank)
    expect(nimh.rank).toBeGreaterThan(2)
    expect(nimh.verdict).toContain('cannot be charged at -10 °C')
  })
  it('at 5 °C NiMH is not penalised', () => {
    const warm = run<{ rows: Array<{ chemistry: string; verdict: string }> }>(compareTool, {
      duration: '3 h',
      load: { power: '3 W' },
      ambientMin: '5 °C',
      ambientMax: '20 °C',
    })
    expect(warm.rows.find((x) => x.chemistry === 'nimh')!.verdict).not.toContain('cannot be charged')
  })
})

describe('direct drive needs headroom for the current limiter', () => {
  it('a 2.95 V LED on three NiCd cells (3.0 V at cut-off) leaves 0.05 V: warned', () => {
    const r = run<Warned>(sizeTool, {
      chemistry: 'nicd',
      duration: '3 h',
      driver: 'direct',
      load: { ledVoltage: '2.95 V', ledCurrent: '0.3 A' },
      cellsInSeries: 3,
    })
    expect(codes(r)).toContain('direct-drive-headroom')
  })
  it('left to choose, the sizing adds a cell so the limiter has its headroom', () => {
    const r = run<Warned & { cellsInSeries: number }>(sizeTool, {
      chemistry: 'nicd',
      duration: '3 h',
      driver: 'direct',
      load: { ledVoltage: '2.95 V', ledCurrent: '0.3 A' },
    })
    expect(r.cellsInSeries).toBe(4)
    expect(codes(r)).not.toContain('direct-drive-headroom')
  })
})
