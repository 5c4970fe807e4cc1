/**
 * Small pieces of the row solver: which symmetries of the intensity table let it evaluate less
 * (mirrored lines, mirrored halves of a luminaire's light along the row), and the golden-section
 * search it refines extremes with.
 */
import type { IntensityTable } from '../lm63'
import type { EvaluationLine } from './criteria'

const GOLDEN = (Math.sqrt(5) - 1) / 2

/** Whether the light is the same either side of the vertical plane along the row. */
export function symmetricAboutRow(table: IntensityTable, cPlane: number): boolean {
  const first = table.horizontalAngles[0]
  const last = table.horizontalAngles[table.horizontalAngles.length - 1]
  const c = ((cPlane % 360) + 360) % 360
  if (last === 0) return true
  if (first === 0 && last === 90) return c % 90 === 0
  if (first === 0 && last === 180) return c % 180 === 0
  if (first === 90 && last === 270) return c % 180 === 90
  return false
}

/**
 * Whether a luminaire lights the point dx along the row as it lights −dx: the table is symmetric
 * about the vertical plane across the row (C = cPlane + 90°).
 */
export function symmetricAcrossRow(table: IntensityTable, cPlane: number): boolean {
  const first = table.horizontalAngles[0]
  const last = table.horizontalAngles[table.horizontalAngles.length - 1]
  const c = ((cPlane % 360) + 360) % 360
  if (last === 0) return true
  if (first === 0 && last === 90) return c % 90 === 0
  if (first === 0 && last === 180) return c % 180 === 90
  if (first === 90 && last === 270) return c % 180 === 0
  return false
}

/** Drops the −y twin of each +y line (same checks), adding its weight to the +y line. */
export function mergeMirroredLines(lines: EvaluationLine[]): EvaluationLine[] {
  const kept: EvaluationLine[] = []
  for (const line of lines) {
    const twin = line.y < 0 ? lines.find((l) => l.y === -line.y && l.minFraction === line.minFraction && l.ratio === line.ratio) : undefined
    if (!twin) kept.push({ ...line })
  }
  for (const line of lines) {
    if (line.y >= 0) continue
    const twin = kept.find((l) => l.y === -line.y)
    if (twin && !kept.includes(line)) twin.weight += line.weight
  }
  return kept.map((l) => (l.y > 0 ? { ...l, label: l.label.replace(' (left)', '') } : l))
}

export function goldenExtreme(f: (x: number) => number, a: number, b: number, sign: 1 | -1, iterations = 18): number {
  // Minimises sign·f on [a, b]; returns f at the best point found.
  let x1 = b - GOLDEN * (b - a)
  let x2 = a + GOLDEN * (b - a)
  let f1 = sign * f(x1)
  let f2 = sign * f(x2)
  for (let k = 0; k < iterations; k++) {
    if (f1 < f2) {
      b = x2
      x2 = x1
      f2 = f1
      x1 = b - GOLDEN * (b - a)
      f1 = sign * f(x1)
    } else {
      a = x1
      x1 = x2
      f1 = f2
      x2 = a + GOLDEN * (b - a)
      f2 = sign * f(x2)
    }
  }
  return sign * Math.min(f1, f2)
}
