import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { jsonWithRawFields } from '../../server/lib/raw-json'

describe('jsonWithRawFields', () => {
  it('gives the same JSON value as serialising the whole object (property, fast-check)', () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string(), fc.jsonValue()), fc.dictionary(fc.string(), fc.jsonValue()), (plain, stored) => {
        // Raw fields replace plain fields of the same name, as they do in the API answers.
        const expected = { ...plain, ...stored }
        const rest = Object.fromEntries(Object.entries(plain).filter(([key]) => !Object.hasOwn(stored, key)))
        const raw = Object.fromEntries(Object.entries(stored).map(([key, value]) => [key, JSON.stringify(value)]))
        expect(JSON.parse(jsonWithRawFields(rest, raw))).toEqual(JSON.parse(JSON.stringify(expected)))
      }),
    )
  })

  it('handles an empty object on either side', () => {
    expect(jsonWithRawFields({}, {})).toBe('{}')
    expect(jsonWithRawFields({}, { results: '{"a":1}' })).toBe('{"results":{"a":1}}')
    expect(jsonWithRawFields({ id: 'x' }, {})).toBe('{"id":"x"}')
  })
})
