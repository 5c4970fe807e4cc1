/**
 * A route laid out as a designer places luminaires: the fewest luminaires, evenly spaced, the
 * end distance chosen together with the spacing, and every criterion checked point by point
 * along the whole route, both ends included, with only the luminaires actually on the route.
 */
import { evenRowPositions } from '../row-layout'
import type { PointServed } from './emphasis-points'
import type { PointFn, RowSolver } from './row-solver'
import { goldenExtreme } from './row-symmetry'

export interface RouteLayout {
  count: number
  /** Distance of each luminaire from the start of the route, m. */
  positionsM: number[]
  /** Distance between neighbouring luminaires, m (null with one luminaire). */
  spacingM: number | null
  /** From each end of the route to the nearest luminaire, m. */
  endDistanceM: number
  /** Width-weighted average over the route (initial), lx. */
  averageLx: number
  /** Smallest illuminance on the lines that count for the ratio (initial), lx. */
  minLx: number
  /** Largest over smallest on those lines. */
  maxToMin: number | null
  /** NFPA 101: the same figures at the end of the rated duration (× the end-of-duration factor). */
  endOfDuration?: { factor: number; averageLx: number; minLx: number }
  /**
   * False when points that need a luminaire fixed some luminaires and the rest fill the
   * stretches between (spacingM is then the largest gap, endDistanceM the larger end distance).
   */
  even?: boolean
  /** For each marked point, the luminaire within reach that serves it. */
  pointsServed?: PointServed[]
}

export interface FiniteRowStatistics {
  /** Minimum per evaluation line over the route. */
  lineMins: number[]
  max: number
  ratioMin: number
  /** Width-weighted average over the checked length. */
  average: number
}

/** Samples per stretch between neighbouring luminaires (or a luminaire and a route end). */
const SAMPLES_PER_STRETCH = 8
/** End distances tried per count before a narrow window is looked for. */
const END_GRID = 48
const MAX_LUMINAIRES = 2000
/**
 * The lowest (highest) local extremes of the samples refined per line: the others sit in
 * stretches like their neighbours' and a dip between samples is a few per cent at most.
 */
const REFINED_EXTREMES = 8
/** Relative margin kept when moving the end distance towards its preferred value. */
const HELD_IN_HAND = 1e-4

/** Index of the first position ≥ x (positions sorted). */
function lowerBound(positions: number[], x: number): number {
  let lo = 0
  let hi = positions.length
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (positions[mid] < x) lo = mid + 1
    else hi = mid
  }
  return lo
}

/** Illuminance at x on line j from the luminaires at `positions` (only those within reach count). */
export function finiteRowAt(solver: RowSolver, positions: number[], j: number, x: number, fn: PointFn = solver.exact): number {
  let total = 0
  for (let k = lowerBound(positions, x - solver.reach); k < positions.length && positions[k] <= x + solver.reach; k++) total += fn(j, x - positions[k])
  return total
}

/**
 * Floor illuminance on line j at sample points along the route, sorted by x. Stretches between
 * the route ends and the nearest luminaire are sampled directly. Between the luminaires of an
 * even row the samples sit at the same offsets δ from every luminaire (eight even steps, plus
 * where a neighbour is seen at one of the table's vertical angles), so each offset's sums for
 * the whole row come from one running sum over the row: E(pᵢ + δ) = Σₘ g(m·S + δ), m from
 * i − n + 1 to i. An uneven row is sampled directly everywhere.
 */
function sampleLine(solver: RowSolver, j: number, from: number, to: number, positions: number[], fn: PointFn): { xs: number[]; vs: number[] } {
  const n = positions.length
  const S = n > 1 ? positions[1] - positions[0] : 0
  const even = n > 1 && S > 0 && positions.every((p, k) => Math.abs(p - positions[0] - k * S) <= 1e-9 * (1 + Math.abs(p)))
  const xs: number[] = []
  const vs: number[] = []
  const add = (x: number, v: number) => {
    xs.push(x)
    vs.push(v)
  }
  const direct = (x: number) => add(x, finiteRowAt(solver, positions, j, x, fn))
  const stretch = (a: number, b: number) => {
    for (let k = 0; k < SAMPLES_PER_STRETCH; k++) direct(a + ((b - a) * k) / SAMPLES_PER_STRETCH)
  }
  const inside = positions.filter((p) => p > from && p < to)
  if (!even || inside.length < n) {
    const anchors = [from, ...inside, to]
    for (let i = 1; i < anchors.length; i++) stretch(anchors[i - 1], anchors[i])
    for (const d of solver.kinksOf(j)) {
      for (const p of positions) {
        if (p - d > from && p - d < to) direct(p - d)
        if (p + d > from && p + d < to) direct(p + d)
      }
    }
  } else {
    stretch(from, positions[0])
    stretch(positions[n - 1], to)
    const offsets = Array.from({ length: SAMPLES_PER_STRETCH }, (_, k) => (k * S) / SAMPLES_PER_STRETCH)
    for (const d of solver.kinksOf(j)) {
      if (d >= S) break
      offsets.push(d, S - d)
    }
    // Kinks beyond the first and last luminaire, towards the ends.
    for (const d of solver.kinksOf(j)) {
      if (positions[0] - d > from) direct(positions[0] - d)
      if (positions[n - 1] + d < to) direct(positions[n - 1] + d)
    }
    const running = new Float64Array(2 * n)
    const reach = solver.reach
    for (const delta of offsets) {
      // running[m + n] = Σ g(m'·S + δ) for m' from −(n − 1) to m.
      let total = 0
      for (let m = -(n - 1); m <= n - 1; m++) {
        const dx = m * S + delta
        if (Math.abs(dx) <= reach) total += fn(j, dx)
        running[m + n] = total
      }
      const last = delta === 0 ? n - 1 : n - 2
      for (let i = 0; i <= last; i++) {
        const sum = running[i + n] - (i - n >= -(n - 1) ? running[i - n + n] : 0)
        add(positions[i] + delta, sum)
      }
    }
  }
  direct(to)
  const order = xs.map((_, i) => i).sort((a, b) => xs[a] - xs[b])
  return { xs: order.map((i) => xs[i]), vs: order.map((i) => vs[i]) }
}

/**
 * Minimum per line, maximum and width-weighted average of a finite row over the route (less
 * the excluded border for open areas). With `refine`, the lowest and highest local extremes of
 * the samples are narrowed by golden-section search.
 */
export function finiteRowStatistics(
  solver: RowSolver,
  routeLength: number,
  positions: number[],
  fn: PointFn = solver.exact,
  refine = true,
): FiniteRowStatistics {
  const { lines } = solver
  const border = Math.min(solver.rowCriteria.endBorder, routeLength / 2)
  const from = border
  const to = routeLength - border
  const lineMins: number[] = []
  let max = 0
  let ratioMin = Infinity
  let average = 0
  for (let j = 0; j < lines.length; j++) {
    const { xs, vs } = sampleLine(solver, j, from, to, positions, fn)
    let lineMin = Infinity
    let lineMax = -Infinity
    for (const v of vs) {
      lineMin = Math.min(lineMin, v)
      lineMax = Math.max(lineMax, v)
    }
    if (refine) {
      const f = (x: number) => finiteRowAt(solver, positions, j, x, fn)
      const lows: number[] = []
      const highs: number[] = []
      for (let k = 0; k < xs.length; k++) {
        const prev = k > 0 ? vs[k - 1] : Infinity
        const next = k + 1 < xs.length ? vs[k + 1] : Infinity
        if (vs[k] <= prev && vs[k] <= next) lows.push(k)
        const prevM = k > 0 ? vs[k - 1] : -Infinity
        const nextM = k + 1 < xs.length ? vs[k + 1] : -Infinity
        if (lines[j].ratio && vs[k] >= prevM && vs[k] >= nextM) highs.push(k)
      }
      const bracket = (k: number): [number, number] => [xs[Math.max(0, k - 1)], xs[Math.min(xs.length - 1, k + 1)]]
      for (const k of lows.sort((a, b) => vs[a] - vs[b]).slice(0, REFINED_EXTREMES)) {
        const [a, b] = bracket(k)
        if (b > a) lineMin = Math.min(lineMin, goldenExtreme(f, a, b, 1))
      }
      for (const k of highs.sort((a, b) => vs[b] - vs[a]).slice(0, REFINED_EXTREMES)) {
        const [a, b] = bracket(k)
        if (b > a) lineMax = Math.max(lineMax, goldenExtreme(f, a, b, -1))
      }
    }
    lineMins.push(lineMin)
    let integral = 0
    for (const p of positions) integral += solver.integral(j, from - p, to - p)
    average += lines[j].weight * (to > from ? integral / (to - from) : vs[0])
    if (lines[j].ratio) {
      ratioMin = Math.min(ratioMin, lineMin)
      max = Math.max(max, lineMax)
    }
  }
  return { lineMins, max, ratioMin, average }
}

/**
 * How far the row is from failing: the smallest of (value / required − 1) over every check
 * (each line's minimum and the average, in every scenario, and the max/min limit). A row
 * passes when this is ≥ 0.
 */
export function layoutMargin(solver: RowSolver, stats: FiniteRowStatistics): number {
  const { lines } = solver
  const { scenarios, maxToMin } = solver.rowCriteria
  if (!(stats.ratioMin > 0)) return -Infinity
  let margin = (maxToMin * stats.ratioMin) / stats.max - 1
  for (const s of scenarios) {
    for (let j = 0; j < lines.length; j++) margin = Math.min(margin, (stats.lineMins[j] * s.scale) / (s.minLx * lines[j].minFraction) - 1)
    if (s.averageLx !== undefined) margin = Math.min(margin, (stats.average * s.scale) / s.averageLx - 1)
  }
  return margin
}

/** Golden-section search for the x in [a, b] with the largest f(x). */
function argmax(f: (x: number) => number, a: number, b: number, iterations = 20): number {
  const g = (Math.sqrt(5) - 1) / 2
  let x1 = b - g * (b - a)
  let x2 = a + g * (b - a)
  let f1 = f(x1)
  let f2 = f(x2)
  for (let k = 0; k < iterations; k++) {
    if (f1 > f2) {
      b = x2
      x2 = x1
      f2 = f1
      x1 = b - g * (b - a)
      f1 = f(x1)
    } else {
      a = x1
      x1 = x2
      f1 = f2
      x2 = a + g * (b - a)
      f2 = f(x2)
    }
  }
  return f1 > f2 ? x1 : x2
}

/**
 * For n luminaires, the end distance to use, or null when no even row of n passes anywhere.
 * The preferred end distance is L/(2n): each luminaire then stands in the middle of an equal
 * share of the route and the spacing is twice the end distance. When that fails, the passing
 * end distance nearest to it is used. End distances are first tried on a grid with the fast
 * table and without refinement (which can only flatter a row, so a count it rejects is
 * rejected), then confirmed exactly.
 */
function placeCount(solver: RowSolver, routeLength: number, n: number): number | null {
  const L = routeLength
  const rowOf = (e: number) => evenRowPositions(L, n, e)
  const scan = (e: number) => layoutMargin(solver, finiteRowStatistics(solver, L, rowOf(e), solver.tabled, false))
  const exact = (e: number) => layoutMargin(solver, finiteRowStatistics(solver, L, rowOf(e)))
  if (n === 1) return exact(L / 2) >= 0 ? L / 2 : null
  const target = L / (2 * n)
  if (scan(target) >= 0 && exact(target) >= 0) return target
  // From a passing end distance towards the preferred one: bisect with the fast scan, then step
  // back towards the passing one until the exact check agrees.
  const towardTarget = (passing: number) => {
    let ok = passing
    let bad = target
    for (let k = 0; k < 16 && Math.abs(bad - ok) > 1e-4; k++) {
      const mid = (ok + bad) / 2
      // A little in hand, so figures rounded for display still pass.
      if (scan(mid) >= HELD_IN_HAND) ok = mid
      else bad = mid
    }
    for (let k = 0; k < 8; k++) {
      const e = ok + ((passing - ok) * k) / 8
      if (exact(e) >= HELD_IN_HAND) return e
    }
    return passing
  }
  const es = Array.from({ length: END_GRID }, (_, i) => (i * L) / (2 * END_GRID))
  const margins = es.map(scan)
  const passing = es
    .map((e, i) => ({ e, m: margins[i] }))
    .filter((c) => c.m >= 0)
    .sort((a, b) => Math.abs(a.e - target) - Math.abs(b.e - target))
  for (const c of passing.slice(0, 4)) if (exact(c.e) >= 0) return towardTarget(c.e)
  // A window narrower than the grid: look around the most promising grid point.
  let best = 0
  for (let i = 1; i < es.length; i++) if (margins[i] > margins[best]) best = i
  const e = argmax(scan, es[Math.max(0, best - 1)], best + 1 < es.length ? es[best + 1] : L / 2 - 1e-6)
  if (scan(e) >= 0 && exact(e) >= 0) return towardTarget(e)
  return null
}

/**
 * The fewest luminaires for a route of length L, evenly spaced, with their end distance; null
 * when no even row up to the cap passes. Starts from the long-row spacing (n = ⌈L/S⌉, each
 * luminaire lighting an equal share), steps down while one fewer still passes, or up
 * (doubling, then halving the gap) until a count passes; either way the count below is shown
 * to fail at every end distance tried.
 */
export function layRoute(solver: RowSolver, routeLength: number, longRowSpacing: number, endOfDurationFactor?: number): RouteLayout | null {
  const L = routeLength
  const placed = new Map<number, number | null>()
  const place = (n: number) => {
    if (!placed.has(n)) placed.set(n, placeCount(solver, L, n))
    return placed.get(n)!
  }
  // The average over the route can only be reached with at least this many (each adds at most its whole ∫E dx).
  const perLuminaire = solver.lines.reduce((a, l, j) => a + l.weight * solver.integral(j, -solver.reach, solver.reach), 0)
  const border = Math.min(solver.rowCriteria.endBorder, L / 2)
  let fewest = 1
  for (const s of solver.rowCriteria.scenarios) {
    if (s.averageLx !== undefined && perLuminaire > 0) fewest = Math.max(fewest, Math.ceil(((L - 2 * border) * s.averageLx) / (perLuminaire * s.scale) - 1e-9))
  }
  const estimate = Math.min(MAX_LUMINAIRES, Math.max(fewest, Math.ceil(L / longRowSpacing - 1e-9)))
  let count: number | null = null
  if (place(estimate) !== null) {
    count = estimate
    while (count > fewest && place(count - 1) !== null) count--
  } else {
    const cap = Math.min(MAX_LUMINAIRES, Math.max(2 * estimate, Math.ceil(L / Math.max(solver.mountingHeight / 4, 0.05)) + 1))
    let lo = estimate
    let hi = estimate + 1
    while (place(hi) === null) {
      if (hi >= cap) return null
      lo = hi
      hi = Math.min(cap, estimate + 2 * (hi - estimate))
    }
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1
      if (place(mid) !== null) hi = mid
      else lo = mid
    }
    count = hi
  }
  const end = place(count)!
  const positions = evenRowPositions(L, count, end)
  const stats = finiteRowStatistics(solver, L, positions)
  const layout: RouteLayout = {
    count,
    positionsM: positions,
    spacingM: count > 1 ? positions[1] - positions[0] : null,
    endDistanceM: positions[0],
    averageLx: stats.average,
    minLx: stats.ratioMin,
    maxToMin: stats.ratioMin > 0 ? stats.max / stats.ratioMin : null,
  }
  if (endOfDurationFactor !== undefined)
    layout.endOfDuration = { factor: endOfDurationFactor, averageLx: stats.average * endOfDurationFactor, minLx: stats.ratioMin * endOfDurationFactor }
  return layout
}
