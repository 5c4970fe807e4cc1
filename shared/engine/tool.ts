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

export interface EngineTool<S extends z.ZodTypeAny = z.ZodTypeAny, R extends ToolResultBase = ToolResultBase> {
  name: string
  summary: string
  input: S
  run: (input: z.output<S>) => R
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

/** Throws if any number in the result is NaN or ±Infinity: that is an engine bug, never an answer. */
export function assertFinite(value: unknown, path = 'result'): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new Error(`engine produced a non-finite number at ${path}`)
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => assertFinite(v, `${path}[${i}]`))
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) assertFinite(v, `${path}.${k}`)
  }
}

/** Validate raw JSON input and run the tool. */
export function runTool<S extends z.ZodTypeAny, R extends ToolResultBase>(tool: EngineTool<S, R>, raw: unknown): ToolOutcome<R> {
  const parsed = tool.input.safeParse(raw)
  if (!parsed.success) return { ok: false, fields: toFieldErrors(parsed.error) }
  const result = tool.run(parsed.data)
  assertFinite(result)
  return { ok: true, result }
}
