/**
 * A reference marked from memory never appears on an issued sheet without its mark: the sheet's
 * reference list keeps one entry per source and basis, so a source cited both as published and from
 * memory (as the battery handbook is, value by value) shows both marks.
 */
import { describe, expect, it } from 'vitest'
import { issuedReferences } from '../../server/modules/sheets/sheet-pdf'
import type { WorkingStep } from '../../shared/engine/types'

const step = (references: WorkingStep['references']): WorkingStep => ({
  id: 'x',
  label: 'x',
  formula: 'x',
  explanation: 'x',
  inputs: [],
  result: { symbol: 'x', label: 'x', value: 1, unit: '' },
  references,
})

describe('issued references', () => {
  it('keeps the from-memory mark when the same source was first cited as published', () => {
    const refs = issuedReferences([
      step([{ source: 'Handbook of Batteries, chemistry chapters', basis: 'published' }]),
      step([
        { source: 'Handbook of Batteries, chemistry chapters', basis: 'from memory' },
        { source: 'Handbook of Batteries, chemistry chapters', basis: 'published' },
      ]),
    ])
    expect(refs.map((r) => r.basis)).toEqual(['published', 'from memory'])
  })
})
