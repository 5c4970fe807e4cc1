/**
 * The one HTTP client: same-origin JSON, the CSRF header on every change, and API errors turned
 * into an ApiError whose field messages a form can show next to its inputs.
 */
import { CONFIG } from '@/config'
import { pointerToPath } from '@shared/schemas/problem.schema'

export interface FieldMessage {
  path: string
  message: string
}

export class ApiError extends Error {
  constructor(
    public readonly status: number,
    message: string,
    public readonly code: string,
    public readonly fields: FieldMessage[] = [],
    public readonly body: Record<string, unknown> = {},
  ) {
    super(message)
  }
  /** Field messages keyed by path, for a form. */
  fieldMap(): Record<string, string> {
    return Object.fromEntries(this.fields.map((f) => [f.path, f.message]))
  }
}

/**
 * A problem details answer as an ApiError: its `detail` is the message, and each refused value
 * (named by a JSON Pointer) becomes the dotted field path a form's inputs are keyed by.
 */
export function problemToError(status: number, statusText: string, body: Record<string, unknown>): ApiError {
  const errors = Array.isArray(body.errors) ? (body.errors as Array<{ pointer?: string; detail?: string; in?: string }>) : []
  const fields = errors
    .filter((e) => (e.in ?? 'body') === 'body')
    .map((e) => ({ path: pointerToPath(String(e.pointer ?? '')), message: String(e.detail ?? '') }))
  const message = body.detail ?? body.error ?? statusText
  return new ApiError(status, String(message), String(body.code ?? 'error'), fields, body)
}

let csrfToken = ''
export function setCsrfToken(token: string) {
  csrfToken = token
}

type UnauthorizedListener = () => void
let onUnauthorized: UnauthorizedListener | null = null
/** Called once by the app: what to do when the session has ended. */
export function setUnauthorizedHandler(fn: UnauthorizedListener) {
  onUnauthorized = fn
}

export interface RequestOptions {
  method?: string
  body?: unknown
  query?: Record<string, string | number | boolean | undefined | null>
  signal?: AbortSignal
  /** Do not treat 401 as "session ended" (e.g. the sign-in call itself). */
  quiet401?: boolean
  headers?: Record<string, string>
}

async function ensureCsrf(): Promise<void> {
  if (csrfToken) return
  const res = await fetch(`${CONFIG.apiBase}/auth/csrf`, { credentials: 'same-origin' })
  if (res.ok) csrfToken = ((await res.json()) as { csrfToken: string }).csrfToken
}

export async function request<T>(path: string, opts: RequestOptions = {}): Promise<T> {
  const method = opts.method ?? 'GET'
  const qs = opts.query
    ? '?' +
      new URLSearchParams(
        Object.entries(opts.query)
          .filter(([, v]) => v !== undefined && v !== null && v !== '')
          .map(([k, v]) => [k, String(v)]),
      ).toString()
    : ''
  const headers: Record<string, string> = { Accept: 'application/json, application/problem+json', ...opts.headers }
  const isForm = typeof FormData !== 'undefined' && opts.body instanceof FormData
  if (opts.body !== undefined && !isForm) headers['Content-Type'] = 'application/json'
  if (method !== 'GET') {
    await ensureCsrf()
    headers['X-CSRF-Token'] = csrfToken
  }
  let res: Response
  try {
    res = await fetch(`${CONFIG.apiBase}${path}${qs}`, {
      method,
      headers,
      credentials: 'same-origin',
      body: opts.body === undefined ? undefined : isForm ? (opts.body as FormData) : JSON.stringify(opts.body),
      signal: opts.signal,
    })
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err
    throw new ApiError(0, 'No connection to Lampwright. Check the network and try again.', 'offline')
  }
  if (res.status === 204) return undefined as T
  const type = res.headers.get('content-type') ?? ''
  // Answers are application/json; errors are problem details (application/problem+json).
  const body = /[/+]json\b/.test(type) ? ((await res.json()) as Record<string, unknown>) : {}
  if (!res.ok) {
    if (res.status === 401 && !opts.quiet401) onUnauthorized?.()
    if (res.status === 403 && body.code === 'csrf') csrfToken = ''
    throw problemToError(res.status, res.statusText, body)
  }
  return body as T
}

export const http = {
  get: <T>(path: string, query?: RequestOptions['query']) => request<T>(path, { query }),
  post: <T>(path: string, body?: unknown, opts: RequestOptions = {}) => request<T>(path, { ...opts, method: 'POST', body }),
  put: <T>(path: string, body?: unknown) => request<T>(path, { method: 'PUT', body }),
  patch: <T>(path: string, body?: unknown) => request<T>(path, { method: 'PATCH', body }),
  del: <T>(path: string) => request<T>(path, { method: 'DELETE' }),
}
