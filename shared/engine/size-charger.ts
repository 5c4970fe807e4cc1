/**
 * The luminaire's charger checked against the sized pack, when `size` is given a `charger`: the
 * `charge` rules (rates, recharge within 24 h, float, cut-off) on the selected pack, plus whether the
 * charger type suits the chemistry. Carried on specification sheets and their PDF.
 */
import { checkCharge, type ChargeInput, type ChargeResult } from './charge'
import { chargerFit, chargerTypeForFamily, type ChargerType, type ChargerVerdict } from './pack-charger'
import type { PackCharger } from './size-input'
import type { SizedPack } from './size-steps'
import type { EngineWarning, WorkingStep } from './types'

const SECONDS_PER_HOUR = 3600
/** Notes every pack result already carries; not repeated inside the charger check. */
const PACK_NOTE_CODES = new Set(['cadmium-restricted', 'lithium-safety', 'lead-acid-handling', 'competent-person'])

export interface SizeChargerCheck extends Omit<ChargeResult, 'working'> {
  /** The type as given ("unknown" when not said). */
  chargerType: ChargerType
  /** The type the verdict assumed: the given one, or the one usual for the chemistry's family. */
  assumedChargerType: Exclude<ChargerType, 'unknown'>
  chargeCurrentA: number
  compatible: ChargerVerdict
  reasons: string[]
}

export function checkPackCharger(s: SizedPack, charger: PackCharger, explain: boolean): { check: SizeChargerCheck; working: WorkingStep[] } {
  const { input, chemistry } = s.basis
  const capacity = s.pack.selectedAh * SECONDS_PER_HOUR
  // The same discharge as the sizing: a measured current is passed as a direct-driven load of that current.
  const load =
    input.dischargeCurrent !== undefined
      ? { driver: 'direct' as const, load: { ledCurrent: input.dischargeCurrent } }
      : { driver: input.driver, load: input.load ?? {} }
  const chargeInput: ChargeInput = {
    chemistry: input.chemistry,
    cellsInSeries: s.cells.n,
    averageCellVoltage: input.averageCellVoltage,
    capacity,
    ...load,
    driverEfficiency: input.driverEfficiency,
    converterInput: input.converterInput,
    duration: input.duration,
    chargeCurrent: charger.chargeCurrent,
    trickleCurrent: charger.trickleCurrent,
    floatVoltage: charger.floatVoltage,
    cutoffVoltage: charger.cutoffVoltage,
    voltageBasis: charger.voltageBasis,
    ambient: charger.ambient ?? input.ambientMax,
  }
  const result = checkCharge(chargeInput, { explain })
  const assumed = charger.type === 'unknown' ? chargerTypeForFamily(chemistry.family) : charger.type
  const fit = chargerFit({
    chemistry,
    cellsInSeries: s.cells.n,
    capacityAh: s.pack.selectedAh,
    chargerType: assumed,
    chargeCurrentA: charger.chargeCurrent,
    trickleCurrentA: result.trickleCurrentA,
  })
  const warnings: EngineWarning[] = result.warnings.filter((w) => !PACK_NOTE_CODES.has(w.code))
  if (fit.verdict === 'no') {
    warnings.unshift({ code: 'charger-type-unsuitable', severity: 'critical', field: 'charger.type', message: fit.reasons.join(' ') })
  }
  if (charger.type === 'unknown') {
    warnings.push({
      code: 'charger-type-assumed',
      severity: 'info',
      field: 'charger.type',
      message: `Charger type not given: taken as the usual one for ${chemistry.name}. Read it from the luminaire's label or its maker.`,
    })
  }
  const { working, ...rest } = result
  const check: SizeChargerCheck = {
    ...rest,
    chargerType: charger.type,
    assumedChargerType: assumed,
    chargeCurrentA: charger.chargeCurrent,
    compatible: fit.verdict,
    reasons: fit.reasons,
    warnings,
  }
  // With a measured current the discharge is the sizing's own; its step is not repeated.
  const steps = input.dischargeCurrent !== undefined ? working.filter((w) => w.id !== 'averageCurrentA') : working
  return { check, working: steps.map((w) => ({ ...w, id: `charger.${w.id}`, label: `Charger: ${w.label}` })) }
}
