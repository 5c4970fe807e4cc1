/**
 * The charger check's form values: the starting point per chemistry, and the form as specification-
 * sheet inputs (the size tool's, with the charger). Plain TypeScript, tested on its own.
 */
import type { ChemistryId } from '../../shared/engine/chemistries'

/** A starting point per chemistry: the luminaire and its pack (as labelled); the charger's currents are measured, so they start empty. */
export function chargerDefaultsFor(chemistry: ChemistryId): Record<string, unknown> {
  const lead = chemistry === 'lead-acid'
  return {
    chemistry,
    capacity: lead ? '7 Ah' : '4 Ah',
    duration: '3 h',
    driver: 'converter',
    load: { power: lead ? '12 W' : '3 W' },
    driverEfficiency: '0.85',
    voltageBasis: 'pack',
    ambient: '25 °C',
  }
}

const CHARGER_KEYS = ['chargeCurrent', 'trickleCurrent', 'floatVoltage', 'cutoffVoltage', 'voltageBasis', 'ambient'] as const

/** The luminaire's charger as the sheet's `charger` input (as typed). */
export function chargerInputsOf(values: Record<string, unknown>): Record<string, unknown> {
  const charger: Record<string, unknown> = { type: values.chargerType ?? 'unknown' }
  for (const k of CHARGER_KEYS) if (values[k] !== undefined) charger[k] = values[k]
  return charger
}

/** The charger check's pack and load as new sheet inputs (the checked pack's capacity and cells), with the charger. */
export function sheetInputsFromCharger(values: Record<string, unknown>, cellsInSeries: number): Record<string, unknown> {
  const inputs: Record<string, unknown> = {
    chemistry: values.chemistry,
    cellsInSeries,
    capacity: values.capacity,
    duration: values.duration,
    driver: values.driver,
    load: values.load,
    driverEfficiency: values.driverEfficiency,
    averageCellVoltage: values.averageCellVoltage,
    converterInput: values.converterInput,
    charger: chargerInputsOf(values),
  }
  for (const k of Object.keys(inputs)) if (inputs[k] === undefined) delete inputs[k]
  return inputs
}
