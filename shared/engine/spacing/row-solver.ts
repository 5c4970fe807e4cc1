/**
 * The row solver: for a long row of identical luminaires along a route, the largest spacing
 * and end distance that meet a criterion (a finite row on a real route is laid out in layout.ts).
 */
import { intensityAt, type IntensityTable } from '../lm63'
import type { EvaluationLine, RowCriteria } from './criteria'
import { DEG, horizontalIlluminance } from './illuminance'
import { goldenExtreme, mergeMirroredLines, symmetricAboutRow, symmetricAcrossRow } from './row-symmetry'

// Held here once: the hottest loops call these millions of times.
const lookUpIntensity = intensityAt
const pointIlluminance = horizontalIlluminance

export interface RowSolverOptions {
  table: IntensityTable
  mountingHeight: number
  /** Maintenance factor × emergency output factor. */
  factor: number
  /** C plane that lies along the row, degrees. */
  cPlane: number
  criteria: RowCriteria
  /**
   * 'row': every luminaire of an endless row contributes (what the tool uses).
   * 'pair': only the two luminaires either side of a point, and only the end luminaire at the
   * end of the route (the simpler hand method; used to check against hand-worked figures).
   */
  neighbours?: 'row' | 'pair'
}

export interface RowStatistics {
  /** Minimum per evaluation line, at scale 1. */
  lineMins: number[]
  /** Largest illuminance on the ratio lines, at scale 1. */
  max: number
  /** Smallest illuminance on the ratio lines, at scale 1. */
  ratioMin: number
  /** Width-weighted average over one spacing, at scale 1. */
  average: number
}

export type PointFn = (line: number, dx: number) => number

/** Running sums of a row's distant luminaires for one spacing and line (see RowSolver.tails). */
interface RowTails {
  /** Luminaires within K spacings are summed one by one. */
  nearK: number
  /** Number of spacings within reach (sums beyond are zero). */
  count: number
  nodes: Float64Array
  weights: Float64Array
  /** [k·m + i]: Σ_{k' ≥ k} g(u_i + k'·S), towards +x. */
  ahead: Float64Array
  /** [k·m + i]: Σ_{k' ≥ k} g(−(u_i + k'·S)), towards −x. */
  behind: Float64Array
}

const SAMPLES = 32
/** Luminaires adding less than this share of the smallest required level are left out (conservative: the row only loses light). */
const NEGLIGIBLE = 1e-4
const BISECTION_TOLERANCE_M = 0.001

/**
 * Precomputes, per evaluation line, the illuminance from one luminaire as a function of the
 * distance along the row (a fine table, for the fast scan), then finds spacings.
 */
export class RowSolver {
  readonly reach: number
  private readonly step: number
  private readonly cells: number
  private readonly grids: Float64Array[]
  private readonly near: number
  private readonly mode: 'row' | 'pair'

  constructor(private readonly o: RowSolverOptions) {
    const h = o.mountingHeight
    this.mode = o.neighbours ?? 'row'
    this.near = 2 * h
    this.lines = symmetricAboutRow(o.table, o.cPlane) ? mergeMirroredLines(o.criteria.lines) : o.criteria.lines
    const smallest = Math.min(...o.criteria.scenarios.flatMap((s) => this.lines.map((l) => (s.minLx * l.minFraction) / Math.max(s.scale, 1e-9))))
    const threshold = NEGLIGIBLE * smallest
    // Reach: beyond it one luminaire adds less than the negligible share on every line. Steps
    // grow with distance, since the angle from straight down changes ever more slowly.
    // With the light the same either way along the row, each table holds its half once.
    const mirrored = symmetricAcrossRow(o.table, o.cPlane)
    let reach = 0
    for (let d = 0; d <= 200 * h; d += Math.max(h / 8, 0.05 * d)) {
      for (let j = 0; j < this.lines.length; j++) {
        if (this.direct(j, d) >= threshold || (!mirrored && this.direct(j, -d) >= threshold)) reach = d
      }
    }
    const wanted = reach > 0 ? reach * 1.1 + h / 8 : 0
    this.kinks = this.lines.map((line) =>
      o.table.verticalAngles
        .filter((g) => g > 0 && g < 90)
        .map((g) => (h * Math.tan(g / DEG)) ** 2 - line.y * line.y)
        .filter((d2) => d2 > 0)
        .map(Math.sqrt)
        .sort((a, b) => a - b),
    )
    this.step = Math.max(h / 64, wanted / 8192)
    this.cells = Math.ceil(wanted / this.step)
    // A whole number of steps, so the table's points sit symmetrically about the luminaire.
    this.reach = this.cells * this.step
    this.areas = []
    this.cumulative = []
    this.grids = this.lines.map((_, j) => {
      const g = new Float64Array(2 * this.cells + 2)
      for (let k = 0; k <= 2 * this.cells; k++) g[k] = mirrored && k > this.cells ? g[2 * this.cells - k] : this.direct(j, -this.reach + k * this.step)
      // Running trapezoid integral from −reach, so any stretch of one luminaire's light is two look-ups.
      const c = new Float64Array(2 * this.cells + 2)
      for (let k = 1; k <= 2 * this.cells + 1; k++) c[k] = c[k - 1] + ((g[k - 1] + g[k]) * this.step) / 2
      this.cumulative.push(c)
      this.areas.push(c[2 * this.cells])
      return g
    })
  }

  get mountingHeight(): number {
    return this.o.mountingHeight
  }

  get rowCriteria(): RowCriteria {
    return this.o.criteria
  }

  /** Distances along the row at which line j sees a luminaire at one of the table's vertical angles. */
  kinksOf(j: number): readonly number[] {
    return this.kinks[j]
  }

  /** ∫ E dx on line j from dx = a to dx = b (a ≤ b) for one luminaire at the origin (from the table). */
  integral(j: number, a: number, b: number): number {
    const c = this.cumulative[j]
    const at = (dx: number) => {
      const u = (dx + this.reach) / this.step
      if (!(u > 0)) return 0
      if (u >= 2 * this.cells) return c[2 * this.cells]
      const k = Math.floor(u)
      const g = this.grids[j]
      const t = u - k
      // Exact integral of the linear interpolant over the part cell.
      return c[k] + this.step * t * (g[k] + (t * (g[k + 1] - g[k])) / 2)
    }
    return at(b) - at(a)
  }

  /** Lines actually evaluated (a mirrored pair is evaluated once when the light is symmetric about the row). */
  readonly lines: EvaluationLine[]
  /** Distances along the row at which line j sees a luminaire at one of the table's vertical angles. */
  private readonly kinks: number[][]
  /** ∫ E dx of one luminaire along each line: an endless row at spacing S averages area / S. */
  private readonly areas: number[]
  /** Running integral of each line's table, for stretches of one luminaire's light. */
  private readonly cumulative: Float64Array[]

  /**
   * A spacing above which the darkest line cannot meet its minimum: half-way between two
   * luminaires each one adds at most the largest value it reaches at that distance or further,
   * which only falls as the spacing grows, so bisection finds where that bound drops below need.
   */
  minimumBound(): number {
    let bound = 2 * this.reach
    for (let j = 0; j < this.lines.length; j++) {
      const g = this.grids[j]
      const env = new Float64Array(this.cells + 2)
      for (let m = this.cells; m >= 0; m--) env[m] = Math.max(env[m + 1], g[this.cells + m], g[this.cells - m])
      const need = Math.max(...this.o.criteria.scenarios.map((s) => (s.minLx * this.lines[j].minFraction) / Math.max(s.scale, 1e-9)))
      const upper = (spacing: number) => {
        let total = 0
        for (let i = 0; (i + 0.5) * spacing <= this.reach; i++) {
          total += 2 * env[Math.floor(((i + 0.5) * spacing) / this.step)]
          if (this.mode === 'pair') break
        }
        return total
      }
      if (upper(bound) >= need) continue
      let lo = 0
      let hi = bound
      while (hi - lo > 1e-4 * hi) {
        const mid = (lo + hi) / 2
        if (upper(mid) >= need) lo = mid
        else hi = mid
      }
      bound = hi
    }
    return bound
  }

  /**
   * Largest spacing the average requirement allows (endless row: average = Σ w·area / S),
   * or Infinity when there is no average requirement.
   */
  averageBound(): number {
    let bound = Infinity
    const perSpacing = this.lines.reduce((a, l, j) => a + l.weight * this.areas[j], 0)
    for (const s of this.o.criteria.scenarios) if (s.averageLx !== undefined) bound = Math.min(bound, (perSpacing * s.scale) / s.averageLx)
    return bound
  }

  /** One luminaire at the origin, the point at distance dx along the row on line j: exact look-up. */
  direct: PointFn = (j, dx) => {
    const y = this.lines[j].y
    const r = Math.hypot(dx, y)
    const gamma = Math.atan2(r, this.o.mountingHeight) * DEG
    const c = this.o.cPlane + (r === 0 ? 0 : Math.atan2(y, dx) * DEG)
    return this.o.factor * pointIlluminance(lookUpIntensity(this.o.table, c, gamma), this.o.mountingHeight, r)
  }

  /** Interpolated from the precomputed table (fast; for the scan). */
  tabled: PointFn = (j, dx) => {
    const u = (dx + this.reach) / this.step
    if (!(u >= 0) || u >= 2 * this.cells) return 0
    const k = Math.floor(u)
    const g = this.grids[j]
    return g[k] + (u - k) * (g[k + 1] - g[k])
  }

  /** Exact for nearby luminaires, table for distant ones (their share is small and smooth). */
  exact: PointFn = (j, dx) => (Math.abs(dx) <= this.near ? this.direct(j, dx) : this.tabled(j, dx))

  /**
   * Illuminance at x on line j with luminaires at k·S (all of them, or the two either side in
   * 'pair' mode). The row repeats every S, so x is taken into [0, S). The nearby luminaires are
   * summed one by one; the distant ones come from sums made once per spacing (see `tails`).
   */
  rowAt(j: number, x: number, spacing: number, fn: PointFn): number {
    if (this.mode === 'pair') return fn(j, x) + fn(j, x - spacing)
    const tails = this.tails(j, spacing)
    if (!tails) {
      let total = 0
      const kMin = Math.ceil((x - this.reach) / spacing)
      const kMax = Math.floor((x + this.reach) / spacing)
      for (let k = kMin; k <= kMax; k++) total += fn(j, x - k * spacing)
      return total
    }
    const u = x - Math.floor(x / spacing) * spacing
    const nearK = tails.nearK
    let total = 0
    for (let k = -nearK; k <= nearK + 1; k++) total += fn(j, u - k * spacing)
    // Beyond: luminaires at u + k·S (k > K) on one side, at −((S − u) + k·S) (k > K) on the other.
    return total + this.tailAt(tails, tails.ahead, u, nearK + 1) + this.tailAt(tails, tails.behind, spacing - u, nearK + 1)
  }

  /** Chebyshev points across one spacing at which the distant luminaires are summed. */
  private static readonly TAIL_NODES = 7
  private tailCache = new Map<number, Array<RowTails | null | undefined>>()

  /**
   * Distant luminaires of a row at spacing S, summed once per spacing and line: at each of a few
   * points u across one spacing, the sums Σ_{k' ≥ k} g(±(u + k'·S)) for every k (running sums
   * from the far end), taken from the fast table. Luminaires at least K·S away, K·S being the
   * larger of 2S and the distance beyond the last vertical angle the table bends at (where
   * the light is smooth), add a smooth function of u, so a polynomial through the points gives
   * it anywhere in the spacing (from the fast table, within 0.01 % of the exact look-up).
   * Null when the row is too short for this to pay.
   */
  private tails(j: number, spacing: number): RowTails | null {
    let perLine = this.tailCache.get(spacing)
    if (!perLine) {
      if (this.tailCache.size > 8) this.tailCache.clear()
      perLine = []
      this.tailCache.set(spacing, perLine)
    }
    const cached = perLine[j]
    if (cached !== undefined) return cached
    const kinks = this.kinks[j]
    const smoothFrom = Math.max(2 * spacing, (kinks.length ? kinks[kinks.length - 1] : 0) + spacing)
    const nearK = Math.ceil(smoothFrom / spacing)
    const count = Math.ceil(this.reach / spacing) + 2
    if (nearK + 2 >= count) {
      perLine[j] = null
      return null
    }
    const m = RowSolver.TAIL_NODES
    const nodes = new Float64Array(m)
    const weights = new Float64Array(m)
    for (let i = 0; i < m; i++) {
      nodes[i] = (spacing / 2) * (1 - Math.cos(((2 * i + 1) * Math.PI) / (2 * m)))
      weights[i] = (i % 2 === 0 ? 1 : -1) * Math.sin(((2 * i + 1) * Math.PI) / (2 * m))
    }
    const running = (sign: 1 | -1) => {
      const sums = new Float64Array((count + 1) * m)
      for (let i = 0; i < m; i++) {
        for (let k = count - 1; k >= 0; k--) sums[k * m + i] = sums[(k + 1) * m + i] + this.tabled(j, sign * (nodes[i] + k * spacing))
      }
      return sums
    }
    const tails: RowTails = { nearK, count, nodes, weights, ahead: running(1), behind: running(-1) }
    perLine[j] = tails
    return tails
  }

  /** Σ_{k' ≥ k} of the distant luminaires at u in [0, S], interpolated between the points (barycentric form). */
  private tailAt(t: RowTails, sums: Float64Array, u: number, k: number): number {
    if (k >= t.count) return 0
    const m = t.nodes.length
    let num = 0
    let den = 0
    for (let i = 0; i < m; i++) {
      const d = u - t.nodes[i]
      if (d === 0) return sums[k * m + i]
      const w = t.weights[i] / d
      num += w * sums[k * m + i]
      den += w
    }
    return num / den
  }

  /** Minimum per line, max and average over one spacing (x from one luminaire to the next). */
  statistics(spacing: number, fn: PointFn = this.exact): RowStatistics {
    const lines = this.lines
    const pair = this.mode === 'pair'
    const lineMins: number[] = []
    let max = 0
    let ratioMin = Infinity
    let average = 0
    for (let j = 0; j < lines.length; j++) {
      const f = (x: number) => this.rowAt(j, x, spacing, fn)
      const xs = this.sampleXs(j, spacing)
      const n = xs.length
      const vs = xs.map(f)
      let lineMin = Infinity
      let lineMax = -Infinity
      let integral = 0
      for (let k = 0; k < n; k++) {
        lineMin = Math.min(lineMin, vs[k])
        lineMax = Math.max(lineMax, vs[k])
        if (k + 1 < n) integral += ((xs[k + 1] - xs[k]) * (vs[k] + vs[k + 1])) / 2
      }
      // Refine every local extreme of the samples: a narrow dip need not hold the lowest sample.
      for (let k = 0; k < n; k++) {
        const prevK = k > 0 ? k - 1 : pair ? -1 : n - 1
        const nextK = k + 1 < n ? k + 1 : pair ? -1 : 0
        const prevV = prevK < 0 ? Infinity : vs[prevK]
        const nextV = nextK < 0 ? Infinity : vs[nextK]
        const a = prevK < 0 ? xs[k] : k > 0 ? xs[prevK] : xs[prevK] - spacing
        const b = nextK < 0 ? xs[k] : k + 1 < n ? xs[nextK] : xs[nextK] + spacing
        if (vs[k] <= prevV && vs[k] <= nextV && b > a) lineMin = Math.min(lineMin, goldenExtreme(f, a, b, 1))
        const prevM = prevK < 0 ? -Infinity : vs[prevK]
        const nextM = nextK < 0 ? -Infinity : vs[nextK]
        if (lines[j].ratio && vs[k] >= prevM && vs[k] >= nextM && b > a) lineMax = Math.max(lineMax, goldenExtreme(f, a, b, -1))
      }
      lineMins.push(lineMin)
      average += lines[j].weight * (pair ? integral / spacing : this.areas[j] / spacing)
      if (lines[j].ratio) {
        ratioMin = Math.min(ratioMin, lineMin)
        max = Math.max(max, lineMax)
      }
    }
    return { lineMins, max, ratioMin, average }
  }

  /**
   * Points along one spacing where line j is sampled: an even set, plus the points where a
   * neighbour is seen at one of the table's vertical angles (the interpolated intensity has a
   * corner there, which is where narrow dips sit).
   */
  private sampleXs(j: number, spacing: number): number[] {
    const pair = this.mode === 'pair'
    const xs: number[] = []
    for (let k = 0; k < SAMPLES; k++) xs.push((k * spacing) / SAMPLES)
    if (pair) xs.push(spacing)
    for (const d of this.kinks[j]) {
      if (d >= spacing) break
      xs.push(d, spacing - d)
    }
    xs.sort((a, b) => a - b)
    const gap = spacing / 256
    const kept: number[] = []
    for (const x of xs) if (kept.length === 0 || x - kept[kept.length - 1] > gap) kept.push(x)
    if (pair && kept[kept.length - 1] !== spacing) kept.push(spacing)
    return kept
  }

  /** Whether every scenario's levels and the max/min limit are met at this spacing. */
  feasible(spacing: number, fn: PointFn = this.exact): boolean {
    const { lines } = this
    const { scenarios } = this.o.criteria
    // The average of an endless row is Σ w·area / S exactly (as statistics() gives it): a
    // spacing it rules out needs no point-by-point look.
    if (this.mode === 'row' && spacing > this.averageBound()) return false
    // Quick rejection half-way between luminaires, usually the darkest place.
    for (let j = 0; j < lines.length; j++) {
      const mid = this.rowAt(j, spacing / 2, spacing, fn)
      for (const s of scenarios) if (mid * s.scale < s.minLx * lines[j].minFraction) return false
    }
    return this.meets(this.statistics(spacing, fn))
  }

  meets(stats: RowStatistics): boolean {
    const { lines } = this
    const { scenarios, maxToMin } = this.o.criteria
    if (!(stats.ratioMin > 0) || stats.max / stats.ratioMin > maxToMin) return false
    for (const s of scenarios) {
      for (let j = 0; j < lines.length; j++) if (stats.lineMins[j] * s.scale < s.minLx * lines[j].minFraction) return false
      if (s.averageLx !== undefined && stats.average * s.scale < s.averageLx) return false
    }
    return true
  }

  /**
   * Largest spacing that meets the criteria, to 1 mm, or null if none does. Scans down from
   * the reach in 0.5 % steps with the fast table (so a spacing above a dark gap is not
   * missed), then bisects with exact look-ups.
   */
  maxSpacing(): number | null {
    if (this.reach <= 0) return null
    const floor = 0.01
    const ratio = 0.995
    let s = Math.min(this.minimumBound(), this.mode === 'row' ? this.averageBound() : Infinity)
    let above = s
    while (s > floor && !this.feasible(s, this.tabled)) {
      above = s
      s *= ratio
    }
    if (s <= floor) return null
    let lo = s
    let hi = above
    while (lo > floor && !this.feasible(lo)) {
      hi = lo
      lo *= ratio
    }
    if (lo <= floor) return null
    while (hi < 2 * this.reach && hi === above && this.feasible(hi)) {
      lo = hi
      hi /= ratio
    }
    while (hi - lo > BISECTION_TOLERANCE_M) {
      const mid = (lo + hi) / 2
      if (this.feasible(mid)) lo = mid
      else hi = mid
    }
    return lo
  }

  /** Illuminance at distance x beyond the end luminaire (direction +1 or −1 along the row). */
  endAt(j: number, x: number, spacing: number, direction: 1 | -1, fn: PointFn = this.exact): number {
    if (this.mode === 'pair') return fn(j, direction * x)
    const tails = this.tails(j, spacing)
    let total = 0
    if (!tails) {
      for (let k = 0; k * spacing <= this.reach + x; k++) total += fn(j, direction * (x + k * spacing))
      return total
    }
    // x = m·S + u: the first K luminaires one by one, the rest from the running sums.
    const m = Math.floor(x / spacing)
    const u = x - m * spacing
    for (let k = 0; k < tails.nearK; k++) total += fn(j, direction * (x + k * spacing))
    return total + this.tailAt(tails, direction === 1 ? tails.ahead : tails.behind, u, m + tails.nearK)
  }

  /**
   * Largest distance from the end luminaire of a row at this spacing to the end of the route
   * with every point in between meeting the levels (and, on ratio lines, at least max/limit),
   * the smaller of the two ends; plus the excluded border for open areas.
   */
  endDistance(spacing: number, rowMax: number): number {
    const { lines } = this
    const { scenarios, maxToMin, endBorder } = this.o.criteria
    const ok = (x: number, direction: 1 | -1) => {
      for (let j = 0; j < lines.length; j++) {
        const e = this.endAt(j, x, spacing, direction)
        if (lines[j].ratio && e * maxToMin < rowMax) return false
        for (const s of scenarios) if (e * s.scale < s.minLx * lines[j].minFraction) return false
      }
      return true
    }
    let best = Infinity
    for (const direction of [1, -1] as const) {
      const step = this.o.mountingHeight / 32
      let lo = 0
      if (!ok(0, direction)) return 0
      let hi = step
      while (hi <= this.reach + spacing && ok(hi, direction)) {
        lo = hi
        hi += step
      }
      while (hi - lo > BISECTION_TOLERANCE_M) {
        const mid = (lo + hi) / 2
        if (ok(mid, direction)) lo = mid
        else hi = mid
      }
      best = Math.min(best, lo)
    }
    return best + endBorder
  }

  /** Centre-line illuminance over one spacing, at scale 1. */
  profile(spacing: number, points = 41): Array<{ x: number; lux: number }> {
    const centre = Math.max(
      0,
      this.lines.findIndex((l) => l.y === 0),
    )
    return Array.from({ length: points }, (_, k) => {
      const x = (k * spacing) / (points - 1)
      return { x, lux: this.rowAt(centre, x, spacing, this.exact) }
    })
  }
}
