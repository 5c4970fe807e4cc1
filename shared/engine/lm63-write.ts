/**
 * Writing IES LM-63-2019 text from an intensity table, and a simple distribution model for
 * invented demo luminaires. The model is for demonstration data only: real designs use the
 * maker's measured file.
 */
import type { IntensityTable } from './lm63'

export interface Lm63Header {
  /** Keyword lines, written in the order given; a value with newlines becomes [MORE] lines. */
  keywords: Array<[string, string]>
  /** Input watts written on the ballast line. */
  inputWatts: number
  /** Luminous opening in metres: width, length, height. */
  opening?: [number, number, number]
}

const num = (v: number) => String(Number(v.toFixed(4)))

/** An LM-63-2019 file (type C, metres, absolute photometry) holding the table. */
export function formatLm63(table: IntensityTable, header: Lm63Header): string {
  const lines = ['IES:LM-63-2019']
  for (const [key, value] of header.keywords) {
    const [first, ...more] = value.split('\n')
    lines.push(`[${key.toUpperCase()}] ${first}`)
    for (const m of more) lines.push(`[MORE] ${m}`)
  }
  lines.push('TILT=NONE')
  const [w, l, h] = header.opening ?? [0, 0, 0]
  // lamps, lumens per lamp (−1: absolute), multiplier, vertical count, horizontal count, type C, metres, opening
  lines.push(`1 -1 1 ${table.verticalAngles.length} ${table.horizontalAngles.length} 1 2 ${num(w)} ${num(l)} ${num(h)}`)
  lines.push(`1 1 ${num(header.inputWatts)}`)
  lines.push(table.verticalAngles.map(num).join(' '))
  lines.push(table.horizontalAngles.map(num).join(' '))
  for (const row of table.candela) lines.push(row.map(num).join(' '))
  return `${lines.join('\n')}\n`
}

export interface ModelledDistribution {
  /** Intensity straight down, cd. */
  peakCd: number
  /** Spread along C0–C180: I(γ) = I₀·cosⁿγ; a smaller n spreads the light wider. */
  exponentAlong: number
  /** The same across, in the C90–C270 plane (equal to exponentAlong for a round pattern). */
  exponentAcross: number
  /** A side lobe along C0–C180 that pushes light towards the ends of a corridor: extra cd at its peak angle. */
  batwingCd?: number
  batwingAngleDeg?: number
}

/**
 * A smooth invented distribution on a 5° γ grid (0–90°) and a 22.5° C grid (0–90°, quadrant
 * symmetry): the two cosine-power patterns blended by the C angle, plus an optional side lobe.
 */
export function modelledDistribution(m: ModelledDistribution): IntensityTable {
  const verticalAngles = Array.from({ length: 19 }, (_, k) => k * 5)
  const horizontalAngles = [0, 22.5, 45, 67.5, 90]
  const rad = Math.PI / 180
  const candela = horizontalAngles.map((c) => {
    const along = Math.cos(c * rad) ** 2
    return verticalAngles.map((g) => {
      const cos = Math.max(0, Math.cos(g * rad))
      const n = along * m.exponentAlong + (1 - along) * m.exponentAcross
      let value = m.peakCd * cos ** n
      if (m.batwingCd && m.batwingAngleDeg) {
        const spread = 12
        value += along * m.batwingCd * Math.exp(-(((g - m.batwingAngleDeg) / spread) ** 2))
      }
      // The last angle (90°) is kept at zero: nothing leaves a ceiling luminaire sideways.
      return g >= 90 ? 0 : Math.round(value * 10) / 10
    })
  })
  return { verticalAngles, horizontalAngles, candela }
}
