/**
 * An engine tool: a zod input schema and a pure function from parsed input to result.
 * The CLI, the API (`POST /api/calc/<tool>`) and the screens all go through `runTool`.
 */
import type { z } from 'zod'
import type { EngineWarning, FieldError, WorkingStep } from './types'

export interface ToolResultBase {
  warnings: EngineWarning[]
  working: WorkingStep[]
}

export interface RunOptions {
  /** Build the working steps and sentences (default true). Tools without a numbers-only mode ignore it. */
  explain?: boolean
}

export interface EngineTool<S extends z.ZodTypeAny = z.ZodTypeAny, R extends ToolResultBase = ToolResultBase> {
  name: string
  summary: string
  input: S
  run: (input: z.output<S>, options?: RunOptions) => R
}

export function defineTool<S extends z.ZodTypeAny, R extends ToolResultBase>(tool: EngineTool<S, R>): EngineTool<S, R> {
  return tool
}

export type ToolOutcome<R> = { ok: true; result: R } | { ok: false; fields: FieldError[] }

/** zod issues → field errors with dotted paths ("load.ledCurrent"). */
export function toFieldErrors(error: z.ZodError): FieldError[] {
  return error.issues.map((issue) => ({
    path: issue.path.length ? issue.path.join('.') : '(input)',
    message: issue.message,
  }))
}

/** True when every number in the value is finite (no paths built: this runs on every answer). */
function allFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value)
  if (Array.isArray(value)) {
    for (const v of value) if (!allFinite(v)) return false
    return true
  }
  if (value && typeof value === 'object') {
    for (const k in value) if (Object.prototype.hasOwnProperty.call(value, k) && !allFinite((value as Record<string, unknown>)[k])) return false
  }
  return true
}

/** Where the first non-finite number sits, e.g. "result.rows[2].score" (only looked for after a failure). */
function firstNonFinite(value: unknown, path: string): string | null {
  if (typeof value === 'number') return Number.isFinite(value) ? null : path
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const found = firstNonFinite(value[i], `${path}[${i}]`)
      if (found) return found
    }
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      const found = firstNonFinite(v, `${path}.${k}`)
      if (found) return found
    }
  }
  return null
}

/** Throws if any number in the result is NaN or ±Infinity: that is an engine bug, never an answer. */
export function assertFinite(value: unknown, path = 'result'): void {
  if (!allFinite(value)) throw new Error(`engine produced a non-finite number at ${firstNonFinite(value, path)}`)
}

/** Validate raw JSON input and run the tool. */
export function runTool<S extends z.ZodTypeAny, R extends ToolResultBase>(tool: EngineTool<S, R>, raw: unknown, options: RunOptions = {}): ToolOutcome<R> {
  const parsed = tool.input.safeParse(raw)
  if (!parsed.success) return { ok: false, fields: toFieldErrors(parsed.error) }
  const result = tool.run(parsed.data, options)
  assertFinite(result)
  return { ok: true, result }
}
