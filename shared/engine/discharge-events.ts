/**
 * The decisions inside a discharge log: when the pack reached its cut-off, when the load went off,
 * and whether the log shows the load was on at all. Each rule is one function over typed arrays
 * (linear passes, no sorting of the whole log) and its thresholds are named here; docs/method.md
 * gives each rule with its source.
 */
import type { CutoffGlitch, ListedIssues } from './discharge-types'

/** Time the voltage must stay below the cut-off before the cut-off counts (common practice: a debounce, not one reading). */
export const CUTOFF_HOLD_S = 30
/** Load counts as on above this share of the typical current, and as off below DROPOUT_SHARE. */
export const LOAD_ON_SHARE = 0.5
export const DROPOUT_SHARE = 0.02
/** Smallest rise per cell that reads as the load going off (recovery without load), volts. */
export const RECOVERY_PER_CELL_V = 0.01
/** A rise or fall must also exceed this many standard deviations of the log's noise. */
export const NOISE_FACTOR = 4
/** Rises that fall back within this time of the start are the pack settling under load, not a drop-out (seconds). */
export const SETTLE_S = 600
/** Without current, the voltage must fall by this share of the nominal pack voltage to show the load was on. */
export const EVIDENCE_SHARE = 0.01
/** Noise per cell above which a voltage-only log cannot show a drop-out, volts. */
export const TOO_NOISY_PER_CELL_V = 0.025
export const LISTED = 50

/** k-th smallest of a (modified in place), Hoare's selection. */
export function quickselect(a: Float64Array, k: number): number {
  let lo = 0
  let hi = a.length - 1
  while (lo < hi) {
    const pivot = a[(lo + hi) >> 1]
    let i = lo
    let j = hi
    while (i <= j) {
      while (a[i] < pivot) i++
      while (a[j] > pivot) j--
      if (i <= j) {
        const tmp = a[i]
        a[i] = a[j]
        a[j] = tmp
        i++
        j--
      }
    }
    if (k <= j) hi = j
    else if (k >= i) lo = i
    else return a[k]
  }
  return a[k]
}

/** The q-quantile (0..1, nearest rank) of the first n values; 0 when there are none. */
export function quantile(values: Float64Array, q: number, n = values.length): number {
  if (n === 0) return 0
  return quickselect(values.slice(0, n), Math.min(n - 1, Math.floor(q * n)))
}

/** Linear interpolation of y at time x between samples k−1 and k. */
export function lerpAt(t: Float64Array, y: Float64Array, k: number, x: number): number {
  const span = t[k] - t[k - 1]
  return span > 0 ? y[k - 1] + ((x - t[k - 1]) / span) * (y[k] - y[k - 1]) : y[k]
}

/** Time at which y passes level between samples k−1 and k. */
export function crossingTime(t: Float64Array, y: Float64Array, k: number, level: number): number {
  const dy = y[k] - y[k - 1]
  return dy !== 0 ? t[k - 1] + ((level - y[k - 1]) / dy) * (t[k] - t[k - 1]) : t[k]
}

/** y interpolated at time x (x inside the log). */
export function valueAt(t: Float64Array, y: Float64Array, m: number, x: number): number {
  if (x <= t[0]) return y[0]
  if (x >= t[m - 1]) return y[m - 1]
  let lo = 0
  let hi = m - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (t[mid] <= x) lo = mid
    else hi = mid
  }
  return lerpAt(t, y, hi, x)
}

/** Running median over 5 samples (fewer at the ends): single-sample spikes vanish, steps stay sharp. */
export function runningMedian5(v: Float64Array, m: number): Float64Array {
  const out = new Float64Array(m)
  const w = new Float64Array(5)
  for (let k = 0; k < m; k++) {
    const from = Math.max(0, k - 2)
    const to = Math.min(m - 1, k + 2)
    const n = to - from + 1
    for (let j = 0; j < n; j++) w[j] = v[from + j]
    // Insertion sort of at most five values.
    for (let a = 1; a < n; a++) {
      const x = w[a]
      let b = a - 1
      while (b >= 0 && w[b] > x) {
        w[b + 1] = w[b]
        b--
      }
      w[b + 1] = x
    }
    out[k] = n % 2 ? w[n >> 1] : (w[n / 2 - 1] + w[n / 2]) / 2
  }
  return out
}

/** Robust standard deviation of the voltage about its running median: 1.4826 × median absolute deviation. */
export function voltageNoise(v: Float64Array, smooth: Float64Array, m: number): number {
  // An even subsample of at most 100 000 deviations estimates the median as well as all of them.
  const stride = Math.max(1, Math.ceil(m / 100_000))
  const dev = new Float64Array(Math.ceil(m / stride))
  let n = 0
  for (let k = 0; k < m; k += stride) dev[n++] = Math.abs(v[k] - smooth[k])
  return 1.4826 * quantile(dev, 0.5, n)
}

export interface LoadOff {
  /** Seconds (absolute, like t) when the load went off for good; null when it never did. */
  dropout: number | null
  /** Sample index at or just before the drop-out. */
  dropoutIndex: number
  /** Seconds when the load first went off and came back; null when it never did. */
  interruption: number | null
}

/**
 * With a current log: the load is off when the current falls below DROPOUT_SHARE of its typical value
 * (after having been on). Off to the end of the log is a drop-out; off and back on (above LOAD_ON_SHARE)
 * is an interruption. Both are timed at the last sample that still showed the load on (at least
 * LOAD_ON_SHARE of typical): the log cannot show when, between two samples, the load went off.
 */
export function currentDropout(t: Float64Array, cur: Float64Array, m: number, typical: number): LoadOff {
  const onLevel = LOAD_ON_SHARE * typical
  const offLevel = DROPOUT_SHARE * typical
  let loadSeen = cur[0] >= onLevel
  let interruption: number | null = null
  for (let k = 1; k < m; k++) {
    if (cur[k] >= onLevel) loadSeen = true
    if (!loadSeen || cur[k] >= offLevel || cur[k - 1] < offLevel) continue
    let lastOn = k - 1
    while (lastOn > 0 && cur[lastOn] < onLevel) lastOn--
    const offAt = t[lastOn]
    let back = -1
    for (let j = k + 1; j < m; j++) {
      if (cur[j] >= onLevel) {
        back = j
        break
      }
    }
    if (back < 0) return { dropout: offAt, dropoutIndex: lastOn, interruption }
    if (interruption === null) interruption = offAt
    k = back
  }
  return { dropout: null, dropoutIndex: -1, interruption }
}

/**
 * Without a current log: the load went off where the (5-sample median) voltage rises at least `rise`
 * above its lowest value so far and never falls back below half that rise for the rest of the log
 * (the pack recovering without load). A rise that falls back again is the pack settling in the first
 * SETTLE_S, or later an interruption (the load went off and came back). The drop-out time is the lowest
 * raw sample before the rise.
 */
export function voltageDropout(t: Float64Array, v: Float64Array, smooth: Float64Array, m: number, rise: number): LoadOff {
  const suffixMin = new Float64Array(m)
  suffixMin[m - 1] = smooth[m - 1]
  for (let k = m - 2; k >= 0; k--) suffixMin[k] = Math.min(smooth[k], suffixMin[k + 1])
  let runMin = smooth[0]
  let argMin = 0
  let interruption: number | null = null
  for (let k = 1; k < m; k++) {
    if (smooth[k] < runMin) {
      runMin = smooth[k]
      argMin = k
      continue
    }
    if (smooth[k] - runMin < rise) continue
    if (suffixMin[k] >= runMin + rise / 2) {
      let low = Math.max(0, argMin - 2)
      for (let j = low + 1; j < k; j++) if (v[j] < v[low]) low = j
      return { dropout: t[low], dropoutIndex: low, interruption }
    }
    if (t[k] - t[0] >= SETTLE_S && interruption === null) interruption = t[argMin]
    runMin = smooth[k]
    argMin = k
  }
  return { dropout: null, dropoutIndex: -1, interruption }
}

export interface CutoffFound {
  /** Seconds when the voltage fell through the cut-off for good (held, or ended by a drop-out); null when never. */
  time: number | null
  rule: 'held' | 'then-dropout' | null
  glitches: ListedIssues<CutoffGlitch>
}

/**
 * The cut-off counts where the voltage falls through it and stays below for CUTOFF_HOLD_S (or to the end
 * of the log), or where the load goes off before the dip ends plus the hold time (the luminaire's own
 * protection). A shorter dip with the load still on is noise: listed and skipped. Only dips starting
 * before `until` (the drop-out, when there is one) are considered.
 */
export function findCutoff(t: Float64Array, v: Float64Array, m: number, cutoffV: number, until: number | null): CutoffFound {
  const glitches: ListedIssues<CutoffGlitch> = { count: 0, items: [] }
  const last = until ?? Number.POSITIVE_INFINITY
  for (let k = 0; k < m; k++) {
    if (!(v[k] < cutoffV)) continue
    const down = k === 0 ? t[0] : crossingTime(t, v, k, cutoffV)
    if (down > last) break
    let j = k
    while (j + 1 < m && v[j + 1] < cutoffV) j++
    if (j === m - 1) return { time: down, rule: 'held', glitches }
    const up = crossingTime(t, v, j + 1, cutoffV)
    if (up - down >= CUTOFF_HOLD_S) return { time: down, rule: 'held', glitches }
    if (until !== null && until <= up + CUTOFF_HOLD_S) return { time: down, rule: 'then-dropout', glitches }
    glitches.count++
    if (glitches.items.length < LISTED) glitches.items.push({ index: k, fromS: down - t[0], seconds: up - down })
    k = j
  }
  return { time: null, rule: null, glitches }
}

/**
 * Without a current log, the last moment the voltage shows the load on: a discharging pack keeps
 * reaching new lows, an unloaded one does not. The time of the last new low of the running median,
 * moved to the lowest raw sample beside it (the median lags a step by up to two samples).
 */
export function lastNewLow(t: Float64Array, v: Float64Array, smooth: Float64Array, m: number): number {
  let runMin = smooth[0]
  let at = 0
  for (let k = 1; k < m; k++) {
    if (smooth[k] < runMin) {
      runMin = smooth[k]
      at = k
    }
  }
  let low = Math.max(0, at - 2)
  for (let j = low + 1; j <= Math.min(m - 1, at + 2); j++) if (v[j] <= v[low]) low = j
  return t[low]
}

/**
 * Without a current log, did the voltage fall enough to show a load at all? It must fall from its
 * highest value in the first SETTLE_S by at least `needed` volts by `untilT`.
 */
export function voltageFell(t: Float64Array, smooth: Float64Array, m: number, untilT: number, needed: number): boolean {
  let start = smooth[0]
  for (let k = 1; k < m && t[k] - t[0] <= SETTLE_S && t[k] <= untilT; k++) start = Math.max(start, smooth[k])
  return start - valueAt(t, smooth, m, untilT) >= needed
}
