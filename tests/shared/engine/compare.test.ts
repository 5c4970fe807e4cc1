/** `compare`: every chemistry sized by the same rules, ranked by the user's weights. */
import { describe, expect, test } from 'vitest'
import { CHEMISTRY_IDS } from '../../../shared/engine/chemistries'
import { compareChemistries, compareTool, type CompareResult } from '../../../shared/engine/compare'
import { sizePack, sizeTool } from '../../../shared/engine/size'
import { runTool } from '../../../shared/engine/tool'

function compare(input: Record<string, unknown>): CompareResult {
  const outcome = runTool(compareTool, input)
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  return outcome.result
}
const base = { duration: '3 h', load: { power: '3 W' }, ambientMin: 10, ambientMax: 25 }

describe('compare', () => {
  test('sizes every chemistry with the size logic and ranks 1..n by score', () => {
    const r = compare(base)
    expect(r.rows.map((x) => x.chemistry)).toEqual([...CHEMISTRY_IDS])
    expect(r.rows.map((x) => x.rank).sort()).toEqual([1, 2, 3, 4, 5, 6])
    const byRank = [...r.rows].sort((a, b) => a.rank - b.rank)
    for (let i = 1; i < byRank.length; i++) expect(byRank[i - 1].score).toBeGreaterThanOrEqual(byRank[i].score)
    for (const row of r.rows) {
      const alone = sizePack(sizeTool.input.parse({ ...base, chemistry: row.chemistry }), { explain: false })
      expect(row.selectedCapacityAh).toBe(alone.selectedCapacityAh)
      expect(row.requiredCapacityAh).toBeCloseTo(alone.requiredCapacityAh, 12)
      expect(row.serviceLifeYears).toBeCloseTo(alone.serviceLifeYears, 12)
      expect(row.verdict).toMatch(new RegExp(`^Rank ${row.rank}: .*\\.$`))
      expect(row.score).toBeGreaterThan(0)
      expect(row.score).toBeLessThanOrEqual(1)
    }
    expect(r.working.map((s) => s.id)).toContain('score.nimh')
  })

  test.each<[string, Record<string, number>, string]>([
    // Sub-scores follow the chemistry data: NMC packs are the smallest (Handbook of Batteries energy densities)
    ['size only', { life: 0, trickle: 0, size: 1, restrictions: 0 }, 'li-ion'],
    // LiFePO4 has the longest standby life at 25 °C in the data (8 years)
    ['life only', { life: 1, trickle: 0, size: 0, restrictions: 0 }, 'lifepo4'],
    // NiMH carries no substance restriction (EU 2023/1542)
    ['restrictions only', { life: 0, trickle: 0, size: 0, restrictions: 1 }, 'nimh'],
    // high-temperature NiCd is built for permanent charge
    ['trickle only', { life: 0, trickle: 1, size: 0, restrictions: 0 }, 'nicd-ht'],
  ])('%s → %s ranks first', (_what, weights, first) => {
    const r = compare({ ...base, weights })
    expect(r.rows.find((x) => x.rank === 1)?.chemistry).toBe(first)
  })

  test('a critical warning halves the score: lithium in a −10 °C store (no charge below 0 °C)', () => {
    const cold = compare({ ...base, ambientMin: -10 })
    const warm = compare(base)
    for (const id of ['lifepo4', 'li-ion'] as const) {
      const c = cold.rows.find((x) => x.chemistry === id)
      expect(c?.verdict).toContain('must not be charged')
      expect(cold.warnings.some((w) => w.code === 'charge-forbidden-cold' && w.message.includes(c?.name ?? '?'))).toBe(true)
      expect(c?.scores.trickle).toBe(warm.rows.find((x) => x.chemistry === id)?.scores.trickle)
      const w = cold.weights
      const s = c!.scores
      const weighted =
        (w.life * s.life + w.trickle * s.trickle + w.size * s.size + w.restrictions * s.restrictions) / (w.life + w.trickle + w.size + w.restrictions)
      expect(c?.score).toBeCloseTo(weighted * 0.5, 12)
    }
  })

  test('a subset of chemistries, duplicates dropped; cadmium note only when NiCd is present', () => {
    const r = compare({ ...base, chemistries: ['nimh', 'lead-acid', 'nimh'] })
    expect(r.rows.map((x) => x.chemistry)).toEqual(['nimh', 'lead-acid'])
    expect(r.warnings.some((w) => w.code === 'cadmium-restricted')).toBe(false)
    expect(compare(base).warnings.some((w) => w.code === 'cadmium-restricted')).toBe(true)
  })

  test('the default weights are used when none are given and echoed back', () => {
    expect(compare(base).weights).toEqual({ life: 0.4, trickle: 0.2, size: 0.2, restrictions: 0.2 })
  })

  test('compareChemistries on parsed input equals the tool', () => {
    const parsed = compareTool.input.parse(base)
    expect(compareChemistries(parsed)).toEqual(compare(base))
  })

  test.each<[string, Record<string, unknown>, string]>([
    ['all weights zero', { weights: { life: 0, trickle: 0, size: 0, restrictions: 0 } }, 'weights'],
    ['negative weight', { weights: { life: -1 } }, 'weights.life'],
    ['no chemistries', { chemistries: [] }, 'chemistries'],
    ['unknown chemistry', { chemistries: ['zinc-air'] }, 'chemistries.0'],
    ['ambient upside down', { ambientMin: 30, ambientMax: 10 }, 'ambientMin'],
    ['no duration', { duration: undefined }, 'duration'],
  ])('%s → %s', (_what, patch, path) => {
    const outcome = runTool(compareTool, { ...base, ...patch })
    expect(outcome.ok).toBe(false)
    if (!outcome.ok) expect(outcome.fields.map((f) => f.path)).toContain(path)
  })
})
