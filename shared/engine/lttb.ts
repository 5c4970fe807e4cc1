/**
 * Largest-Triangle-Three-Buckets downsampling (S. Steinarsson, "Downsampling Time Series for
 * Visual Representation", University of Iceland, 2013): keeps the first and last points and,
 * from each bucket in between, the point that makes the largest triangle with the point kept
 * before it and the average of the next bucket. Peaks and dips survive, so a plot of a
 * million-sample discharge log looks the same with a thousand points.
 */

/** Indexes of the points to keep, ascending; all of them when `threshold` ≥ the number of points. */
export function lttbIndices(x: ArrayLike<number>, y: ArrayLike<number>, threshold: number): Uint32Array {
  const n = x.length
  if (y.length !== n) throw new RangeError(`x has ${n} values but y has ${y.length}`)
  if (!Number.isInteger(threshold) || threshold < 0) throw new RangeError('threshold must be a whole number of points')
  if (threshold >= n) return Uint32Array.from({ length: n }, (_, k) => k)
  if (threshold < 3) throw new RangeError('threshold must be at least 3 points (first, last and one between)')

  const out = new Uint32Array(threshold)
  const every = (n - 2) / (threshold - 2)
  let a = 0
  out[0] = 0
  for (let bucket = 0; bucket < threshold - 2; bucket++) {
    // Average of the next bucket (the last point for the final bucket).
    const nextStart = Math.floor((bucket + 1) * every) + 1
    const nextEnd = Math.min(Math.floor((bucket + 2) * every) + 1, n)
    let avgX = 0
    let avgY = 0
    for (let k = nextStart; k < nextEnd; k++) {
      avgX += x[k]
      avgY += y[k]
    }
    const count = nextEnd - nextStart
    avgX /= count
    avgY /= count

    const from = Math.floor(bucket * every) + 1
    const to = Math.floor((bucket + 1) * every) + 1
    let best = from
    let bestArea = -1
    for (let k = from; k < to; k++) {
      // Twice the triangle's area; the factor does not change which point wins.
      const area = Math.abs((x[a] - avgX) * (y[k] - y[a]) - (x[a] - x[k]) * (avgY - y[a]))
      if (area > bestArea) {
        bestArea = area
        best = k
      }
    }
    out[bucket + 1] = best
    a = best
  }
  out[threshold - 1] = n - 1
  return out
}

/** The kept points themselves. */
export function lttb(x: ArrayLike<number>, y: ArrayLike<number>, threshold: number): { x: Float64Array; y: Float64Array } {
  const keep = lttbIndices(x, y, threshold)
  return { x: Float64Array.from(keep, (k) => x[k]), y: Float64Array.from(keep, (k) => y[k]) }
}
