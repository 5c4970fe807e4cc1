/**
 * EULUMDAT (.ldt) files written by hand to the published line-by-line description of the format
 * (Stockmar 1990, EULUMDAT/2 1998; field order as in the format's description: 26 header lines,
 * six lines per lamp set, 10 direct ratios, Mc C angles, Ng γ angles, then the stored planes'
 * intensities in cd/1000 lm). The order of the lamp-set fields (each set's six in turn) and
 * the planes stored per symmetry indicator are from memory, checked against the fixtures only.
 * Absolute photometry (negative number of lamps, flux of the luminaire): the convention agreed
 * between two design-software makers, quoted in the format notes we hold.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { parseEulumdat, type EulumdatFile } from '../../../shared/engine/eulumdat'
import { formatLm63 } from '../../../shared/engine/lm63-write'
import { intensityAt, parseLm63 } from '../../../shared/engine/lm63'
import { parsePhotometricFile } from '../../../shared/engine/photometric-file'
import { spacingInput } from '../../../shared/engine/spacing'

const fixture = (name: string) => readFileSync(new URL(`../../fixtures/photometry/${name}`, import.meta.url), 'utf8')
const bothPlanes = fixture('corridor-module-both-planes.ldt')
const absolute = fixture('round-downlight-absolute.ldt')

function parsed(text: string): EulumdatFile {
  const r = parseEulumdat(text)
  if (!r.ok) throw new Error(`line ${r.error.line}: ${r.error.message}`)
  return r.value
}
function failure(text: string) {
  const r = parseEulumdat(text)
  if (r.ok) throw new Error('expected the parser to refuse this file')
  return r.error
}
/** The fixture's lines (without CR LF), to change one field and join again. */
const linesOf = (text: string) => text.split('\r\n')
const withLine = (text: string, lineNo: number, value: string) => {
  const l = linesOf(text)
  l[lineNo - 1] = value
  return l.join('\r\n')
}

describe('parseEulumdat: symmetry about both planes (Isym 4), two lamp sets', () => {
  const p = parsed(bothPlanes)
  it('reads the header lines into the shared photometry shape', () => {
    expect(p.edition).toBe('EULUMDAT')
    expect(p.typeIndicator).toBe(3)
    expect(p.symmetry).toBe(4)
    expect(p.keywords.LUMINAIRE).toBe('Corridor module, 3 W emergency LED, opal lens (invented)')
    expect(p.keywords.LUMCAT).toBe('INV-CM-3')
    expect(p.keywords.TEST).toBe('LW-LDT-007 (invented test report)')
    expect([p.length, p.width, p.height]).toEqual([0.32, 0.11, 0.045])
    expect(p.lightOutputRatio).toBe(82)
    expect(p.absolute).toBe(false)
  })
  it('reads every lamp set, and scales by the first set only', () => {
    expect(p.lampSets).toEqual([
      { lamps: 1, type: 'LED module 3 W', fluxLm: 400, colour: '4000 K', colourRendering: '80', watts: 3.5 },
      { lamps: 1, type: 'LED module 1 W', fluxLm: 150, colour: '4000 K', colourRendering: '80', watts: 1.4 },
    ])
    expect(p.lumensPerLamp).toBe(400)
    expect(p.inputWatts).toBe(3.5)
    expect(p.candelaMultiplier).toBeCloseTo(0.4, 12)
  })
  it('keeps the stored planes C0 to C90 (Mc/4 + 1 = 7) and converts cd/klm to cd', () => {
    expect(p.horizontalAngles).toEqual([0, 15, 30, 45, 60, 75, 90])
    expect(p.verticalAngles).toEqual(Array.from({ length: 19 }, (_, k) => k * 5))
    // Line 39 + 10 + 24 + 19 = line 92 is C0 γ0: 320.0 cd/klm × 400 lm / 1000.
    expect(linesOf(bothPlanes)[91]).toBe('320.0')
    expect(p.candela[0][0]).toBeCloseTo(128, 9)
    expect(p.candela.every((row) => row.length === 19)).toBe(true)
  })
  it('mirrors the stored quadrant into the others (same look-up as an LM-63 quadrant file)', () => {
    for (const g of [0, 12.5, 40, 70]) {
      expect(intensityAt(p, 180, g)).toBeCloseTo(intensityAt(p, 0, g), 9)
      expect(intensityAt(p, 270, g)).toBeCloseTo(intensityAt(p, 90, g), 9)
      expect(intensityAt(p, 345, g)).toBeCloseTo(intensityAt(p, 15, g), 9)
      expect(intensityAt(p, 200, g)).toBeCloseTo(intensityAt(p, 20, g), 9)
    }
  })
  it('round-trips through an LM-63 file: the same intensities in every direction', () => {
    const text = formatLm63(p, { keywords: [['LUMINAIRE', p.keywords.LUMINAIRE]], inputWatts: p.inputWatts })
    const back = parseLm63(text)
    if (!back.ok) throw new Error(back.error.message)
    for (const c of [0, 10, 45, 100, 190, 300]) {
      for (const g of [0, 7, 33, 61, 89]) expect(back.value.candela.length && intensityAt(back.value, c, g)).toBeCloseTo(intensityAt(p, c, g), 3)
    }
  })
})

describe('parseEulumdat: absolute photometry, rotational symmetry (Isym 1), uneven γ steps', () => {
  const p = parsed(absolute)
  it('takes a negative number of lamps as absolute photometry with the luminaire flux', () => {
    expect(p.absolute).toBe(true)
    expect(p.lumensPerLamp).toBe(-1)
    expect(p.lamps).toBe(6)
    expect(p.lampSets[0].fluxLm).toBe(250)
  })
  it('reads a decimal comma (2,5 W)', () => expect(p.inputWatts).toBe(2.5))
  it('stores one plane and gives the same intensity in every C direction', () => {
    expect(p.horizontalAngles).toEqual([0])
    expect(p.verticalAngles).toEqual([0, 10, 30, 45, 60, 75, 90])
    expect(p.candela[0]).toEqual([125, 120, 100, 75, 37.5, 10, 0])
    expect(intensityAt(p, 123, 20)).toBeCloseTo(110, 9) // halfway between 120 and 100
  })
  it('is accepted by the spacing tool as text, like an LM-63 file', () => {
    const input = spacingInput.parse({ photometry: absolute, mountingHeight: '2.5 m', emergencyOutputFactor: 1, criteria: 'en1838-route', routeWidth: '2 m' })
    expect(input.photometry.absolute).toBe(true)
    expect(input.photometry.name).toBe('Round downlight, 2 W emergency LED (invented)')
    expect(input.photometry.table.candela[0][0]).toBe(125)
  })
})

describe('parsePhotometricFile tells the formats apart by content', () => {
  it('EULUMDAT text goes to the EULUMDAT parser, LM-63 text to the LM-63 parser', () => {
    expect(parsePhotometricFile(absolute).format).toBe('eulumdat')
    expect(parsePhotometricFile(fixture('lm63-1991-minimal.ies')).format).toBe('lm63')
  })
})

describe('parseEulumdat refuses what does not fit, naming the line', () => {
  it('a file cut short', () => {
    const cut = linesOf(absolute).slice(0, 52).join('\r\n')
    expect(failure(cut)).toMatchObject({ line: 52, message: expect.stringMatching(/ends early: expected intensity 3 of 7/) })
  })
  it('a symmetry that needs a multiple of 4 C-planes', () => {
    const bad = withLine(bothPlanes, 4, '22')
    expect(failure(bad)).toMatchObject({ line: 4, message: expect.stringMatching(/multiple of 4/) })
  })
  it('a symmetry indicator out of range', () => expect(failure(withLine(bothPlanes, 3, '5'))).toMatchObject({ line: 3 }))
  it('a C angle off the declared step', () => {
    // C angles start at line 49 (26 + 12 lamp-set lines + 10 direct ratios + 1).
    expect(failure(withLine(bothPlanes, 51, '31'))).toMatchObject({ line: 51, message: expect.stringMatching(/off the declared 15° step/) })
  })
  it('a negative intensity', () => expect(failure(withLine(absolute, 55, '-4'))).toMatchObject({ line: 55, message: expect.stringMatching(/negative/) }))
  it('values left over after the table', () => expect(failure(`${absolute}12`)).toMatchObject({ line: 58, message: expect.stringMatching(/left after/) }))
  it('a lamp set with no flux', () =>
    expect(failure(withLine(absolute, 29, '0'))).toMatchObject({ line: 29, message: expect.stringMatching(/flux of lamp set 1/) }))
  it('text where a number belongs', () =>
    expect(failure(withLine(bothPlanes, 6, 'nineteen'))).toMatchObject({ line: 6, message: expect.stringMatching(/expected a number/) }))
  it('γ angles outside the type C ranges', () =>
    expect(failure(withLine(absolute, 50, '85'))).toMatchObject({ line: 44, message: expect.stringMatching(/0–85/) }))
  it('notes (without refusing) a γ = 0° value that differs between planes', () => {
    // Line 92 + 19 = 111 is C15 γ0.
    const p = parsed(withLine(bothPlanes, 111, '300.0'))
    expect(p.notes).toHaveLength(1)
  })
})
