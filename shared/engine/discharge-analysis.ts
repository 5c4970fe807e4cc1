/**
 * Analysis of a logged full-duration discharge test: when the pack fell through its cut-off,
 * when the load dropped out, what it delivered, and whether it met the rated duration.
 * The core works on typed arrays in a few linear passes, so a million samples stay cheap.
 */
import { cutoffCellVoltageAtRate, deepDischargeLimitCellV } from './battery-models'
import { getChemistry } from './chemistries'
import {
  EVIDENCE_SHARE,
  LISTED,
  NOISE_FACTOR,
  RECOVERY_PER_CELL_V,
  TOO_NOISY_PER_CELL_V,
  crossingTime,
  currentDropout,
  findCutoff,
  lerpAt,
  quantile,
  runningMedian5,
  valueAt,
  voltageDropout,
  voltageNoise,
  voltageFell,
  lastNewLow,
  type LoadOff,
} from './discharge-events'
import { dischargeReport } from './discharge-report'
import type { DischargeArrays, DischargeOptions, DischargeResult, EndRule, LoadEvidence, RuntimeEnd, SampleIssues } from './discharge-types'
import type { ToolOutcome } from './tool'
import type { FieldError } from './types'

/** A gap is an interval longer than this many median intervals. */
export const GAP_FACTOR = 5

function checkInput(samples: DischargeArrays, options: DischargeOptions): FieldError[] {
  const { t, v, i } = samples
  const fields: FieldError[] = []
  const n = t.length
  if (n === 0) fields.push({ path: 'samples', message: 'needs at least two samples; the log is empty' })
  if (v.length !== n) fields.push({ path: 'samples.v', message: `has ${v.length} values but samples.t has ${n}` })
  if (i && i.length !== n) fields.push({ path: 'samples.i', message: `has ${i.length} values but samples.t has ${n}` })
  if (!(Number.isInteger(options.cellsInSeries) && options.cellsInSeries >= 1))
    fields.push({ path: 'cellsInSeries', message: 'must be a whole number of at least 1' })
  if (!(options.ratedDuration > 0 && Number.isFinite(options.ratedDuration))) fields.push({ path: 'ratedDuration', message: 'must be greater than zero' })
  if (fields.length) return fields
  for (let k = 0; k < n; k++) {
    if (!Number.isFinite(t[k])) return [{ path: `samples[${k}].t`, message: 'must be a finite number' }]
    if (!Number.isFinite(v[k])) return [{ path: `samples[${k}].v`, message: 'must be a finite number' }]
    if (i && !Number.isFinite(i[k])) return [{ path: `samples[${k}].i`, message: 'must be a finite number' }]
  }
  return fields
}

/** Keep samples whose time moves forward; list the rest and the gaps. */
function cleanSamples(samples: DischargeArrays) {
  const { t: rawT, v: rawV, i: rawI } = samples
  const n = rawT.length
  const t = new Float64Array(n)
  const v = new Float64Array(n)
  const cur = rawI ? new Float64Array(n) : null
  const index = new Uint32Array(n)
  const issues: SampleIssues = { gaps: { count: 0, items: [] }, duplicates: { count: 0, items: [] }, outOfOrder: { count: 0, items: [] } }
  let m = 0
  for (let k = 0; k < n; k++) {
    const tk = rawT[k]
    if (m > 0 && tk <= t[m - 1]) {
      if (tk === t[m - 1]) {
        issues.duplicates.count++
        if (issues.duplicates.items.length < LISTED) issues.duplicates.items.push({ index: k, t: tk })
      } else {
        issues.outOfOrder.count++
        if (issues.outOfOrder.items.length < LISTED) issues.outOfOrder.items.push({ index: k, t: tk, afterT: t[m - 1] })
      }
      continue
    }
    t[m] = tk
    v[m] = rawV[k]
    if (cur && rawI) cur[m] = rawI[k]
    index[m] = k
    m++
  }
  if (m >= 2) {
    const intervals = new Float64Array(m - 1)
    for (let k = 1; k < m; k++) intervals[k - 1] = t[k] - t[k - 1]
    const medianInterval = quantile(intervals, 0.5)
    for (let k = 1; k < m; k++) {
      if (intervals[k - 1] > GAP_FACTOR * medianInterval) {
        issues.gaps.count++
        if (issues.gaps.items.length < LISTED) issues.gaps.items.push({ index: index[k], fromT: t[k - 1], toT: t[k], seconds: intervals[k - 1] })
      }
    }
  }
  return { t, v, cur, m, issues }
}

/** Analyse a discharge log held in typed arrays. Field errors for unusable input; never NaN. */
export function analyseDischarge(samples: DischargeArrays, options: DischargeOptions): ToolOutcome<DischargeResult> {
  const fields = checkInput(samples, options)
  if (fields.length) return { ok: false, fields }
  const { t, v, cur, m, issues } = cleanSamples(samples)
  if (m < 2) return { ok: false, fields: [{ path: 'samples', message: 'needs at least two samples at different times' }] }

  const chemistry = getChemistry(options.chemistry)
  const cells = options.cellsInSeries
  const nominalV = cells * chemistry.nominalCellVoltage.value
  const t0 = t[0]

  // The load current. The direction that moved more charge is discharge (a log written with discharge
  // negative is turned round); its typical value is the median of the readings above 5 % of the largest,
  // so a load on for only part of the log, or a switch-on spike, does not skew it.
  let typicalCurrent = 0
  let currentSignFlipped = false
  if (cur) {
    let positive = 0
    let negative = 0
    for (let k = 0; k < m; k++) {
      if (cur[k] > 0) positive += cur[k]
      else negative -= cur[k]
    }
    if (negative > positive) {
      currentSignFlipped = true
      for (let k = 0; k < m; k++) cur[k] = -cur[k]
    }
    let largest = 0
    for (let k = 0; k < m; k++) if (cur[k] > largest) largest = cur[k]
    const clear = new Float64Array(m)
    let count = 0
    for (let k = 0; k < m; k++) if (cur[k] > 0.05 * largest) clear[count++] = cur[k]
    typicalCurrent = quantile(clear, 0.5, count)
  }
  const useCurrent = cur !== null && typicalCurrent > 0
  const ratedAh = options.ratedCapacity !== undefined ? options.ratedCapacity / 3600 : null
  const dischargeRateC = useCurrent && ratedAh !== null && ratedAh > 0 ? typicalCurrent / ratedAh : null

  // One rule for the end voltage: the given one, else the makers' final voltage at the test's rate where
  // they tabulate it and the rate is known, else the chemistry's default (the highest, most demanding).
  const tabulated = chemistry.cutoffByDischargeRate !== undefined
  const cutoffPerCell =
    options.cutoffPerCell ?? (tabulated && dischargeRateC !== null ? cutoffCellVoltageAtRate(chemistry, dischargeRateC) : chemistry.cutoffCellVoltage.value)
  const cutoffV = cells * cutoffPerCell
  const safeLimitPerCell = deepDischargeLimitCellV(chemistry, dischargeRateC)

  // Load off: from the current when it is logged, from the voltage alone otherwise.
  // The running median and the noise serve the voltage-only rules; a current log does not need them.
  const smooth = useCurrent ? v : runningMedian5(v, m)
  const noise = useCurrent ? 0 : voltageNoise(v, smooth, m)
  const rise = Math.max(RECOVERY_PER_CELL_V * cells, NOISE_FACTOR * noise)
  const tooNoisy = !useCurrent && NOISE_FACTOR * noise > TOO_NOISY_PER_CELL_V * cells
  const loadOff: LoadOff = useCurrent && cur ? currentDropout(t, cur, m, typicalCurrent) : voltageDropout(t, v, smooth, m, rise)
  const cutoff = findCutoff(t, v, m, cutoffV, loadOff.dropout)

  const thresholds = (options.thresholdsPerCell ?? []).map((perCell) => ({ perCellV: perCell, packV: perCell * cells, time: null as number | null }))
  const lastUseful = loadOff.dropout ?? Number.POSITIVE_INFINITY
  for (let k = 1; k < m && t[k - 1] <= lastUseful; k++) {
    for (const th of thresholds) {
      if (th.time === null && v[k] < th.packV && v[k - 1] >= th.packV) {
        const at = crossingTime(t, v, k, th.packV)
        if (at <= lastUseful) th.time = at
      }
    }
  }

  const cutoffTime = cutoff.time
  const dropoutTime = cutoffTime === null ? loadOff.dropout : null
  const endTime = cutoffTime ?? dropoutTime ?? t[m - 1]
  const runtimeEnd: RuntimeEnd = cutoffTime !== null ? 'cutoff' : dropoutTime !== null ? 'dropout' : 'end-of-log'
  const endRule: EndRule =
    cutoff.rule === 'held'
      ? 'cutoff-held'
      : cutoff.rule === 'then-dropout'
        ? 'cutoff-then-dropout'
        : dropoutTime !== null
          ? useCurrent
            ? 'current-dropout'
            : 'voltage-recovery'
          : 'end-of-log'

  // Integrate to the end point (trapezoids, the last one cut at the end time).
  // Compensated (Kahan) sums: a million small trapezoids would otherwise lose digits.
  let ampSeconds = 0
  let ampCarry = 0
  let jouleSum = 0
  let jouleCarry = 0
  const power = options.assumedPower
  const resistance = options.assumedResistance
  // An assumed constant power draws P/v; a collapsed (≤ 0 V) sample contributes nothing rather than infinity.
  const fromPower = (volts: number) => (power !== undefined && volts > 0 ? power / volts : 0)
  const currentAt = (k: number): number =>
    useCurrent && cur ? cur[k] : power !== undefined ? fromPower(v[k]) : resistance !== undefined ? v[k] / resistance : 0
  const canIntegrate = useCurrent || power !== undefined || resistance !== undefined
  if (canIntegrate) {
    for (let k = 1; k < m && t[k - 1] < endTime; k++) {
      const tEnd = Math.min(t[k], endTime)
      const dt = tEnd - t[k - 1]
      const iA = currentAt(k - 1)
      const vA = v[k - 1]
      let iB = currentAt(k)
      let vB = v[k]
      if (tEnd < t[k]) {
        vB = lerpAt(t, v, k, tEnd)
        iB = useCurrent && cur ? lerpAt(t, cur, k, tEnd) : power !== undefined ? fromPower(vB) : vB / (resistance ?? 1)
      }
      const dq = ((iA + iB) * dt) / 2 - ampCarry
      const q = ampSeconds + dq
      ampCarry = q - ampSeconds - dq
      ampSeconds = q
      const de = ((vA * iA + vB * iB) * dt) / 2 - jouleCarry
      const e = jouleSum + de
      jouleCarry = e - jouleSum - de
      jouleSum = e
    }
  }

  const midpointVoltageV = valueAt(t, v, m, t0 + (endTime - t0) / 2)
  const runtimeS = endTime - t0
  const runtimeH = runtimeS / 3600
  const ratedS = options.ratedDuration
  const logEndedEarly = runtimeEnd === 'end-of-log' && runtimeS < ratedS
  const interruptedBeforeRated = loadOff.interruption !== null && loadOff.interruption - t0 < ratedS

  // What shows the load was on through the rated duration.
  // Without current: the load is shown on up to the rated duration when the voltage fell by a clear amount
  // and was still reaching new lows (or stepped up only) at or after the rated duration.
  let loadEvidence: LoadEvidence
  if (useCurrent) loadEvidence = 'current'
  else if (runtimeEnd === 'cutoff') loadEvidence = 'voltage-fall'
  else {
    const untilT = Math.min(endTime, t0 + ratedS)
    const fell = voltageFell(t, smooth, m, untilT, Math.max(EVIDENCE_SHARE * nominalV, NOISE_FACTOR * noise))
    const lastOn = loadOff.dropout ?? lastNewLow(t, v, smooth, m)
    loadEvidence = fell && lastOn - t0 >= Math.min(ratedS, runtimeS) ? 'voltage-fall' : 'none'
  }
  const currentNeverOn = cur !== null && !useCurrent

  let pass: boolean | null
  if (logEndedEarly) pass = null
  else if (runtimeS < ratedS) pass = false
  else if (interruptedBeforeRated || currentNeverOn || loadEvidence === 'none' || tooNoisy) pass = null
  else pass = true

  const deliveredAh = canIntegrate ? ampSeconds / 3600 : null
  const deliveredWh = canIntegrate ? jouleSum / 3600 : null
  const stateOfHealth = deliveredAh !== null && ratedAh !== null && ratedAh > 0 ? deliveredAh / ratedAh : null
  const estimated = canIntegrate && !useCurrent

  const { warnings, working, verdictReason } = dischargeReport({
    chemistry,
    options,
    cells,
    cutoffPerCell,
    cutoffV,
    safeLimitPerCell,
    dischargeRateC,
    t0,
    firstV: v[0],
    runtimeH,
    runtimeEnd,
    endRule,
    pass,
    logEndedEarly,
    interruptedBeforeRated,
    interruptionH: loadOff.interruption === null ? null : (loadOff.interruption - t0) / 3600,
    currentNeverOn,
    currentSignFlipped,
    loadEvidence,
    tooNoisy,
    noiseV: noise,
    riseV: rise,
    glitches: cutoff.glitches,
    useCurrent,
    canIntegrate,
    estimated,
    issues,
    deliveredAh,
    deliveredWh,
    ratedAh,
    stateOfHealth,
  })

  return {
    ok: true,
    result: {
      runtimeH,
      runtimeEnd,
      endRule,
      cutoffTimeH: cutoffTime === null ? null : (cutoffTime - t0) / 3600,
      dropoutTimeH: dropoutTime === null ? null : (dropoutTime - t0) / 3600,
      interruptionTimeH: loadOff.interruption === null ? null : (loadOff.interruption - t0) / 3600,
      cutoffVoltageV: cutoffV,
      cutoffGlitches: cutoff.glitches,
      loadEvidence,
      voltageNoiseV: noise,
      thresholdCrossings: thresholds.map((th) => ({ perCellV: th.perCellV, packV: th.packV, timeH: th.time === null ? null : (th.time - t0) / 3600 })),
      deliveredAh,
      deliveredWh,
      estimated,
      midpointVoltageV,
      pass,
      verdictReason,
      marginH: runtimeH - ratedS / 3600,
      stateOfHealth,
      sampleIssues: issues,
      samplesUsed: m,
      warnings,
      working,
    },
  }
}
