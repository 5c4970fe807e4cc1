/** Shapes every engine tool shares: the working shown to the user and the warnings. */

/** How firmly a value or a step rests on an outside source. */
export type Basis = 'published' | 'common practice' | 'from memory' | 'derived'

/** A source a value or a formula rests on (standard and clause, handbook, maker's manual). */
export interface Reference {
  /** e.g. "IEC 60598-2-22:2014, Annex A" */
  source: string
  basis: Basis
  note?: string
}

export interface WorkingValue {
  symbol: string
  label: string
  value: number
  unit: string
}

/** One step of the working: a formula in words and symbols, the values in, the value out. */
export interface WorkingStep {
  /** Stable id, used by the UI to open a result figure's working (e.g. "requiredCapacity"). */
  id: string
  label: string
  /** The formula in symbols, e.g. "C_req = I · t / (u · f_EoL · f_T)". */
  formula: string
  /** The formula in words. */
  explanation: string
  inputs: WorkingValue[]
  result: WorkingValue
  references: Reference[]
}

export type Severity = 'critical' | 'warning' | 'info'

export interface EngineWarning {
  code: string
  severity: Severity
  message: string
  /** The input field the warning is about, when there is one. */
  field?: string
}

/** One named value in a working step. */
export function workingValue(symbol: string, label: string, value: number, unit: string): WorkingValue {
  return { symbol, label, value, unit }
}

export const SEVERITY_ORDER: Record<Severity, number> = { critical: 0, warning: 1, info: 2 }

/** Warnings ordered most severe first, stable within a severity. */
export function sortWarnings(warnings: EngineWarning[]): EngineWarning[] {
  return warnings
    .map((w, i) => ({ w, i }))
    .sort((a, b) => SEVERITY_ORDER[a.w.severity] - SEVERITY_ORDER[b.w.severity] || a.i - b.i)
    .map(({ w }) => w)
}

/** A field-level input error: which field, and why. */
export interface FieldError {
  path: string
  message: string
}
