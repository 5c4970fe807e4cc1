/** Warnings, working and the verdict sentence of a discharge-log analysis: the words around the numbers. */
import type { Chemistry } from './chemistries'
import { CUTOFF_HOLD_S, DROPOUT_SHARE, EVIDENCE_SHARE, LOAD_ON_SHARE, SETTLE_S } from './discharge-events'
import type { CutoffGlitch, DischargeOptions, EndRule, ListedIssues, LoadEvidence, RuntimeEnd, SampleIssues } from './discharge-types'
import { sortWarnings, type EngineWarning, type Reference, type WorkingStep } from './types'

const FULL_DURATION_TEST: Reference = {
  source: 'EN 50172 / BS 5266-1 full rated-duration discharge test',
  basis: 'common practice',
  note: 'A self-contained luminaire passes when it keeps working for its rated duration.',
}
const TRAPEZOID: Reference = { source: 'Trapezoidal rule (numerical integration)', basis: 'published' }
const HOLD_RULE: Reference = {
  source: `End of discharge only when the voltage stays below the cut-off for ${CUTOFF_HOLD_S} s (a debounce of the end-voltage reading)`,
  basis: 'common practice',
}
const CURRENT_RULE: Reference = {
  source: `Load off below ${DROPOUT_SHARE * 100} % of the typical current, timed where it passes ${LOAD_ON_SHARE * 100} %`,
  basis: 'common practice',
}
const RECOVERY_RULE: Reference = {
  source: 'A discharging pack only falls; a step up that stays up is the pack recovering without load (terminal voltage = EMF − I·R)',
  basis: 'common practice',
  note: 'Rise threshold 10 mV per cell or 4 × the log’s noise, whichever is larger.',
}

const GAP_WORDS = 5

export interface ReportFacts {
  chemistry: Chemistry
  options: DischargeOptions
  cells: number
  cutoffPerCell: number
  cutoffV: number
  safeLimitPerCell: number
  dischargeRateC: number | null
  t0: number
  firstV: number
  runtimeH: number
  runtimeEnd: RuntimeEnd
  endRule: EndRule
  pass: boolean | null
  logEndedEarly: boolean
  interruptedBeforeRated: boolean
  interruptionH: number | null
  currentNeverOn: boolean
  currentSignFlipped: boolean
  loadEvidence: LoadEvidence
  tooNoisy: boolean
  noiseV: number
  riseV: number
  glitches: ListedIssues<CutoffGlitch>
  useCurrent: boolean
  canIntegrate: boolean
  estimated: boolean
  issues: SampleIssues
  deliveredAh: number | null
  deliveredWh: number | null
  ratedAh: number | null
  stateOfHealth: number | null
}

const RULE_WORDS: Record<EndRule, string> = {
  'cutoff-held': `Ends where the pack voltage fell through the cut-off and stayed below it for at least ${CUTOFF_HOLD_S} s (or to the end of the log).`,
  'cutoff-then-dropout': 'Ends where the pack voltage fell through the cut-off; the load went off during that dip (the luminaire’s own protection).',
  'current-dropout': `Ends where the logged current fell below ${DROPOUT_SHARE * 100} % of its typical value and stayed there: the load went off.`,
  'voltage-recovery': 'No current was logged. Ends where the pack voltage stepped up and stayed up: a pack only recovers like that when the load is off.',
  'end-of-log': 'Neither the cut-off nor a drop-out was found, so the runtime runs to the last sample.',
}

function verdictReason(f: ReportFacts, ratedH: number): string {
  const run = `${f.runtimeH.toFixed(2)} h`
  if (f.pass === true)
    return `Passed: the luminaire ran ${run}, at least its rated ${ratedH.toFixed(2)} h, and the ${f.loadEvidence === 'current' ? 'logged current' : 'falling voltage'} shows the load was on throughout.`
  if (f.pass === false)
    return `Failed: the runtime ended after ${run} (${RULE_WORDS[f.endRule].replace(/^Ends /, 'it ended ')}) short of the rated ${ratedH.toFixed(2)} h.`
  if (f.logEndedEarly) return 'Not decided: the log ends before the rated duration and before the cut-off.'
  if (f.interruptedBeforeRated)
    return `Not decided: the load went off and came back at about ${(f.interruptionH ?? 0).toFixed(2)} h, before the rated duration; the luminaire may have gone dark. Retest.`
  if (f.currentNeverOn) return 'Not decided: the logged current is zero throughout, so the log does not show the luminaire drawing any current.'
  if (f.tooNoisy) return 'Not decided: without a current log the voltage is too noisy to show whether the load stayed on.'
  return 'Not decided: no current was logged and the voltage barely fell, so the log cannot show that the load was on for the rated duration.'
}

export function dischargeReport(f: ReportFacts): { warnings: EngineWarning[]; working: WorkingStep[]; verdictReason: string } {
  const { chemistry, options } = f
  const ratedH = options.ratedDuration / 3600
  const warnings: EngineWarning[] = []
  if (f.pass === false) {
    warnings.push({
      code: 'duration-not-met',
      severity: 'critical',
      message: `The pack ran for ${f.runtimeH.toFixed(2)} h, short of the rated ${ratedH.toFixed(2)} h: replace the battery (or find the fault) and retest.`,
    })
  }
  if (f.logEndedEarly) {
    warnings.push({
      code: 'log-ended-early',
      severity: 'warning',
      message: 'The log ends before the rated duration and before the cut-off, so the test neither passed nor failed.',
    })
  }
  if (f.interruptedBeforeRated) {
    warnings.push({
      code: 'load-interrupted',
      severity: 'critical',
      message: `The load went off and came back at about ${(f.interruptionH ?? 0).toFixed(2)} h (${f.useCurrent ? 'the current fell to zero' : 'the voltage rose and then fell again'}): the luminaire may have gone dark during the test, so it is not passed. Check the connections and retest.`,
    })
  }
  if (f.currentNeverOn) {
    warnings.push({
      code: 'current-never-on',
      severity: 'warning',
      field: 'samples',
      message:
        'The current column is zero throughout: check the current clamp or shunt; the log does not show the luminaire drawing current, so it is not passed.',
    })
  }
  if (!f.useCurrent && f.loadEvidence === 'none' && !f.logEndedEarly && f.pass === null && !f.interruptedBeforeRated) {
    warnings.push({
      code: 'load-not-evident',
      severity: 'warning',
      field: 'samples',
      message: `No current was logged and the pack voltage fell by less than ${EVIDENCE_SHARE * 100} % of nominal up to the rated duration: the log cannot show the load was on, so it is not passed. Log the current, or check the luminaire was lit.`,
    })
  }
  if (f.tooNoisy) {
    warnings.push({
      code: 'voltage-too-noisy',
      severity: 'warning',
      field: 'samples',
      message: `The voltage log is noisy (about ${(f.noiseV * 1000).toPrecision(2)} mV): without a current log a drop-out could hide in it, so the test is not passed. Log the current or use a steadier logger.`,
    })
  }
  if (f.runtimeEnd === 'end-of-log' && !f.logEndedEarly) {
    warnings.push({
      code: 'cutoff-not-reached',
      severity: 'info',
      message: 'The pack never fell through the cut-off and the load never dropped out; the runtime is to the end of the log.',
    })
  }
  if (f.runtimeEnd === 'dropout') {
    warnings.push({
      code: 'dropout-before-cutoff',
      severity: 'info',
      message: `The load went off before the pack reached the cut-off used here (${f.endRule === 'voltage-recovery' ? 'the voltage stepped up and stayed up' : 'the current fell to zero'}): the luminaire’s own deep-discharge protection, a fault, or the end of the test.`,
    })
  }
  if (f.glitches.count > 0) {
    warnings.push({
      code: 'cutoff-glitch-ignored',
      severity: 'info',
      field: 'samples',
      message: `${f.glitches.count} dip(s) below the cut-off lasting under ${CUTOFF_HOLD_S} s with the load still on were taken as noise, not the end of the test.`,
    })
  }
  if (f.currentSignFlipped) {
    warnings.push({
      code: 'current-sign-flipped',
      severity: 'info',
      field: 'samples',
      message: 'Most current readings were negative, so the log was read with discharge negative and turned round.',
    })
  }
  if (f.runtimeEnd === 'cutoff' && f.runtimeH === 0 && f.firstV < f.cutoffV) {
    warnings.push({
      code: 'starts-below-cutoff',
      severity: 'critical',
      field: 'samples',
      message: 'The first sample is already below the cut-off: check the cell count and the cut-off, or the battery is flat.',
    })
  }
  if (f.cutoffPerCell < f.safeLimitPerCell - 1e-9) {
    warnings.push({
      code: 'cutoff-below-safe',
      severity: 'warning',
      field: 'cutoffPerCell',
      message: `A cut-off of ${f.cutoffPerCell} V per cell is below the ${f.safeLimitPerCell} V per cell ${chemistry.name} tolerates${chemistry.cutoffByDischargeRate ? (f.dischargeRateC === null ? ' at any rate' : ` at this rate (${f.dischargeRateC.toPrecision(2)} C)`) : ''}: discharging that deep harms the cells.`,
    })
  }
  if (options.cutoffPerCell === undefined) {
    const rateWords = chemistry.cutoffByDischargeRate
      ? f.dischargeRateC === null
        ? ' (the makers’ value at low rates: the rate is unknown without logged current and a rated capacity)'
        : ` (the makers’ final voltage at ${f.dischargeRateC.toPrecision(2)} C)`
      : ''
    warnings.push({
      code: 'default-cutoff',
      severity: 'info',
      field: 'cutoffPerCell',
      message: `Cut-off taken as ${f.cutoffPerCell} V per cell, the usual end-of-discharge voltage for ${chemistry.name}${rateWords}.`,
    })
  }
  if (!f.canIntegrate) {
    warnings.push({
      code: 'no-current',
      severity: 'info',
      message: 'No current was logged and no assumed power or resistance was given, so the delivered charge and energy are not known.',
    })
  } else if (f.estimated) {
    warnings.push({
      code: 'estimated-delivery',
      severity: 'warning',
      message: `Delivered Ah and Wh are estimates from an assumed constant ${options.assumedPower !== undefined ? 'power' : 'resistance'}, not measured current.`,
    })
  }
  if (f.useCurrent && options.assumedPower !== undefined)
    warnings.push({ code: 'assumption-unused', severity: 'info', field: 'assumedPower', message: 'Current was logged, so the assumed power was not used.' })
  if (f.useCurrent && options.assumedResistance !== undefined)
    warnings.push({
      code: 'assumption-unused',
      severity: 'info',
      field: 'assumedResistance',
      message: 'Current was logged, so the assumed resistance was not used.',
    })
  if (f.issues.duplicates.count + f.issues.outOfOrder.count > 0) {
    warnings.push({
      code: 'samples-excluded',
      severity: 'warning',
      field: 'samples',
      message: `${f.issues.duplicates.count} duplicate and ${f.issues.outOfOrder.count} out-of-order sample(s) were left out; check the logger's clock.`,
    })
  }
  if (f.issues.gaps.count > 0) {
    warnings.push({
      code: 'gaps',
      severity: 'warning',
      field: 'samples',
      message: `${f.issues.gaps.count} gap(s) longer than ${GAP_WORDS} × the usual interval: the values across them are interpolated in a straight line.`,
    })
  }
  if (f.ratedAh !== null && f.stateOfHealth !== null) {
    warnings.push({
      code: 'rate-dependent-capacity',
      severity: 'info',
      field: 'ratedCapacity',
      message:
        'State of health compares the charge delivered at this test’s rate with the rated capacity at its own rate; at a faster rate a healthy pack delivers less.',
    })
  }
  warnings.push({
    code: 'competent-person',
    severity: 'info',
    message:
      'Let the pack recharge fully (usually 24 h) before relying on the luminaires again. Packs hold hazardous materials: recycle them through an authorised scheme, never in general waste. Local codes and a competent, licensed person decide.',
  })

  const cutoffRef: Reference =
    options.cutoffPerCell !== undefined
      ? { source: 'value entered', basis: 'derived' }
      : chemistry.cutoffByDischargeRate && f.dischargeRateC !== null
        ? chemistry.cutoffByDischargeRate.ref
        : chemistry.cutoffCellVoltage.ref
  const working: WorkingStep[] = [
    {
      id: 'cutoffVoltage',
      label: 'Pack cut-off voltage',
      formula: 'V_co = n · V_co,cell',
      explanation: 'The pack has reached the end of its discharge when its voltage falls through the number of cells times the per-cell cut-off.',
      inputs: [
        { symbol: 'n', label: 'cells in series', value: f.cells, unit: '' },
        { symbol: 'V_co,cell', label: 'cut-off per cell', value: f.cutoffPerCell, unit: 'V' },
      ],
      result: { symbol: 'V_co', label: 'pack cut-off', value: f.cutoffV, unit: 'V' },
      references: [cutoffRef],
    },
    {
      id: 'runtime',
      label: 'Runtime',
      formula: 't_run = t_end − t_0; t_end linear between the samples either side of the crossing',
      explanation: `${RULE_WORDS[f.endRule]}${f.glitches.count ? ` ${f.glitches.count} shorter dip(s) below the cut-off were ignored.` : ''}`,
      inputs: [{ symbol: 't_0', label: 'first sample', value: f.t0, unit: 's' }],
      result: { symbol: 't_run', label: 'runtime', value: f.runtimeH, unit: 'h' },
      references: [f.endRule === 'current-dropout' ? CURRENT_RULE : f.endRule === 'voltage-recovery' ? RECOVERY_RULE : HOLD_RULE, FULL_DURATION_TEST],
    },
    {
      id: 'loadEvidence',
      label: 'Was the load on throughout?',
      formula: f.useCurrent
        ? 'i ≥ 50 % of typical, never below 2 % before t_run'
        : 'V(start) − V(t_rated) ≥ 1 % of nominal; no step up that stays up; noise · 4 ≤ 25 mV per cell',
      explanation: f.useCurrent
        ? 'The logged current shows whether the luminaire drew current; a fall to zero that comes back is an interruption and is not passed.'
        : `No current was logged, so only the voltage can show the load: a discharging pack falls; one that rises by ${(f.riseV * 1000).toPrecision(3)} mV or more and stays up has lost its load. Rises that fall back within the first ${SETTLE_S / 60} min are the pack settling.`,
      inputs: [{ symbol: 'σ', label: 'voltage noise', value: f.noiseV, unit: 'V' }],
      result: {
        symbol: 'on',
        label: f.loadEvidence === 'none' ? 'not shown' : f.loadEvidence === 'current' ? 'shown by the current' : 'shown by the falling voltage',
        value: f.loadEvidence === 'none' ? 0 : 1,
        unit: '',
      },
      references: [f.useCurrent ? CURRENT_RULE : RECOVERY_RULE],
    },
    {
      id: 'margin',
      label: 'Margin over the rated duration',
      formula: 'margin = t_run − t_rated',
      explanation: verdictReason(f, ratedH),
      inputs: [
        { symbol: 't_run', label: 'runtime', value: f.runtimeH, unit: 'h' },
        { symbol: 't_rated', label: 'rated duration', value: ratedH, unit: 'h' },
      ],
      result: { symbol: 'margin', label: 'margin', value: f.runtimeH - ratedH, unit: 'h' },
      references: [FULL_DURATION_TEST],
    },
  ]
  const power = options.assumedPower
  if (f.deliveredAh !== null && f.deliveredWh !== null) {
    working.push(
      {
        id: 'deliveredAh',
        label: f.estimated ? 'Charge delivered (estimated)' : 'Charge delivered',
        formula: f.estimated ? (power !== undefined ? 'Q = Σ ½(P/v_k + P/v_k+1)·Δt' : 'Q = Σ ½(v_k + v_k+1)/R·Δt') : 'Q = Σ ½(i_k + i_k+1)·Δt',
        explanation: 'Trapezoids between samples, up to the end of the runtime.',
        inputs: f.estimated
          ? [
              power !== undefined
                ? { symbol: 'P', label: 'assumed power', value: power, unit: 'W' }
                : { symbol: 'R', label: 'assumed resistance', value: options.assumedResistance ?? 0, unit: 'Ω' },
            ]
          : [],
        result: { symbol: 'Q', label: 'delivered', value: f.deliveredAh, unit: 'Ah' },
        references: [TRAPEZOID],
      },
      {
        id: 'deliveredWh',
        label: f.estimated ? 'Energy delivered (estimated)' : 'Energy delivered',
        formula: 'E = Σ ½(v_k·i_k + v_k+1·i_k+1)·Δt',
        explanation: 'Trapezoids of voltage times current, up to the end of the runtime.',
        inputs: [],
        result: { symbol: 'E', label: 'delivered', value: f.deliveredWh, unit: 'Wh' },
        references: [TRAPEZOID],
      },
    )
  }
  if (f.stateOfHealth !== null && f.deliveredAh !== null && f.ratedAh !== null) {
    working.push({
      id: 'stateOfHealth',
      label: 'State of health',
      formula: 'SoH = Q / C_rated',
      explanation: 'Charge delivered in this test as a share of the rated capacity.',
      inputs: [
        { symbol: 'Q', label: 'delivered', value: f.deliveredAh, unit: 'Ah' },
        { symbol: 'C_rated', label: 'rated capacity', value: f.ratedAh, unit: 'Ah' },
      ],
      result: { symbol: 'SoH', label: 'state of health', value: f.stateOfHealth, unit: '' },
      references: [{ source: 'Capacity test practice', basis: 'common practice' }],
    })
  }
  return { warnings: sortWarnings(warnings), working, verdictReason: verdictReason(f, ratedH) }
}
