/**
 * The words of a wattage audit: input labels, headline figures, and engine messages turned into
 * plain sentences (the engine names fields by their keys). Free of engine code, so the sheet and
 * luminaire pages that list audits stay small, and the PDF uses the same words as the screen.
 */
import { formatFigure } from './sheet-text'

/** Labels of the audit inputs, for the form, the saved audit and the PDF. */
export const AUDIT_INPUT_LABELS: Record<string, string> = {
  claimedPower: 'Claimed power',
  claimedApparentPower: 'Claimed apparent power',
  supplyVoltage: 'Supply voltage',
  supplyFrequency: 'Supply frequency',
  measuredPower: 'Measured real power',
  measuredCurrent: 'Measured mains current',
  powerFactor: 'Power factor shown by the meter',
  apparentPower: 'Apparent power shown by the meter',
  meterMinCurrent: "Meter's lowest reliable current",
  meterMinPower: "Meter's lowest reliable power",
  ledVoltageMains: 'LED voltage, lit from mains',
  ledCurrentMains: 'LED current, lit from mains',
  ledVoltageBattery: 'LED voltage, lit from battery',
  ledCurrentBattery: 'LED current, lit from battery',
  batteryVoltage: 'Battery voltage on charge',
  batteryChargeCurrent: 'Charging current',
  mode: 'Mode',
  hoursPerDay: 'Lit hours per day',
  tariffPerKWh: 'Tariff per kWh',
  currency: 'Currency',
  claimTolerancePct: 'Tolerance on the claim (±%)',
}

/** How each field is named inside a sentence. */
export const AUDIT_FIELD_WORDS: Record<string, string> = {
  claimedPower: 'the claimed power',
  claimedApparentPower: 'the claimed apparent power',
  supplyVoltage: 'the supply voltage',
  supplyFrequency: 'the supply frequency',
  measuredPower: 'the measured power',
  measuredCurrent: 'the measured current',
  powerFactor: 'the power factor',
  apparentPower: 'the apparent power read from the meter',
  meterMinCurrent: "the meter's lowest reliable current",
  meterMinPower: "the meter's lowest reliable power",
  ledVoltageMains: 'the LED voltage on mains',
  ledCurrentMains: 'the LED current on mains',
  ledVoltageBattery: 'the LED voltage on battery',
  ledCurrentBattery: 'the LED current on battery',
  batteryVoltage: 'the battery voltage',
  batteryChargeCurrent: 'the charging current',
  hoursPerDay: 'the lit hours per day',
  tariffPerKWh: 'the tariff',
  claimTolerancePct: 'the tolerance',
}

/** The headline figures of an audit result; `key` is also the id of its working step where one exists. */
export const AUDIT_RESULT_FIGURES: Array<{ key: string; label: string; unit: string; step?: string; percent?: boolean; milli?: boolean }> = [
  { key: 'measuredPowerW', label: 'Real input power', unit: 'W', step: 'powerFactor' },
  { key: 'claimDeviationPct', label: 'Deviation from the claim', unit: '%', step: 'claimDeviation' },
  { key: 'apparentPowerVA', label: 'Apparent power', unit: 'VA', step: 'apparentPower' },
  { key: 'powerFactor', label: 'Power factor', unit: '', step: 'powerFactor' },
  { key: 'measuredCurrentA', label: 'Mains current', unit: 'mA', step: 'apparentPower', milli: true },
  { key: 'ledPowerMainsW', label: 'LED power on mains', unit: 'W', step: 'ledPowerMains' },
  { key: 'ledPowerBatteryW', label: 'LED power on battery', unit: 'W', step: 'ledPowerBattery' },
  { key: 'emergencyOutputRatio', label: 'Emergency output ratio (approx.)', unit: '%', step: 'emergencyOutputRatio', percent: true },
  { key: 'driverEfficiency', label: 'Electronics efficiency', unit: '%', step: 'driverEfficiency', percent: true },
  { key: 'standbyChargePowerW', label: 'Charging power (light off)', unit: 'W', step: 'standbyChargePower' },
  { key: 'annualEnergyKWh', label: 'Energy over a year', unit: 'kWh', step: 'annualEnergy' },
  { key: 'annualCost', label: 'Cost over a year', unit: '', step: 'annualCost' },
]

/**
 * Replaces field keys in an engine message ("measuredPower (3 W) and measuredCurrent …") with
 * words ("the measured power (3 W) and the measured current …") and starts it with a capital.
 */
export function inPlainWords(message: string, words: Record<string, string> = AUDIT_FIELD_WORDS): string {
  const keys = Object.keys(words).sort((a, b) => b.length - a.length)
  if (!keys.length) return message
  const re = new RegExp(`\\b(${keys.join('|')})\\b`, 'g')
  const out = message.replace(re, (k) => words[k] ?? k)
  return out.charAt(0).toUpperCase() + out.slice(1)
}

/** Engine warnings of an audit in plain sentences (order kept: the engine sorts by severity). */
export function plainAuditWarnings<W extends { message: string }>(warnings: W[]): W[] {
  return warnings.map((w) => ({ ...w, message: inPlainWords(w.message) }))
}

/** A figure of a saved or live result as people read it: fractions as per cent, cost with its currency; null when absent. */
export function auditFigureText(results: Record<string, unknown>, f: (typeof AUDIT_RESULT_FIGURES)[number]): string | null {
  const v = results[f.key]
  if (typeof v !== 'number') return null
  if (f.key === 'annualCost') return formatFigure(v, String(results.currency ?? '')).trim()
  if (f.key === 'claimDeviationPct') return `${v > 0 ? '+' : ''}${formatFigure(v, '%')}`
  // Shown in per cent or milli-units; the engine's values are fractions and base units.
  return formatFigure(f.percent || f.milli ? v * (f.percent ? 100 : 1000) : v, f.unit)
}
