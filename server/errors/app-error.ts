/** Errors the API answers with on purpose: a status, a machine code, and a message for people. */
export interface FieldIssue {
  /** Dotted path ("records.0.note"); "(body)" for the whole body. */
  path: string
  message: string
  /** RFC 6901 pointer; made from `path` when not given. */
  pointer?: string
  /** A code of FIELD_ERROR_CODES (shared/schemas/problem.schema.ts); "invalid" when not given. */
  code?: string
  /** Where the value was: the JSON body unless said otherwise. */
  in?: 'body' | 'query' | 'header'
}

export class AppError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly fields?: FieldIssue[],
    public readonly details?: Record<string, unknown>,
  ) {
    super(message)
    this.name = 'AppError'
  }
}

export class BadRequestError extends AppError {
  constructor(message: string, fields?: FieldIssue[], details?: Record<string, unknown>) {
    super(400, 'bad_request', message, fields, details)
  }
}
export class UnauthorizedError extends AppError {
  constructor(message = 'Sign in to continue.') {
    super(401, 'unauthorized', message)
  }
}
export class ForbiddenError extends AppError {
  constructor(message = 'Your role in this workspace does not allow this.') {
    super(403, 'forbidden', message)
  }
}
export class NotFoundError extends AppError {
  constructor(what = 'That record') {
    super(404, 'not_found', `${what} was not found.`)
  }
}
export class ConflictError extends AppError {
  constructor(message: string, details?: Record<string, unknown>, fields?: FieldIssue[]) {
    super(409, 'conflict', message, fields, details)
  }
}
/** The body is valid but cannot be carried out (a date in the future, a reused key). */
export class UnprocessableError extends AppError {
  constructor(message: string, fields?: FieldIssue[], code = 'unprocessable') {
    super(422, code, message, fields)
  }
}
export class ServiceUnavailableError extends AppError {
  constructor(message = 'The database is not answering; try again in a few seconds.') {
    super(503, 'unavailable', message)
  }
}
