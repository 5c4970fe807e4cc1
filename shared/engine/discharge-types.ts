/** Shapes of the discharge-log analysis: what goes in, what comes out. */
import type { ChemistryId } from './chemistries'
import type { EngineWarning, WorkingStep } from './types'

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
  /** Volts per cell; the chemistry's end-of-discharge voltage (at the test's rate, where tabulated) when omitted. */
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

/**
 * Which decision rule ended the runtime:
 * - `cutoff-held`: the voltage fell through the cut-off and stayed below it for the hold time (or to the end of the log);
 * - `cutoff-then-dropout`: the voltage fell through the cut-off and the load went off during that dip (the luminaire's own protection);
 * - `current-dropout`: the logged current fell to (nearly) zero and stayed there;
 * - `voltage-recovery`: no current logged; the pack voltage stepped up and stayed up (recovery without load);
 * - `end-of-log`: none of these; the runtime runs to the last sample.
 */
export type EndRule = 'cutoff-held' | 'cutoff-then-dropout' | 'current-dropout' | 'voltage-recovery' | 'end-of-log'

/** What shows that the luminaire was drawing current all along: the logged current, a falling voltage, or nothing. */
export type LoadEvidence = 'current' | 'voltage-fall' | 'none'

/** A brief dip below the cut-off that did not last the hold time while the load stayed on: noise, not the end. */
export interface CutoffGlitch {
  index: number
  /** Seconds from the first sample. */
  fromS: number
  /** Seconds spent below the cut-off. */
  seconds: number
}

export interface DischargeResult {
  runtimeH: number
  /** What ended the runtime: the cut-off, the load dropping out, or the end of the log. */
  runtimeEnd: RuntimeEnd
  /** The decision rule behind runtimeEnd. */
  endRule: EndRule
  cutoffTimeH: number | null
  dropoutTimeH: number | null
  /** First time the load went off and came back (current, or a voltage that rose and fell again), hours; null when none. */
  interruptionTimeH: number | null
  /** Pack cut-off voltage used, volts. */
  cutoffVoltageV: number
  /** Dips below the cut-off ignored as noise (shorter than the hold time with the load still on). */
  cutoffGlitches: ListedIssues<CutoffGlitch>
  loadEvidence: LoadEvidence
  /** Noise of the voltage log (robust standard deviation about a 5-sample running median), volts. */
  voltageNoiseV: number
  thresholdCrossings: Array<{ perCellV: number; packV: number; timeH: number | null }>
  deliveredAh: number | null
  deliveredWh: number | null
  /** True when Ah/Wh come from an assumed power or resistance rather than logged current. */
  estimated: boolean
  midpointVoltageV: number
  /**
   * Runtime ≥ rated duration with the load shown to be on throughout. false when the runtime ended short;
   * null when the log cannot tell (it stopped short of both the rated duration and the cut-off, the load
   * went off and came back, or nothing in the log shows the load was on).
   */
  pass: boolean | null
  /** One sentence: why pass, fail or undecided. */
  verdictReason: string
  marginH: number
  stateOfHealth: number | null
  sampleIssues: SampleIssues
  /** Samples used after removing duplicates and out-of-order ones. */
  samplesUsed: number
  warnings: EngineWarning[]
  working: WorkingStep[]
}
