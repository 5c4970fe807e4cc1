/**
 * Every API error is an RFC 9457 problem details document (media type application/problem+json).
 * `type` is a URI reference naming the kind of problem, `title` its fixed sentence, `status` the
 * HTTP status, `detail` what went wrong this time; `errors[]` names each refused value by an
 * RFC 6901 JSON Pointer. `code` repeats the kind as a short word for programs that switch on it.
 */
import { z } from 'zod'

/** Kinds of problem the API answers with: the status each is sent with and its title. */
export const PROBLEMS = {
  invalid_input: { status: 400, title: 'The request has values that are not valid' },
  invalid_json: { status: 400, title: 'The request body is not valid JSON' },
  bad_request: { status: 400, title: 'The request could not be read' },
  bad_upload: { status: 400, title: 'The upload was refused' },
  unauthorized: { status: 401, title: 'Authentication is needed' },
  bad_credentials: { status: 401, title: 'The e-mail or password is wrong' },
  bad_token: { status: 401, title: 'The API token is not valid' },
  forbidden: { status: 403, title: 'Not allowed for this account or role' },
  insufficient_scope: { status: 403, title: 'The API token does not have the scope this request needs' },
  csrf: { status: 403, title: 'Refused by cross-site request protection' },
  email_unconfirmed: { status: 403, title: 'The e-mail address is not confirmed yet' },
  not_found: { status: 404, title: 'Not found' },
  no_route: { status: 404, title: 'No such API route' },
  method_not_allowed: { status: 405, title: 'This method is not allowed on this path' },
  conflict: { status: 409, title: 'The request conflicts with the current state of a record' },
  expired: { status: 410, title: 'The link has expired' },
  revoked: { status: 410, title: 'The link has been withdrawn' },
  too_large: { status: 413, title: 'The request is too large' },
  unsupported_media_type: { status: 415, title: 'The body is not in a media type this route reads' },
  idempotency_key_reused: { status: 422, title: 'The Idempotency-Key was already used for another request' },
  unprocessable: { status: 422, title: 'The request is understood but cannot be carried out' },
  too_many_requests: { status: 429, title: 'Too many requests' },
  too_many_attempts: { status: 429, title: 'Too many failed attempts' },
  internal: { status: 500, title: 'Something went wrong on the server' },
  busy: { status: 503, title: 'The server is busy' },
  unavailable: { status: 503, title: 'A service the API needs is not answering' },
  storage_full: { status: 507, title: 'The workspace storage is full' },
} as const satisfies Record<string, { status: number; title: string }>

export type ProblemCode = keyof typeof PROBLEMS

/** Codes of one refused value in `errors[]`. */
export const FIELD_ERROR_CODES = {
  unknown_field: 'The field is not part of this request (a misspelling is refused, never ignored)',
  unknown_parameter: 'The query parameter is not one this route reads',
  required: 'A value is needed here',
  wrong_type: 'The value is of the wrong type (for example text where a number is expected)',
  out_of_range: 'The number, length or count is outside what is allowed',
  not_allowed: 'The value is not one of the allowed choices',
  bad_format: 'The text is not in the expected format (date, e-mail, id, …)',
  not_found: 'The record this names is not in the workspace',
  future_date: 'The date is later than now',
  invalid: 'The value breaks a rule given in `detail`',
} as const

export type FieldErrorCode = keyof typeof FIELD_ERROR_CODES

/** The type URI of a kind of problem (a relative reference; GET it for the description). */
export function problemType(code: string): string {
  return `/api/problems/${code}`
}

export const ProblemFieldError = z.object({
  /** RFC 6901 pointer into the body (or into the query parameters when `in` is "query"). */
  pointer: z.string(),
  code: z.string(),
  detail: z.string(),
  in: z.enum(['body', 'query', 'header']).optional(),
})

export const ProblemSchema = z.object({
  type: z.string(),
  title: z.string(),
  status: z.number().int(),
  detail: z.string(),
  code: z.string(),
  errors: z.array(ProblemFieldError).optional(),
  /** Deprecated (removed in v2): the same as `detail`. */
  error: z.string(),
  /** Deprecated (removed in v2): `errors[]` with dotted paths. */
  fields: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
})
export type Problem = z.infer<typeof ProblemSchema>

/** RFC 6901: "~" is written "~0" and "/" is written "~1" inside a reference token. */
export function jsonPointer(path: ReadonlyArray<string | number>): string {
  return path.map((p) => '/' + String(p).replace(/~/g, '~0').replace(/\//g, '~1')).join('')
}

/** A pointer back to the dotted path older answers used ("records.0.note"), for form mapping. */
export function pointerToPath(pointer: string): string {
  if (!pointer) return '(body)'
  return pointer
    .slice(1)
    .split('/')
    .map((t) => t.replace(/~1/g, '/').replace(/~0/g, '~'))
    .join('.')
}
