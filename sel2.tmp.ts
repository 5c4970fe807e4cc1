import { LuminaireTypeSchema } from './shared/schemas/photometry.schema'
import { assessType } from './shared/engine/route-select'
import { modelledDistribution } from './shared/engine/lm63-write'
const table = modelledDistribution({ peakCd: 180, exponentAlong: 1, exponentAcross: 2.5, batwingCd: 140, batwingAngleDeg: 58 })
const base: Record<string, unknown> = { name: 'x', photometricFileId: null, emergencyOutputFactor: 0.5, ratedDuration: '3 h', modes: ['maintained'], chemistry: 'nicd', cellsInSeries: 4, capacityAh: 1, emergencyPower: 1.6, inputPower: 1.2 }
const values: unknown[] = [5e-324, 1e308, 0, -1, 2000, 100, 30, 0.0001, Number.MAX_SAFE_INTEGER, 1e-9, 0.01, 1, 48, 400, 1000, 10000]
const route = { routeLengthM: 30, routeWidthM: 2, mountingHeightM: 2.5, criteria: 'en1838-route' as const, ratedDurationS: 10800, maintenanceFactor: 0.8 }
for (const k of Object.keys(base)) for (const v of values) for (const chem of ['nicd', 'lifepo4', 'lead-acid', 'li-ion', 'nimh', 'nicd-ht']) {
  const r = LuminaireTypeSchema.safeParse({ ...base, chemistry: chem, [k]: v })
  if (!r.success) continue
  const t = r.data
  try {
    assessType(route, { id: 'a', name: 'a', table, emergencyOutputFactor: t.emergencyOutputFactor, ratedDurationS: t.ratedDuration, chemistry: t.chemistry, cellsInSeries: t.cellsInSeries, capacityAh: t.capacityAh, emergencyPowerW: t.emergencyPower, inputPowerW: t.inputPower })
  } catch (e) { console.log('THROW', k, v, chem, (e as Error).message) }
}
