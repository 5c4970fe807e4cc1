/**
 * The route laid out: fewest luminaires, evenly spaced, end distance chosen with the spacing.
 * Checked against an independent point-by-point computation for an isotropic source, whose
 * floor illuminance has a closed form (IES Lighting Handbook, point method:
 * E = I·h / (h² + r²)^{3/2}), with the levels of EN 1838:2013 4.2 and NFPA 101 (2021) 7.9.2.1
 * written out here rather than taken from the engine.
 */
import { describe, expect, it } from 'vitest'
import { spacingTool } from '../../../shared/engine/spacing'
import { runTool } from '../../../shared/engine/tool'

function run(input: Record<string, unknown>) {
  const outcome = runTool(spacingTool, input)
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  return outcome.result
}

const isotropic = (cd: number) => ({ verticalAngles: [0, 90], horizontalAngles: [0], candela: [[cd, cd]] })

interface Case {
  cd: number
  h: number
  /** Maintenance factor × emergency output factor. */
  factor: number
  width: number
}

/** Floor illuminance at (x, y) from isotropic luminaires at `positions` on the centre line. */
function floorLx(c: Case, positions: number[], x: number, y: number): number {
  let e = 0
  for (const p of positions) {
    const d2 = c.h * c.h + (x - p) ** 2 + y * y
    e += (c.factor * c.cd * c.h) / (d2 * Math.sqrt(d2))
  }
  return e
}

const evenRow = (L: number, n: number, end: number) => (n === 1 ? [L / 2] : Array.from({ length: n }, (_, k) => end + (k * (L - 2 * end)) / (n - 1)))
/** x from 0 to L in steps of at most `step`, both ends included. */
const along = (L: number, step: number) => Array.from({ length: Math.ceil(L / step) + 1 }, (_, k) => (k * L) / Math.ceil(L / step))
/**
 * Where the centre line is checked: every `step` plus the route ends and the points half-way
 * between luminaires (an isotropic row is darkest at one of these).
 */
const checkpoints = (L: number, positions: number[], step: number) =>
  [...along(L, step), ...positions.slice(1).map((p, k) => (p + positions[k]) / 2)].sort((a, b) => a - b)

/**
 * EN 1838:2013 4.2.1 and 4.2.2 for a route up to 2 m wide: at least 1 lx on the centre line, at
 * least 0.5 lx over the central band of half the width, max:min on the centre line at most 40.
 * Returns the smallest of (value / required − 1): ≥ 0 passes.
 */
function en1838RouteMargin(c: Case, L: number, positions: number[], step = 0.01): number {
  let min = Infinity
  let max = 0
  let band = Infinity
  for (const x of checkpoints(L, positions, step)) {
    const e = floorLx(c, positions, x, 0)
    min = Math.min(min, e)
    max = Math.max(max, e)
    for (const y of [c.width / 8, c.width / 4]) band = Math.min(band, floorLx(c, positions, x, y))
  }
  return Math.min(min / 1 - 1, band / 0.5 - 1, (40 * min) / max - 1)
}

/**
 * NFPA 101 (2021) 7.9.2.1: initially an average of 10.8 lx (1 fc) over the floor of the path and
 * at least 1.1 lx (0.1 fc) at any point; at the end of the 1½ h duration 6.5 lx average and
 * 0.65 lx at any point; max:min at most 40. Average by Simpson's rule across the width on 9
 * lines and trapezoids along, `step` apart; minimum also at the ends and half-way between luminaires.
 */
function nfpaFigures(c: Case, L: number, positions: number[], step = 0.01) {
  const ys = Array.from({ length: 9 }, (_, k) => -c.width / 2 + (k * c.width) / 8)
  const simpson = [1, 4, 2, 4, 2, 4, 2, 4, 1].map((w) => w / 24)
  const xs = along(L, step)
  let min = Infinity
  let max = 0
  let average = 0
  xs.forEach((x, i) => {
    const edge = i === 0 || i === xs.length - 1 ? 0.5 : 1
    ys.forEach((y, k) => {
      const e = floorLx(c, positions, x, y)
      max = Math.max(max, e)
      average += (edge * simpson[k] * e) / (xs.length - 1)
    })
  })
  for (const x of checkpoints(L, positions, step)) min = Math.min(min, floorLx(c, positions, x, c.width / 2))
  return { min, max, average }
}

function nfpaMargin(c: Case, L: number, positions: number[], endFactor: number, step = 0.01): number {
  const { min, max, average } = nfpaFigures(c, L, positions, step)
  return Math.min(min / 1.1 - 1, average / 10.8 - 1, (endFactor * min) / 0.65 - 1, (endFactor * average) / 6.5 - 1, (40 * min) / max - 1)
}

/**
 * The best an even row of n can do: the largest margin over end distances 5 cm apart, then
 * around the best of them 5 mm apart (checked every 5 cm along the route and at every point
 * half-way between luminaires, where an isotropic row is darkest).
 */
function bestMargin(L: number, n: number, margin: (positions: number[], step: number) => number): number {
  if (n === 1) return margin([L / 2], 0.05)
  let best = -Infinity
  let bestE = 0
  for (let e = 0; e < L / 2; e += 0.05) {
    const m = margin(evenRow(L, n, e), 0.05)
    if (m > best) [best, bestE] = [m, e]
  }
  for (let e = Math.max(0, bestE - 0.05); e <= Math.min(L / 2, bestE + 0.05); e += 0.005) best = Math.max(best, margin(evenRow(L, n, e), 0.05))
  return best
}

/** The end distance is L/(2n), or as near to it as passes: 2 cm nearer fails. */
function expectEndNearestEven(L: number, layout: { count: number; endDistanceM: number }, margin: (positions: number[]) => number) {
  const target = L / (2 * layout.count)
  const e = layout.endDistanceM
  if (layout.count === 1 || Math.abs(e - target) < 0.005) return
  const nearer = e + Math.sign(target - e) * 0.02
  expect(margin(evenRow(L, layout.count, nearer))).toBeLessThan(0)
}

function expectEven(layout: { count: number; positionsM: number[]; spacingM: number | null; endDistanceM: number }, L: number) {
  const p = layout.positionsM
  expect(p).toHaveLength(layout.count)
  expect(p[0]).toBeCloseTo(layout.endDistanceM, 3)
  expect(L - p[p.length - 1]).toBeCloseTo(layout.endDistanceM, 3)
  for (let k = 1; k < p.length; k++) expect(p[k] - p[k - 1]).toBeCloseTo(layout.spacingM!, 3)
}

// Tolerance of the independent check: the engine leaves out luminaires adding under 0.01 % of the
// requirement each and averages across the width on five lines, so its figures agree to 0.1 %.
const TOLERANCE = 1e-3

describe('even layout, EN 1838 escape route (isotropic 10 cd at 2.5 m, MF 0.8, 2 m wide)', () => {
  const c: Case = { cd: 10, h: 2.5, factor: 0.8, width: 2 }
  it.each([6, 12, 23.5, 40])('route of %s m: evenly spaced, every point passes, one fewer fails wherever placed', { timeout: 120_000 }, (L) => {
    const r = run({
      photometry: isotropic(10),
      mountingHeight: 2.5,
      emergencyOutputFactor: 1,
      maintenanceFactor: 0.8,
      criteria: 'en1838-route',
      routeWidth: 2,
      routeLength: L,
    })
    const layout = r.layout!
    expect(layout).not.toBeNull()
    expect(r.luminairesNeeded).toBe(layout.count)
    expectEven(layout, L)
    const margin = (positions: number[], step = 0.01) => en1838RouteMargin(c, L, positions, step)
    expect(margin(layout.positionsM)).toBeGreaterThanOrEqual(-TOLERANCE)
    expect(bestMargin(L, layout.count - 1, margin)).toBeLessThan(-TOLERANCE)
    expectEndNearestEven(L, layout, margin)
    // The figures the engine gives for the layout are those of the independent computation.
    const centre = checkpoints(L, layout.positionsM, 0.01).map((x) => floorLx(c, layout.positionsM, x, 0))
    expect(layout.minLx).toBeCloseTo(Math.min(...centre), 3)
    expect(layout.maxToMin!).toBeCloseTo(Math.max(...centre) / Math.min(...centre), 2)
  })
})

describe('even layout, NFPA 101 (isotropic 100 cd at 3 m, MF 0.8, 2 m wide)', () => {
  const c: Case = { cd: 100, h: 3, factor: 0.8, width: 2 }
  it.each([
    [10, 1],
    [30, 1],
    [30, 0.55],
    [45, 0.8],
  ])(
    'route of %s m, %s of the output left at the end: average and minimum pass at the start and the end; one fewer fails',
    { timeout: 120_000 },
    (L, endFactor) => {
      const r = run({
        photometry: isotropic(100),
        mountingHeight: 3,
        emergencyOutputFactor: 1,
        maintenanceFactor: 0.8,
        criteria: 'nfpa101',
        routeWidth: 2,
        routeLength: L,
        endOfDurationFactor: endFactor,
      })
      const layout = r.layout!
      expect(layout).not.toBeNull()
      expectEven(layout, L)
      const margin = (positions: number[], step = 0.01) => nfpaMargin(c, L, positions, endFactor, step)
      expect(margin(layout.positionsM)).toBeGreaterThanOrEqual(-TOLERANCE)
      expect(bestMargin(L, layout.count - 1, margin)).toBeLessThan(-TOLERANCE)
      expectEndNearestEven(L, layout, margin)
      const independent = nfpaFigures(c, L, layout.positionsM)
      expect(Math.abs(layout.averageLx / independent.average - 1)).toBeLessThan(TOLERANCE)
      expect(Math.abs(layout.minLx / independent.min - 1)).toBeLessThan(TOLERANCE)
      // Average beside minimum at the end of the rated duration.
      expect(layout.endOfDuration).toEqual({ factor: endFactor, averageLx: expect.any(Number), minLx: expect.any(Number) })
      expect(layout.endOfDuration!.averageLx).toBeCloseTo(layout.averageLx * endFactor, 4)
      expect(layout.endOfDuration!.minLx).toBeCloseTo(layout.minLx * endFactor, 4)
    },
  )

  it('with the output falling to 0.55 the end of the duration governs: more luminaires than with the output held', () => {
    const base = {
      photometry: isotropic(100),
      mountingHeight: 3,
      emergencyOutputFactor: 1,
      maintenanceFactor: 0.8,
      criteria: 'nfpa101',
      routeWidth: 2,
      routeLength: 30,
    }
    const held = run(base).layout!
    const falling = run({ ...base, endOfDurationFactor: 0.55 }).layout!
    expect(falling.count).toBeGreaterThan(held.count)
    expect(falling.endOfDuration!.averageLx).toBeGreaterThanOrEqual(6.5 * (1 - TOLERANCE))
  })
})

describe('layout with nothing to lay out', () => {
  it('no layout without a route length, a null layout when no spacing meets the level', () => {
    const base = { photometry: isotropic(10), mountingHeight: 2.5, emergencyOutputFactor: 1, criteria: 'en1838-route', routeWidth: 2 }
    expect(run(base).layout).toBeUndefined()
    const dark = run({ ...base, photometry: isotropic(0.01), routeLength: 20 })
    expect(dark.layout).toBeNull()
    expect(dark.luminairesNeeded).toBeNull()
  })
  it('a short route lit by one luminaire in its middle', () => {
    const r = run({
      photometry: isotropic(10),
      mountingHeight: 2.5,
      emergencyOutputFactor: 1,
      maintenanceFactor: 0.8,
      criteria: 'en1838-route',
      routeWidth: 2,
      routeLength: 1.5,
    })
    expect(r.layout).toMatchObject({ count: 1, positionsM: [0.75], spacingM: null, endDistanceM: 0.75 })
  })
})
