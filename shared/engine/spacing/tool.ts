/**
 * The spacing tool: the largest distance between emergency luminaires in a long row, and from
 * the last luminaire to the end of the route, such that the floor illuminance meets a chosen
 * criterion (point-by-point method), with the count for a route of given length.
 */
import { intensityAt, type IntensityTable } from '../lm63'
import { defineTool } from '../tool'
import { sortWarnings, type EngineWarning, type Reference, type WorkingStep } from '../types'
import { requirementFor, rowCriteria, type RowCriteria } from './criteria'
import { glareLimitCd, peakIntensityBetween } from './glare'
import { spacingInput, type SpacingInput, type SpacingResult, type SpacingTableRow } from './input'
import { layRoute, type RouteLayout } from './layout'
import { layRouteWithPoints } from './emphasis'
import { EMPHASIS_REACH_M } from './emphasis-points'
import { RowSolver, type RowStatistics } from './row-solver'

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
  /** Undefined without a route length; null when no even row passes. */
  layout?: RouteLayout | null
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
  if (spacing === null) return { solver, spacing: null, end: null, stats: null, ...(input.routeLength === undefined ? {} : { layout: null, count: null }) }
  const stats = solver.statistics(spacing)
  const end = solver.endDistance(spacing, stats.max)
  if (input.routeLength === undefined) return { solver, spacing, end, stats }
  const endFactor = input.criteria === 'nfpa101' ? input.endOfDurationFactor : undefined
  let layout = layRoute(solver, input.routeLength, spacing, endFactor)
  if (input.points?.length) {
    const points = input.points.map((p) => ({ kind: p.kind, atM: p.at, ...(p.name ? { name: p.name } : {}) }))
    layout = layRouteWithPoints(solver, input.routeLength, spacing, points, layout, endFactor)
  }
  return { solver, spacing, end, stats, layout, count: layout?.count ?? null }
}

const round = (v: number, digits = 4) => Number(v.toFixed(digits))
/** Distances are rounded down, so the figure shown never exceeds the one found. */
const roundDown = (v: number) => Math.floor(v * 1e4 + 1e-9) / 1e4

function roundLayout(l: RouteLayout): RouteLayout {
  const out: RouteLayout = {
    count: l.count,
    positionsM: l.positionsM.map((p) => round(p)),
    spacingM: l.spacingM === null ? null : round(l.spacingM),
    endDistanceM: round(l.endDistanceM),
    averageLx: round(l.averageLx, 6),
    minLx: round(l.minLx, 6),
    maxToMin: l.maxToMin === null ? null : round(l.maxToMin),
  }
  if (l.even === false) out.even = false
  if (l.pointsServed) out.pointsServed = l.pointsServed.map((p) => ({ ...p, atM: round(p.atM), distanceM: round(p.distanceM) }))
  if (l.endOfDuration)
    out.endOfDuration = { factor: l.endOfDuration.factor, averageLx: round(l.endOfDuration.averageLx, 6), minLx: round(l.endOfDuration.minLx, 6) }
  return out
}

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
      message:
        'No spacing meets the requirement at this mounting height: the luminaire gives too little light where it is needed, or too uneven a pattern. Try a lower mounting height or a different luminaire.',
    })
  }
  if (main.end === 0) {
    warnings.push({
      code: 'row-end-too-dark',
      severity: 'warning',
      message:
        'At the largest spacing the floor below the last luminaire of a row already falls short, because the light from beyond the end is missing: close up the last spacings or add a luminaire near each end.',
    })
  }
  if (absolute === false) {
    warnings.push({
      code: 'relative-photometry',
      severity: 'info',
      field: 'photometry',
      message:
        'The file uses relative photometry: its candela values are for the rated lamp lumens, so the emergency output factor must be relative to that output.',
    })
  }
  if (input.criteria !== 'nfpa101' && input.endOfDurationFactor !== 1) {
    warnings.push({
      code: 'end-factor-unused',
      severity: 'info',
      field: 'endOfDurationFactor',
      message:
        'The end-of-duration factor is only used for NFPA 101; EN 1838 levels apply for the whole rated duration, so give the lowest emergency output as the emergency output factor.',
    })
  }
  if (input.criteria !== 'en1838-high-risk' && input.normalIlluminance !== undefined) {
    warnings.push({
      code: 'normal-illuminance-unused',
      severity: 'info',
      field: 'normalIlluminance',
      message: 'Normal illuminance is only used for high-risk task areas.',
    })
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
  if (input.points?.length && main.spacing !== null && main.layout === null) {
    warnings.push({
      code: 'points-not-served',
      severity: 'warning',
      field: 'points',
      message: `No row with a luminaire within ${EMPHASIS_REACH_M} m of every marked point passed the check over the whole route; place the luminaires at those points by hand and check the route point by point.`,
    })
  } else if (input.routeLength !== undefined && main.spacing !== null && main.count === null) {
    warnings.push({
      code: 'count-not-found',
      severity: 'warning',
      field: 'routeLength',
      message: 'No even row of luminaires, at any end distance tried, passed the check over the whole route length; lay the route out point by point.',
    })
  }
  warnings.push({
    code: 'direct-light-only',
    severity: 'info',
    message:
      'Direct light only, on the floor, with no obstructions: reflections are ignored, as emergency-lighting practice requires. Confirm on site with a lux meter after installation.',
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
      formula:
        input.criteria === 'nfpa101'
          ? 'E_min ≥ 1.1 lx, E_avg ≥ 10.8 lx; at end: f_end·E_min ≥ 0.65 lx, f_end·E_avg ≥ 6.5 lx; E_max/E_min ≤ 40'
          : `E_min ≥ ${round(requirement.minLx, 3)} lx, E_max/E_min ≤ ${requirement.maxToMin}`,
      explanation: requirement.source,
      inputs: [
        { symbol: 'W', label: 'route or area width', value: input.routeWidth, unit: 'm' },
        ...(input.criteria === 'nfpa101'
          ? [{ symbol: 'f_end', label: 'output left at the end of the duration', value: input.endOfDurationFactor, unit: '' }]
          : []),
        ...(input.normalIlluminance !== undefined && input.criteria === 'en1838-high-risk'
          ? [{ symbol: 'E_n', label: 'normal illuminance', value: input.normalIlluminance, unit: 'lx' }]
          : []),
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
        explanation:
          'The end luminaire and the row behind it must light every point up to the end wall; the shorter of the two directions along the row is given.',
        inputs: [{ symbol: 'S', label: 'spacing in the row', value: round(main.spacing), unit: 'm' }],
        result: { symbol: 'd', label: 'end distance', value: round(main.end ?? 0), unit: 'm' },
        references: [POINT_METHOD],
      },
    )
    const served = main.layout?.pointsServed
    if (input.routeLength !== undefined && main.layout && served) {
      const l = main.layout
      working.push({
        id: 'points',
        label: 'Points that need a luminaire',
        formula: `|x_point − x_luminaire| ≤ ${EMPHASIS_REACH_M} m for every marked point`,
        explanation:
          l.even === false
            ? `The even row left a marked point more than ${EMPHASIS_REACH_M} m from a luminaire, so a luminaire stands within reach of each group of points, as near an even row's place as it can (one luminaire serves points up to ${2 * EMPHASIS_REACH_M} m apart) and each stretch between is filled with the fewest evenly spaced luminaires for which the whole route still passes.`
            : `The even row already has a luminaire within ${EMPHASIS_REACH_M} m of every marked point.`,
        inputs: served.map((p) => ({
          symbol: `d${p.point + 1}`,
          label: `point ${p.point + 1} at ${round(p.atM, 3)} m to luminaire ${p.luminaire + 1}`,
          value: round(p.distanceM),
          unit: 'm',
        })),
        result: { symbol: 'n', label: 'luminaires', value: l.count, unit: '' },
        references: [
          {
            source:
              'EN 1838 4.1 and BS 5266-1 siting of luminaires near points of emphasis (2 m from secondary summaries; clause from memory: check the standard)',
            basis: 'from memory',
          },
        ],
      })
    }
    if (input.routeLength !== undefined && main.layout) {
      const l = main.layout
      working.push({
        id: 'luminairesNeeded',
        label: 'Luminaires for the route',
        formula: 'n = fewest with every point of the route passing; positions d + k·(L − 2d)/(n − 1), d chosen with n',
        explanation:
          'A finite row lacks the light from beyond its ends, so it is checked point by point over the whole route, both ends included, with only its own luminaires. The count starts at ⌈L/S⌉ and is lowered while one fewer still passes, or raised until one passes; for each count the end distance d is L/(2n) (each luminaire in the middle of an equal share of the route) when that passes, else the passing end distance nearest to it.',
        inputs: [
          { symbol: 'L', label: 'route length', value: input.routeLength, unit: 'm' },
          { symbol: 'S', label: 'largest spacing in a long row', value: round(main.spacing), unit: 'm' },
        ],
        result: { symbol: 'n', label: 'luminaires', value: l.count, unit: '' },
        references: [POINT_METHOD],
      })
      working.push({
        id: 'layout',
        label: 'The route as laid out',
        formula: input.criteria === 'nfpa101' ? 'E_avg, E_min over the route; at the end of the duration × f_end' : 'E_min, E_max/E_min over the route',
        explanation: `Spacing ${round(l.spacingM ?? 0, 3)} m, ${round(l.endDistanceM, 3)} m from each end; figures from the finite row over the whole route.`,
        inputs: [
          { symbol: 's', label: 'spacing', value: round(l.spacingM ?? 0), unit: 'm' },
          { symbol: 'd', label: 'end distance', value: round(l.endDistanceM), unit: 'm' },
          { symbol: 'E_min', label: 'minimum over the route', value: round(l.minLx, 6), unit: 'lx' },
          ...(l.endOfDuration
            ? [{ symbol: 'E_avg,end', label: 'average at the end of the rated duration', value: round(l.endOfDuration.averageLx, 6), unit: 'lx' }]
            : []),
        ],
        result: { symbol: 'E_avg', label: 'average over the route', value: round(l.averageLx, 6), unit: 'lx' },
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
  if (input.routeLength !== undefined) {
    result.luminairesNeeded = main.count ?? null
    result.layout = main.layout ? roundLayout(main.layout) : null
  }
  return result
}

export const spacingTool = defineTool({
  name: 'spacing',
  summary: 'Largest spacing of emergency luminaires along an escape route, and to the route ends, for EN 1838 or NFPA 101 levels.',
  input: spacingInput,
  run: computeSpacing,
})
