/**
 * Choosing a luminaire type for an escape route: for each candidate type, the spacing and the
 * number of luminaires its photometry needs on the route, the standby power of that many, and
 * the battery pack each one needs for the route's rated duration (the `size` tool).
 */
import { sizeInputSchema, sizePack } from './size'
import { computeSpacing, spacingInput, type CriteriaId } from './spacing'
import type { IntensityTable } from './lm63'
import type { ChemistryId } from './chemistries/types'
import type { EngineWarning } from './types'

const SECONDS_PER_HOUR = 3600

export interface RouteNeed {
  routeLengthM: number
  routeWidthM: number
  mountingHeightM: number
  criteria: CriteriaId
  ratedDurationS: number
  maintenanceFactor: number
  normalIlluminanceLx?: number
}

export interface TypeCandidate {
  id: string
  name: string
  /** The type's intensity table, or null when it has no photometric file. */
  table: IntensityTable | null
  emergencyOutputFactor: number
  ratedDurationS: number
  chemistry: ChemistryId
  cellsInSeries: number | null
  /** Fitted pack, Ah, if the type states one. */
  capacityAh: number | null
  /** Power at the light source on battery, W. */
  emergencyPowerW: number
  /** Mains input power in standby (charging, plus the lamp when maintained), W. */
  inputPowerW: number
}

export interface PackNeed {
  chemistry: ChemistryId
  cellsInSeries: number
  requiredCapacityAh: number
  /** The pack the size tool picks from the chemistry's capacity steps. */
  selectedCapacityAh: number
  fittedCapacityAh: number | null
  /** Whether the fitted pack covers the need; null when no pack is stated. */
  fittedPackEnough: boolean | null
  runtimeEndOfLifeH: number
}

export interface TypeSelection {
  id: string
  name: string
  meets: boolean
  /** Why the type does not meet the route (empty when it does). */
  reasons: string[]
  luminairesNeeded: number | null
  maxSpacingM: number | null
  maxEndSpacingM: number | null
  minIlluminanceLx: number | null
  uniformityRatio: number | null
  totalStandbyPowerW: number | null
  pack: PackNeed | null
  /** Critical and ordinary warnings from the spacing and size tools. */
  warnings: EngineWarning[]
}

const round = (v: number, digits = 4) => Number(v.toFixed(digits))

function packFor(route: RouteNeed, c: TypeCandidate): { pack: PackNeed | null; reason: string | null; warnings: EngineWarning[] } {
  const parsed = sizeInputSchema.safeParse({
    chemistry: c.chemistry,
    ...(c.cellsInSeries ? { cellsInSeries: c.cellsInSeries } : {}),
    duration: route.ratedDurationS,
    driver: 'converter',
    load: { power: c.emergencyPowerW, ...(c.inputPowerW > 0 ? { mainsPower: c.inputPowerW } : {}) },
  })
  if (!parsed.success) {
    const first = parsed.error.issues[0]
    return { pack: null, reason: `pack cannot be sized: ${first.path.join('.')} ${first.message}`, warnings: [] }
  }
  const size = sizePack(parsed.data, { explain: false })
  const fittedEnough = c.capacityAh === null ? null : c.capacityAh >= size.requiredCapacityAh * (1 - 1e-9)
  return {
    pack: {
      chemistry: size.chemistry,
      cellsInSeries: size.cellsInSeries,
      requiredCapacityAh: round(size.requiredCapacityAh),
      selectedCapacityAh: size.selectedCapacityAh,
      fittedCapacityAh: c.capacityAh,
      fittedPackEnough: fittedEnough,
      runtimeEndOfLifeH: round(size.runtimeEndOfLifeH),
    },
    reason: null,
    warnings: size.warnings.filter((w) => w.severity !== 'info'),
  }
}

/** One candidate against the route. */
export function assessType(route: RouteNeed, c: TypeCandidate): TypeSelection {
  const out: TypeSelection = {
    id: c.id,
    name: c.name,
    meets: false,
    reasons: [],
    luminairesNeeded: null,
    maxSpacingM: null,
    maxEndSpacingM: null,
    minIlluminanceLx: null,
    uniformityRatio: null,
    totalStandbyPowerW: null,
    pack: null,
    warnings: [],
  }
  if (c.ratedDurationS < route.ratedDurationS * (1 - 1e-9)) {
    out.reasons.push(`rated duration ${round(c.ratedDurationS / SECONDS_PER_HOUR, 2)} h is shorter than the ${round(route.ratedDurationS / SECONDS_PER_HOUR, 2)} h the route needs`)
  }
  if (!c.table) {
    out.reasons.push('has no photometric file')
    return out
  }
  const input = spacingInput.safeParse({
    photometry: c.table,
    mountingHeight: route.mountingHeightM,
    emergencyOutputFactor: c.emergencyOutputFactor,
    maintenanceFactor: route.maintenanceFactor,
    criteria: route.criteria,
    routeWidth: route.routeWidthM,
    routeLength: route.routeLengthM,
    ...(route.normalIlluminanceLx !== undefined ? { normalIlluminance: route.normalIlluminanceLx } : {}),
  })
  if (!input.success) {
    const first = input.error.issues[0]
    out.reasons.push(`spacing cannot be computed: ${first.path.join('.')} ${first.message}`)
    return out
  }
  const spacing = computeSpacing(input.data)
  out.maxSpacingM = spacing.maxSpacingM
  out.maxEndSpacingM = spacing.maxEndSpacingM
  out.minIlluminanceLx = spacing.minIlluminanceLx
  out.uniformityRatio = spacing.uniformityRatio
  out.luminairesNeeded = spacing.luminairesNeeded ?? null
  out.warnings.push(...spacing.warnings.filter((w) => w.severity !== 'info'))
  if (spacing.maxSpacingM === null) out.reasons.push('no spacing meets the levels at this mounting height')
  else if (out.luminairesNeeded === null) out.reasons.push('no even row passed the check over the whole route')
  if (out.luminairesNeeded !== null) out.totalStandbyPowerW = round(out.luminairesNeeded * c.inputPowerW, 3)

  const pack = packFor(route, c)
  out.pack = pack.pack
  out.warnings.push(...pack.warnings)
  if (pack.reason) out.reasons.push(pack.reason)
  if (pack.pack?.fittedPackEnough === false) {
    out.reasons.push(`fitted ${pack.pack.fittedCapacityAh} Ah pack is below the ${pack.pack.requiredCapacityAh} Ah needed for the route's duration`)
  }
  out.meets = out.reasons.length === 0
  return out
}

/** Every candidate, those meeting the route first (fewest luminaires, then least standby power). */
export function selectTypesForRoute(route: RouteNeed, candidates: TypeCandidate[]): TypeSelection[] {
  const assessed = candidates.map((c) => assessType(route, c))
  return assessed.sort(
    (a, b) =>
      Number(b.meets) - Number(a.meets) ||
      (a.luminairesNeeded ?? Infinity) - (b.luminairesNeeded ?? Infinity) ||
      (a.totalStandbyPowerW ?? Infinity) - (b.totalStandbyPowerW ?? Infinity) ||
      a.name.localeCompare(b.name),
  )
}
