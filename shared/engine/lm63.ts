/**
 * IES LM-63 photometric data files (editions 1986, 1991, 1995, 2002, 2019): a parser and
 * an intensity look-up with bilinear interpolation. Only type C photometry is read; types
 * A and B are refused with a message rather than read into numbers that would be wrong.
 */

export type Lm63Edition = '1986' | '1991' | '1995' | '2002' | '2019'

export interface Photometry {
  /** The LM-63 edition, or 'EULUMDAT' for a file read by the EULUMDAT parser into this shape. */
  edition: Lm63Edition | 'EULUMDAT'
  /** Keyword lines ("[LUMINAIRE] ..."), keyed without brackets; [MORE] lines are joined with a newline. */
  keywords: Record<string, string>
  /** 'NONE', 'INCLUDE', or the file name given after TILT=. */
  tilt: string
  lamps: number
  /** −1 means absolute photometry (the candela values are the luminaire's own). */
  lumensPerLamp: number
  candelaMultiplier: number
  /** 1 = type C, 2 = type B, 3 = type A. Only 1 is returned. */
  photometricType: 1 | 2 | 3
  /** 1 = feet, 2 = metres. */
  unitsType: 1 | 2
  width: number
  length: number
  height: number
  ballastFactor: number
  inputWatts: number
  /** γ angles, degrees from straight down, ascending. */
  verticalAngles: number[]
  /** C angles, degrees, ascending. */
  horizontalAngles: number[]
  /**
   * Candela, one row per horizontal angle, one value per vertical angle, with the candela
   * multiplier applied. Ballast factor is NOT applied: the emergency output factor used by
   * the spacing tool takes its place for emergency operation.
   */
  candela: number[][]
  absolute: boolean
}

export interface Lm63Error {
  /** 1-based line of the file the problem was found on. */
  line: number
  message: string
}

export type Lm63Result = { ok: true; value: Photometry } | { ok: false; error: Lm63Error }

const EDITION_LINES: Array<[RegExp, Lm63Edition]> = [
  [/^IESNA91\b/i, '1991'],
  [/^IESNA:LM-63-1995\b/i, '1995'],
  [/^IESNA:LM-63-2002\b/i, '2002'],
  [/^IES:LM-63-2019\b/i, '2019'],
]

interface Token {
  text: string
  line: number
}

class Lm63ParseError extends Error {
  constructor(
    readonly line: number,
    message: string,
  ) {
    super(message)
  }
}

/** Reads numbers one at a time from the tokens after the TILT line, naming each one in errors. */
class NumberReader {
  private pos = 0
  constructor(
    private readonly tokens: Token[],
    private readonly lastLine: number,
  ) {}

  next(what: string): number {
    const token = this.tokens[this.pos]
    if (!token) {
      throw new Lm63ParseError(this.lastLine, `file ends early: expected ${what}, found the end of the file`)
    }
    this.pos++
    const value = Number(token.text)
    if (token.text === '' || !Number.isFinite(value)) {
      throw new Lm63ParseError(token.line, `expected a number (${what}) but found "${token.text}"`)
    }
    return value
  }

  /** Line of the value that would be read next (or the last line at the end). */
  get line(): number {
    return this.tokens[this.pos]?.line ?? this.lastLine
  }

  get remaining(): Token[] {
    return this.tokens.slice(this.pos)
  }
}

function wholeNumber(reader: NumberReader, what: string, min: number): number {
  const line = reader.line
  const value = reader.next(what)
  if (!Number.isInteger(value) || value < min) {
    throw new Lm63ParseError(line, `${what} must be a whole number of at least ${min}, found ${value}`)
  }
  return value
}

function ascendingAngles(reader: NumberReader, count: number, what: string): number[] {
  const angles: number[] = []
  for (let k = 0; k < count; k++) {
    const line = reader.line
    const angle = reader.next(`${what} ${k + 1} of ${count}`)
    if (k > 0 && !(angle > angles[k - 1])) {
      throw new Lm63ParseError(line, `${what}s must be in ascending order: ${angle} follows ${angles[k - 1]}`)
    }
    angles.push(angle)
  }
  return angles
}

/** Parse the text of an LM-63 file. Never throws; errors name the line. */
export function parseLm63(text: string): Lm63Result {
  try {
    return { ok: true, value: parseOrThrow(text) }
  } catch (e) {
    if (e instanceof Lm63ParseError) return { ok: false, error: { line: e.line, message: e.message } }
    throw e
  }
}

function parseOrThrow(text: string): Photometry {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/)
  while (lines.length > 0 && lines[lines.length - 1].trim() === '') lines.pop()
  if (lines.length === 0) throw new Lm63ParseError(1, 'the file is empty')

  let edition: Lm63Edition = '1986'
  let index = 0
  const first = lines[0].trim()
  const match = EDITION_LINES.find(([pattern]) => pattern.test(first))
  if (match) {
    edition = match[1]
    index = 1
  }

  // Keyword lines (or, in 1986 files, free text) up to the TILT line.
  const keywords: Record<string, string> = {}
  let lastKeyword: string | null = null
  let tilt: string | null = null
  for (; index < lines.length; index++) {
    const line = lines[index].trim()
    const tiltMatch = /^TILT\s*=\s*(.*)$/i.exec(line)
    if (tiltMatch) {
      const value = tiltMatch[1].trim()
      if (value === '') throw new Lm63ParseError(index + 1, 'TILT= needs NONE, INCLUDE or a file name')
      tilt = /^NONE$/i.test(value) ? 'NONE' : /^INCLUDE$/i.test(value) ? 'INCLUDE' : value
      index++
      break
    }
    if (edition === '1986') continue
    const keywordMatch = /^\[([^\]]+)\]\s*(.*)$/.exec(line)
    if (keywordMatch) {
      const key = keywordMatch[1].trim().toUpperCase()
      const value = keywordMatch[2].trim()
      if (key === 'MORE' && lastKeyword !== null) {
        keywords[lastKeyword] += `\n${value}`
      } else {
        keywords[key] = key in keywords ? `${keywords[key]}\n${value}` : value
        lastKeyword = key
      }
    } else if (line !== '' && lastKeyword !== null) {
      // Some files wrap a long keyword value onto an unbracketed line: keep it with the keyword.
      keywords[lastKeyword] += `\n${line}`
    }
  }
  if (tilt === null) {
    throw new Lm63ParseError(lines.length, 'no TILT= line found; every LM-63 file has one before the numeric data')
  }

  const tokens: Token[] = []
  for (let k = index; k < lines.length; k++) {
    for (const part of lines[k].split(/[\s,]+/)) if (part !== '') tokens.push({ text: part, line: k + 1 })
  }
  const reader = new NumberReader(tokens, lines.length)

  if (tilt === 'INCLUDE') {
    // Lamp-to-luminaire geometry, pair count, tilt angles, multiplying factors: read and set aside.
    const geometryLine = reader.line
    const geometry = reader.next('tilt lamp-to-luminaire geometry')
    if (![1, 2, 3].includes(geometry)) {
      throw new Lm63ParseError(geometryLine, `tilt lamp-to-luminaire geometry must be 1, 2 or 3, found ${geometry}`)
    }
    const pairs = wholeNumber(reader, 'number of tilt angle/factor pairs', 1)
    ascendingAngles(reader, pairs, 'tilt angle')
    for (let k = 0; k < pairs; k++) reader.next(`tilt multiplying factor ${k + 1} of ${pairs}`)
  }

  const lamps = wholeNumber(reader, 'number of lamps', 1)
  const lumensLine = reader.line
  const lumensPerLamp = reader.next('lumens per lamp')
  if (!(lumensPerLamp === -1 || lumensPerLamp > 0)) {
    throw new Lm63ParseError(lumensLine, `lumens per lamp must be positive, or −1 for absolute photometry; found ${lumensPerLamp}`)
  }
  const multiplierLine = reader.line
  const candelaMultiplier = reader.next('candela multiplier')
  if (!(candelaMultiplier > 0)) {
    throw new Lm63ParseError(multiplierLine, `candela multiplier must be greater than zero, found ${candelaMultiplier}`)
  }
  const verticalCount = wholeNumber(reader, 'number of vertical angles', 1)
  const horizontalCount = wholeNumber(reader, 'number of horizontal angles', 1)
  const typeLine = reader.line
  const photometricType = reader.next('photometric type')
  if (photometricType === 2 || photometricType === 3) {
    const letter = photometricType === 2 ? 'B' : 'A'
    throw new Lm63ParseError(
      typeLine,
      `photometric type ${letter} is not supported yet; only type C (photometric type 1, usual for emergency luminaires) can be read`,
    )
  }
  if (photometricType !== 1) {
    throw new Lm63ParseError(typeLine, `photometric type must be 1 (C), 2 (B) or 3 (A), found ${photometricType}`)
  }
  const unitsLine = reader.line
  const unitsType = reader.next('units type')
  if (unitsType !== 1 && unitsType !== 2) {
    throw new Lm63ParseError(unitsLine, `units type must be 1 (feet) or 2 (metres), found ${unitsType}`)
  }
  const width = reader.next('width of the luminous opening')
  const length = reader.next('length of the luminous opening')
  const height = reader.next('height of the luminous opening')
  const ballastFactor = reader.next('ballast factor')
  reader.next('second value of the ballast line (ballast-lamp factor, future use or file generation type by edition)')
  const inputWatts = reader.next('input watts')

  const verticalLine = reader.line
  const verticalAngles = ascendingAngles(reader, verticalCount, 'vertical angle')
  const vFirst = verticalAngles[0]
  const vLast = verticalAngles[verticalCount - 1]
  if (!(vFirst === 0 || vFirst === 90) || !(vLast === 90 || vLast === 180) || vLast < vFirst) {
    throw new Lm63ParseError(verticalLine, `type C vertical angles must run 0–90, 90–180 or 0–180 degrees; these run ${vFirst}–${vLast}`)
  }

  const horizontalLine = reader.line
  const horizontalAngles = ascendingAngles(reader, horizontalCount, 'horizontal angle')
  const hFirst = horizontalAngles[0]
  const hLast = horizontalAngles[horizontalCount - 1]
  const validRange = (hFirst === 0 && (hLast === 0 || hLast === 90 || hLast === 180 || (hLast > 180 && hLast <= 360))) || (hFirst === 90 && hLast === 270)
  if (!validRange) {
    throw new Lm63ParseError(
      horizontalLine,
      `type C horizontal angles must start at 0 and end at 0 (axial symmetry), 90 (quadrant), 180 (bilateral) or above 180 up to 360 (no symmetry), or run 90–270; these run ${hFirst}–${hLast}`,
    )
  }

  const candela: number[][] = []
  for (let h = 0; h < horizontalCount; h++) {
    const row: number[] = []
    for (let v = 0; v < verticalCount; v++) {
      const line = reader.line
      const value = reader.next(
        `candela value ${v + 1} of ${verticalCount} for horizontal angle ${horizontalAngles[h]}° (the counts are ${verticalCount} × ${horizontalCount})`,
      )
      if (value < 0) throw new Lm63ParseError(line, `candela values cannot be negative, found ${value}`)
      row.push(value * candelaMultiplier)
    }
    candela.push(row)
  }
  const extra = reader.remaining
  if (extra.length > 0) {
    throw new Lm63ParseError(
      extra[0].line,
      `${extra.length} value(s) left after the candela table: the counts say ${verticalCount} vertical × ${horizontalCount} horizontal angles`,
    )
  }

  return {
    edition,
    keywords,
    tilt,
    lamps,
    lumensPerLamp,
    candelaMultiplier,
    photometricType: 1,
    unitsType,
    width,
    length,
    height,
    ballastFactor,
    inputWatts,
    verticalAngles,
    horizontalAngles,
    candela,
    absolute: lumensPerLamp === -1,
  }
}

/** The intensity table the look-up needs: the parsed file or a hand-entered table. */
export interface IntensityTable {
  verticalAngles: number[]
  horizontalAngles: number[]
  candela: number[][]
}

/** Index i with angles[i] ≤ x < angles[i+1] (angles ascending, x within range). */
function bracket(angles: number[], x: number): number {
  let lo = 0
  let hi = angles.length - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (angles[mid] <= x) lo = mid
    else hi = mid
  }
  return lo
}

/** Linear interpolation of one row in γ; zero outside the measured vertical range. */
function rowAt(table: IntensityTable, row: number, gamma: number): number {
  const va = table.verticalAngles
  const values = table.candela[row]
  const last = va.length - 1
  if (gamma < va[0] || gamma > va[last]) return 0
  if (last === 0) return values[0]
  const k = Math.min(bracket(va, gamma), last - 1)
  const f = (gamma - va[k]) / (va[k + 1] - va[k])
  return values[k] + f * (values[k + 1] - values[k])
}

/**
 * Fold a C angle into the stored range using the symmetry the last horizontal angle states:
 * 0 axial, 90 quadrant, 180 bilateral about C0–C180, 90–270 bilateral about C90–C270, 360 none.
 */
function foldC(horizontal: number[], c: number): number {
  const first = horizontal[0]
  const last = horizontal[horizontal.length - 1]
  let a = ((c % 360) + 360) % 360
  if (last === 0) return 0
  if (first === 90 && last === 270) {
    if (a < 90) a = 180 - a
    else if (a > 270) a = 540 - a
    return a
  }
  if (last === 90) {
    a = a % 180
    return a > 90 ? 180 - a : a
  }
  if (last === 180) return a > 180 ? 360 - a : a
  return a
}

/**
 * Luminous intensity (cd) towards C (degrees, counter-clockwise seen from above) and γ
 * (degrees from straight down), interpolated bilinearly in the table.
 */
export function intensityAt(table: IntensityTable, cDeg: number, gammaDeg: number): number {
  let c = cDeg
  let gamma = Math.abs(gammaDeg)
  // A negative γ points the same way as +γ in the opposite C plane.
  if (gammaDeg < 0) c += 180
  if (gamma > 180) gamma = 360 - gamma
  const ha = table.horizontalAngles
  const a = foldC(ha, c)
  const last = ha.length - 1
  if (last === 0) return rowAt(table, 0, gamma)
  if (a >= ha[last]) {
    // Beyond the last stored plane of a full (unsymmetric) table: wrap round to C = 360 ≡ first plane.
    if (ha[last] >= 360 || a === ha[last]) return rowAt(table, last, gamma)
    const f = (a - ha[last]) / (360 - ha[last])
    const lo = rowAt(table, last, gamma)
    return lo + f * (rowAt(table, 0, gamma) - lo)
  }
  if (a <= ha[0]) return rowAt(table, 0, gamma)
  const k = bracket(ha, a)
  const f = (a - ha[k]) / (ha[k + 1] - ha[k])
  const lo = rowAt(table, k, gamma)
  return lo + f * (rowAt(table, k + 1, gamma) - lo)
}

/**
 * Checks a hand-entered intensity table against the same rules as a type C file: ascending
 * angles, the allowed ranges, one row per horizontal angle with one value per vertical angle.
 * Returns the first problem with its path inside the table, or null.
 */
export function checkIntensityTable(table: IntensityTable): { path: Array<string | number>; message: string } | null {
  const { verticalAngles: va, horizontalAngles: ha, candela } = table
  for (const [name, angles] of [
    ['verticalAngles', va],
    ['horizontalAngles', ha],
  ] as const) {
    for (let k = 1; k < angles.length; k++) {
      if (!(angles[k] > angles[k - 1])) return { path: [name, k], message: `angles must be in ascending order: ${angles[k]} follows ${angles[k - 1]}` }
    }
  }
  const vFirst = va[0]
  const vLast = va[va.length - 1]
  if (!(vFirst === 0 || vFirst === 90) || !(vLast === 90 || vLast === 180)) {
    return { path: ['verticalAngles'], message: `must run 0–90, 90–180 or 0–180 degrees from straight down; these run ${vFirst}–${vLast}` }
  }
  const hFirst = ha[0]
  const hLast = ha[ha.length - 1]
  const validRange = (hFirst === 0 && (hLast === 0 || hLast === 90 || hLast === 180 || (hLast > 180 && hLast <= 360))) || (hFirst === 90 && hLast === 270)
  if (!validRange) {
    return { path: ['horizontalAngles'], message: `must start at 0 and end at 0, 90, 180 or above 180 up to 360 (or run 90–270); these run ${hFirst}–${hLast}` }
  }
  if (candela.length !== ha.length) {
    return { path: ['candela'], message: `needs one row per horizontal angle: ${ha.length} angles but ${candela.length} rows` }
  }
  for (let r = 0; r < candela.length; r++) {
    if (candela[r].length !== va.length) {
      return { path: ['candela', r], message: `needs one value per vertical angle: ${va.length} angles but ${candela[r].length} values` }
    }
  }
  return null
}
