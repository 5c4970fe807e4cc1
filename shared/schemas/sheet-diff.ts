/**
 * Field-by-field difference between two versions of a sheet's content: used by the server to tell a
 * stale editor what changed, and by the revision comparison on screen.
 */

export interface SheetSnapshot {
  title: string
  reference: string
  client: string
  site: string
  luminaire: string
  inputs: Record<string, unknown>
  results?: Record<string, unknown> | null
  engineVersion?: string
}

export interface FieldChange {
  /** Dotted path, e.g. "title", "inputs.load.power", "results.requiredCapacityAh". */
  field: string
  before: unknown
  after: unknown
}

/** Result figures worth comparing (the working and warnings are compared as a count only). */
const RESULT_FIELDS = [
  'cellsInSeries',
  'averageCurrentA',
  'requiredCapacityAh',
  'selectedCapacityAh',
  'runtimeH',
  'runtimeEndOfLifeH',
  'serviceLifeYears',
  'energyWh',
] as const

function flatten(value: unknown, prefix: string, out: Map<string, unknown>) {
  if (value && typeof value === 'object' && !Array.isArray(value)) {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) flatten(v, prefix ? `${prefix}.${k}` : k, out)
  } else if (value !== undefined) {
    out.set(prefix, value)
  }
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b)

export function diffSheets(before: SheetSnapshot, after: SheetSnapshot): FieldChange[] {
  const changes: FieldChange[] = []
  for (const f of ['title', 'reference', 'client', 'site', 'luminaire'] as const) {
    if (before[f] !== after[f]) changes.push({ field: f, before: before[f], after: after[f] })
  }
  const a = new Map<string, unknown>()
  const b = new Map<string, unknown>()
  flatten(before.inputs, 'inputs', a)
  flatten(after.inputs, 'inputs', b)
  for (const key of [...new Set([...a.keys(), ...b.keys()])].sort()) {
    if (!same(a.get(key), b.get(key))) changes.push({ field: key, before: a.get(key) ?? null, after: b.get(key) ?? null })
  }
  if (before.results && after.results) {
    for (const f of RESULT_FIELDS) {
      if (!same(before.results[f], after.results[f]))
        changes.push({ field: `results.${f}`, before: before.results[f] ?? null, after: after.results[f] ?? null })
    }
  }
  if (before.engineVersion !== undefined && after.engineVersion !== undefined && before.engineVersion !== after.engineVersion) {
    changes.push({ field: 'engineVersion', before: before.engineVersion, after: after.engineVersion })
  }
  return changes
}
