/**
 * The portfolio across sites, for owners and managers: luminaires by state (failed, overdue, due
 * soon) with filters, and the pack budget for the next 12 months from each pack's replacement
 * date and the workspace's price per luminaire type. The rules are the engine's (due.ts,
 * portfolio.ts); this module gathers, filters and stores the prices.
 */
import { packBudget, type PackPrice } from '../../../shared/engine/portfolio'
import type { LuminaireDue } from '../../../shared/engine/due'
import type { PortfolioState } from '../../../shared/schemas/portfolio.schema'
import { dataSource } from '../../data-source'
import { recordAudit } from '../audit/audit.service'
import { PackPriceEntity } from './pack-price.entity'
import { findSite, todayIso, workspaceStatuses, type LuminaireStatus } from './register.service'

/** Which of the asked states a luminaire is in (failed first), or null when none. */
export function stateOf(due: LuminaireDue, wanted: readonly PortfolioState[]): PortfolioState | null {
  if (due.failed) return wanted.includes('failed') ? 'failed' : null
  if (due.state === 'overdue') return wanted.includes('overdue') ? 'overdue' : null
  // A test due now (a retest or commissioning test inside its window) is as close as due soon.
  if (due.state === 'due-now' || due.state === 'due-soon') return wanted.includes('due-soon') ? 'due-soon' : null
  return null
}

const RANK: Record<PortfolioState, number> = { failed: 0, overdue: 1, 'due-soon': 2 }

/**
 * Luminaires in the given states across the workspace's sites (or one site), failed first, then
 * the longest overdue. The same filter serves the portfolio screen and any list by state.
 */
export async function luminairesInState(workspaceId: string, filter: { states: readonly PortfolioState[]; siteId?: string }, today = todayIso()) {
  if (filter.siteId) await findSite(workspaceId, filter.siteId)
  const { sites, statuses } = await workspaceStatuses(workspaceId, today)
  const siteName = new Map(sites.map((s) => [s.id, s.name]))
  const counts = { failed: 0, overdue: 0, dueSoon: 0 }
  const items = statuses
    .filter((l) => !filter.siteId || l.siteId === filter.siteId)
    .map((l) => ({ l, state: stateOf(l.due, ['failed', 'overdue', 'due-soon']) }))
    .filter((x): x is { l: LuminaireStatus; state: PortfolioState } => x.state !== null)
  for (const x of items) counts[x.state === 'due-soon' ? 'dueSoon' : x.state]++
  const listed = items
    .filter((x) => filter.states.includes(x.state))
    .map(({ l, state }) => {
      const tests = [l.due.functional, l.due.duration]
        .filter((t) => t.state !== 'scheduled')
        .map((t) => ({ kind: t.kind, dueOn: t.state === 'overdue' ? t.overdueAfter : t.nextDueOn, daysOverdue: -t.daysUntilDue, reason: t.reason }))
      return {
        siteId: l.siteId,
        siteName: siteName.get(l.siteId) ?? '',
        luminaireId: l.id,
        tag: l.tag,
        location: l.location,
        areaName: l.areaName,
        typeLabel: l.typeLabel,
        state,
        tests,
        failures: l.due.openFailures.map((f) => ({
          kind: f.kind,
          testedOn: f.testedOn,
          faults: f.faults,
          remedialAction: f.remedialAction,
          retestBy: f.retestBy,
          retestOverdue: f.retestOverdue,
        })),
      }
    })
    .sort(
      (a, b) =>
        RANK[a.state] - RANK[b.state] ||
        Math.max(0, ...b.tests.map((t) => t.daysOverdue)) - Math.max(0, ...a.tests.map((t) => t.daysOverdue)) ||
        a.siteName.localeCompare(b.siteName) ||
        a.tag.localeCompare(b.tag, undefined, { numeric: true }),
    )
  return { today, states: [...filter.states], sites: sites.map((s) => ({ id: s.id, name: s.name })), counts, items: listed }
}

export async function packPrices(workspaceId: string): Promise<PackPrice[]> {
  const rows = await dataSource.getRepository(PackPriceEntity).find({ where: { workspaceId }, order: { typeLabel: 'ASC' } })
  return rows.map((r) => ({ typeLabel: r.typeLabel, price: r.price, currency: r.currency }))
}

/** Replaces the price list (a type left out loses its price); recorded in the audit trail. */
export async function setPackPrices(workspaceId: string, actorId: string, prices: PackPrice[]) {
  await dataSource.transaction(async (m) => {
    const before = await m.getRepository(PackPriceEntity).find({ where: { workspaceId } })
    await m.getRepository(PackPriceEntity).delete({ workspaceId })
    if (prices.length) await m.getRepository(PackPriceEntity).insert(prices.map((p) => ({ workspaceId, ...p })))
    await recordAudit(
      {
        workspaceId,
        actorId,
        action: 'pack-prices.updated',
        entityType: 'workspace',
        entityId: workspaceId,
        data: { before: before.map((b) => ({ typeLabel: b.typeLabel, price: b.price, currency: b.currency })), after: prices },
      },
      m,
    )
  })
  return { prices: await packPrices(workspaceId) }
}

/** Packs to buy in the next 12 months, per site and type, costed where the workspace set a price. */
export async function workspacePackBudget(workspaceId: string, today = todayIso()) {
  const { sites, statuses } = await workspaceStatuses(workspaceId, today)
  const prices = await packPrices(workspaceId)
  const budget = packBudget(
    statuses.map((l) => ({ siteId: l.siteId, luminaireId: l.id, tag: l.tag, typeLabel: l.typeLabel, replaceBy: l.forecast.replaceBy })),
    prices,
    today,
  )
  const siteName = new Map(sites.map((s) => [s.id, s.name]))
  const priceOf = new Map(prices.map((p) => [p.typeLabel, p]))
  const perType = new Map<string, number>()
  for (const l of statuses) perType.set(l.typeLabel, (perType.get(l.typeLabel) ?? 0) + 1)
  return {
    ...budget,
    sites: budget.sites.map((s) => ({ ...s, siteName: siteName.get(s.siteId) ?? '' })).sort((a, b) => a.siteName.localeCompare(b.siteName)),
    types: [...perType.entries()]
      .sort(([a], [b]) => a.localeCompare(b))
      .map(([typeLabel, luminaires]) => {
        const p = priceOf.get(typeLabel)
        return { typeLabel, luminaires, price: p ? { currency: p.currency, amount: p.price } : null }
      }),
  }
}
