/**
 * Points that need a luminaire: a luminaire within 2 m horizontally of each marked point (EN 1838
 * 4.1 / BS 5266-1 siting near points of emphasis; the 2 m from secondary summaries of BS 5266-1,
 * the clause from memory), the route still passing every criterion. Checked for an isotropic
 * source by an independent point-by-point computation (IES Lighting Handbook, point method:
 * E = I·h / (h² + r²)^{3/2}) with the levels of EN 1838:2013 4.2 and NFPA 101 (2021) 7.9.2.1
 * written out here.
 */
import { describe, expect, it } from 'vitest'
import { anchorsFor, spacingTool, type RouteLayout } from '../../../shared/engine/spacing'
import { runTool } from '../../../shared/engine/tool'

const isotropic = (cd: number) => ({ verticalAngles: [0, 90], horizontalAngles: [0], candela: [[cd, cd]] })

function run(input: Record<string, unknown>) {
  const outcome = runTool(spacingTool, input)
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  return outcome.result
}

/** Floor illuminance at (x, y) from isotropic luminaires of `cd` × `factor` at height h. */
const floorLx = (cd: number, h: number, positions: number[], x: number, y: number) =>
  positions.reduce((e, p) => {
    const d2 = h * h + (x - p) ** 2 + y * y
    return e + (0.8 * cd * h) / (d2 * Math.sqrt(d2))
  }, 0)

/** x every `step` from 0 to L, plus the points half-way between luminaires (an isotropic row is darkest at one of these). */
const checkpoints = (L: number, positions: number[], step = 0.01) => {
  const n = Math.ceil(L / step)
  return [...Array.from({ length: n + 1 }, (_, k) => (k * L) / n), ...positions.slice(1).map((p, k) => (p + positions[k]) / 2)]
}

/** EN 1838:2013 4.2.1/4.2.2, route up to 2 m wide: ≥ 1 lx on the centre line, ≥ 0.5 lx over the central half, max:min ≤ 40. */
function en1838Margin(cd: number, h: number, width: number, L: number, positions: number[]): number {
  let min = Infinity
  let max = 0
  let band = Infinity
  for (const x of checkpoints(L, positions)) {
    const e = floorLx(cd, h, positions, x, 0)
    min = Math.min(min, e)
    max = Math.max(max, e)
    band = Math.min(band, floorLx(cd, h, positions, x, width / 4))
  }
  return Math.min(min - 1, band / 0.5 - 1, (40 * min) / max - 1)
}

/** NFPA 101 (2021) 7.9.2.1: ≥ 1.1 lx anywhere, 10.8 lx average (here: on the centre and edge lines, trapezoids along), max:min ≤ 40. */
function nfpaMinimumMargin(cd: number, h: number, width: number, L: number, positions: number[]): number {
  let min = Infinity
  let max = 0
  for (const x of checkpoints(L, positions)) {
    for (const y of [0, width / 2]) {
      const e = floorLx(cd, h, positions, x, y)
      min = Math.min(min, e)
      max = Math.max(max, e)
    }
  }
  return Math.min(min / 1.1 - 1, (40 * min) / max - 1)
}

const TOLERANCE = 1e-3
const within2m = (layout: RouteLayout, at: number) => layout.positionsM.some((p) => Math.abs(p - at) <= 2 + 1e-9)

describe('points that need a luminaire, EN 1838 escape route (isotropic 20 cd at 2.5 m, MF 0.8, 2 m wide, 30 m)', () => {
  const base = {
    photometry: isotropic(20),
    mountingHeight: 2.5,
    emergencyOutputFactor: 1,
    maintenanceFactor: 0.8,
    criteria: 'en1838-route',
    routeWidth: 2,
    routeLength: 30,
  }
  const plain = run(base).layout!
  const points = [
    { kind: 'exit-door', at: 30, name: 'door to the yard' },
    { kind: 'call-point', at: 12 },
  ]
  const r = run({ ...base, points })
  const layout = r.layout!

  it('the even row leaves a point more than 2 m from a luminaire, so the layout changes', () => {
    expect(within2m(plain, 30) && within2m(plain, 12)).toBe(false)
    expect(layout.even).toBe(false)
  })
  it('every marked point has a luminaire within 2 m, and the answer says which one', () => {
    for (const p of points) expect(within2m(layout, p.at)).toBe(true)
    expect(layout.pointsServed).toHaveLength(2)
    for (const s of layout.pointsServed!) {
      expect(s.distanceM).toBeCloseTo(Math.abs(layout.positionsM[s.luminaire] - s.atM), 3)
      expect(s.distanceM).toBeLessThanOrEqual(2 + 1e-9)
    }
    expect(layout.pointsServed![0]).toMatchObject({ point: 0, kind: 'exit-door', name: 'door to the yard', placedForIt: true })
  })
  it('the whole route still meets every criterion by the independent point method', () => {
    expect(en1838Margin(20, 2.5, 2, 30, layout.positionsM)).toBeGreaterThanOrEqual(-TOLERANCE)
    expect(r.luminairesNeeded).toBe(layout.count)
    expect(layout.positionsM).toHaveLength(layout.count)
  })
  it('no luminaire is spare: taking any one away leaves a point unserved or the route short of light', () => {
    for (let k = 0; k < layout.count; k++) {
      const fewer = layout.positionsM.filter((_, i) => i !== k)
      const served = points.every((p) => fewer.some((x) => Math.abs(x - p.at) <= 2 + 1e-9))
      expect(served && en1838Margin(20, 2.5, 2, 30, fewer) >= 0).toBe(false)
    }
  })
  it('the working names the rule and its source', () => {
    const step = r.working.find((w) => w.id === 'points')!
    expect(step.formula).toContain('≤ 2 m')
    expect(step.references[0].basis).toBe('from memory')
  })
})

describe('points an even row already serves leave it as it is', () => {
  it('NFPA 101, isotropic 100 cd at 3 m, 30 m: a point at a luminaire keeps the even row', () => {
    const base = {
      photometry: isotropic(100),
      mountingHeight: 3,
      emergencyOutputFactor: 1,
      maintenanceFactor: 0.8,
      criteria: 'nfpa101',
      routeWidth: 2,
      routeLength: 30,
    }
    const plain = run(base).layout!
    const at = plain.positionsM[1] + 1.5
    const withPoint = run({ ...base, points: [{ kind: 'stairs', at }] }).layout!
    expect(withPoint.positionsM).toEqual(plain.positionsM)
    expect(withPoint.even).toBeUndefined()
    expect(withPoint.pointsServed).toEqual([{ point: 0, kind: 'stairs', atM: Number(at.toFixed(4)), luminaire: 1, distanceM: 1.5, placedForIt: false }])
  })
  it('NFPA 101: a point the even row misses moves the layout, which still passes the minimum and max:min', () => {
    const base = {
      photometry: isotropic(100),
      mountingHeight: 3,
      emergencyOutputFactor: 1,
      maintenanceFactor: 0.8,
      criteria: 'nfpa101',
      routeWidth: 2,
      routeLength: 30,
    }
    const plain = run(base).layout!
    const gapMiddle = (plain.positionsM[0] + plain.positionsM[1]) / 2
    expect(within2m(plain, gapMiddle)).toBe(false)
    const moved = run({ ...base, points: [{ kind: 'first-aid-point', at: gapMiddle }] }).layout!
    expect(within2m(moved, gapMiddle)).toBe(true)
    expect(nfpaMinimumMargin(100, 3, 2, 30, moved.positionsM)).toBeGreaterThanOrEqual(-TOLERANCE)
    expect(moved.averageLx).toBeGreaterThanOrEqual(10.8 * (1 - TOLERANCE))
  })
})

describe('grouping points: one luminaire serves points up to 4 m apart', () => {
  const pts = (...at: number[]) => at.map((a) => ({ kind: 'exit-door' as const, atM: a }))
  it('points 3.9 m apart share a luminaire; 4.1 m apart need two', () => {
    expect(anchorsFor(pts(10, 13.9), 30)).toHaveLength(1)
    expect(anchorsFor(pts(10, 14.1), 30)).toHaveLength(2)
  })
  it('the luminaire stays within reach of all its points and on the route', () => {
    const [g] = anchorsFor(pts(0.5, 3), 30, [4.5])
    expect(g.atM).toBeCloseTo(2.499, 9) // as near the preferred 4.5 m as 2 m (less 1 mm) from the point at 0.5 m allows
    const [end] = anchorsFor(pts(30), 30)
    expect(end.atM).toBe(30)
  })
})

describe('marked points are checked before anything is laid out', () => {
  const base = { photometry: isotropic(20), mountingHeight: 2.5, emergencyOutputFactor: 1, criteria: 'en1838-route', routeWidth: 2 }
  it('a point beyond the end of the route is refused, naming it', () => {
    const outcome = runTool(spacingTool, { ...base, routeLength: 20, points: [{ kind: 'exit-door', at: 21 }] })
    expect(outcome.ok).toBe(false)
    if (!outcome.ok) expect(outcome.fields).toContainEqual({ path: 'points.0.at', message: expect.stringMatching(/beyond the end of the route/) })
  })
  it('points need a route length, and a kind the engine knows', () => {
    const outcome = runTool(spacingTool, { ...base, points: [{ kind: 'door', at: 2 }] })
    expect(outcome.ok).toBe(false)
    if (!outcome.ok) {
      const paths = outcome.fields.map((f) => f.path)
      expect(paths).toContain('points.0.kind')
    }
    const noLength = runTool(spacingTool, { ...base, points: [{ kind: 'exit-door', at: 2 }] })
    expect(noLength.ok).toBe(false)
    if (!noLength.ok) expect(noLength.fields.map((f) => f.path)).toContain('routeLength')
  })
})
