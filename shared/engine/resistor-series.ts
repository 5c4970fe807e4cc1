/**
 * Preferred resistor values of IEC 60063 (E12 and E24) and picking the nearest one.
 * Values are the significands of one decade; each repeats in every decade (×10ⁿ).
 */

/** IEC 60063:2015, E12 series (±10 % parts). */
export const E12 = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2] as const

/**
 * IEC 60063:2015, E24 series (±5 % parts). Note the historical values 2.7, 3.0, 3.3, 3.6, 3.9,
 * 4.3, 4.7 and 8.2, which differ from the rounded geometric sequence 10^(k/24).
 */
export const E24 = [1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1] as const

export type ESeriesName = 'E12' | 'E24'

export const E_SERIES: Record<ESeriesName, readonly number[]> = { E12, E24 }

/** Power ratings commonly stocked for through-hole and wirewound resistors, watts (common practice). */
export const STANDARD_RESISTOR_RATINGS_W = [0.25, 0.5, 1, 2, 3, 5] as const

/** Round a decade-scaled value so that 4.7 × 10 is exactly 47, not 47.00000000000001. */
function tidy(value: number): number {
  return Number(value.toPrecision(6))
}

/**
 * The preferred value nearest to `ohms`, judged by ratio (log distance), which is how the
 * series is spaced. Ties go to the larger value (the smaller current).
 */
export function nearestPreferred(ohms: number, series: ESeriesName): number {
  if (!(ohms > 0) || !Number.isFinite(ohms)) throw new RangeError('resistance must be a finite number above zero')
  const values = E_SERIES[series]
  const decade = Math.floor(Math.log10(ohms))
  let best = Number.NaN
  let bestDistance = Number.POSITIVE_INFINITY
  // Look one decade either side so values near a decade edge (9.6 → 10) are handled.
  for (let d = decade - 1; d <= decade + 1; d += 1) {
    for (const significand of values) {
      const candidate = tidy(significand * 10 ** d)
      const distance = Math.abs(Math.log(candidate / ohms))
      if (distance < bestDistance - 1e-12 || (Math.abs(distance - bestDistance) <= 1e-12 && candidate > best)) {
        best = candidate
        bestDistance = distance
      }
    }
  }
  return best
}

/** Every preferred value of a series between two bounds (inclusive), ascending. */
export function preferredValuesBetween(lowOhms: number, highOhms: number, series: ESeriesName): number[] {
  const out: number[] = []
  const first = Math.floor(Math.log10(lowOhms))
  const last = Math.floor(Math.log10(highOhms))
  for (let d = first; d <= last; d += 1) {
    for (const significand of E_SERIES[series]) {
      const v = tidy(significand * 10 ** d)
      if (v >= lowOhms && v <= highOhms) out.push(v)
    }
  }
  return out
}

/**
 * The smallest stocked power rating at least `margin` times the dissipation, or null when even
 * the largest listed rating is too small.
 */
export function resistorRatingFor(dissipationW: number, margin = 2): number | null {
  const needed = dissipationW * margin
  for (const rating of STANDARD_RESISTOR_RATINGS_W) if (rating >= needed) return rating
  return null
}
