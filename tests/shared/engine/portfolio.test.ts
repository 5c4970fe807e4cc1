/** The pack budget: a window of 12 calendar months from today, counted and costed per site and type (figures worked by hand below). */
import { describe, expect, it } from 'vitest'
import { packBudget, type BudgetLuminaire } from '../../../shared/engine/portfolio'

const lum = (siteId: string, tag: string, typeLabel: string, replaceBy: string): BudgetLuminaire => ({ siteId, luminaireId: tag, tag, typeLabel, replaceBy })

describe('packBudget', () => {
  const today = '2026-12-02'
  const items = [
    lum('a', 'A1', 'Bulkhead', '2026-06-01'), // already past: buy now
    lum('a', 'A2', 'Bulkhead', '2027-12-01'), // last day inside the window
    lum('a', 'A3', 'Bulkhead', '2027-12-02'), // first day after it: not counted
    lum('a', 'A4', 'Exit sign', '2027-03-15'),
    lum('b', 'B1', 'High-bay', '2027-01-10'),
    lum('b', 'B2', 'Unpriced panel', '2027-02-01'),
  ]
  const prices = [
    { typeLabel: 'Bulkhead', price: 18.5, currency: 'EUR' },
    { typeLabel: 'Exit sign', price: 12.25, currency: 'EUR' },
    { typeLabel: 'High-bay', price: 64, currency: 'EUR' },
  ]
  const b = packBudget(items, prices, today)
  it('states its window: today to the same day 12 months on', () => {
    expect([b.from, b.to, b.months]).toEqual(['2026-12-02', '2027-12-02', 12])
  })
  it('counts per site (hand count: A1, A2, A4 at site a; B1, B2 at site b)', () => {
    expect(b.sites.map((s) => [s.siteId, s.count, s.overdue, s.unpriced])).toEqual([
      ['a', 3, 1, 0],
      ['b', 2, 0, 1],
    ])
  })
  it('costs per type and site: a = 2 × 18.50 + 12.25 = 49.25; b = 64 (one pack unpriced)', () => {
    expect(b.sites[0].lines).toEqual([
      { typeLabel: 'Bulkhead', count: 2, unitPrice: { currency: 'EUR', amount: 18.5 }, cost: { currency: 'EUR', amount: 37 } },
      { typeLabel: 'Exit sign', count: 1, unitPrice: { currency: 'EUR', amount: 12.25 }, cost: { currency: 'EUR', amount: 12.25 } },
    ])
    expect(b.sites[0].costs).toEqual([{ currency: 'EUR', amount: 49.25 }])
    expect(b.sites[1].costs).toEqual([{ currency: 'EUR', amount: 64 }])
    expect(b.total).toEqual({ count: 5, overdue: 1, costs: [{ currency: 'EUR', amount: 113.25 }], unpriced: 1 })
  })
  it('keeps currencies apart rather than adding them', () => {
    const mixed = packBudget(
      [lum('a', 'A1', 'X', '2027-01-01'), lum('a', 'A2', 'Y', '2027-01-01')],
      [
        { typeLabel: 'X', price: 10, currency: 'EUR' },
        { typeLabel: 'Y', price: 10, currency: 'USD' },
      ],
      today,
    )
    expect(mixed.total.costs).toEqual([
      { currency: 'EUR', amount: 10 },
      { currency: 'USD', amount: 10 },
    ])
  })
  it('a window from 31 January ends on the last day of a shorter month, not in March', () => {
    expect(packBudget([], [], '2027-01-31', 1).to).toBe('2027-02-28')
  })
})
