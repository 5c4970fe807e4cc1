/**
 * The client reads RFC 9457 problem details: `detail` is the message, and each `errors[]` JSON
 * Pointer (RFC 6901) becomes the dotted path a form keys its inputs by, so a refused value is shown
 * beside its own input. Values named in the query or a header are not a form field's and are left out.
 */
import { describe, expect, it } from 'vitest'
import { ApiError, problemToError } from '../../src/api/http'

describe('problem details in the client', () => {
  it('maps each pointer to the form path and keeps the detail as the message', () => {
    const err = problemToError(400, 'Bad Request', {
      type: '/api/problems/invalid_input',
      title: 'The request has values that are not valid',
      status: 400,
      detail: 'Invalid input: records.1.testedOn is later than today',
      code: 'invalid_input',
      errors: [
        { pointer: '/records/1/testedOn', code: 'future_date', detail: 'is later than today' },
        { pointer: '/a~1b/m~0n', code: 'invalid', detail: 'escaped' },
        { pointer: '/colour', code: 'unknown_parameter', detail: 'is not a query parameter', in: 'query' },
      ],
    })
    expect(err).toBeInstanceOf(ApiError)
    expect(err.message).toBe('Invalid input: records.1.testedOn is later than today')
    expect(err.code).toBe('invalid_input')
    expect(err.fieldMap()).toEqual({ 'records.1.testedOn': 'is later than today', 'a/b.m~n': 'escaped' })
  })

  it('names a whole-body problem "(body)" and falls back to the status text when there is no detail', () => {
    const err = problemToError(422, 'Unprocessable Content', { errors: [{ pointer: '', code: 'invalid', detail: 'cannot be done' }] })
    expect(err.fieldMap()).toEqual({ '(body)': 'cannot be done' })
    expect(err.message).toBe('Unprocessable Content')
    expect(err.code).toBe('error')
  })
})
