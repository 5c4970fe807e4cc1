/**
 * Points that need a luminaire near them (EN 1838 / BS 5266-1 points of emphasis): their kinds,
 * the distance within which a luminaire must stand, and which luminaire serves which point.
 */
export const EMPHASIS_KINDS = [
  'exit-door',
  'final-exit',
  'change-of-direction',
  'intersection',
  'stairs',
  'change-of-level',
  'fire-fighting-equipment',
  'call-point',
  'first-aid-point',
  'safety-sign',
] as const
export type EmphasisKind = (typeof EMPHASIS_KINDS)[number]

/**
 * What to look for on a route, one reminder per kind (the usual siting practice of BS 5266-1 and
 * EN 1838 4.1 as summarised in trade guidance; common practice where a standard's wording is not held).
 */
export const EMPHASIS_HINTS: Record<EmphasisKind, string> = {
  'exit-door': 'every door meant for use in an emergency',
  'final-exit': 'outside each final exit, to a place of safety',
  'change-of-direction': 'each corner or turn of the route',
  intersection: 'where corridors meet',
  stairs: 'each flight, so every tread gets direct light',
  'change-of-level': 'ramps and steps within a floor',
  'fire-fighting-equipment': 'extinguishers, hose reels and fire panels',
  'call-point': 'each manual call point of the fire alarm',
  'first-aid-point': 'first-aid boxes and stations',
  'safety-sign': 'exit and safety signs that need lighting',
}

/**
 * Largest horizontal distance from a point of emphasis to a luminaire: 2 m (EN 1838 4.1 and
 * BS 5266-1 siting guidance; the clause number is from memory, the 2 m is found in secondary
 * summaries of BS 5266-1:2016: check the standard).
 */
export const EMPHASIS_REACH_M = 2

export interface EmphasisPoint {
  kind: EmphasisKind
  /** Distance from the start of the route, m. */
  atM: number
  /** The designer's own name for it ("door to yard"). */
  name?: string
}

export interface PointServed {
  /** Index of the point in the input list. */
  point: number
  kind: EmphasisKind
  atM: number
  name?: string
  /** Index (0-based) of the luminaire within 2 m that serves it, in positionsM. */
  luminaire: number
  distanceM: number
  /** True when that luminaire stands where it does because of this point (and the others of its group). */
  placedForIt: boolean
}

/** The nearest luminaire to each point, or null when some point has none within reach. */
export function servePoints(positions: number[], points: EmphasisPoint[], placedFor: Map<number, number[]> = new Map()): PointServed[] | null {
  const served: PointServed[] = []
  for (let i = 0; i < points.length; i++) {
    const p = points[i]
    let best = -1
    for (let k = 0; k < positions.length; k++) if (best < 0 || Math.abs(positions[k] - p.atM) < Math.abs(positions[best] - p.atM)) best = k
    const distance = best < 0 ? Infinity : Math.abs(positions[best] - p.atM)
    if (!(distance <= EMPHASIS_REACH_M + 1e-9)) return null
    served.push({
      point: i,
      kind: p.kind,
      atM: p.atM,
      ...(p.name ? { name: p.name } : {}),
      luminaire: best,
      distanceM: distance,
      placedForIt: placedFor.get(best)?.includes(i) ?? false,
    })
  }
  return served
}

const INSIDE_REACH = 0.001

/**
 * Groups of points one luminaire can serve (greedy from the start: a group holds the points
 * within 2 × reach of its first, which is the fewest groups). Each group's luminaire may stand
 * anywhere within reach of all its points, on the route; it goes where the nearest of the
 * `preferred` positions (an even row's) comes closest, or without them at the middle of its points.
 */
export function anchorsFor(points: EmphasisPoint[], routeLength: number, preferred: number[] = []): Array<{ atM: number; points: number[] }> {
  const order = points.map((_, i) => i).sort((a, b) => points[a].atM - points[b].atM)
  const groups: Array<{ atM: number; points: number[] }> = []
  for (const i of order) {
    const g = groups[groups.length - 1]
    if (g && points[i].atM - points[g.points[0]].atM <= 2 * EMPHASIS_REACH_M) g.points.push(i)
    else groups.push({ atM: 0, points: [i] })
  }
  for (const g of groups) {
    const first = points[g.points[0]].atM
    const last = points[g.points[g.points.length - 1]].atM
    // 1 mm inside the reach, so distances rounded for display never read above 2 m.
    const lo = Math.max(0, last - EMPHASIS_REACH_M + INSIDE_REACH)
    const hi = Math.max(lo, Math.min(routeLength, first + EMPHASIS_REACH_M - INSIDE_REACH))
    const middle = Math.min(routeLength, Math.max(0, (first + last) / 2))
    let best = middle
    let bestDistance = Infinity
    for (const p of preferred) {
      const x = Math.min(hi, Math.max(lo, p))
      if (Math.abs(x - p) < bestDistance) {
        bestDistance = Math.abs(x - p)
        best = x
      }
    }
    g.atM = best
  }
  return groups
}
