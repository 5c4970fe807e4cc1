/**
 * EULUMDAT (.ldt) photometric files: one field per line (Stockmar 1990; EULUMDAT/2 1998), read
 * into the same Photometry shape an LM-63 file gives, so everything that accepts one accepts
 * the other. Intensities are stored in cd/1000 lm and turned into candela with the first lamp
 * set's flux; the symmetry indicator says which C-planes are stored and the table keeps the
 * same symmetry the LM-63 look-up already folds (axial, C0–C180, C90–C270, both planes, none).
 * Like the LM-63 parser it never guesses: a count, angle or value that does not fit is refused
 * with the line it is on.
 */
import type { Lm63Error, Photometry } from './lm63'

export interface LampSet {
  /** Number of lamps; negative in the file for absolute photometry (kept positive here). */
  lamps: number
  type: string
  /** Total flux of the set's lamps, lm (for absolute photometry: the luminaire's flux). */
  fluxLm: number
  colour: string
  colourRendering: string
  /** Wattage including the control gear, W. */
  watts: number
}

export interface EulumdatFile extends Photometry {
  format: 'eulumdat'
  /** Type indicator: 1 point source with symmetry about the vertical axis, 2 linear, 3 point source with other symmetry. */
  typeIndicator: number
  /** Symmetry indicator: 0 none, 1 about the vertical axis, 2 about C0–C180, 3 about C90–C270, 4 about both. */
  symmetry: 0 | 1 | 2 | 3 | 4
  lampSets: LampSet[]
  /** Light output ratio of the luminaire, %. */
  lightOutputRatio: number
  /** Downward flux fraction, %. */
  downwardFluxFraction: number
  /** Notes on the data that do not stop it being read (γ = 0° differing between planes). */
  notes: string[]
}

export type EulumdatResult = { ok: true; value: EulumdatFile } | { ok: false; error: Lm63Error }

class LdtError extends Error {
  constructor(
    readonly line: number,
    message: string,
  ) {
    super(message)
  }
}

/** Reads the file one line (one field) at a time, naming the field in every refusal. */
class LineReader {
  private index = 0
  constructor(private readonly lines: string[]) {}

  get line(): number {
    return this.index + 1
  }

  text(what: string): string {
    if (this.index >= this.lines.length) throw new LdtError(this.lines.length, `file ends early: expected ${what}, found the end of the file`)
    return this.lines[this.index++].trim()
  }

  number(what: string): number {
    const line = this.line
    const raw = this.text(what)
    // Files written with a decimal comma are common; a comma is read as the decimal point.
    const value = raw === '' ? NaN : Number(raw.replace(',', '.'))
    if (!Number.isFinite(value)) throw new LdtError(line, `expected a number (${what}) but found "${raw}"`)
    return value
  }

  whole(what: string, min: number, max = Infinity): number {
    const line = this.line
    const value = this.number(what)
    if (!Number.isInteger(value) || value < min || value > max) {
      throw new LdtError(line, `${what} must be a whole number from ${min}${max === Infinity ? ' up' : ` to ${max}`}, found ${value}`)
    }
    return value
  }

  get rest(): string[] {
    return this.lines.slice(this.index)
  }
}

/** Which of the Mc C-planes are stored for each symmetry indicator: [first index, count]. */
function storedPlanes(symmetry: number, mc: number): [number, number] {
  if (symmetry === 1) return [0, 1]
  if (symmetry === 2) return [0, mc / 2 + 1]
  if (symmetry === 3) return [mc / 4, mc / 2 + 1]
  if (symmetry === 4) return [0, mc / 4 + 1]
  return [0, mc]
}

const SYMMETRY_NAMES = [
  'no symmetry',
  'symmetry about the vertical axis',
  'symmetry about the C0–C180 plane',
  'symmetry about the C90–C270 plane',
  'symmetry about both planes',
]

function angles(reader: LineReader, count: number, what: string, step: number): number[] {
  const out: number[] = []
  for (let k = 0; k < count; k++) {
    const line = reader.line
    const a = reader.number(`${what} ${k + 1} of ${count}`)
    if (k > 0 && !(a > out[k - 1])) throw new LdtError(line, `${what}s must be in ascending order: ${a} follows ${out[k - 1]}`)
    // An equidistant grid is declared with its step; the angles must then sit on it.
    if (step > 0 && k > 0 && Math.abs(a - (out[0] + k * step)) > 1e-6) {
      throw new LdtError(line, `${what} ${a} is off the declared ${step}° step (expected ${out[0] + k * step})`)
    }
    out.push(a)
  }
  return out
}

function parseOrThrow(text: string): EulumdatFile {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/)
  while (lines.length > 0 && lines[lines.length - 1].trim() === '') lines.pop()
  if (lines.length === 0) throw new LdtError(1, 'the file is empty')
  const r = new LineReader(lines)
  const company = r.text('company identification')
  const typeIndicator = r.whole('type indicator (Ityp)', 0, 3)
  const symLine = r.line
  const symmetry = r.whole('symmetry indicator (Isym)', 0, 4) as 0 | 1 | 2 | 3 | 4
  const mcLine = r.line
  const mc = r.whole('number of C-planes (Mc)', 1, 721)
  const dc = r.number('distance between C-planes (Dc)')
  const ng = r.whole('number of luminous intensities per C-plane (Ng)', 1, 361)
  const dg = r.number('distance between luminous intensities (Dg)')
  if ((symmetry === 2 || symmetry === 3) && mc % 2 !== 0)
    throw new LdtError(mcLine, `with ${SYMMETRY_NAMES[symmetry]} the number of C-planes must be even, found ${mc}`)
  if ((symmetry === 3 || symmetry === 4) && mc % 4 !== 0)
    throw new LdtError(mcLine, `with ${SYMMETRY_NAMES[symmetry]} the number of C-planes must be a multiple of 4, found ${mc}`)
  const report = r.text('measurement report number')
  const name = r.text('luminaire name')
  const number = r.text('luminaire number')
  r.text('file name')
  const dateUser = r.text('date and user')
  const length = r.number('length or diameter of the luminaire (mm)')
  const width = r.number('width of the luminaire (mm)')
  const height = r.number('height of the luminaire (mm)')
  for (const what of [
    'length or diameter of the luminous area',
    'width of the luminous area',
    'height of the luminous area in C0',
    'in C90',
    'in C180',
    'in C270',
  ])
    r.number(`${what} (mm)`)
  const downwardFluxFraction = r.number('downward flux fraction (%)')
  const lightOutputRatio = r.number('light output ratio of the luminaire (%)')
  const conversionLine = r.line
  const conversion = r.number('conversion factor for luminous intensities')
  if (!(conversion > 0)) throw new LdtError(conversionLine, `the conversion factor must be greater than zero, found ${conversion}`)
  r.number('tilt of the luminaire during measurement')
  const setCount = r.whole('number of standard lamp sets', 1, 20)
  // Each lamp set's six fields follow one another: number, type, flux, colour, rendering, watts.
  const lampSets: LampSet[] = []
  let absolute = false
  for (let s = 1; s <= setCount; s++) {
    const lampsLine = r.line
    const lamps = r.number(`number of lamps in lamp set ${s}`)
    if (!Number.isInteger(lamps) || lamps === 0)
      throw new LdtError(lampsLine, `number of lamps in lamp set ${s} must be a whole number other than 0 (negative for absolute photometry), found ${lamps}`)
    if (lamps < 0 && s === 1) absolute = true
    const type = r.text(`type of lamps in lamp set ${s}`)
    const fluxLine = r.line
    const fluxLm = r.number(`total luminous flux of lamp set ${s} (lm)`)
    if (!(fluxLm > 0)) throw new LdtError(fluxLine, `the flux of lamp set ${s} must be greater than zero, found ${fluxLm}`)
    const colour = r.text(`colour appearance of lamp set ${s}`)
    const colourRendering = r.text(`colour rendering of lamp set ${s}`)
    const watts = r.number(`wattage of lamp set ${s} including control gear (W)`)
    lampSets.push({ lamps: Math.abs(lamps), type, fluxLm, colour, colourRendering, watts })
  }
  for (let k = 1; k <= 10; k++) r.number(`direct ratio ${k} of 10`)
  const cLine = r.line
  const cAngles = angles(r, mc, 'C angle', dc)
  if (cAngles[0] !== 0 || cAngles[mc - 1] >= 360)
    throw new LdtError(cLine, `C angles must start at 0 and stay below 360; these run ${cAngles[0]}–${cAngles[mc - 1]}`)
  const gLine = r.line
  const gAngles = angles(r, ng, 'γ angle', dg)
  const gFirst = gAngles[0]
  const gLast = gAngles[ng - 1]
  if (!(gFirst === 0 || gFirst === 90) || !(gLast === 90 || gLast === 180)) {
    throw new LdtError(gLine, `γ angles must run 0–90, 90–180 or 0–180 degrees from straight down; these run ${gFirst}–${gLast}`)
  }
  const [firstPlane, planeCount] = storedPlanes(symmetry, mc)
  const horizontalAngles = symmetry === 1 ? [0] : cAngles.slice(firstPlane, firstPlane + planeCount)
  const expectedLast = [null, 0, 180, 270, 90][symmetry]
  if (expectedLast !== null && horizontalAngles[horizontalAngles.length - 1] !== expectedLast) {
    throw new LdtError(
      symLine,
      `${SYMMETRY_NAMES[symmetry]} stores the planes up to C${expectedLast}, but the C angles put C${horizontalAngles[horizontalAngles.length - 1]} there`,
    )
  }
  // Relative photometry: cd/klm of the lamps' flux; absolute: cd/klm of the luminaire's flux.
  const scale = (lampSets[0].fluxLm / 1000) * conversion
  const candela: number[][] = []
  for (let p = 0; p < planeCount; p++) {
    const row: number[] = []
    for (let g = 0; g < ng; g++) {
      const line = r.line
      const v = r.number(
        `intensity ${g + 1} of ${ng} in plane C${horizontalAngles[p]} (${planeCount} plane${planeCount === 1 ? '' : 's'} stored for ${SYMMETRY_NAMES[symmetry]})`,
      )
      if (v < 0) throw new LdtError(line, `intensities cannot be negative, found ${v}`)
      row.push(v * scale)
    }
    candela.push(row)
  }
  const extra = r.rest.findIndex((l) => l.trim() !== '')
  if (extra >= 0)
    throw new LdtError(
      r.line + extra,
      `values left after the intensity table: Mc ${mc}, Ng ${ng} and ${SYMMETRY_NAMES[symmetry]} give ${planeCount * ng} intensities`,
    )
  const notes: string[] = []
  if (gFirst === 0 && candela.some((row) => Math.abs(row[0] - candela[0][0]) > 1e-6 * (1 + candela[0][0]))) {
    notes.push('The intensity straight down (γ = 0°) differs between C-planes, although every plane meets there; the values are used as stored.')
  }
  const keywords: Record<string, string> = {}
  if (company) keywords.MANUFAC = company
  if (name) keywords.LUMINAIRE = name
  if (number) keywords.LUMCAT = number
  if (report) keywords.TEST = report
  if (dateUser) keywords.ISSUEDATE = dateUser
  const first = lampSets[0]
  return {
    format: 'eulumdat',
    edition: 'EULUMDAT',
    keywords,
    tilt: 'NONE',
    lamps: first.lamps,
    lumensPerLamp: absolute ? -1 : first.fluxLm / first.lamps,
    candelaMultiplier: scale,
    photometricType: 1,
    unitsType: 2,
    width: width / 1000,
    length: length / 1000,
    height: height / 1000,
    ballastFactor: 1,
    inputWatts: first.watts,
    verticalAngles: gAngles,
    horizontalAngles,
    candela,
    absolute,
    typeIndicator,
    symmetry,
    lampSets,
    lightOutputRatio,
    downwardFluxFraction,
    notes,
  }
}

/** Parse the text of an EULUMDAT file. Never throws; errors name the line. */
export function parseEulumdat(text: string): EulumdatResult {
  try {
    return { ok: true, value: parseOrThrow(text) }
  } catch (e) {
    if (e instanceof LdtError) return { ok: false, error: { line: e.line, message: e.message } }
    throw e
  }
}

/**
 * True when the text reads as EULUMDAT rather than LM-63: no LM-63 first line or TILT= line,
 * and lines 2 and 3 hold a single-digit type and symmetry indicator.
 */
export function looksLikeEulumdat(text: string): boolean {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/, 4)
  if (lines.length < 3) return false
  if (/^\s*IES(NA)?[:\d]/i.test(lines[0]) || /^\s*TILT\s*=/im.test(text)) return false
  return /^\s*[0-3]\s*$/.test(lines[1]) && /^\s*[0-4]\s*$/.test(lines[2])
}
