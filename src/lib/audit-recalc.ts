/**
 * What the claim check and the retrofit planner compute on every keystroke, in the browser: the
 * engine's schema and tool, nothing else. No formula here: every figure comes from the engine.
 */
import { auditInput, computeAudit, type AuditInput, type AuditResult } from '../../shared/engine/audit'
import { planRetrofit, retrofitInput, type RetrofitInput, type RetrofitResult } from '../../shared/engine/retrofit'
import { assertFinite, toFieldErrors } from '../../shared/engine/tool'
import type { FieldError } from '../../shared/engine/types'

export interface Recalc<I, R> {
  ok: boolean
  fields: FieldError[]
  input?: I
  result?: R
}

export function recalcAudit(raw: unknown): Recalc<AuditInput, AuditResult> {
  const parsed = auditInput.safeParse(raw)
  if (!parsed.success) return { ok: false, fields: toFieldErrors(parsed.error) }
  const result = computeAudit(parsed.data)
  assertFinite(result)
  return { ok: true, fields: [], input: parsed.data, result }
}

export function recalcRetrofit(raw: unknown): Recalc<RetrofitInput, RetrofitResult> {
  const parsed = retrofitInput.safeParse(raw)
  if (!parsed.success) return { ok: false, fields: toFieldErrors(parsed.error) }
  const result = planRetrofit(parsed.data)
  assertFinite(result)
  return { ok: true, fields: [], input: parsed.data, result }
}

/** Form values without the empty fields, as they are sent and saved. */
export function withoutEmpty(values: unknown): Record<string, unknown> {
  const out: Record<string, unknown> = {}
  for (const [k, v] of Object.entries((values ?? {}) as Record<string, unknown>)) {
    if (v === undefined || v === null || v === '') continue
    if (typeof v === 'object' && !Array.isArray(v)) {
      const inner = withoutEmpty(v)
      if (Object.keys(inner).length) out[k] = inner
    } else out[k] = v
  }
  return out
}
