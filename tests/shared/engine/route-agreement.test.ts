/**
 * The spacing calculator and the type selector give one answer: for every demo luminaire type
 * and every criterion, the selector's verdict on the light, its count and spacing are those of
 * the spacing tool run on the request the calculator sends for the same route and type.
 */
import { describe, expect, it } from 'vitest'
import { DEMO, demoText } from '../../../server/demo/photometry.demo-data'
import { parseLm63 } from '../../../shared/engine/lm63'
import { assessType, lightVerdict, spacingRequestFor, type RouteNeed, type TypeCandidate } from '../../../shared/engine/route-select'
import { spacingTool } from '../../../shared/engine/spacing'
import { runTool } from '../../../shared/engine/tool'
import { CRITERIA_IDS, LuminaireTypeSchema } from '../../../shared/schemas/photometry.schema'

const candidates: TypeCandidate[] = DEMO.map((d, k) => {
  const parsed = parseLm63(demoText(d.file))
  if (!parsed.ok) throw new Error(parsed.error.message)
  const t = LuminaireTypeSchema.parse({ ...d.type, photometricFileId: null })
  return {
    id: `demo-${k}`,
    name: t.name,
    table: { verticalAngles: parsed.value.verticalAngles, horizontalAngles: parsed.value.horizontalAngles, candela: parsed.value.candela },
    emergencyOutputFactor: t.emergencyOutputFactor,
    ratedDurationS: t.ratedDuration,
    chemistry: t.chemistry,
    cellsInSeries: t.cellsInSeries,
    capacityAh: t.capacityAh,
    emergencyPowerW: t.emergencyPower,
    inputPowerW: t.inputPower,
  }
})

/** What the calculator asks of the engine for a type on a route (as the screen sends it, with its table of heights). */
function calculator(route: RouteNeed, c: TypeCandidate) {
  const outcome = runTool(spacingTool, { ...spacingRequestFor(route, { table: c.table!, emergencyOutputFactor: c.emergencyOutputFactor }), heights: [2.5, 3] })
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.fields))
  return outcome.result
}

const route = (criteria: RouteNeed['criteria']): RouteNeed => ({
  routeLengthM: 30,
  routeWidthM: 2,
  mountingHeightM: 3,
  criteria,
  ratedDurationS: 3 * 3600,
  maintenanceFactor: 0.8,
  ...(criteria === 'en1838-high-risk' ? { normalIlluminanceLx: 150 } : {}),
})

describe('selector and calculator agree (every demo type × every criterion)', () => {
  const combos = candidates.flatMap((c) => CRITERIA_IDS.map((criteria) => [c.name, criteria, c] as const))
  it.each(combos)('%s, %s', { timeout: 60_000 }, (_name, criteria, c) => {
    const r = route(criteria)
    const selected = assessType(r, c)
    const calc = calculator(r, c)
    const light = lightVerdict(calc)
    expect(selected.lightReasons.length === 0).toBe(light.meets)
    expect(selected.lightReasons).toEqual(light.reasons)
    expect(selected.luminairesNeeded).toBe(calc.luminairesNeeded)
    expect(selected.maxSpacingM).toBe(calc.maxSpacingM)
    expect(selected.maxEndSpacingM).toBe(calc.maxEndSpacingM)
    expect(selected.layout).toEqual(calc.layout)
    // The verdict names what fails.
    const packOk = selected.packReasons.length === 0
    expect(selected.verdict).toBe(light.meets ? (packOk ? 'meets' : 'pack') : packOk ? 'light' : 'both')
    expect(selected.emergencyOutputFactor).toEqual({ value: c.emergencyOutputFactor, from: 'type' })
  })
})

describe('values taken from a type', () => {
  it('an output factor typed over the type’s is used by both, and the selection says it was typed', () => {
    const c = candidates[0]
    const r = { ...route('en1838-route'), emergencyOutputFactor: 0.25 }
    const selected = assessType(r, c)
    expect(selected.emergencyOutputFactor).toEqual({ value: 0.25, from: 'typed', typeValue: c.emergencyOutputFactor })
    expect(spacingRequestFor(r, { table: c.table!, emergencyOutputFactor: c.emergencyOutputFactor }).emergencyOutputFactor).toBe(0.25)
    expect(selected.layout).toEqual(calculator(r, c).layout)
    // Less light per luminaire: at least as many luminaires as with the type's own 0.5.
    expect(selected.luminairesNeeded!).toBeGreaterThanOrEqual(assessType(route('en1838-route'), c).luminairesNeeded!)
  })
})

describe('a type that meets the light but not the duration says so, in figures rounded like every screen', () => {
  it('fitted pack too small for the route', () => {
    const c = { ...candidates[0], capacityAh: 1.6 }
    const s = assessType(route('en1838-route'), c)
    expect(s.verdict).toBe('pack')
    expect(s.meets).toBe(false)
    expect(s.packReasons[0]).toMatch(/^the fitted 1\.6 Ah pack is below the 1\.91 Ah needed for 3 h \(the next pack step is 2\.2 Ah\)$/)
    expect(s.summary).toMatch(/^Meets the light with \d+ luminaires [\d.]+ m apart, but not the duration/)
  })
  it('rated for less than the route needs', () => {
    const c = candidates.find((x) => x.ratedDurationS < 3 * 3600)!
    const s = assessType(route('en1838-route'), c)
    expect(s.packReasons).toContain('rated for 1 h, shorter than the 3 h the route needs')
  })
})
