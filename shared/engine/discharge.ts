/**
 * Analysis of a logged full-duration discharge test: when the pack fell through its cut-off,
 * when the load dropped out, what it delivered, and whether it met the rated duration.
 * The core works on typed arrays in a few linear passes, so a million samples stay cheap;
 * the `discharge` tool wraps it for JSON input.
 */
import { z } from 'zod'
import { chemistryIdSchema } from './battery-inputs'
import { getChemistry, type ChemistryId } from './chemistries'
import { finiteNumber, quantity } from './fields'
import { defineTool, type ToolOutcome } from './tool'
import { sortWarnings, type EngineWarning, type FieldError, type Reference, type WorkingStep } from './types'

export interface DischargeArrays {
  /** Seconds. */
  t: Float64Array
  /** Pack voltage, volts. */
  v: Float64Array
  /** Load current, amps (discharge positive); omit when not logged. */
  i?: Float64Array
}

export interface DischargeOptions {
  chemistry: ChemistryId
  cellsInSeries: number
  /** Volts per cell; the chemistry's end-of-discharge voltage when omitted. */
  cutoffPerCell?: number
  /** Seconds. */
  ratedDuration: number
  /** Coulombs (A·s). */
  ratedCapacity?: number
  thresholdsPerCell?: number[]
  /** Watts, for estimates when no current is logged. */
  assumedPower?: number
  /** Ohms, for estimates when no current is logged. */
  assumedResistance?: number
}

export interface ListedIssues<T> {
  count: number
  /** The first ones (at most LISTED), with sample indexes into the input and times. */
  items: T[]
}

export interface SampleIssues {
  gaps: ListedIssues<{ index: number; fromT: number; toT: number; seconds: number }>
  duplicates: ListedIssues<{ index: number; t: number }>
  outOfOrder: ListedIssues<{ index: number; t: number; afterT: number }>
}

export type RuntimeEnd = 'cutoff' | 'dropout' | 'end-of-log'

export interface DischargeResult {
  runtimeH: number
  /** What ended the runtime: the cut-off, the load dropping out, or the end of the log. */
  runtimeEnd: RuntimeEnd
  cutoffTimeH: number | null
  dropoutTimeH: number | null
  /** Pack cut-off voltage used, volts. */
  cutoffVoltageV: number
  thresholdCrossings: Array<{ perCellV: number; packV: number; timeH: number | null }>
  deliveredAh: number | null
  deliveredWh: number | null
  /** True when Ah/Wh come from an assumed power or resistance rather than logged current. */
  estimated: boolean
  midpointVoltageV: number
  /** Runtime ≥ rated duration; null when the log stopped short of both the rated duration and the cut-off. */
  pass: boolean | null
  marginH: number
  stateOfHealth: number | null
  sampleIssues: SampleIssues
  /** Samples used after removing duplicates and out-of-order ones. */
  samplesUsed: number
  warnings: EngineWarning[]
  working: WorkingStep[]
}

const LISTED = 50
/** A gap is an interval longer than this many median intervals. */
const GAP_FACTOR = 5
/** Load counts as on above this share of the typical current, and as dropped out below DROPOUT_SHARE. */
const LOAD_ON_SHARE = 0.5
const DROPOUT_SHARE = 0.02
/** A voltage recovery of this share of the nominal pack voltage after a fall marks a dropout. */
const RECOVERY_SHARE = 0.05

const IEC_TEST: Reference = {
  source: 'EN 50172 / BS 5266-1 full rated-duration discharge test',
  basis: 'common practice',
  note: 'A self-contained luminaire passes when it keeps working for its rated duration.',
}
const TRAPEZOID: Reference = { source: 'Trapezoidal rule (numerical integration)', basis: 'published' }

/** k-th smallest of a (modified in place), Hoare's selection. */
function quickselect(a: Float64Array, k: number): number {
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

function median(values: Float64Array): number {
  if (values.length === 0) return 0
  return quickselect(Float64Array.from(values), values.length >> 1)
}

/** Linear interpolation of y at time x between samples k−1 and k. */
function lerpAt(t: Float64Array, y: Float64Array, k: number, x: number): number {
  const span = t[k] - t[k - 1]
  return span > 0 ? y[k - 1] + ((x - t[k - 1]) / span) * (y[k] - y[k - 1]) : y[k]
}

/** Time at which y (falling) passes level between samples k−1 and k. */
function crossingTime(t: Float64Array, y: Float64Array, k: number, level: number): number {
  const dy = y[k] - y[k - 1]
  return dy !== 0 ? t[k - 1] + ((level - y[k - 1]) / dy) * (t[k] - t[k - 1]) : t[k]
}

/** Analyse a discharge log held in typed arrays. Field errors for unusable input; never NaN. */
export function analyseDischarge(samples: DischargeArrays, options: DischargeOptions): ToolOutcome<DischargeResult> {
  const { t: rawT, v: rawV, i: rawI } = samples
  const fields: FieldError[] = []
  const n = rawT.length
  if (n === 0) fields.push({ path: 'samples', message: 'needs at least two samples; the log is empty' })
  if (rawV.length !== n) fields.push({ path: 'samples.v', message: `has ${rawV.length} values but samples.t has ${n}` })
  if (rawI && rawI.length !== n) fields.push({ path: 'samples.i', message: `has ${rawI.length} values but samples.t has ${n}` })
  if (!(Number.isInteger(options.cellsInSeries) && options.cellsInSeries >= 1)) fields.push({ path: 'cellsInSeries', message: 'must be a whole number of at least 1' })
  if (!(options.ratedDuration > 0 && Number.isFinite(options.ratedDuration))) fields.push({ path: 'ratedDuration', message: 'must be greater than zero' })
  if (fields.length) return { ok: false, fields }
  for (let k = 0; k < n; k++) {
    if (!Number.isFinite(rawT[k])) return { ok: false, fields: [{ path: `samples[${k}].t`, message: 'must be a finite number' }] }
    if (!Number.isFinite(rawV[k])) return { ok: false, fields: [{ path: `samples[${k}].v`, message: 'must be a finite number' }] }
    if (rawI && !Number.isFinite(rawI[k])) return { ok: false, fields: [{ path: `samples[${k}].i`, message: 'must be a finite number' }] }
  }

  // Pass 1: keep samples whose time moves forward; list the rest.
  const t = new Float64Array(n)
  const v = new Float64Array(n)
  const cur = rawI ? new Float64Array(n) : null
  const index = new Uint32Array(n)
  const issues: SampleIssues = { gaps: { count: 0, items: [] }, duplicates: { count: 0, items: [] }, outOfOrder: { count: 0, items: [] } }
  let m = 0
  for (let k = 0; k < n; k++) {
    const tk = rawT[k]
    if (m > 0 && tk <= t[m - 1]) {
      const list = tk === t[m - 1] ? issues.duplicates : issues.outOfOrder
      list.count++
      if (list.items.length < LISTED) {
        if (list === issues.duplicates) issues.duplicates.items.push({ index: k, t: tk })
        else issues.outOfOrder.items.push({ index: k, t: tk, afterT: t[m - 1] })
      }
      continue
    }
    t[m] = tk
    v[m] = rawV[k]
    if (cur && rawI) cur[m] = rawI[k]
    index[m] = k
    m++
  }
  if (m < 2) return { ok: false, fields: [{ path: 'samples', message: 'needs at least two samples at different times' }] }

  const intervals = new Float64Array(m - 1)
  for (let k = 1; k < m; k++) intervals[k - 1] = t[k] - t[k - 1]
  const medianInterval = median(intervals)
  for (let k = 1; k < m; k++) {
    if (intervals[k - 1] > GAP_FACTOR * medianInterval) {
      issues.gaps.count++
      if (issues.gaps.items.length < LISTED) issues.gaps.items.push({ index: index[k], fromT: t[k - 1], toT: t[k], seconds: intervals[k - 1] })
    }
  }

  const chemistry = getChemistry(options.chemistry)
  const cells = options.cellsInSeries
  const cutoffPerCell = options.cutoffPerCell ?? chemistry.cutoffCellVoltage.value
  const cutoffV = cells * cutoffPerCell
  const nominalV = cells * chemistry.nominalCellVoltage.value
  const t0 = t[0]

  // Pass 2: cut-off, dropout and threshold crossings.
  let typicalCurrent = 0
  if (cur) {
    const magnitudes = new Float64Array(m)
    for (let k = 0; k < m; k++) magnitudes[k] = Math.abs(cur[k])
    typicalCurrent = median(magnitudes)
  }
  const useCurrent = cur !== null && typicalCurrent > 0
  const thresholds = (options.thresholdsPerCell ?? []).map((perCell) => ({ perCellV: perCell, packV: perCell * cells, time: null as number | null }))
  let cutoffTime: number | null = v[0] < cutoffV ? t0 : null
  let dropoutTime: number | null = null
  let loadSeen = false
  let highestSoFar = v[0]
  let highestBeforeMin = v[0]
  let minV = v[0]
  let minK = 0
  const recovery = RECOVERY_SHARE * nominalV
  for (let k = 1; k < m && dropoutTime === null; k++) {
    if (cutoffTime === null && v[k] < cutoffV && v[k - 1] >= cutoffV) cutoffTime = crossingTime(t, v, k, cutoffV)
    for (const th of thresholds) if (th.time === null && v[k] < th.packV && v[k - 1] >= th.packV) th.time = crossingTime(t, v, k, th.packV)
    if (useCurrent && cur) {
      const a = Math.abs(cur[k])
      const before = Math.abs(cur[k - 1])
      if (before >= LOAD_ON_SHARE * typicalCurrent || loadSeen) loadSeen = true
      if (loadSeen && a < DROPOUT_SHARE * typicalCurrent && before >= DROPOUT_SHARE * typicalCurrent) {
        // The moment the current fell through half its typical value.
        const half = LOAD_ON_SHARE * typicalCurrent
        dropoutTime = before > half ? t[k - 1] + ((before - half) / (before - a)) * (t[k] - t[k - 1]) : t[k - 1]
      }
    } else if (!useCurrent) {
      if (v[k] < minV) {
        minV = v[k]
        minK = k
        highestBeforeMin = highestSoFar
      }
      highestSoFar = Math.max(highestSoFar, v[k])
      if (highestBeforeMin - minV >= recovery && v[k] - minV >= recovery) {
        // The voltage fell, then jumped back: the load went off at the lowest point.
        dropoutTime = t[minK]
      }
    }
  }
  if (cutoffTime !== null && dropoutTime !== null && cutoffTime > dropoutTime) cutoffTime = null
  for (const th of thresholds) if (th.time !== null && dropoutTime !== null && th.time > dropoutTime) th.time = null
  const endTime = cutoffTime ?? dropoutTime ?? t[m - 1]
  const runtimeEnd: RuntimeEnd = cutoffTime !== null ? 'cutoff' : dropoutTime !== null ? 'dropout' : 'end-of-log'

  // Pass 3: integrate to the end point (trapezoids, the last one cut at the end time).
  // Compensated (Kahan) sums: a million small trapezoids would otherwise lose digits.
  let ampSeconds = 0
  let ampCarry = 0
  let jouleSum = 0
  let jouleCarry = 0
  const power = options.assumedPower
  const resistance = options.assumedResistance
  // An assumed constant power draws P/v; a collapsed (≤ 0 V) sample contributes nothing rather than infinity.
  const fromPower = (volts: number) => (power !== undefined && volts > 0 ? power / volts : 0)
  const currentAt = (k: number): number => (useCurrent && cur ? cur[k] : power !== undefined ? fromPower(v[k]) : resistance !== undefined ? v[k] / resistance : 0)
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

  // Midpoint voltage: binary search for half the runtime.
  const midTime = t0 + (endTime - t0) / 2
  let lo = 0
  let hi = m - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (t[mid] <= midTime) lo = mid
    else hi = mid
  }
  const midpointVoltageV = lerpAt(t, v, hi, midTime)

  const runtimeS = endTime - t0
  const runtimeH = runtimeS / 3600
  const ratedH = options.ratedDuration / 3600
  const inconclusive = runtimeEnd === 'end-of-log' && runtimeS < options.ratedDuration
  const pass = inconclusive ? null : runtimeS >= options.ratedDuration
  const deliveredAh = canIntegrate ? ampSeconds / 3600 : null
  const deliveredWh = canIntegrate ? jouleSum / 3600 : null
  const ratedAh = options.ratedCapacity !== undefined ? options.ratedCapacity / 3600 : null
  const stateOfHealth = deliveredAh !== null && ratedAh !== null && ratedAh > 0 ? deliveredAh / ratedAh : null
  const estimated = canIntegrate && !useCurrent

  const warnings: EngineWarning[] = []
  if (pass === false) {
    warnings.push({
      code: 'duration-not-met',
      severity: 'critical',
      message: `The pack ran for ${runtimeH.toFixed(2)} h, short of the rated ${ratedH.toFixed(2)} h: replace the battery (or find the fault) and retest.`,
    })
  }
  if (inconclusive) {
    warnings.push({
      code: 'log-ended-early',
      severity: 'warning',
      message: 'The log ends before the rated duration and before the cut-off, so the test neither passed nor failed.',
    })
  }
  if (runtimeEnd === 'end-of-log' && !inconclusive) {
    warnings.push({ code: 'cutoff-not-reached', severity: 'info', message: 'The pack never fell through the cut-off and the load never dropped out; the runtime is to the end of the log.' })
  }
  if (runtimeEnd === 'dropout') {
    warnings.push({
      code: 'dropout-before-cutoff',
      severity: 'info',
      message: "The load dropped out before the pack reached the cut-off used here: the luminaire's own deep-discharge protection probably disconnected it.",
    })
  }
  if (cutoffTime === t0 && v[0] < cutoffV) {
    warnings.push({ code: 'starts-below-cutoff', severity: 'critical', field: 'samples', message: 'The first sample is already below the cut-off: check the cell count and the cut-off, or the battery is flat.' })
  }
  if (cutoffPerCell < chemistry.minSafeCellVoltage.value) {
    warnings.push({
      code: 'cutoff-below-safe',
      severity: 'warning',
      field: 'cutoffPerCell',
      message: `A cut-off of ${cutoffPerCell} V per cell is below the ${chemistry.minSafeCellVoltage.value} V per cell this chemistry tolerates: discharging that deep harms the cells.`,
    })
  }
  if (options.cutoffPerCell === undefined) {
    warnings.push({ code: 'default-cutoff', severity: 'info', field: 'cutoffPerCell', message: `Cut-off taken as ${cutoffPerCell} V per cell, the usual end-of-discharge voltage for ${chemistry.name}.` })
  }
  if (!canIntegrate) {
    warnings.push({ code: 'no-current', severity: 'info', message: 'No current was logged and no assumed power or resistance was given, so the delivered charge and energy are not known.' })
  } else if (estimated) {
    warnings.push({
      code: 'estimated-delivery',
      severity: 'warning',
      message: `Delivered Ah and Wh are estimates from an assumed constant ${power !== undefined ? 'power' : 'resistance'}, not measured current.`,
    })
  }
  if (useCurrent && power !== undefined) warnings.push({ code: 'assumption-unused', severity: 'info', field: 'assumedPower', message: 'Current was logged, so the assumed power was not used.' })
  if (useCurrent && resistance !== undefined) warnings.push({ code: 'assumption-unused', severity: 'info', field: 'assumedResistance', message: 'Current was logged, so the assumed resistance was not used.' })
  if (issues.duplicates.count + issues.outOfOrder.count > 0) {
    warnings.push({
      code: 'samples-excluded',
      severity: 'warning',
      field: 'samples',
      message: `${issues.duplicates.count} duplicate and ${issues.outOfOrder.count} out-of-order sample(s) were left out; check the logger's clock.`,
    })
  }
  if (issues.gaps.count > 0) {
    warnings.push({
      code: 'gaps',
      severity: 'warning',
      field: 'samples',
      message: `${issues.gaps.count} gap(s) longer than ${GAP_FACTOR} × the usual interval: the values across them are interpolated in a straight line.`,
    })
  }
  if (ratedAh !== null && stateOfHealth !== null) {
    warnings.push({
      code: 'rate-dependent-capacity',
      severity: 'info',
      field: 'ratedCapacity',
      message: 'State of health compares the charge delivered at this test’s rate with the rated capacity at its own rate; at a faster rate a healthy pack delivers less.',
    })
  }
  warnings.push({
    code: 'competent-person',
    severity: 'info',
    message: 'Let the pack recharge fully (usually 24 h) before relying on the luminaires again. Packs hold hazardous materials: recycle them through an authorised scheme, never in general waste. Local codes and a competent, licensed person decide.',
  })

  const working: WorkingStep[] = [
    {
      id: 'cutoffVoltage',
      label: 'Pack cut-off voltage',
      formula: 'V_co = n · V_co,cell',
      explanation: 'The pack has reached the end of its discharge when its voltage falls through the number of cells times the per-cell cut-off.',
      inputs: [
        { symbol: 'n', label: 'cells in series', value: cells, unit: '' },
        { symbol: 'V_co,cell', label: 'cut-off per cell', value: cutoffPerCell, unit: 'V' },
      ],
      result: { symbol: 'V_co', label: 'pack cut-off', value: cutoffV, unit: 'V' },
      references: [options.cutoffPerCell === undefined ? chemistry.cutoffCellVoltage.ref : { source: 'value entered', basis: 'derived' }],
    },
    {
      id: 'runtime',
      label: 'Runtime',
      formula: 't_run = t_end − t_0; t_end linear between the samples either side of the crossing',
      explanation:
        runtimeEnd === 'cutoff' ? 'Ends where the pack voltage falls through the cut-off.' : runtimeEnd === 'dropout' ? 'Ends where the load dropped out.' : 'Ends with the log.',
      inputs: [{ symbol: 't_0', label: 'first sample', value: t0, unit: 's' }],
      result: { symbol: 't_run', label: 'runtime', value: runtimeH, unit: 'h' },
      references: [IEC_TEST],
    },
    {
      id: 'margin',
      label: 'Margin over the rated duration',
      formula: 'margin = t_run − t_rated',
      explanation: 'A positive margin means the pack outlasted its rated duration.',
      inputs: [
        { symbol: 't_run', label: 'runtime', value: runtimeH, unit: 'h' },
        { symbol: 't_rated', label: 'rated duration', value: ratedH, unit: 'h' },
      ],
      result: { symbol: 'margin', label: 'margin', value: runtimeH - ratedH, unit: 'h' },
      references: [IEC_TEST],
    },
  ]
  if (deliveredAh !== null && deliveredWh !== null) {
    working.push(
      {
        id: 'deliveredAh',
        label: estimated ? 'Charge delivered (estimated)' : 'Charge delivered',
        formula: estimated ? (power !== undefined ? 'Q = Σ ½(P/v_k + P/v_k+1)·Δt' : 'Q = Σ ½(v_k + v_k+1)/R·Δt') : 'Q = Σ ½(i_k + i_k+1)·Δt',
        explanation: 'Trapezoids between samples, up to the end of the runtime.',
        inputs: estimated
          ? [power !== undefined ? { symbol: 'P', label: 'assumed power', value: power, unit: 'W' } : { symbol: 'R', label: 'assumed resistance', value: resistance ?? 0, unit: 'Ω' }]
          : [],
        result: { symbol: 'Q', label: 'delivered', value: deliveredAh, unit: 'Ah' },
        references: [TRAPEZOID],
      },
      {
        id: 'deliveredWh',
        label: estimated ? 'Energy delivered (estimated)' : 'Energy delivered',
        formula: 'E = Σ ½(v_k·i_k + v_k+1·i_k+1)·Δt',
        explanation: 'Trapezoids of voltage times current, up to the end of the runtime.',
        inputs: [],
        result: { symbol: 'E', label: 'delivered', value: deliveredWh, unit: 'Wh' },
        references: [TRAPEZOID],
      },
    )
  }
  if (stateOfHealth !== null && deliveredAh !== null && ratedAh !== null) {
    working.push({
      id: 'stateOfHealth',
      label: 'State of health',
      formula: 'SoH = Q / C_rated',
      explanation: 'Charge delivered in this test as a share of the rated capacity.',
      inputs: [
        { symbol: 'Q', label: 'delivered', value: deliveredAh, unit: 'Ah' },
        { symbol: 'C_rated', label: 'rated capacity', value: ratedAh, unit: 'Ah' },
      ],
      result: { symbol: 'SoH', label: 'state of health', value: stateOfHealth, unit: '' },
      references: [{ source: 'Capacity test practice', basis: 'common practice' }],
    })
  }

  return {
    ok: true,
    result: {
      runtimeH,
      runtimeEnd,
      cutoffTimeH: cutoffTime === null ? null : (cutoffTime - t0) / 3600,
      dropoutTimeH: dropoutTime === null ? null : (dropoutTime - t0) / 3600,
      cutoffVoltageV: cutoffV,
      thresholdCrossings: thresholds.map((th) => ({ perCellV: th.perCellV, packV: th.packV, timeH: th.time === null ? null : (th.time - t0) / 3600 })),
      deliveredAh,
      deliveredWh,
      estimated,
      midpointVoltageV,
      pass,
      marginH: runtimeH - ratedH,
      stateOfHealth,
      sampleIssues: issues,
      samplesUsed: m,
      warnings: sortWarnings(warnings),
      working,
    },
  }
}

// ---------------------------------------------------------------------------------------------
// The tool: JSON samples in, the same analysis out.

const sampleSchema = z.object({
  t: finiteNumber(),
  v: finiteNumber(),
  i: finiteNumber().optional(),
})

export const dischargeInput = z
  .object({
    samples: z.array(sampleSchema).min(2, 'needs at least two samples'),
    chemistry: chemistryIdSchema,
    cellsInSeries: finiteNumber({ int: true, min: 1, max: 400 }),
    cutoffPerCell: quantity('voltage', { positive: true, max: 5 }).optional(),
    ratedDuration: quantity('time', { positive: true, max: 7 * 24 * 3600 }),
    ratedCapacity: quantity('charge', { positive: true }).optional(),
    thresholdsPerCell: z.array(quantity('voltage', { positive: true, max: 5 })).max(20, 'at most 20 thresholds').optional(),
    assumedPower: quantity('power', { positive: true }).optional(),
    assumedResistance: quantity('resistance', { positive: true }).optional(),
  })
  .superRefine((input, ctx) => {
    if (input.assumedPower !== undefined && input.assumedResistance !== undefined) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['assumedResistance'], message: 'give an assumed power or an assumed resistance, not both' })
    }
    const withCurrent = input.samples.filter((s) => s.i !== undefined).length
    if (withCurrent > 0 && withCurrent < input.samples.length) {
      const k = input.samples.findIndex((s) => s.i === undefined)
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['samples', k, 'i'], message: 'give the current on every sample or on none' })
    }
  })

export type DischargeInput = z.output<typeof dischargeInput>

export function runDischarge(input: DischargeInput): DischargeResult {
  const n = input.samples.length
  const t = new Float64Array(n)
  const v = new Float64Array(n)
  const hasCurrent = input.samples[0].i !== undefined
  const i = hasCurrent ? new Float64Array(n) : undefined
  input.samples.forEach((s, k) => {
    t[k] = s.t
    v[k] = s.v
    if (i) i[k] = s.i ?? 0
  })
  const outcome = analyseDischarge({ t, v, i }, input)
  // The schema has already checked everything analyseDischarge checks.
  if (!outcome.ok) throw new Error(`discharge: ${outcome.fields.map((f) => `${f.path} ${f.message}`).join('; ')}`)
  return outcome.result
}

export const dischargeTool = defineTool({
  name: 'discharge',
  summary: 'Analyse a logged full-duration discharge test: runtime to cut-off or dropout, delivered Ah and Wh, pass or fail.',
  input: dischargeInput,
  run: runDischarge,
})
