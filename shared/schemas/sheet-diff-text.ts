/**
 * A revision comparison as people read it: each changed field by its name, each value in words
 * with its unit and rounded as the sheet shows it, never a dotted path or a code.
 */
import { DEFAULT_PREFS, formatNumber, type FormatPrefs } from '../format'
import type { FieldChange } from './sheet-diff'
import { inputLabel, inputValueText, PACK_RESULT_FIGURES } from './sheet-text'

const META_LABELS: Record<string, string> = {
  title: 'Title',
  reference: 'Reference',
  client: 'Client',
  site: 'Site',
  luminaire: 'Luminaire',
  engineVersion: 'Calculation engine version',
}

export interface ChangeRow {
  label: string
  before: string
  after: string
}

function valueText(field: string, value: unknown, prefs: FormatPrefs): string {
  if (value === null || value === undefined || value === '') return '—'
  if (field.startsWith('inputs.')) return inputValueText(field.slice('inputs.'.length), Array.isArray(value) ? value.join(', ') : String(value))
  if (field.startsWith('results.')) {
    const figure = PACK_RESULT_FIGURES.find((f) => f.key === field.slice('results.'.length))
    return formatNumber(value, { unit: figure?.unit || undefined }, prefs)
  }
  return typeof value === 'number' ? formatNumber(value, {}, prefs) : String(value)
}

function labelText(field: string): string {
  if (field.startsWith('inputs.')) return inputLabel(field.slice('inputs.'.length))
  if (field.startsWith('results.')) {
    const key = field.slice('results.'.length)
    return `${PACK_RESULT_FIGURES.find((f) => f.key === key)?.label ?? inputLabel(key)} (result)`
  }
  return META_LABELS[field] ?? inputLabel(field)
}

export function changeRows(changes: FieldChange[], prefs: FormatPrefs = DEFAULT_PREFS): ChangeRow[] {
  return changes.map((c) => ({ label: labelText(c.field), before: valueText(c.field, c.before, prefs), after: valueText(c.field, c.after, prefs) }))
}
