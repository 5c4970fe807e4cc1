/**
 * Points that need a luminaire near them (EN 1838 / BS 5266-1 points of emphasis): the designer
 * marks them along the route and the layout keeps a luminaire within 2 m horizontally of each.
 * An even row that already does so is kept; otherwise a luminaire is placed for each group of
 * points (one luminaire can serve points up to 4 m apart) and the stretches between are filled
 * with the fewest evenly spaced luminaires for which the whole route still passes.
 */
import { finiteRowStatistics, layoutMargin, type RouteLayout } from './layout'
import type { RowSolver } from './row-solver'
import { anchorsFor, servePoints, type EmphasisPoint, type PointServed } from './emphasis-points'

/**
 * Positions with k[i] extra luminaires in each stretch: before the first anchor they continue
 * its spacing outwards (the first at half a step from the start), between anchors they are
 * evenly spaced, after the last they mirror the start.
 */
function fill(anchors: number[], L: number, extra: number[]): number[] {
  const out: number[] = []
  const m = anchors.length
  const startStep = anchors[0] / (extra[0] + 0.5)
  for (let j = extra[0]; j >= 1; j--) out.push(anchors[0] - j * startStep)
  for (let i = 0; i < m; i++) {
    out.push(anchors[i])
    if (i + 1 < m) {
      const gap = anchors[i + 1] - anchors[i]
      for (let j = 1; j <= extra[i + 1]; j++) out.push(anchors[i] + (j * gap) / (extra[i + 1] + 1))
    }
  }
  const endStep = (L - anchors[m - 1]) / (extra[m] + 0.5)
  for (let j = 1; j <= extra[m]; j++) out.push(anchors[m - 1] + j * endStep)
  return out
}

/** Length each luminaire of a stretch covers with k extra luminaires in it. */
function share(anchors: number[], L: number, extra: number[], s: number): number {
  const m = anchors.length
  if (s === 0) return anchors[0] / (extra[0] + 0.5)
  if (s === m) return (L - anchors[m - 1]) / (extra[m] + 0.5)
  return (anchors[s] - anchors[s - 1]) / (extra[s] + 1)
}

const MAX_ADDED = 400

/** Luminaires at each group of points, the stretches filled; null when no such row passes. */
function anchoredRow(
  solver: RowSolver,
  L: number,
  longRowSpacing: number,
  points: EmphasisPoint[],
  preferred: number[],
): { positions: number[]; served: PointServed[] } | null {
  const groups = anchorsFor(points, L, preferred)
  const anchors = groups.map((g) => g.atM)
  const m = anchors.length
  const passes = (positions: number[]) => layoutMargin(solver, finiteRowStatistics(solver, L, positions)) >= 0
  // First guess: each stretch filled at the long-row spacing.
  const extra = Array.from({ length: m + 1 }, (_, s) => {
    if (s === 0) return anchors[0] <= 1e-9 ? 0 : Math.max(0, Math.ceil(anchors[0] / longRowSpacing - 0.5))
    if (s === m) return L - anchors[m - 1] <= 1e-9 ? 0 : Math.max(0, Math.ceil((L - anchors[m - 1]) / longRowSpacing - 0.5))
    return Math.max(0, Math.ceil((anchors[s] - anchors[s - 1]) / longRowSpacing) - 1)
  })
  let added = 0
  while (!passes(fill(anchors, L, extra))) {
    if (++added > MAX_ADDED) return null
    // One more luminaire where each covers the most.
    let worst = 0
    for (let s = 1; s <= m; s++) if (share(anchors, L, extra, s) > share(anchors, L, extra, worst)) worst = s
    if (share(anchors, L, extra, worst) < 1e-3) return null
    extra[worst]++
  }
  // Then one fewer in each stretch while the route still passes.
  for (let s = 0; s <= m; s++) {
    while (extra[s] > 0) {
      extra[s]--
      if (passes(fill(anchors, L, extra))) continue
      extra[s]++
      break
    }
  }
  const positions = fill(anchors, L, extra)
  const placedFor = new Map<number, number[]>()
  for (const g of groups) placedFor.set(positions.indexOf(g.atM), g.points)
  const served = servePoints(positions, points, placedFor)
  return served ? { positions, served } : null
}

/**
 * A layout that serves every point, from the even layout when it already does, else anchored
 * at the points and filled; null when no such row passes.
 */
export function layRouteWithPoints(
  solver: RowSolver,
  L: number,
  longRowSpacing: number,
  points: EmphasisPoint[],
  even: RouteLayout | null,
  endOfDurationFactor?: number,
): RouteLayout | null {
  if (even) {
    const served = servePoints(even.positionsM, points)
    if (served) return { ...even, pointsServed: served }
  }
  // Anchored where an even row's luminaire can move to, and at the middle of the points: the fewer wins.
  const tries = [even ? anchoredRow(solver, L, longRowSpacing, points, even.positionsM) : null, anchoredRow(solver, L, longRowSpacing, points, [])]
  const found = tries.filter((t): t is { positions: number[]; served: PointServed[] } => t !== null)
  if (!found.length) return null
  const { positions, served } = found.reduce((a, b) => (b.positions.length < a.positions.length ? b : a))
  const stats = finiteRowStatistics(solver, L, positions)
  const gaps = positions.slice(1).map((p, k) => p - positions[k])
  const layout: RouteLayout = {
    count: positions.length,
    positionsM: positions,
    spacingM: gaps.length ? Math.max(...gaps) : null,
    endDistanceM: Math.max(positions[0], L - positions[positions.length - 1]),
    averageLx: stats.average,
    minLx: stats.ratioMin,
    maxToMin: stats.ratioMin > 0 ? stats.max / stats.ratioMin : null,
    even: false,
    pointsServed: served,
  }
  if (endOfDurationFactor !== undefined)
    layout.endOfDuration = { factor: endOfDurationFactor, averageLx: stats.average * endOfDurationFactor, minLx: stats.ratioMin * endOfDurationFactor }
  return layout
}
