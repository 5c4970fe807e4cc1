/**
 * Writes RFC 9457 problem details (application/problem+json). Every error answer of the API goes
 * through `sendProblem`, so the shape is the same on every route.
 */
import type { Response } from 'express'
import type { ZodError, ZodIssue } from 'zod'
import { jsonPointer, PROBLEMS, problemType, type FieldErrorCode } from '../../shared/schemas/problem.schema'
import { AppError, type FieldIssue } from './app-error'

export interface ProblemInput {
  status: number
  code: string
  detail: string
  fields?: FieldIssue[]
  /** Extension members (retryAfterSeconds, allowed methods, …). */
  extra?: Record<string, unknown>
}

function titleOf(code: string, status: number): string {
  return (PROBLEMS as Record<string, { title: string }>)[code]?.title ?? (status >= 500 ? PROBLEMS.internal.title : PROBLEMS.bad_request.title)
}

/** "records.0.note" → "/records/0/note" for issues that only carry a dotted path. */
function pointerOfPath(path: string): string {
  if (!path || path === '(body)' || path === '(input)') return ''
  return jsonPointer(path.split('.'))
}

export function sendProblem(res: Response, p: ProblemInput): void {
  const fields = p.fields ?? []
  const errors = fields.map((f) => ({
    pointer: f.pointer ?? pointerOfPath(f.path),
    code: f.code ?? 'invalid',
    detail: f.message,
    ...(f.in && f.in !== 'body' ? { in: f.in } : {}),
  }))
  res.status(p.status)
  res.set('Content-Type', 'application/problem+json; charset=utf-8')
  res.json({
    type: problemType(p.code),
    title: titleOf(p.code, p.status),
    status: p.status,
    detail: p.detail,
    code: p.code,
    ...(errors.length ? { errors } : {}),
    ...p.extra,
    // Older names of `detail` and `errors`, kept through v1 (see docs/api.md, deprecation).
    error: p.detail,
    ...(fields.length ? { fields: fields.map((f) => ({ path: f.path, message: f.message })) } : {}),
  })
}

function fieldCode(issue: ZodIssue): FieldErrorCode {
  switch (issue.code) {
    case 'invalid_type':
      return issue.received === 'undefined' ? 'required' : 'wrong_type'
    case 'too_small':
    case 'too_big':
    case 'not_multiple_of':
    case 'not_finite':
      return 'out_of_range'
    case 'invalid_enum_value':
    case 'invalid_literal':
    case 'invalid_union_discriminator':
      return 'not_allowed'
    case 'invalid_string':
    case 'invalid_date':
      return 'bad_format'
    default:
      return 'invalid'
  }
}

/** One refused value per zod issue; an unknown key is named by its own pointer. */
function issuesToFields(issues: ZodIssue[], where: 'body' | 'query', out: FieldIssue[]): FieldIssue[] {
  for (const issue of issues) {
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        const path = [...issue.path, key]
        out.push({
          path: path.join('.'),
          pointer: jsonPointer(path),
          code: where === 'query' ? 'unknown_parameter' : 'unknown_field',
          message: where === 'query' ? 'is not a query parameter of this route' : 'is not a field of this request',
          in: where,
        })
      }
      continue
    }
    if (issue.code === 'invalid_union' && issue.unionErrors.length) {
      // Report the alternative that came closest (fewest problems), not a bare "invalid input".
      const closest = [...issue.unionErrors].sort((a, b) => a.issues.length - b.issues.length)[0]!
      issuesToFields(closest.issues, where, out)
      continue
    }
    out.push({ path: issue.path.join('.') || '(body)', pointer: jsonPointer(issue.path), code: fieldCode(issue), message: issue.message, in: where })
  }
  return out
}

export function zodFields(error: ZodError, where: 'body' | 'query' = 'body'): FieldIssue[] {
  return issuesToFields(error.issues, where, [])
}

/** A request part that fails its schema: 400 naming each value by its pointer. */
export class InvalidInputError extends AppError {
  constructor(error: ZodError, where: 'body' | 'query' = 'body', prefix = 'Invalid input') {
    const fields = zodFields(error, where)
    super(
      400,
      'invalid_input',
      `${prefix}: ${fields
        .map((f) => `${f.path} ${f.message}`)
        .slice(0, 3)
        .join('; ')}`,
      fields,
    )
  }
}
