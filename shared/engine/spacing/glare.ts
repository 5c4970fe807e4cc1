/** Glare: EN 1838:2013 Table 1 (from memory), intensity limits in the 60°–90° zone for level routes. */
import { intensityAt, type IntensityTable } from '../lm63'

const GLARE_LIMITS: Array<[number, number, number]> = [
  // [height below which it applies, escape route / open area cd, high-risk cd]
  [2.5, 500, 1000],
  [3.0, 900, 1800],
  [3.5, 1600, 3200],
  [4.0, 2500, 5000],
  [4.5, 3500, 7000],
  [Infinity, 5000, 10000],
]

export function glareLimitCd(mountingHeightM: number, highRisk: boolean): number {
  const row = GLARE_LIMITS.find(([below]) => mountingHeightM < below) ?? GLARE_LIMITS[GLARE_LIMITS.length - 1]
  return highRisk ? row[2] : row[1]
}

export function peakIntensityBetween(table: IntensityTable, fromGamma: number, toGamma: number): number {
  let peak = 0
  const gammas = new Set([fromGamma, toGamma, ...table.verticalAngles.filter((g) => g > fromGamma && g < toGamma)])
  for (const c of table.horizontalAngles.length ? table.horizontalAngles : [0]) {
    for (const g of gammas) peak = Math.max(peak, intensityAt(table, c, g))
  }
  return peak
}
