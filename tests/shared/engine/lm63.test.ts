import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { intensityAt, parseLm63, type Photometry } from '../../../shared/engine/lm63'

const fixture = (name: string) => readFileSync(new URL(`../../fixtures/photometry/${name}`, import.meta.url), 'utf8')

function parsed(text: string): Photometry {
  const result = parseLm63(text)
  if (!result.ok) throw new Error(`line ${result.error.line}: ${result.error.message}`)
  return result.value
}

function failure(text: string) {
  const result = parseLm63(text)
  if (result.ok) throw new Error('expected the parser to refuse this file')
  return result.error
}

const minimal91 = fixture('lm63-1991-minimal.ies')

describe('parseLm63: the minimal example file of the IES LM-63 documentation (IESNA91, TILT=NONE)', () => {
  const p = parsed(minimal91)
  it('reads the header values exactly', () => {
    expect(p.edition).toBe('1991')
    expect(p.tilt).toBe('NONE')
    expect(p.lamps).toBe(1)
    expect(p.lumensPerLamp).toBe(-1)
    expect(p.absolute).toBe(true)
    expect(p.candelaMultiplier).toBe(1)
    expect(p.photometricType).toBe(1)
    expect(p.unitsType).toBe(2)
    expect([p.width, p.length, p.height]).toEqual([0, 0, 0])
    expect(p.ballastFactor).toBe(1)
    expect(p.inputWatts).toBe(0)
  })
  it('reads the angles and the candela row exactly', () => {
    expect(p.verticalAngles).toEqual([0, 5, 10, 20, 30, 45, 65, 90])
    expect(p.horizontalAngles).toEqual([0])
    expect(p.candela).toEqual([[1000, 1100, 1300, 1150, 930, 650, 350, 0]])
  })
  it('treats a single horizontal angle as axial symmetry and interpolates in γ', () => {
    expect(intensityAt(p, 123, 5)).toBe(1100)
    expect(intensityAt(p, 0, 15)).toBeCloseTo(1225, 12) // halfway between 1300 and 1150
    expect(intensityAt(p, 270, 55)).toBeCloseTo(500, 12) // halfway between 650 and 350
    expect(intensityAt(p, 0, 120)).toBe(0) // above the measured range
  })
})

describe('parseLm63: hand-written 2002 file with keywords, [MORE] and TILT=INCLUDE', () => {
  const p = parsed(fixture('corridor-wash-2002.ies'))
  it('reads edition, keywords and tilt', () => {
    expect(p.edition).toBe('2002')
    expect(p.tilt).toBe('INCLUDE')
    expect(p.keywords.TEST).toBe('LW-T-0042 (invented test report)')
    expect(p.keywords.LUMINAIRE).toBe('Corridor wash, 3 W emergency module, opal diffuser\nInvented fixture for parser tests; not a real product')
    expect(p.keywords._SERIALNUMBER).toBe('0001')
    expect(Object.keys(p.keywords)).not.toContain('MORE')
  })
  it('skips the tilt block and reads the header after it', () => {
    expect(p.lamps).toBe(1)
    expect(p.lumensPerLamp).toBe(250)
    expect(p.absolute).toBe(false)
    expect(p.candelaMultiplier).toBe(0.5)
    expect([p.width, p.length, p.height]).toEqual([-0.1, 0.3, 0.05])
    expect(p.ballastFactor).toBe(1)
    expect(p.inputWatts).toBe(3.2)
  })
  it('applies the candela multiplier (0.5) to every value', () => {
    expect(p.verticalAngles).toEqual([0, 15, 30, 45, 60, 75, 90])
    expect(p.horizontalAngles).toEqual([0, 45, 90])
    expect(p.candela[0]).toEqual([110, 105, 95, 75, 50, 20, 0])
    expect(p.candela[2]).toEqual([110, 100, 85, 60, 35, 12.5, 0])
  })
  it('uses quadrant symmetry (last angle 90): C and 180−C and 360−C look the same', () => {
    // Hand check: C = 45 row at γ = 30 is 180 × 0.5 = 90 cd.
    expect(intensityAt(p, 45, 30)).toBeCloseTo(90, 12)
    expect(intensityAt(p, 135, 30)).toBeCloseTo(90, 12)
    expect(intensityAt(p, 225, 30)).toBeCloseTo(90, 12)
    expect(intensityAt(p, 315, 30)).toBeCloseTo(90, 12)
    expect(intensityAt(p, 180, 45)).toBeCloseTo(75, 12) // C180 ≡ C0
    expect(intensityAt(p, 270, 45)).toBeCloseTo(60, 12) // C270 ≡ C90
  })
  it('interpolates bilinearly between planes and angles', () => {
    // C = 22.5 (half-way C0–C45), γ = 37.5 (half-way 30–45): mean of 95, 75, 90, 70 = 82.5 cd.
    expect(intensityAt(p, 22.5, 37.5)).toBeCloseTo(82.5, 12)
    // Negative γ is the same direction as +γ in the opposite plane.
    expect(intensityAt(p, 0, -30)).toBeCloseTo(intensityAt(p, 180, 30), 12)
  })
})

describe('parseLm63: hand-written 2019 file, absolute photometry, bilateral symmetry', () => {
  const p = parsed(fixture('open-area-2019.ies'))
  it('reads it', () => {
    expect(p.edition).toBe('2019')
    expect(p.keywords.LUMINAIRE).toContain('\nasymmetric lens')
    expect(p.absolute).toBe(true)
    expect(p.horizontalAngles).toEqual([0, 90, 180])
    expect(p.candela[1]).toEqual([400, 350, 250, 120, 0])
    expect(p.inputWatts).toBe(5)
  })
  it('mirrors about the C0–C180 plane (last angle 180)', () => {
    expect(intensityAt(p, 270, 45)).toBeCloseTo(250, 12)
    expect(intensityAt(p, 200, 45)).toBeCloseTo(intensityAt(p, 160, 45), 12)
    expect(intensityAt(p, 135, 22.5)).toBeCloseTo((350 + 330) / 2, 12)
    expect(intensityAt(p, -90, 45)).toBeCloseTo(250, 12)
  })
})

describe('parseLm63: other editions and layouts', () => {
  it('reads a 1995 file with values separated by commas and spread over lines', () => {
    const p = parsed(['IESNA:LM-63-1995', '[TEST] T1', 'TILT=NONE', '1,-1,2,3,1,1,2', '0,0,0', '1 1 1.5', '0 45', '90', '0', '10,', '8,0'].join('\r\n'))
    expect(p.edition).toBe('1995')
    expect(p.candela).toEqual([[20, 16, 0]])
  })
  it('reads a 1986 file (no version line; text before TILT is ignored)', () => {
    const p = parsed(['Some free text line', 'another', 'TILT=NONE', '1 -1 1 2 1 1 2 0 0 0', '1 1 0', '0 90', '0', '5 0'].join('\n'))
    expect(p.edition).toBe('1986')
    expect(p.keywords).toEqual({})
    expect(p.candela).toEqual([[5, 0]])
  })
  it('keeps a TILT file name', () => {
    const p = parsed(minimal91.replace('TILT=NONE', 'TILT=tilt-table.dat'))
    expect(p.tilt).toBe('tilt-table.dat')
  })
  it('keeps an unbracketed wrapped keyword line with the keyword before it', () => {
    const p = parsed(minimal91.replace('IESNA91\n', 'IESNA91\n[LUMINAIRE] first part\nsecond part\n'))
    expect(p.keywords.LUMINAIRE).toBe('first part\nsecond part')
  })
  it('handles a full table (last angle 360) and wraps between the last plane and C = 360 ≡ C0', () => {
    const text = ['IESNA:LM-63-2002', 'TILT=NONE', '1 -1 1 2 4 1 2 0 0 0', '1 1 0', '0 90', '0 90 180 270', '100 0', '200 0', '300 0', '400 0'].join('\n')
    const p = parsed(text)
    expect(intensityAt(p, 315, 0)).toBeCloseTo(250, 12) // half-way 400 (C270) → 100 (C360 ≡ C0)
    expect(intensityAt(p, 135, 0)).toBeCloseTo(250, 12)
    expect(intensityAt(p, 270, 0)).toBe(400)
    const full = parsed(text.replace('0 90 180 270', '0 90 180 360'))
    expect(intensityAt(full, 360, 0)).toBe(100) // C = 360 is read as C = 0
    expect(intensityAt(full, 270, 0)).toBeCloseTo(350, 12)
  })
  it('handles bilateral symmetry about the C90–C270 plane (horizontal angles 90–270; from memory of LM-63-1995)', () => {
    const p = parsed(['IESNA:LM-63-1995', 'TILT=NONE', '1 -1 1 2 3 1 2 0 0 0', '1 1 0', '0 90', '90 180 270', '10 0', '20 0', '30 0'].join('\n'))
    expect(intensityAt(p, 0, 0)).toBe(20) // C0 mirrors to C180
    expect(intensityAt(p, 45, 0)).toBeCloseTo(15, 12) // C45 mirrors to C135
    expect(intensityAt(p, 315, 0)).toBeCloseTo(25, 12) // C315 mirrors to C225
  })
  it('a single vertical angle gives that value wherever it applies', () => {
    expect(intensityAt({ verticalAngles: [0], horizontalAngles: [0], candela: [[7]] }, 0, 0)).toBe(7)
  })
  it('treats an up-only table (γ 90–180) as dark below the horizontal', () => {
    const p = parsed(['IESNA91', 'TILT=NONE', '1 -1 1 2 1 1 2 0 0 0', '1 1 0', '90 180', '0', '0 50'].join('\n'))
    expect(intensityAt(p, 0, 45)).toBe(0)
    expect(intensityAt(p, 0, 135)).toBeCloseTo(25, 12)
    expect(intensityAt(p, 0, 200)).toBeCloseTo(intensityAt(p, 0, 160), 12)
  })
})

describe('parseLm63: refuses bad files and names the line', () => {
  const lines91 = minimal91.trimEnd().split('\n')
  const withLine = (n: number, text: string) => lines91.map((l, k) => (k === n - 1 ? text : l)).join('\n')

  it('photometric type B and A are refused, never read as wrong numbers', () => {
    expect(failure(withLine(3, '1 -1 1 8 1 2 2 0 0 0'))).toEqual({ line: 3, message: expect.stringContaining('photometric type B is not supported yet') })
    expect(failure(withLine(3, '1 -1 1 8 1 3 2 0 0 0')).message).toContain('photometric type A is not supported yet')
    expect(failure(withLine(3, '1 -1 1 8 1 4 2 0 0 0')).message).toContain('must be 1 (C), 2 (B) or 3 (A)')
  })
  it('text where a number belongs', () => {
    const e = failure(withLine(7, '1000 1100 1300 abc 930 650 350 0'))
    expect(e.line).toBe(7)
    expect(e.message).toContain('"abc"')
  })
  it('a truncated file', () => {
    const e = failure(withLine(7, '1000 1100 1300 1150 930'))
    expect(e.line).toBe(7)
    expect(e.message).toMatch(/file ends early.*candela value 6 of 8/)
  })
  it('wrong counts: values left over', () => {
    const e = failure(`${minimal91.trimEnd()}\n12 13\n`)
    expect(e.line).toBe(8)
    expect(e.message).toContain('2 value(s) left after the candela table')
  })
  it('angles not ascending', () => {
    const e = failure(withLine(5, '0 5 10 20 15 45 65 90'))
    expect(e.line).toBe(5)
    expect(e.message).toContain('ascending')
  })
  it('type C horizontal range that is not 0 / 90 / 180 / up to 360', () => {
    const text = ['IESNA:LM-63-2002', 'TILT=NONE', '1 -1 1 2 2 1 2 0 0 0', '1 1 0', '0 90', '0 120', '10 0', '10 0'].join('\n')
    const e = failure(text)
    expect(e.line).toBe(6)
    expect(e.message).toContain('horizontal angles must start at 0')
  })
  it('type C vertical range that is not 0–90, 90–180 or 0–180', () => {
    expect(failure(withLine(5, '0 5 10 20 30 45 65 80')).message).toContain('vertical angles must run 0–90')
  })
  it('missing TILT line, empty file, empty TILT value', () => {
    expect(failure('IESNA91\n[TEST] x\n')).toEqual({ line: 2, message: expect.stringContaining('no TILT= line') })
    expect(failure('  \n\n').message).toBe('the file is empty')
    expect(failure(withLine(2, 'TILT=')).line).toBe(2)
  })
  it('header values out of range', () => {
    expect(failure(withLine(3, '0 -1 1 8 1 1 2 0 0 0')).message).toContain('number of lamps must be a whole number')
    expect(failure(withLine(3, '1 0 1 8 1 1 2 0 0 0')).message).toContain('lumens per lamp')
    expect(failure(withLine(3, '1 -1 0 8 1 1 2 0 0 0')).message).toContain('candela multiplier')
    expect(failure(withLine(3, '1 -1 1 8.5 1 1 2 0 0 0')).message).toContain('number of vertical angles')
    expect(failure(withLine(3, '1 -1 1 8 1 1 3 0 0 0')).message).toContain('units type')
    expect(failure(withLine(7, '1000 1100 1300 -1150 930 650 350 0')).message).toContain('cannot be negative')
  })
  it('bad tilt block', () => {
    const tilted = (block: string) => minimal91.replace('TILT=NONE', `TILT=INCLUDE\n${block}`)
    expect(failure(tilted('4\n2\n0 90\n1 1')).message).toContain('geometry must be 1, 2 or 3')
    expect(failure(tilted('1\n2\n90 0\n1 1'))).toEqual({ line: 5, message: expect.stringContaining('ascending') })
    expect(parsed(tilted('2\n2\n0 90\n1 0.9')).candela[0][0]).toBe(1000)
  })
})
