/**
 * What may reach a log. Request paths lose any long random segment (share and invitation tokens
 * travel in paths); ids (UUIDs) stay, as they are needed to follow a request and are not secrets.
 * Errors keep their kind, message, code and stack, never SQL parameters or row details.
 */
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i
const SECRET_LIKE = /^[A-Za-z0-9_-]{20,}$/

export function loggablePath(originalUrl: string): string {
  return originalUrl
    .split('?')[0]
    .split('/')
    .map((segment) => (SECRET_LIKE.test(segment) && !UUID.test(segment) ? '[redacted]' : segment))
    .join('/')
}

export function errorForLog(err: unknown): Record<string, unknown> {
  if (!(err instanceof Error)) return { message: String(err) }
  const e = err as Error & { code?: unknown; driverError?: { code?: unknown; message?: unknown }; query?: unknown }
  return {
    type: e.name,
    message: e.message,
    code: e.driverError?.code ?? e.code,
    // The SQL text has only placeholders; the values ($1, $2, …) and the row detail are left out.
    ...(typeof e.query === 'string' ? { query: e.query } : {}),
    stack: e.stack,
  }
}
