/**
 * The API token a request was made with, for the code that writes the audit trail: services do not
 * see the request, so the token travels with the request's async context instead of through every
 * function's arguments.
 */
import { AsyncLocalStorage } from 'node:async_hooks'

export interface RequestToken {
  id: string
  name: string
}

const current = new AsyncLocalStorage<RequestToken>()

/** Runs the rest of the request with `token` as its token. */
export function withRequestToken<T>(token: RequestToken, fn: () => T): T {
  return current.run(token, fn)
}

/** The token of the request being served, or undefined for a session or the system. */
export function requestToken(): RequestToken | undefined {
  return current.getStore()
}
