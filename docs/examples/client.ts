/**
 * The typed Lampwright client the example jobs share: openapi-fetch over the types openapi-typescript
 * generated from /api/openapi.json (api.d.ts beside this file), so a path, a parameter or a field
 * the API does not have fails the type check, not the job.
 */
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import createClient from 'openapi-fetch'
import type { paths } from './api'

export type Lampwright = ReturnType<typeof lampwrightClient>

/** A client for one workspace, authenticated with an API token (made on the account page). */
export function lampwrightClient(baseUrl: string, token: string) {
  return createClient<paths>({ baseUrl, headers: { Authorization: `Bearer ${token}` } })
}

/** The API's answer, or an error naming the request and what the API said (its fields, if any). */
export function answerOf<T>(what: string, r: { data?: T; error?: unknown; response: Response }): T {
  if (r.data === undefined || r.error !== undefined) throw new Error(`${what}: HTTP ${r.response.status} ${JSON.stringify(r.error ?? null)}`)
  return r.data
}

/** Settings from the environment when a job runs on its own: LAMPWRIGHT_URL and LAMPWRIGHT_TOKEN. */
export function clientFromEnv(): Lampwright {
  const url = process.env.LAMPWRIGHT_URL ?? 'http://127.0.0.1:8420'
  const token = process.env.LAMPWRIGHT_TOKEN
  if (!token) throw new Error('Set LAMPWRIGHT_TOKEN to an API token (account page → API tokens).')
  return lampwrightClient(url, token)
}

/** True when this module is the script node was started with (not imported by a test). */
export function isMain(moduleUrl: string): boolean {
  return !!process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(moduleUrl)
}
