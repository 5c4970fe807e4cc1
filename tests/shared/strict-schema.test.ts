/**
 * Strict copies of zod schemas (the API refuses undeclared fields with them). Each case is a shape
 * the route schemas use: nested objects, arrays, optional and defaulted parts, refinements,
 * discriminated unions, records; an object that says `.passthrough()` keeps accepting extra keys.
 */
import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import { refuseKeysOutside, strictSchema } from '../../shared/lib/strict-schema'

const unknownKeys = (r: z.SafeParseReturnType<unknown, unknown>) =>
  r.success ? [] : r.error.issues.filter((i) => i.code === 'unrecognized_keys').map((i) => [...i.path, ...(i as z.ZodUnrecognizedKeysIssue).keys].join('.'))

describe('strictSchema', () => {
  const Load = z.object({ power: z.string() })
  const Body = z
    .object({
      name: z.string(),
      load: Load.optional(),
      rows: z.array(z.object({ tag: z.string() })).default([]),
      kind: z
        .discriminatedUnion('type', [z.object({ type: z.literal('a'), x: z.number() }), z.object({ type: z.literal('b'), y: z.number() })])
        .nullable()
        .default(null),
      byTag: z.record(z.object({ n: z.number() })).optional(),
    })
    .refine((b) => b.name !== 'forbidden', 'no')

  it('accepts what the schema declares and parses it as the original does', () => {
    const input = { name: 'x', load: { power: '1 W' }, rows: [{ tag: 'A' }], kind: { type: 'b', y: 2 }, byTag: { A: { n: 1 } } }
    expect(strictSchema(Body).parse(input)).toEqual(Body.parse(input))
  })

  it('refuses an undeclared key at any depth, naming where it is', () => {
    const r = strictSchema(Body).safeParse({
      name: 'x',
      extra: 1,
      load: { power: '1 W', watts: 2 },
      rows: [{ tag: 'A', colour: 'red' }],
      kind: { type: 'a', x: 1, z: 0 },
      byTag: { A: { n: 1, m: 2 } },
    })
    expect(unknownKeys(r).sort()).toEqual(['byTag.A.m', 'extra', 'kind.z', 'load.watts', 'rows.0.colour'])
  })

  it('leaves the original schema as it was (it still drops unknown keys)', () => {
    strictSchema(Body)
    expect(Body.safeParse({ name: 'x', extra: 1 }).success).toBe(true)
  })

  it('keeps refinements', () => {
    expect(strictSchema(Body).safeParse({ name: 'forbidden' }).success).toBe(false)
  })

  it('keeps an object that accepts extra keys on purpose', () => {
    const Open = z.object({ a: z.number() }).passthrough()
    expect(strictSchema(Open).parse({ a: 1, b: 2 })).toEqual({ a: 1, b: 2 })
  })
})

describe('refuseKeysOutside', () => {
  it('reports keys of a record that are not in the known list', () => {
    const Inputs = z.record(z.unknown()).superRefine(refuseKeysOutside(['duration', 'load']))
    expect(Inputs.safeParse({ duration: '3 h' }).success).toBe(true)
    expect(unknownKeys(Inputs.safeParse({ duration: '3 h', durationn: '3 h' }))).toEqual(['durationn'])
  })
})
