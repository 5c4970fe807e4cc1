/**
 * The portfolio across sites, for owners and managers: the pack budget for a stated window (the
 * next 12 months by default) from each luminaire's pack-replacement date and a price per
 * luminaire type that the workspace sets. Pure: the replacement dates come from forecastPack.
 */
import { addMonthsClamped, type IsoDate } from './due'

/** The budget looks this many months ahead (a year's purchasing, common practice). */
export const BUDGET_MONTHS = 12

export interface BudgetLuminaire {
  siteId: string
  luminaireId: string
  tag: string
  /** The type as written in the register; prices are set per type. */
  typeLabel: string
  /** Day the pack should be replaced by (forecast). */
  replaceBy: IsoDate
}

export interface PackPrice {
  typeLabel: string
  /** Price of one replacement pack, in `currency`. */
  price: number
  /** ISO 4217 code. */
  currency: string
}

export interface Money {
  currency: string
  amount: number
}

export interface BudgetLine {
  typeLabel: string
  count: number
  /** Null when the workspace has set no price for this type. */
  unitPrice: Money | null
  cost: Money | null
}

export interface SiteBudget {
  siteId: string
  count: number
  /** Packs whose date has already passed (to buy now), part of count. */
  overdue: number
  lines: BudgetLine[]
  /** One sum per currency used. */
  costs: Money[]
  /** Packs of types without a price: counted, not costed. */
  unpriced: number
}

export interface PackBudget {
  /** The window: from today (included) to `to` (excluded). */
  from: IsoDate
  to: IsoDate
  months: number
  sites: SiteBudget[]
  total: { count: number; overdue: number; costs: Money[]; unpriced: number }
}

function addMoney(into: Money[], m: Money) {
  const same = into.find((x) => x.currency === m.currency)
  if (same) same.amount = Math.round((same.amount + m.amount) * 100) / 100
  else into.push({ ...m })
}

/**
 * Packs to buy within the window, per site and type: every luminaire whose replacement date
 * falls before the end of the window (dates already past count too: those packs are bought now).
 */
export function packBudget(luminaires: readonly BudgetLuminaire[], prices: readonly PackPrice[], today: IsoDate, months = BUDGET_MONTHS): PackBudget {
  const to = addMonthsClamped(today, months)
  const priceOf = new Map(prices.map((p) => [p.typeLabel, p]))
  const bySite = new Map<string, SiteBudget>()
  for (const l of luminaires) {
    if (!(l.replaceBy < to)) continue
    let site = bySite.get(l.siteId)
    if (!site) {
      site = { siteId: l.siteId, count: 0, overdue: 0, lines: [], costs: [], unpriced: 0 }
      bySite.set(l.siteId, site)
    }
    site.count++
    if (l.replaceBy <= today) site.overdue++
    let line = site.lines.find((x) => x.typeLabel === l.typeLabel)
    if (!line) {
      const p = priceOf.get(l.typeLabel)
      line = {
        typeLabel: l.typeLabel,
        count: 0,
        unitPrice: p ? { currency: p.currency, amount: p.price } : null,
        cost: p ? { currency: p.currency, amount: 0 } : null,
      }
      site.lines.push(line)
    }
    line.count++
    if (line.cost && line.unitPrice) line.cost.amount = Math.round(line.count * line.unitPrice.amount * 100) / 100
    else site.unpriced++
  }
  const sites = [...bySite.values()]
  const total = { count: 0, overdue: 0, costs: [] as Money[], unpriced: 0 }
  for (const s of sites) {
    s.lines.sort((a, b) => a.typeLabel.localeCompare(b.typeLabel))
    for (const line of s.lines) if (line.cost) addMoney(s.costs, line.cost)
    total.count += s.count
    total.overdue += s.overdue
    total.unpriced += s.unpriced
    for (const c of s.costs) addMoney(total.costs, c)
  }
  return { from: today, to, months, sites, total }
}
