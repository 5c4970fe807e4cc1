/**
 * Rounding to significant digits for the numbers in sentences. Gives the same double as
 * `Number(x.toPrecision(digits))` (tests check this on a million values) without building and
 * parsing a string in the usual case, which matters when 60,000 packs are sized in one go.
 */
const POWERS_OF_TEN = Array.from({ length: 23 }, (_, i) => 10 ** i) // exact doubles up to 1e22

export function roundToSignificant(x: number, digits = 3): number {
  if (x === 0 || !Number.isFinite(x)) return x
  const places = digits - 1 - Math.floor(Math.log10(Math.abs(x)))
  if (places >= 0 && places < POWERS_OF_TEN.length) {
    const scale = POWERS_OF_TEN[places]
    const scaled = x * scale
    const whole = Math.round(scaled)
    // Away from a half the product's rounding error cannot change the digit; at a half, ask the exact path.
    // whole / scale is the double nearest to the decimal, as parsing the decimal string would give.
    if (Math.abs(Math.abs(scaled - whole) - 0.5) > 1e-6) return whole / scale
  }
  return Number(x.toPrecision(digits))
}

/** The same rounding written out for a sentence: 0.1234 → "0.123", 1200 → "1200". */
export function significantText(x: number, digits = 3): string {
  return String(roundToSignificant(x, digits))
}
