/** The API client's error mapping: every failure becomes an ApiError a screen can show. */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { ApiError, http, request, setCsrfToken, setUnauthorizedHandler } from '../../src/api/http'

function answer(status: number, body?: unknown, headers: Record<string, string> = {}): Response {
  const init = { status, headers: body === undefined ? headers : { 'content-type': 'application/json', ...headers } }
  return new Response(body === undefined ? null : JSON.stringify(body), init)
}

const fetchMock = vi.fn<typeof fetch>()
let unauthorized = 0

beforeEach(() => {
  fetchMock.mockReset()
  vi.stubGlobal('fetch', fetchMock)
  unauthorized = 0
  setUnauthorizedHandler(() => unauthorized++)
  setCsrfToken('token-1')
})
afterEach(() => {
  vi.unstubAllGlobals()
})

describe('request', () => {
  it('returns the JSON answer and sends the CSRF header on a change', async () => {
    fetchMock.mockResolvedValueOnce(answer(201, { id: 'a1' }))
    await expect(http.post<{ id: string }>('/sites', { name: 'Harbour depot' })).resolves.toEqual({ id: 'a1' })
    const [url, init] = fetchMock.mock.calls[0]!
    expect(url).toBe('/api/sites')
    expect((init!.headers as Record<string, string>)['X-CSRF-Token']).toBe('token-1')
    expect(init!.body).toBe(JSON.stringify({ name: 'Harbour depot' }))
  })

  it('leaves empty query values out of the address', async () => {
    fetchMock.mockResolvedValueOnce(answer(200, { items: [] }))
    await http.get('/audits', { limit: 50, q: '', sheetId: undefined, ids: null })
    expect(fetchMock.mock.calls[0]![0]).toBe('/api/audits?limit=50')
  })

  it('turns a 400 into an ApiError with the message, the code and the field messages for the form', async () => {
    // The server's problem details (RFC 9457): each refused value named by a JSON Pointer (RFC 6901).
    const errors = [
      { in: 'body', pointer: '/title', detail: 'is required' },
      { in: 'body', pointer: '/inputs/claimedPower', detail: 'must be a power such as "4 W"' },
    ]
    fetchMock.mockResolvedValueOnce(
      answer(400, {
        type: '/api/problems/invalid_input',
        title: 'Invalid input',
        status: 400,
        detail: 'Some fields need attention.',
        code: 'invalid_input',
        errors,
      }),
    )
    const err = await request('/audits', { method: 'POST', body: {} }).catch((e: unknown) => e)
    expect(err).toBeInstanceOf(ApiError)
    const api = err as ApiError
    expect(api.status).toBe(400)
    expect(api.message).toBe('Some fields need attention.')
    expect(api.code).toBe('invalid_input')
    expect(api.fieldMap()).toEqual({ title: 'is required', 'inputs.claimedPower': 'must be a power such as "4 W"' })
  })

  it('falls back to the status text when the answer is not JSON', async () => {
    fetchMock.mockResolvedValueOnce(new Response('upstream broke', { status: 502, statusText: 'Bad Gateway', headers: { 'content-type': 'text/plain' } }))
    const err = (await request('/sites').catch((e: unknown) => e)) as ApiError
    expect(err.status).toBe(502)
    expect(err.message).toBe('Bad Gateway')
    expect(err.fields).toEqual([])
  })

  it('reports no connection as status 0 with a sentence to show, not a TypeError', async () => {
    fetchMock.mockRejectedValueOnce(new TypeError('Failed to fetch'))
    const err = (await request('/sites').catch((e: unknown) => e)) as ApiError
    expect(err).toBeInstanceOf(ApiError)
    expect(err.status).toBe(0)
    expect(err.code).toBe('offline')
    expect(err.message).toMatch(/No connection/)
  })

  it('lets a cancelled request stay an AbortError', async () => {
    fetchMock.mockRejectedValueOnce(new DOMException('aborted', 'AbortError'))
    const err = (await request('/sites').catch((e: unknown) => e)) as Error
    expect(err).not.toBeInstanceOf(ApiError)
    expect(err.name).toBe('AbortError')
  })

  it('tells the app the session has ended on a 401, except for calls that expect one', async () => {
    fetchMock.mockResolvedValue(answer(401, { error: 'Sign in first.', code: 'unauthenticated' }))
    await request('/sites').catch(() => undefined)
    expect(unauthorized).toBe(1)
    await request('/auth/me', { quiet401: true }).catch(() => undefined)
    expect(unauthorized).toBe(1)
  })

  it('forgets a refused CSRF token so the next change fetches a fresh one', async () => {
    fetchMock.mockResolvedValueOnce(answer(403, { error: 'Reload the page.', code: 'csrf' }))
    await http.post('/sites', {}).catch(() => undefined)
    fetchMock.mockResolvedValueOnce(answer(200, { csrfToken: 'token-2' }))
    fetchMock.mockResolvedValueOnce(answer(200, { ok: true }))
    await http.post('/sites', {})
    expect(fetchMock.mock.calls[1]![0]).toBe('/api/auth/csrf')
    expect((fetchMock.mock.calls[2]![1]!.headers as Record<string, string>)['X-CSRF-Token']).toBe('token-2')
  })

  it('answers 204 with nothing', async () => {
    fetchMock.mockResolvedValueOnce(new Response(null, { status: 204 }))
    await expect(http.del('/audits/a1')).resolves.toBeUndefined()
  })
})
