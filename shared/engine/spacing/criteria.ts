/**
 * What each criterion asks of the floor (EN 1838, NFPA 101), and where across the width of a
 * route or strip it is checked.
 */

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
        source:
          'NFPA 101 (2021) 7.9.2.1 (initial: average 10.8 lx (1 fc), any point ≥ 1.1 lx (0.1 fc); at the end of 1½ h: average 6.5 lx, any point ≥ 0.65 lx; max:min ≤ 40:1)',
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
      return {
        lines: simpson3(widthM / 4, (requirement.bandMinLx ?? 0.5) / requirement.minLx, false, 'central band edge'),
        scenarios: [initial],
        maxToMin: requirement.maxToMin,
        endBorder: 0,
      }
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
