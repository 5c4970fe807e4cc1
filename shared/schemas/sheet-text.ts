/**
 * The words of a specification sheet: cautions, input labels, headline figures and how figures are
 * written. Free of engine code, so read-only pages (the public sheet, the list) stay small.
 */
import { CHARGER_TYPE_LABELS, CHEMISTRY_LABELS, DRIVER_LABELS, labelOf, MODE_LABELS, VOLTAGE_BASIS_LABELS } from '../labels'

/** The cautions every sheet and pack screen shows. Plain, short, our own words. */
export const SHEET_CAUTIONS: Array<{ id: string; title: string; text: string }> = [
  {
    id: 'isolate',
    title: 'Isolate the mains first',
    text: 'Switch off and isolate the supply, including the unswitched live that keeps the charger going, before you open a luminaire; prove it dead.',
  },
  {
    id: 'handling',
    title: 'Handle packs with care',
    text: 'Do not short, crush, puncture or heat a pack. Wear eye protection; an electrolyte leak burns skin (alkaline in nickel cells, acid in lead-acid).',
  },
  {
    id: 'cadmium',
    title: 'Nickel-cadmium',
    text: 'Cadmium is toxic: never put NiCd cells in general waste. Return them through a battery take-back scheme, and check whether the pack may still be placed on the market where you work.',
  },
  {
    id: 'lithium',
    title: 'Lithium',
    text: 'A damaged or wrongly charged lithium cell can overheat and burn. Never charge it below 0 °C, keep to the charger the luminaire was designed for, and ship it under the dangerous-goods rules.',
  },
  {
    id: 'lead',
    title: 'Lead-acid',
    text: 'Lead-acid blocks contain lead and sulphuric acid and can vent gas on overcharge: keep them ventilated, upright if vented, and send them for recycling.',
  },
  {
    id: 'charging',
    title: 'Charging limits',
    text: 'Keep charge and trickle currents, float voltage and charging temperature within the cell ratings; too much shortens life or causes venting, too little leaves the pack short after a test.',
  },
  {
    id: 'estimate',
    title: 'Engineering estimate',
    text: 'These figures are engineering estimates from published models and typical data. Local codes, the standards in force and a competent, licensed person decide what is installed.',
  },
]

/** Words for each pack input (dotted paths), for forms, sheets and the PDF. */
export const PACK_INPUT_LABELS: Record<string, string> = {
  // In the order the pack screen asks for them; sheets and PDFs list inputs in this order too.
  chemistry: 'Chemistry',
  duration: 'Rated duration',
  driver: 'Driver',
  'load.power': 'LED power in emergency mode',
  'load.ledVoltage': 'LED string voltage',
  'load.ledCurrent': 'LED current',
  driverEfficiency: 'Converter efficiency',
  ambientMin: 'Lowest ambient',
  ambientMax: 'Highest ambient',
  capacity: 'Pack capacity (checked)',
  cellsInSeries: 'Cells in series',
  averageCellVoltage: 'Average cell voltage',
  cutoffCellVoltage: 'End-of-discharge voltage per cell',
  ratedHours: 'Capacity rating basis',
  peukertExponent: 'Peukert exponent',
  depthOfDischarge: 'Depth of discharge',
  endOfLifeCapacity: 'End-of-life capacity fraction',
  designMargin: 'Design margin',
  designLifeYears: 'Design life (years)',
  'converterInput.min': 'Converter minimum input',
  'converterInput.max': 'Converter maximum input',
  'load.mainsPower': 'Mains-mode power (maintained)',
  capacityLadder: 'Capacities to choose from',
  nominalVoltage: 'Nominal pack voltage',
  cellFormat: 'Cell format',
  mode: 'Mode',
  dischargeCurrent: 'Measured discharge current',
  'charger.type': 'Charger type',
  'charger.chargeCurrent': 'Charge current',
  'charger.trickleCurrent': 'Permanent (trickle) current',
  'charger.floatVoltage': 'Float / hold voltage',
  'charger.cutoffVoltage': 'Deep-discharge cut-off',
  'charger.voltageBasis': 'Charger voltages given',
  'charger.ambient': 'Ambient while charging',
}

/** The headline figures of a pack result, in the order sheets show them; `key` is also the working step id. */
export const PACK_RESULT_FIGURES: Array<{ key: string; label: string; unit: string; range?: boolean }> = [
  { key: 'requiredCapacityAh', label: 'Required rated capacity', unit: 'Ah' },
  { key: 'selectedCapacityAh', label: 'Pack capacity', unit: 'Ah' },
  { key: 'cellsInSeries', label: 'Cells in series', unit: '' },
  { key: 'nominalVoltageV', label: 'Nominal pack voltage', unit: 'V' },
  { key: 'averageCurrentA', label: 'Average discharge current', unit: 'A' },
  { key: 'averagePowerW', label: 'Average power from the pack', unit: 'W' },
  { key: 'dischargeCRate', label: 'Discharge rate', unit: 'C' },
  { key: 'runtimeH', label: 'Runtime, new pack', unit: 'h' },
  { key: 'runtimeEndOfLifeH', label: 'Runtime at end of life', unit: 'h' },
  { key: 'annexAMaxCurrentA', label: 'Annex A current limit', unit: 'A' },
  { key: 'cutoffVoltageV', label: 'Pack end-of-discharge voltage', unit: 'V' },
  { key: 'energyWh', label: 'Nominal energy', unit: 'Wh' },
  { key: 'massKg', label: 'Mass', unit: 'kg', range: true },
  { key: 'volumeL', label: 'Volume', unit: 'L', range: true },
  { key: 'serviceLifeYears', label: 'Service life at the warmest ambient', unit: 'years' },
]

/** A figure for people: three significant digits, never NaN or Infinity. */
export function formatFigure(value: unknown, unit = '', digits = 3): string {
  if (value && typeof value === 'object' && 'min' in value && 'max' in value) {
    const r = value as { min: unknown; max: unknown }
    return `${formatFigure(r.min, '', digits)}–${formatFigure(r.max, unit, digits)}`
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) return '—'
  const n = Number(value.toPrecision(digits))
  return unit ? `${n} ${unit}` : String(n)
}

/** Flattens pack inputs to dotted paths with the text as typed, for display. */
export function flattenInputs(inputs: Record<string, unknown>, prefix = ''): Array<{ path: string; value: string }> {
  const out: Array<{ path: string; value: string }> = []
  for (const [k, v] of Object.entries(inputs)) {
    const path = prefix ? `${prefix}.${k}` : k
    if (v && typeof v === 'object' && !Array.isArray(v)) out.push(...flattenInputs(v as Record<string, unknown>, path))
    else if (v !== undefined && v !== null && v !== '') out.push({ path, value: Array.isArray(v) ? v.join(', ') : String(v) })
  }
  return out
}

/** Typed units written the usual way ("25 degC" → "25 °C", "47 ohm" → "47 Ω"), a minus as a minus. */
export function tidyTypedValue(text: string): string {
  return text
    .replace(/\bdeg\s*C\b/g, '°C')
    .replace(/\bdeg\s*F\b/g, '°F')
    .replace(/(\d)\s*ohm\b/g, '$1 Ω')
    .replace(/(^|[\s(])-(?=\d)/g, '$1−')
}

/** How each enumerated input is written, by its dotted path. */
const ENUMERATED_INPUTS: Record<string, Record<string, string>> = {
  chemistry: CHEMISTRY_LABELS,
  driver: DRIVER_LABELS,
  mode: MODE_LABELS,
  'charger.type': CHARGER_TYPE_LABELS,
  'charger.voltageBasis': VOLTAGE_BASIS_LABELS,
}

/** Fractions typed as 0.82 are read by people as a percentage. */
const FRACTION_INPUTS = new Set(['driverEfficiency', 'endOfLifeCapacity', 'depthOfDischarge', 'designMargin'])

/**
 * The inputs of a sheet as people read them, in the order the pack screen asks for them (the order
 * of PACK_INPUT_LABELS): words for codes, usual unit symbols, fractions as percentages.
 */
export function sheetInputRows(inputs: Record<string, unknown>): Array<{ path: string; label: string; value: string }> {
  const order = Object.keys(PACK_INPUT_LABELS)
  const rank = (path: string) => (order.includes(path) ? order.indexOf(path) : order.length)
  return flattenInputs(inputs)
    .sort((a, b) => rank(a.path) - rank(b.path))
    .map(({ path, value }) => ({ path, label: inputLabel(path), value: inputValueText(path, value) }))
}

/** The words for an input's dotted path ("ambientMax" → "Highest ambient"). */
export function inputLabel(path: string): string {
  return PACK_INPUT_LABELS[path] ?? labelOf({}, path)
}

/** One input's value as people read it: words for codes, usual unit symbols, fractions as percentages. */
export function inputValueText(path: string, value: string): string {
  const words = ENUMERATED_INPUTS[path]
  const number = Number(value)
  if (words) return labelOf(words, value)
  if (FRACTION_INPUTS.has(path) && value.trim() !== '' && Number.isFinite(number)) return `${Number((number * 100).toPrecision(3))} %`
  return tidyTypedValue(value)
}
