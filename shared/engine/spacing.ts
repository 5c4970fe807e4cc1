/**
 * Escape-route spacing: the largest distance between emergency luminaires in a long row,
 * and from the last luminaire to the end of the route, such that the floor illuminance
 * meets a chosen criterion. Point-by-point method with the inverse-square cosine law
 * E = I(C,γ)·cos³γ / h², direct light only, summed over every luminaire that contributes.
 */
import { z } from 'zod'
import { finiteNumber, fraction, quantity } from './fields'
import { checkIntensityTable, intensityAt, parseLm63, type IntensityTable } from './lm63'
import { defineTool } from './tool'
import { sortWarnings, type EngineWarning, type Reference, type WorkingStep } from './types'

const DEG = 180 / Math.PI

// ---------------------------------------------------------------------------------------------
// Point illuminance

/** Horizontal illuminance (lx) from intensity I (cd) at height h (m), horizontal distance r (m): I·cos³γ/h². */
export function horizontalIlluminance(intensityCd: number, mountingHeightM: number, horizontalDistanceM: number): number {
  const h = mountingHeightM
  const d2 = h * h + horizontalDistanceM * horizontalDistanceM
  // cos γ = h/d, so I·cos³γ/h² = I·h/d³.
  return (intensityCd * h) / (d2 * Math.sqrt(d2))
}

export interface PlacedLuminaire {
  x: number
  y: number
  /** Height above the floor (the reference plane), m. */
  height: number
  /** Azimuth of the luminaire's C0 plane, degrees counter-clockwise from +x. */
  rotation?: number
}

/** Floor illuminance (lx) at (x, y) from several luminaires, each looked up in the table towards the point. */
export function illuminanceAtPoint(table: IntensityTable, luminaires: PlacedLuminaire[], x: number, y: number, factor = 1): number {
  let total = 0
  for (const l of luminaires) {
    const dx = x - l.x
    const dy = y - l.y
    const r = Math.hypot(dx, dy)
    const gamma = Math.atan2(r, l.height) * DEG
    const c = Math.atan2(dy, dx) * DEG - (l.rotation ?? 0)
    total += horizontalIlluminance(intensityAt(table, c, gamma), l.height, r)
  }
  return total * factor
}

// ---------------------------------------------------------------------------------------------
// Criteria

export type CriteriaId = 'en1838-route' | 'en1838-open-area' | 'en1838-high-risk' | 'nfpa101'

export interface Requirement {
  /** Minimum illuminance, lx (on the centre line for routes). */
  minLx: number
  /** Largest permitted max/min ratio. */
  maxToMin: number
  /** Average illuminance, lx, where the criterion sets one. */
  averageLx?: number
  /** EN 1838 routes: minimum over the central band of half the route width, lx. */
  bandMinLx?: number
  /** NFPA 101: levels that must still be met at the end of the rated duration. */
  endOfDuration?: { minLx: number; averageLx: number }
  source: string
}

export function requirementFor(criteria: CriteriaId, normalIlluminanceLx?: number): Requirement {
  switch (criteria) {
    case 'en1838-route':
      return {
        minLx: 1,
        bandMinLx: 0.5,
        maxToMin: 40,
        source: 'EN 1838:2013 4.2.1 (≥ 1 lx on the centre line, ≥ 0.5 lx over the central half of the width, routes up to 2 m) and 4.2.2 (max:min ≤ 40:1)',
      }
    case 'en1838-open-area':
      return { minLx: 0.5, maxToMin: 40, source: 'EN 1838:2013 4.3 (≥ 0.5 lx on the empty core area, 0.5 m border excluded; max:min ≤ 40:1)' }
    case 'en1838-high-risk':
      return {
        minLx: Math.max(15, 0.1 * (normalIlluminanceLx ?? 0)),
        maxToMin: 10,
        source: 'EN 1838:2013 4.4 (10 % of the normal-lighting maintained illuminance and never below 15 lx; max:min ≤ 10:1)',
      }
    case 'nfpa101':
      return {
        minLx: 1.1,
        averageLx: 10.8,
        maxToMin: 40,
        endOfDuration: { minLx: 0.65, averageLx: 6.5 },
        source: 'NFPA 101 (2021) 7.9.2.1 (initial: average 10.8 lx (1 fc), any point ≥ 1.1 lx (0.1 fc); at the end of 1½ h: average 6.5 lx, any point ≥ 0.65 lx; max:min ≤ 40:1)',
      }
  }
}

/** A line parallel to the row, at lateral offset y, where the floor illuminance is checked. */
export interface EvaluationLine {
  y: number
  label: string
  /** This line's minimum as a fraction of the scenario's minimum (0.5 for the EN 1838 band edges). */
  minFraction: number
  /** Whether the line counts for the max/min ratio. */
  ratio: boolean
  /** Weight of the line in the average across the width (weights sum to 1). */
  weight: number
}

/** One set of levels to meet, with the output scale it applies at (NFPA: initial and end of duration). */
export interface Scenario {
  label: string
  /** Multiplies the computed illuminance (1 initial; the end-of-duration factor at the end). */
  scale: number
  minLx: number
  averageLx?: number
}

export interface RowCriteria {
  lines: EvaluationLine[]
  scenarios: Scenario[]
  maxToMin: number
  /** Added to the end distance: open areas exclude a border from the core area. */
  endBorder: number
}

/**
 * Where the floor is checked for each criterion, for a row along the middle of a strip of
 * width W: EN 1838 routes on the centre line plus the central band edges (±W/4); open areas
 * on the centre line and the core edges (±(W/2 − 0.5 m)); high-risk areas and NFPA paths
 * across the whole width. Weights are Simpson's rule across the width.
 */
export function rowCriteria(criteria: CriteriaId, requirement: Requirement, widthM: number, endOfDurationFactor = 1): RowCriteria {
  const simpson3 = (y: number, fractionOfMin: number, ratio: boolean, label: string): EvaluationLine[] => [
    { y: 0, label: 'centre line', minFraction: 1, ratio: true, weight: 4 / 6 },
    { y, label: `${label} (left)`, minFraction: fractionOfMin, ratio, weight: 1 / 6 },
    { y: -y, label: `${label} (right)`, minFraction: fractionOfMin, ratio, weight: 1 / 6 },
  ]
  const initial: Scenario = { label: 'initial', scale: 1, minLx: requirement.minLx, averageLx: requirement.averageLx }
  switch (criteria) {
    case 'en1838-route':
      return { lines: simpson3(widthM / 4, (requirement.bandMinLx ?? 0.5) / requirement.minLx, false, 'central band edge'), scenarios: [initial], maxToMin: requirement.maxToMin, endBorder: 0 }
    case 'en1838-open-area': {
      const core = widthM / 2 - 0.5
      const lines = core > 0 ? simpson3(core, 1, true, 'core area edge') : [{ y: 0, label: 'centre line', minFraction: 1, ratio: true, weight: 1 }]
      return { lines, scenarios: [initial], maxToMin: requirement.maxToMin, endBorder: 0.5 }
    }
    case 'en1838-high-risk':
      return { lines: simpson3(widthM / 2, 1, true, 'area edge'), scenarios: [initial], maxToMin: requirement.maxToMin, endBorder: 0 }
    case 'nfpa101': {
      const q = widthM / 4
      const e = widthM / 2
      const lines: EvaluationLine[] = [
        { y: 0, label: 'centre line', minFraction: 1, ratio: true, weight: 2 / 12 },
        { y: q, label: 'quarter width (left)', minFraction: 1, ratio: true, weight: 4 / 12 },
        { y: -q, label: 'quarter width (right)', minFraction: 1, ratio: true, weight: 4 / 12 },
        { y: e, label: 'path edge (left)', minFraction: 1, ratio: true, weight: 1 / 12 },
        { y: -e, label: 'path edge (right)', minFraction: 1, ratio: true, weight: 1 / 12 },
      ]
      const end = requirement.endOfDuration ?? { minLx: 0.65, averageLx: 6.5 }
      return {
        lines,
        scenarios: [initial, { label: 'end of rated duration', scale: endOfDurationFactor, minLx: end.minLx, averageLx: end.averageLx }],
        maxToMin: requirement.maxToMin,
        endBorder: 0,
      }
    }
  }
}

// ---------------------------------------------------------------------------------------------
// Row solver

/** Whether the light is the same either side of the vertical plane along the row. */
function symmetricAboutRow(table: IntensityTable, cPlane: number): boolean {
  const first = table.horizontalAngles[0]
  const last = table.horizontalAngles[table.horizontalAngles.length - 1]
  const c = ((cPlane % 360) + 360) % 360
  if (last === 0) return true
  if (first === 0 && last === 90) return c % 90 === 0
  if (first === 0 && last === 180) return c % 180 === 0
  if (first === 90 && last === 270) return c % 180 === 90
  return false
}

/** Drops the −y twin of each +y line (same checks), adding its weight to the +y line. */
function mergeMirroredLines(lines: EvaluationLine[]): EvaluationLine[] {
  const kept: EvaluationLine[] = []
  for (const line of lines) {
    const twin = line.y < 0 ? lines.find((l) => l.y === -line.y && l.minFraction === line.minFraction && l.ratio === line.ratio) : undefined
    if (!twin) kept.push({ ...line })
  }
  for (const line of lines) {
    if (line.y >= 0) continue
    const twin = kept.find((l) => l.y === -line.y)
    if (twin && !kept.includes(line)) twin.weight += line.weight
  }
  return kept.map((l) => (l.y > 0 ? { ...l, label: l.label.replace(' (left)', '') } : l))
}

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

type PointFn = (line: number, dx: number) => number

const SAMPLES = 32
const GOLDEN = (Math.sqrt(5) - 1) / 2
/** Luminaires adding less than this share of the smallest required level are left out (conservative: the row only loses light). */
const NEGLIGIBLE = 1e-4
const BISECTION_TOLERANCE_M = 0.001

function goldenExtreme(f: (x: number) => number, a: number, b: number, sign: 1 | -1, iterations = 18): number {
  // Minimises sign·f on [a, b]; returns f at the best point found.
  let x1 = b - GOLDEN * (b - a)
  let x2 = a + GOLDEN * (b - a)
  let f1 = sign * f(x1)
  let f2 = sign * f(x2)
  for (let k = 0; k < iterations; k++) {
    if (f1 < f2) {
      b = x2
      x2 = x1
      f2 = f1
      x1 = b - GOLDEN * (b - a)
      f1 = sign * f(x1)
    } else {
      a = x1
      x1 = x2
      f1 = f2
      x2 = a + GOLDEN * (b - a)
      f2 = sign * f(x2)
    }
  }
  return sign * Math.min(f1, f2)
}

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
    let reach = 0
    for (let d = 0; d <= 200 * h; d += Math.max(h / 8, 0.05 * d)) {
      for (let j = 0; j < this.lines.length; j++) {
        if (this.direct(j, d) >= threshold || this.direct(j, -d) >= threshold) reach = d
      }
    }
    this.reach = reach > 0 ? reach * 1.1 + h / 8 : 0
    this.kinks = this.lines.map((line) =>
      o.table.verticalAngles
        .filter((g) => g > 0 && g < 90)
        .map((g) => (h * Math.tan(g / DEG)) ** 2 - line.y * line.y)
        .filter((d2) => d2 > 0)
        .map(Math.sqrt)
        .sort((a, b) => a - b),
    )
    this.step = Math.max(h / 64, this.reach / 8192)
    this.cells = Math.ceil(this.reach / this.step)
    this.areas = []
    this.grids = this.lines.map((_, j) => {
      const g = new Float64Array(2 * this.cells + 2)
      let area = 0
      for (let k = 0; k <= 2 * this.cells; k++) {
        g[k] = this.direct(j, -this.reach + k * this.step)
        area += k === 0 || k === 2 * this.cells ? g[k] / 2 : g[k]
      }
      this.areas.push(area * this.step)
      return g
    })
  }

  /** Lines actually evaluated (a mirrored pair is evaluated once when the light is symmetric about the row). */
  readonly lines: EvaluationLine[]
  /** Distances along the row at which line j sees a luminaire at one of the table's vertical angles. */
  private readonly kinks: number[][]
  /** ∫ E dx of one luminaire along each line: an endless row at spacing S averages area / S. */
  private readonly areas: number[]

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
    return this.o.factor * horizontalIlluminance(intensityAt(this.o.table, c, gamma), this.o.mountingHeight, r)
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

  /** Illuminance at x on line j with luminaires at k·S (all of them, or the two either side in 'pair' mode). */
  rowAt(j: number, x: number, spacing: number, fn: PointFn): number {
    if (this.mode === 'pair') return fn(j, x) + fn(j, x - spacing)
    let total = 0
    const kMin = Math.ceil((x - this.reach) / spacing)
    const kMax = Math.floor((x + this.reach) / spacing)
    for (let k = kMin; k <= kMax; k++) total += fn(j, x - k * spacing)
    return total
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
    let total = 0
    for (let k = 0; k * spacing <= this.reach + x; k++) total += fn(j, direction * (x + k * spacing))
    return total
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
    const centre = Math.max(0, this.lines.findIndex((l) => l.y === 0))
    return Array.from({ length: points }, (_, k) => {
      const x = (k * spacing) / (points - 1)
      return { x, lux: this.rowAt(centre, x, spacing, this.exact) }
    })
  }

  /**
   * Checks an actual finite row: n luminaires, end ones `end` from each end of a route of
   * length L, evenly spaced between. Returns whether every point meets the levels.
   */
  finiteRowMeets(routeLength: number, count: number, end: number): boolean {
    const { lines } = this
    const { scenarios, maxToMin, endBorder } = this.o.criteria
    const positions = count === 1 ? [routeLength / 2] : Array.from({ length: count }, (_, k) => end + (k * (routeLength - 2 * end)) / (count - 1))
    const gap = count > 1 ? (routeLength - 2 * end) / (count - 1) : routeLength
    const step = Math.min(this.o.mountingHeight / 8, gap / 12, routeLength / 16)
    const from = endBorder
    const to = routeLength - endBorder
    const points = Math.max(2, Math.ceil((to - from) / step) + 1)
    let max = 0
    let ratioMin = Infinity
    const sums = lines.map(() => 0)
    const mins = lines.map(() => Infinity)
    for (let p = 0; p < points; p++) {
      const x = from + ((to - from) * p) / (points - 1)
      for (let j = 0; j < lines.length; j++) {
        let e = 0
        for (const xi of positions) if (Math.abs(x - xi) <= this.reach) e += this.exact(j, x - xi)
        sums[j] += e
        mins[j] = Math.min(mins[j], e)
        if (lines[j].ratio) {
          max = Math.max(max, e)
          ratioMin = Math.min(ratioMin, e)
        }
      }
    }
    if (!(ratioMin > 0) || max / ratioMin > maxToMin) return false
    const average = lines.reduce((a, l, j) => a + (l.weight * sums[j]) / points, 0)
    for (const s of scenarios) {
      for (let j = 0; j < lines.length; j++) if (mins[j] * s.scale < s.minLx * lines[j].minFraction) return false
      if (s.averageLx !== undefined && average * s.scale < s.averageLx) return false
    }
    return true
  }

  /**
   * Fewest luminaires for a route of length L that pass the finite-row check, or null.
   * Starts from the long-row estimate; if that fails, steps up exponentially, then bisects
   * (more luminaires on the same route never make a point darker).
   */
  luminairesFor(routeLength: number, spacing: number, end: number): number | null {
    const usableEnd = Math.min(end, routeLength / 2)
    const passes = (n: number) => this.finiteRowMeets(routeLength, n, n === 1 ? routeLength / 2 : usableEnd)
    const estimate = routeLength <= 2 * usableEnd ? 1 : Math.ceil((routeLength - 2 * usableEnd) / spacing - 1e-9) + 1
    if (passes(estimate)) return estimate
    const cap = Math.max(estimate + 1, Math.ceil(routeLength / Math.max(this.o.mountingHeight / 4, 0.05)) + 1)
    let lo = estimate
    let hi = estimate + 1
    while (!passes(hi)) {
      if (hi >= cap) return null
      lo = hi
      hi = Math.min(cap, estimate + 2 * (hi - estimate))
    }
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1
      if (passes(mid)) hi = mid
      else lo = mid
    }
    return hi
  }
}

// ---------------------------------------------------------------------------------------------
// Glare: EN 1838:2013 Table 1 (from memory), intensity limits in the 60°–90° zone for level routes

const GLARE_LIMITS: Array<[number, number, number]> = [
  // [height below which it applies, escape route / open area cd, high-risk cd]
  [2.5, 500, 1000],
  [3.0, 900, 1800],
  [3.5, 1600, 3200],
  [4.0, 2500, 5000],
  [4.5, 3500, 7000],
  [Infinity, 5000, 10000],
]

export function glareLimitCd(mountingHeightM: number, highRisk: boolean): number {
  const row = GLARE_LIMITS.find(([below]) => mountingHeightM < below) ?? GLARE_LIMITS[GLARE_LIMITS.length - 1]
  return highRisk ? row[2] : row[1]
}

function peakIntensityBetween(table: IntensityTable, fromGamma: number, toGamma: number): number {
  let peak = 0
  const gammas = new Set([fromGamma, toGamma, ...table.verticalAngles.filter((g) => g > fromGamma && g < toGamma)])
  for (const c of table.horizontalAngles.length ? table.horizontalAngles : [0]) {
    for (const g of gammas) peak = Math.max(peak, intensityAt(table, c, g))
  }
  return peak
}

// ---------------------------------------------------------------------------------------------
// The tool

const intensityTableInput = z.object({
  verticalAngles: z.array(finiteNumber()).min(1, 'needs at least one vertical angle'),
  horizontalAngles: z.array(finiteNumber()).min(1, 'needs at least one horizontal angle'),
  candela: z.array(z.array(finiteNumber({ min: 0 }))).min(1, 'needs at least one row of candela values'),
})

const photometryInput = z
  .union([z.string(), intensityTableInput], {
    errorMap: () => ({ message: 'must be the text of an LM-63 (.ies) file or { verticalAngles, horizontalAngles, candela }' }),
  })
  .transform((raw, ctx): { table: IntensityTable; absolute: boolean | null; name: string | null } => {
    if (typeof raw === 'string') {
      const parsed = parseLm63(raw)
      if (!parsed.ok) {
        ctx.addIssue({ code: z.ZodIssueCode.custom, message: `LM-63 file, line ${parsed.error.line}: ${parsed.error.message}` })
        return z.NEVER
      }
      return { table: parsed.value, absolute: parsed.value.absolute, name: parsed.value.keywords.LUMINAIRE ?? null }
    }
    const problem = checkIntensityTable(raw)
    if (problem) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: problem.message, path: problem.path })
      return z.NEVER
    }
    return { table: raw, absolute: null, name: null }
  })

export const spacingInput = z
  .object({
    photometry: photometryInput,
    // Lower bounds keep the solver's grids finite (a vanishing height or width has no meaning here).
    mountingHeight: quantity('length', { positive: true, min: 0.1, max: 30 }),
    emergencyOutputFactor: fraction(),
    maintenanceFactor: fraction().default(0.8),
    criteria: z.enum(['en1838-route', 'en1838-open-area', 'en1838-high-risk', 'nfpa101'], {
      errorMap: () => ({ message: "must be one of 'en1838-route', 'en1838-open-area', 'en1838-high-risk', 'nfpa101'" }),
    }),
    routeWidth: quantity('length', { positive: true, min: 0.1, max: 100 }),
    normalIlluminance: quantity('illuminance', { positive: true, max: 100000 }).optional(),
    routeLength: quantity('length', { positive: true, min: 0.1, max: 2000 }).optional(),
    cPlane: finiteNumber({ min: 0, max: 360 }).default(0),
    heights: z.array(quantity('length', { positive: true, min: 0.1, max: 30 })).max(20, 'at most 20 heights').optional(),
    /** NFPA 101 only: share of the initial emergency output left at the end of the rated duration. */
    endOfDurationFactor: fraction().default(1),
  })
  .superRefine((input, ctx) => {
    if (input.criteria === 'en1838-high-risk' && input.normalIlluminance === undefined) {
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: ['normalIlluminance'],
        message: 'is required for a high-risk task area (the emergency level is 10 % of it, at least 15 lx)',
      })
    }
  })

export type SpacingInput = z.output<typeof spacingInput>

export interface SpacingTableRow {
  mountingHeightM: number
  maxSpacingM: number | null
  maxEndSpacingM: number | null
  minIlluminanceLx: number | null
  uniformityRatio: number | null
  luminairesNeeded?: number | null
}

export interface SpacingResult {
  maxSpacingM: number | null
  maxEndSpacingM: number | null
  minIlluminanceLx: number | null
  maxIlluminanceLx: number | null
  averageIlluminanceLx: number | null
  uniformityRatio: number | null
  requirement: Requirement
  profile: Array<{ x: number; lux: number }>
  spacingTable: SpacingTableRow[]
  luminairesNeeded?: number | null
  warnings: EngineWarning[]
  working: WorkingStep[]
}

const POINT_METHOD: Reference = {
  source: 'IES Lighting Handbook, point-by-point method (inverse-square cosine law)',
  basis: 'published',
}
const MAINTENANCE_BASIS: Reference = {
  source: 'Emergency-lighting design practice: a design maintenance factor of 0.8 is built into isolux and spacing tables',
  basis: 'common practice',
}

interface HeightSolution {
  solver: RowSolver
  spacing: number | null
  end: number | null
  stats: RowStatistics | null
  count?: number | null
}

function solveHeight(input: SpacingInput, table: IntensityTable, criteria: RowCriteria, h: number): HeightSolution {
  const solver = new RowSolver({
    table,
    mountingHeight: h,
    factor: input.maintenanceFactor * input.emergencyOutputFactor,
    cPlane: input.cPlane,
    criteria,
  })
  const spacing = solver.maxSpacing()
  if (spacing === null) return { solver, spacing: null, end: null, stats: null, count: input.routeLength === undefined ? undefined : null }
  const stats = solver.statistics(spacing)
  const end = solver.endDistance(spacing, stats.max)
  const count = input.routeLength === undefined ? undefined : solver.luminairesFor(input.routeLength, spacing, end)
  return { solver, spacing, end, stats, count }
}

const round = (v: number, digits = 4) => Number(v.toFixed(digits))
/** Distances are rounded down, so the figure shown never exceeds the one found. */
const roundDown = (v: number) => Math.floor(v * 1e4 + 1e-9) / 1e4

export function computeSpacing(input: SpacingInput): SpacingResult {
  const { table, absolute } = input.photometry
  const requirement = requirementFor(input.criteria, input.normalIlluminance)
  const criteria = rowCriteria(input.criteria, requirement, input.routeWidth, input.endOfDurationFactor)
  const warnings: EngineWarning[] = []
  const h = input.mountingHeight
  const main = solveHeight(input, table, criteria, h)

  if (input.criteria === 'en1838-route' && input.routeWidth > 2) {
    warnings.push({
      code: 'route-wider-than-2m',
      severity: 'warning',
      field: 'routeWidth',
      message: `EN 1838 escape-route levels are for routes up to 2 m wide; a ${round(input.routeWidth, 2)} m route should be treated as several strips up to 2 m wide (a row each) or as an open area.`,
    })
  }
  if (input.criteria === 'en1838-open-area' && input.routeWidth <= 1) {
    warnings.push({
      code: 'no-core-area',
      severity: 'warning',
      field: 'routeWidth',
      message: 'With the 0.5 m border excluded on both sides this strip has no core area; only the centre line was checked.',
    })
  }
  if (h < 2) {
    warnings.push({
      code: 'mounting-below-2m',
      severity: 'warning',
      field: 'mountingHeight',
      message: 'EN 1838 expects emergency luminaires at least 2 m above the floor where that is practical.',
    })
  }
  if (main.spacing === null) {
    warnings.push({
      code: 'requirement-not-met',
      severity: 'critical',
      message: 'No spacing meets the requirement at this mounting height: the luminaire gives too little light where it is needed, or too uneven a pattern. Try a lower mounting height or a different luminaire.',
    })
  }
  if (main.end === 0) {
    warnings.push({
      code: 'row-end-too-dark',
      severity: 'warning',
      message: 'At the largest spacing the floor below the last luminaire of a row already falls short, because the light from beyond the end is missing: close up the last spacings or add a luminaire near each end.',
    })
  }
  if (absolute === false) {
    warnings.push({
      code: 'relative-photometry',
      severity: 'info',
      field: 'photometry',
      message: 'The file uses relative photometry: its candela values are for the rated lamp lumens, so the emergency output factor must be relative to that output.',
    })
  }
  if (input.criteria !== 'nfpa101' && input.endOfDurationFactor !== 1) {
    warnings.push({
      code: 'end-factor-unused',
      severity: 'info',
      field: 'endOfDurationFactor',
      message: 'The end-of-duration factor is only used for NFPA 101; EN 1838 levels apply for the whole rated duration, so give the lowest emergency output as the emergency output factor.',
    })
  }
  if (input.criteria !== 'en1838-high-risk' && input.normalIlluminance !== undefined) {
    warnings.push({ code: 'normal-illuminance-unused', severity: 'info', field: 'normalIlluminance', message: 'Normal illuminance is only used for high-risk task areas.' })
  }
  if (input.criteria.startsWith('en1838')) {
    const limit = glareLimitCd(h, input.criteria === 'en1838-high-risk')
    const peak = peakIntensityBetween(table, 60, 90) * input.emergencyOutputFactor
    if (peak > limit) {
      warnings.push({
        code: 'glare-limit',
        severity: 'warning',
        field: 'photometry',
        message: `In emergency mode the luminaire sends up to ${round(peak, 0)} cd between 60° and 90° from straight down; the disability-glare limit for ${round(h, 2)} m is ${limit} cd (EN 1838:2013 Table 1, from memory: check the standard).`,
      })
    }
  }
  if (input.routeLength !== undefined && main.spacing !== null && main.count === null) {
    warnings.push({
      code: 'count-not-found',
      severity: 'warning',
      field: 'routeLength',
      message: 'No even row of luminaires passed the check over the whole route length; lay the route out point by point.',
    })
  }
  warnings.push({
    code: 'direct-light-only',
    severity: 'info',
    message: 'Direct light only, on the floor, with no obstructions: reflections are ignored, as emergency-lighting practice requires. Confirm on site with a lux meter after installation.',
  })
  warnings.push({
    code: 'competent-person',
    severity: 'info',
    message: 'This is a design aid. Local codes and a competent, licensed person decide the final layout; isolate the supply before working on luminaires.',
  })

  const spacingTable: SpacingTableRow[] = (input.heights ?? []).map((height) => {
    const s = height === h ? main : solveHeight(input, table, criteria, height)
    const row: SpacingTableRow = {
      mountingHeightM: height,
      maxSpacingM: s.spacing === null ? null : roundDown(s.spacing),
      maxEndSpacingM: s.end === null ? null : roundDown(s.end),
      minIlluminanceLx: s.stats ? round(s.stats.ratioMin) : null,
      uniformityRatio: s.stats && s.stats.ratioMin > 0 ? round(s.stats.max / s.stats.ratioMin) : null,
    }
    if (input.routeLength !== undefined) row.luminairesNeeded = s.count ?? null
    return row
  })

  const stats = main.stats
  const working: WorkingStep[] = [
    {
      id: 'pointIlluminance',
      label: 'Floor illuminance from one luminaire',
      formula: 'E = I(C, γ) · cos³γ / h² · MF · f_em',
      explanation:
        'Each luminaire lights a floor point with its intensity towards that point, reduced by the cube of the cosine of the angle from straight down and divided by the square of the mounting height; the row sum adds every luminaire until one adds less than 0.01 % of the requirement.',
      inputs: [
        { symbol: 'h', label: 'mounting height', value: h, unit: 'm' },
        { symbol: 'MF', label: 'maintenance factor', value: input.maintenanceFactor, unit: '' },
        { symbol: 'f_em', label: 'emergency output factor', value: input.emergencyOutputFactor, unit: '' },
        { symbol: 'I₀', label: 'intensity straight down', value: intensityAt(table, input.cPlane, 0), unit: 'cd' },
      ],
      result: { symbol: 'E₀', label: 'one luminaire, straight below', value: round(main.solver.direct(0, 0), 6), unit: 'lx' },
      references: [POINT_METHOD, MAINTENANCE_BASIS],
    },
    {
      id: 'requirement',
      label: 'Level to meet',
      formula: input.criteria === 'nfpa101' ? 'E_min ≥ 1.1 lx, E_avg ≥ 10.8 lx; at end: f_end·E_min ≥ 0.65 lx, f_end·E_avg ≥ 6.5 lx; E_max/E_min ≤ 40' : `E_min ≥ ${round(requirement.minLx, 3)} lx, E_max/E_min ≤ ${requirement.maxToMin}`,
      explanation: requirement.source,
      inputs: [
        { symbol: 'W', label: 'route or area width', value: input.routeWidth, unit: 'm' },
        ...(input.criteria === 'nfpa101' ? [{ symbol: 'f_end', label: 'output left at the end of the duration', value: input.endOfDurationFactor, unit: '' }] : []),
        ...(input.normalIlluminance !== undefined && input.criteria === 'en1838-high-risk' ? [{ symbol: 'E_n', label: 'normal illuminance', value: input.normalIlluminance, unit: 'lx' }] : []),
      ],
      result: { symbol: 'E_req', label: 'minimum illuminance', value: requirement.minLx, unit: 'lx' },
      references: [{ source: requirement.source.split(' (')[0], basis: 'published' }],
    },
  ]
  if (main.spacing !== null && stats) {
    working.push(
      {
        id: 'maxSpacing',
        label: 'Largest spacing in a long row',
        formula: 'S = max { S : min E(x) ≥ E_req on every checked line, E_max/E_min ≤ limit }',
        explanation: `Spacings are scanned downwards in 0.5 % steps and the boundary is bisected to 1 mm; checked on: ${criteria.lines.map((l) => l.label).join(', ')}.`,
        inputs: [
          { symbol: 'E_min', label: 'minimum at that spacing', value: round(Math.min(...stats.lineMins), 6), unit: 'lx' },
          { symbol: 'E_max', label: 'maximum at that spacing', value: round(stats.max, 6), unit: 'lx' },
        ],
        result: { symbol: 'S', label: 'largest spacing', value: round(main.spacing), unit: 'm' },
        references: [POINT_METHOD],
      },
      {
        id: 'maxEndSpacing',
        label: 'Last luminaire to the end of the route',
        formula: 'd = max { d : E(x) ≥ E_req for 0 ≤ x ≤ d }' + (criteria.endBorder > 0 ? ' + 0.5 m border' : ''),
        explanation: 'The end luminaire and the row behind it must light every point up to the end wall; the shorter of the two directions along the row is given.',
        inputs: [{ symbol: 'S', label: 'spacing in the row', value: round(main.spacing), unit: 'm' }],
        result: { symbol: 'd', label: 'end distance', value: round(main.end ?? 0), unit: 'm' },
        references: [POINT_METHOD],
      },
    )
    if (input.routeLength !== undefined && main.count) {
      working.push({
        id: 'luminairesNeeded',
        label: 'Luminaires for the route',
        formula: 'n = ⌈(L − 2d) / S⌉ + 1, then checked point by point over the finite row',
        explanation: 'A finite row lacks the light from beyond its ends, so the count is checked over the whole route and raised until every point passes.',
        inputs: [
          { symbol: 'L', label: 'route length', value: input.routeLength, unit: 'm' },
          { symbol: 'S', label: 'largest spacing', value: round(main.spacing), unit: 'm' },
          { symbol: 'd', label: 'end distance', value: round(main.end ?? 0), unit: 'm' },
        ],
        result: { symbol: 'n', label: 'luminaires', value: main.count, unit: '' },
        references: [POINT_METHOD],
      })
    }
  }

  const result: SpacingResult = {
    maxSpacingM: main.spacing === null ? null : roundDown(main.spacing),
    maxEndSpacingM: main.end === null ? null : roundDown(main.end),
    minIlluminanceLx: stats ? round(stats.ratioMin, 6) : null,
    maxIlluminanceLx: stats ? round(stats.max, 6) : null,
    averageIlluminanceLx: stats ? round(stats.average, 6) : null,
    uniformityRatio: stats && stats.ratioMin > 0 ? round(stats.max / stats.ratioMin) : null,
    requirement,
    profile: main.spacing === null ? [] : main.solver.profile(main.spacing).map((p) => ({ x: round(p.x), lux: round(p.lux, 6) })),
    spacingTable,
    warnings: sortWarnings(warnings),
    working,
  }
  if (input.routeLength !== undefined) result.luminairesNeeded = main.count ?? null
  return result
}

export const spacingTool = defineTool({
  name: 'spacing',
  summary: 'Largest spacing of emergency luminaires along an escape route, and to the route ends, for EN 1838 or NFPA 101 levels.',
  input: spacingInput,
  run: computeSpacing,
})
