/**
 * Choosing a luminaire type for an escape route: for each candidate type, the spacing and the
 * number of luminaires its photometry needs on the route, the standby power of that many, and
 * the battery pack each one needs for the route's rated duration (the `size` tool).
 *
 * The spacing calculator and this selector build the spacing tool's input with the same
 * function (`spacingRequestFor`) and read the light's verdict with the same one
 * (`lightVerdict`), so for the same route and type they agree.
 */
import { sizeInputSchema, sizePack } from './size'
import { computeSpacing, spacingInput, type CriteriaId, type RouteLayout, type SpacingResult } from './spacing'
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
  /** Typed by the designer: overrides each type's own emergency output factor. */
  emergencyOutputFactor?: number
  /** NFPA 101: share of the initial output left at the end of the rated duration (default 1). */
  endOfDurationFactor?: number
}

/** Where an input value came from: the luminaire type, or typed by the designer over it. */
export interface TakenValue {
  value: number
  from: 'type' | 'typed'
  /** The type's own value, when the designer typed another. */
  typeValue?: number
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

export type SelectionVerdict = 'meets' | 'light' | 'pack' | 'both'

export interface TypeSelection {
  id: string
  name: string
  meets: boolean
  /** What fails: nothing ('meets'), the light, the pack (duration), or both. */
  verdict: SelectionVerdict
  /** Why the type does not meet the route (empty when it does): the light's reasons, then the pack's. */
  reasons: string[]
  lightReasons: string[]
  packReasons: string[]
  /** One sentence for the table: the verdict and its main reason. */
  summary: string
  /** The even layout on the route (null when none passes or there is no photometry). */
  layout: RouteLayout | null
  emergencyOutputFactor: TakenValue
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
/** Three significant figures, as every result screen shows them. */
const sig = (v: number) => String(Number(v.toPrecision(3)))

/** The emergency output factor used for a type on a route, and where it came from. */
export function takenOutputFactor(route: RouteNeed, typeFactor: number): TakenValue {
  if (route.emergencyOutputFactor === undefined || route.emergencyOutputFactor === typeFactor) return { value: typeFactor, from: 'type' }
  return { value: route.emergencyOutputFactor, from: 'typed', typeValue: typeFactor }
}

/**
 * The spacing tool's input for one type on a route: the one path both the spacing calculator
 * and the type selector take. Values are SI; the calculator adds its table of heights.
 */
export function spacingRequestFor(route: RouteNeed, type: { table: IntensityTable; emergencyOutputFactor: number }): Record<string, unknown> {
  return {
    photometry: type.table,
    mountingHeight: route.mountingHeightM,
    emergencyOutputFactor: takenOutputFactor(route, type.emergencyOutputFactor).value,
    maintenanceFactor: route.maintenanceFactor,
    criteria: route.criteria,
    routeWidth: route.routeWidthM,
    routeLength: route.routeLengthM,
    ...(route.normalIlluminanceLx !== undefined ? { normalIlluminance: route.normalIlluminanceLx } : {}),
    ...(route.endOfDurationFactor !== undefined ? { endOfDurationFactor: route.endOfDurationFactor } : {}),
  }
}

/** Whether the light meets the route, and why not: read the same way by the calculator and the selector. */
export function lightVerdict(result: Pick<SpacingResult, 'maxSpacingM' | 'layout'>): { meets: boolean; reasons: string[] } {
  if (result.maxSpacingM === null) return { meets: false, reasons: ['no spacing meets the levels at this mounting height'] }
  if (!result.layout) return { meets: false, reasons: ['no even row passes the check over the whole route'] }
  return { meets: true, reasons: [] }
}

function packFor(route: RouteNeed, c: TypeCandidate): { pack: PackNeed | null; reason: string | null; warnings: EngineWarning[] } {
  const parsed = sizeInputSchema.safeParse({
    chemistry: c.chemistry,
    ...(c.cellsInSeries ? { cellsInSeries: c.cellsInSeries } : {}),
    // Quantities carry their units: a bare number is refused as ambiguous.
    duration: `${route.ratedDurationS} s`,
    driver: 'converter',
    load: { power: `${c.emergencyPowerW} W`, ...(c.inputPowerW > 0 ? { mainsPower: `${c.inputPowerW} W` } : {}) },
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
    verdict: 'both',
    reasons: [],
    lightReasons: [],
    packReasons: [],
    summary: '',
    layout: null,
    emergencyOutputFactor: takenOutputFactor(route, c.emergencyOutputFactor),
    luminairesNeeded: null,
    maxSpacingM: null,
    maxEndSpacingM: null,
    minIlluminanceLx: null,
    uniformityRatio: null,
    totalStandbyPowerW: null,
    pack: null,
    warnings: [],
  }
  const hours = (s: number) => `${sig(s / SECONDS_PER_HOUR)} h`
  if (c.ratedDurationS < route.ratedDurationS * (1 - 1e-9)) {
    out.packReasons.push(`rated for ${hours(c.ratedDurationS)}, shorter than the ${hours(route.ratedDurationS)} the route needs`)
  }
  if (!c.table) out.lightReasons.push('has no photometric file')
  else {
    const input = spacingInput.safeParse(spacingRequestFor(route, { table: c.table, emergencyOutputFactor: c.emergencyOutputFactor }))
    if (!input.success) {
      const first = input.error.issues[0]
      out.lightReasons.push(`spacing cannot be worked out: ${first.path.join('.')} ${first.message}`)
    } else {
      const spacing = computeSpacing(input.data)
      out.maxSpacingM = spacing.maxSpacingM
      out.maxEndSpacingM = spacing.maxEndSpacingM
      out.minIlluminanceLx = spacing.minIlluminanceLx
      out.uniformityRatio = spacing.uniformityRatio
      out.layout = spacing.layout ?? null
      out.luminairesNeeded = spacing.luminairesNeeded ?? null
      out.warnings.push(...spacing.warnings.filter((w) => w.severity !== 'info'))
      out.lightReasons.push(...lightVerdict(spacing).reasons)
      if (out.luminairesNeeded !== null) out.totalStandbyPowerW = round(out.luminairesNeeded * c.inputPowerW, 3)
    }
  }

  const pack = packFor(route, c)
  out.pack = pack.pack
  out.warnings.push(...pack.warnings)
  if (pack.reason) out.packReasons.push(pack.reason)
  if (pack.pack?.fittedPackEnough === false) {
    out.packReasons.push(
      `the fitted ${sig(pack.pack.fittedCapacityAh!)} Ah pack is below the ${sig(pack.pack.requiredCapacityAh)} Ah needed for ${hours(route.ratedDurationS)} (the next pack step is ${sig(pack.pack.selectedCapacityAh)} Ah)`,
    )
  }
  out.reasons = [...out.lightReasons, ...out.packReasons]
  const lightOk = out.lightReasons.length === 0
  const packOk = out.packReasons.length === 0
  out.meets = lightOk && packOk
  out.verdict = out.meets ? 'meets' : lightOk ? 'pack' : packOk ? 'light' : 'both'
  const row = out.layout
    ? `${out.layout.count} luminaire${out.layout.count === 1 ? '' : 's'}${out.layout.spacingM !== null ? ` ${sig(out.layout.spacingM)} m apart` : ''}`
    : ''
  out.summary =
    out.verdict === 'meets'
      ? `Meets the route: ${row}, ${out.pack?.fittedPackEnough ? 'and the fitted pack lasts the duration' : `with a ${out.pack ? sig(out.pack.selectedCapacityAh) + ' Ah ' : ''}pack for the duration (no fitted pack stated)`}.`
      : out.verdict === 'pack'
        ? `Meets the light with ${row}, but not the duration: ${out.packReasons.join('; ')}.`
        : out.verdict === 'light'
          ? `The pack lasts the duration, but the light does not meet the route: ${out.lightReasons.join('; ')}.`
          : `Neither the light nor the pack meets the route: ${out.reasons.join('; ')}.`
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
