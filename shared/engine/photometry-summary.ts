/**
 * A photometric file in a few figures for a document: where its intensity peaks and how many lamp
 * lumens it was measured with. Read from the parsed LM-63 table, nothing interpolated.
 */
import type { IntensityTable } from './lm63'

export interface PeakIntensity {
  cd: number
  /** C-plane and angle from straight down (γ) of the highest tabulated value. */
  cDeg: number
  gammaDeg: number
}

/** The highest tabulated intensity; the first one found in file order when several are equal. */
export function peakIntensity(table: IntensityTable): PeakIntensity {
  let best: PeakIntensity = { cd: 0, cDeg: table.horizontalAngles[0] ?? 0, gammaDeg: table.verticalAngles[0] ?? 0 }
  table.candela.forEach((row, h) =>
    row.forEach((cd, v) => {
      if (cd > best.cd) best = { cd, cDeg: table.horizontalAngles[h], gammaDeg: table.verticalAngles[v] }
    }),
  )
  return best
}

/**
 * Lamp lumens the file was measured with: lamps × lumens per lamp (IES LM-63, line 10). Absolute
 * photometry (lumens per lamp −1) has none: its candela values are the luminaire's own.
 */
export function lampLumens(header: { lamps: number; lumensPerLamp: number; absolute: boolean }): number | null {
  if (header.absolute || header.lumensPerLamp < 0) return null
  return header.lamps * header.lumensPerLamp
}
