/**
 * Point illuminance on the floor: the inverse-square cosine law E = I(C,γ)·cos³γ / h², direct
 * light only, summed over every luminaire that contributes.
 */
import { intensityAt, type IntensityTable } from '../lm63'

export const DEG = 180 / Math.PI

/** Horizontal illuminance (lx) from intensity I (cd) at height h (m), horizontal distance r (m): I·cos³γ/h². */
export function horizontalIlluminance(intensityCd: number, mountingHeightM: number, horizontalDistanceM: number): number {
  const h = mountingHeightM
  const d2 = h * h + horizontalDistanceM * horizontalDistanceM
  // cos γ = h/d, so I·cos³γ/h² = I·h/d³.
  return (intensityCd * h) / (d2 * Math.sqrt(d2))
}

export interface PlacedLuminaire {
  x: number
  y: number
  /** Height above the floor (the reference plane), m. */
  height: number
  /** Azimuth of the luminaire's C0 plane, degrees counter-clockwise from +x. */
  rotation?: number
}

/** Floor illuminance (lx) at (x, y) from several luminaires, each looked up in the table towards the point. */
export function illuminanceAtPoint(table: IntensityTable, luminaires: PlacedLuminaire[], x: number, y: number, factor = 1): number {
  let total = 0
  for (const l of luminaires) {
    const dx = x - l.x
    const dy = y - l.y
    const r = Math.hypot(dx, dy)
    const gamma = Math.atan2(r, l.height) * DEG
    const c = Math.atan2(dy, dx) * DEG - (l.rotation ?? 0)
    total += horizontalIlluminance(intensityAt(table, c, gamma), l.height, r)
  }
  return total * factor
}
