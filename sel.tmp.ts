import { RouteNeedSchema } from './shared/schemas/photometry.schema'
import { selectTypesForRoute } from './shared/engine/route-select'
import { modelledDistribution } from './shared/engine/lm63-write'
const table = modelledDistribution({ peakCd: 180, exponentAlong: 1, exponentAcross: 2.5, batwingCd: 140, batwingAngleDeg: 58 })
const base: Record<string, unknown> = { routeLength: 30, routeWidth: 2, mountingHeight: 2.5, criteria: 'en1838-route', ratedDuration: '3 h', maintenanceFactor: 0.8 }
const values: unknown[] = [5e-324, 1e308, 0, -1, 'NaN', '', 2000, 100, 30, 0.0001, Number.MAX_SAFE_INTEGER, 1e-9, 0.01, 1]
for (const k of Object.keys(base)) for (const v of values) {
  const r = RouteNeedSchema.safeParse({ ...base, [k]: v })
  if (!r.success) continue
  const t0 = performance.now()
  try {
    selectTypesForRoute({ routeLengthM: r.data.routeLength, routeWidthM: r.data.routeWidth, mountingHeightM: r.data.mountingHeight, criteria: r.data.criteria, ratedDurationS: r.data.ratedDuration, maintenanceFactor: r.data.maintenanceFactor }, [{ id: 'a', name: 'a', table, emergencyOutputFactor: 0.5, ratedDurationS: 10800, chemistry: 'nicd', cellsInSeries: 4, capacityAh: null, emergencyPowerW: 1.6, inputPowerW: 1.2 }])
    const ms = performance.now() - t0
    if (ms > 500) console.log('slow', k, v, ms.toFixed(0))
  } catch (e) { console.log('THROW', k, v, (e as Error).message) }
}
