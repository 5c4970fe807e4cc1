/** The few figures of a photometric file a handover document prints, read from parsed LM-63 files. */
import fs from 'node:fs'
import path from 'node:path'
import { describe, expect, it } from 'vitest'
import { parseLm63 } from '../../../shared/engine/lm63'
import { lampLumens, peakIntensity } from '../../../shared/engine/photometry-summary'

const fixture = (name: string) => fs.readFileSync(path.join(__dirname, '../../fixtures/photometry', name), 'utf8')
const parsed = (text: string) => {
  const r = parseLm63(text)
  if (!r.ok) throw new Error(r.error.message)
  return r.value
}

describe('peakIntensity', () => {
  it('finds the highest tabulated value of the LM-63 documentation example and its angles', () => {
    // IES LM-63-1991 example file: one plane, 1300 cd at γ = 10° is the largest of its eight values.
    expect(peakIntensity(parsed(fixture('lm63-1991-minimal.ies')))).toEqual({ cd: 1300, cDeg: 0, gammaDeg: 10 })
  })

  it('reads the peak across several C-planes, not only the first', () => {
    const table = {
      verticalAngles: [0, 45, 90],
      horizontalAngles: [0, 90],
      candela: [
        [100, 120, 0],
        [100, 240, 0],
      ],
    }
    expect(peakIntensity(table)).toEqual({ cd: 240, cDeg: 90, gammaDeg: 45 })
  })
})

describe('lampLumens', () => {
  it('is lamps × lumens per lamp (IES LM-63 line 10)', () => {
    expect(lampLumens({ lamps: 2, lumensPerLamp: 850, absolute: false })).toBe(1700)
  })
  it('is none for absolute photometry (lumens per lamp −1, IES LM-63)', () => {
    const p = parsed(fixture('lm63-1991-minimal.ies'))
    expect(p.lumensPerLamp).toBe(-1)
    expect(lampLumens(p)).toBeNull()
  })
})
