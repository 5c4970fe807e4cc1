/**
 * Wattage audit: a luminaire's claimed power against bench readings. Works out apparent power,
 * power factor, what the claim most likely describes, LED and charging power, the emergency output
 * ratio, driver efficiency and a year's energy and cost, and flags readings that cannot all be right
 * or that no luminaire gives (audit-plausibility.ts). Formulas: audit-formulas.ts; input: audit-input.ts.
 */
import { defineTool } from './tool'
import { sortWarnings, workingValue, type EngineWarning, type WorkingStep } from './types'
import { significantText } from './round'
import {
  CLAIM_TOLERANCE,
  DC_POWER,
  ENERGY_DEFINITION,
  IEEE_1459,
  IEV_POWER_FACTOR,
  annualEnergyKWh,
  apparentPower,
  euMinimumDisplacementFactor,
  powerFactorOf,
} from './audit-formulas'
import { auditInput, type AuditInput } from './audit-input'
import { mainsPlausibility } from './audit-plausibility'

export * from './audit-formulas'
export * from './audit-input'

// ---------------------------------------------------------------------------------------------
// Result
// ---------------------------------------------------------------------------------------------

export type ClaimVerdict = 'within tolerance' | 'above claim' | 'below claim'
export type ClaimMeaning = 'input power' | 'LED power' | 'apparent power' | 'something else'

export interface AuditResult {
  /** The real input power used, W (measured, or S × λ when only those were given). */
  measuredPowerW: number
  /** The mains current used, A (measured, or S / V). */
  measuredCurrentA: number
  apparentPowerVA: number
  powerFactor: number
  claimDeviationW: number
  claimDeviationPct: number
  claimVerdict: ClaimVerdict
  claimLikelyMeans: ClaimMeaning
  claimExplanation: string
  /** Deviation of the measured apparent power from a declared apparent power, % (null without a declaration). */
  apparentClaimDeviationPct: number | null
  ledPowerMainsW: number | null
  ledPowerBatteryW: number | null
  /** LED power on battery ÷ LED power on mains: an approximation of the emergency light output ratio. */
  emergencyOutputRatio: number | null
  driverEfficiency: number | null
  standbyChargePowerW: number | null
  annualEnergyKWh: number
  annualCost: number
  currency: string | null
  supplyFrequencyHz: number | null
  realVsApparentNote: string
  warnings: EngineWarning[]
  working: WorkingStep[]
}

// ---------------------------------------------------------------------------------------------
// Helpers
// ---------------------------------------------------------------------------------------------

const fmt = significantText
const val = workingValue

/** How far a claim is from a candidate, as a fraction of the candidate. */
function relativeGap(claimed: number, candidate: number): number {
  return Math.abs(claimed / candidate - 1)
}

// ---------------------------------------------------------------------------------------------
// The audit
// ---------------------------------------------------------------------------------------------

export function computeAudit(input: AuditInput): AuditResult {
  const warnings: EngineWarning[] = []
  const working: WorkingStep[] = []
  const V = input.supplyVoltage
  const tolerance = input.claimTolerancePct / 100

  // --- Power triangle: S from V·I (or the meter's VA), P measured, λ = P/S; the third from the other two.
  const sFromCurrent = input.measuredCurrent !== undefined ? apparentPower(V, input.measuredCurrent) : undefined
  const sFromReadings = sFromCurrent ?? input.apparentPower
  let S: number
  let P: number
  if (input.measuredPower !== undefined) {
    P = input.measuredPower
    S = sFromReadings ?? P / (input.powerFactor as number)
  } else {
    // Guaranteed by the schema: S from readings and a power factor.
    S = sFromReadings as number
    P = S * (input.powerFactor as number)
  }
  const I = input.measuredCurrent ?? S / V
  const PF = powerFactorOf(P, S)

  working.push({
    id: 'apparentPower',
    label: 'Apparent power',
    formula: sFromCurrent !== undefined ? 'S = V · I' : sFromReadings !== undefined ? 'S (read from the meter)' : 'S = P / λ',
    explanation:
      sFromCurrent !== undefined
        ? 'Apparent power is the product of the rms supply voltage and the rms current.'
        : sFromReadings !== undefined
          ? 'No current was given, so the apparent power shown by the meter is used.'
          : 'No current or apparent power was given, so apparent power follows from real power and the power factor.',
    inputs:
      sFromCurrent !== undefined
        ? [val('V', 'supply voltage', V, 'V'), val('I', 'measured current', I, 'A')]
        : sFromReadings !== undefined
          ? [val('S', 'apparent power read', S, 'VA')]
          : [val('P', 'measured power', P, 'W'), val('λ', 'power factor given', input.powerFactor as number, '')],
    result: val('S', 'apparent power', S, 'VA'),
    references: [IEEE_1459],
  })
  working.push({
    id: 'powerFactor',
    label: 'Power factor',
    formula: input.measuredPower !== undefined ? 'λ = P / S' : 'P = S · λ',
    explanation:
      input.measuredPower !== undefined
        ? 'The power factor is real power divided by apparent power. It covers both phase shift and waveform distortion, so it is not the same as cos φ.'
        : 'No real-power reading was given, so real power is the apparent power times the power factor shown by the meter.',
    inputs: [val('P', 'real power', P, 'W'), val('S', 'apparent power', S, 'VA')],
    result: val('λ', 'power factor', PF, ''),
    references: [IEEE_1459, IEV_POWER_FACTOR],
  })

  // --- Consistency of the mains readings.
  const readingsGivePf = input.measuredPower !== undefined && sFromReadings !== undefined
  const sNames = sFromCurrent !== undefined ? 'measuredCurrent' : 'apparentPower'
  if (readingsGivePf && PF > 1.05) {
    warnings.push({
      code: 'power-current-inconsistent',
      severity: 'critical',
      field: 'measuredPower',
      message: `measuredPower (${fmt(P)} W) and ${sNames} cannot both be right at ${fmt(V)} V: the apparent power is only ${fmt(S)} VA and real power can never exceed it (power factor would be ${fmt(PF)}). Re-check both readings and the meter's range.`,
    })
  } else if (readingsGivePf && PF > 1) {
    warnings.push({
      code: 'power-factor-above-one',
      severity: 'warning',
      field: 'measuredPower',
      message: `measuredPower and ${sNames} give a power factor of ${fmt(PF)}, above 1, which is impossible; the difference is small enough to be meter error at low readings. Treat the power factor as close to 1.`,
    })
  }
  if (sFromCurrent !== undefined && input.apparentPower !== undefined && relativeGap(input.apparentPower, sFromCurrent) > 0.05) {
    warnings.push({
      code: 'apparent-power-disagrees',
      severity: 'warning',
      field: 'apparentPower',
      message: `apparentPower (${fmt(input.apparentPower)} VA) disagrees with supplyVoltage × measuredCurrent (${fmt(sFromCurrent)} VA) by more than 5 %; V·I is used.`,
    })
  }
  if (readingsGivePf && input.powerFactor !== undefined && Math.abs(input.powerFactor - PF) > 0.05) {
    warnings.push({
      code: 'power-factor-disagrees',
      severity: 'warning',
      field: 'powerFactor',
      message: `powerFactor given (${fmt(input.powerFactor)}) disagrees with measuredPower / (supplyVoltage × measuredCurrent) = ${fmt(PF)}; the computed value is used. A meter that shows cos φ ignores waveform distortion.`,
    })
  }
  if (input.meterMinCurrent !== undefined && input.measuredCurrent !== undefined && input.measuredCurrent < input.meterMinCurrent) {
    warnings.push({
      code: 'below-meter-range',
      severity: 'warning',
      field: 'measuredCurrent',
      message: `measuredCurrent (${fmt(input.measuredCurrent * 1000)} mA) is below the meter's lowest reliable current (${fmt(input.meterMinCurrent * 1000)} mA); do not rely on it or on the power factor computed from it.`,
    })
  }
  if (input.meterMinPower !== undefined && input.measuredPower !== undefined && input.measuredPower < input.meterMinPower) {
    warnings.push({
      code: 'below-meter-range',
      severity: 'warning',
      field: 'measuredPower',
      message: `measuredPower (${fmt(input.measuredPower)} W) is below the meter's lowest reliable power (${fmt(input.meterMinPower)} W); do not rely on it, on the claim check or on the energy figures.`,
    })
  }

  // --- Readings no luminaire gives.
  for (const w of mainsPlausibility(input, P, PF)) warnings.push(w)

  // --- The claim.
  const claimed = input.claimedPower
  const claimDeviationW = P - claimed
  const claimDeviationPct = (claimDeviationW / claimed) * 100
  const claimVerdict: ClaimVerdict =
    Math.abs(claimDeviationPct) <= input.claimTolerancePct ? 'within tolerance' : claimDeviationPct > 0 ? 'above claim' : 'below claim'
  working.push({
    id: 'claimDeviation',
    label: 'Measured power against the claim',
    formula: 'ΔP = P − P_claim;  Δ% = 100 · ΔP / P_claim',
    explanation: `The measured real power is compared with the declared power; within ±${fmt(input.claimTolerancePct)} % counts as agreeing.`,
    inputs: [val('P', 'measured power', P, 'W'), val('P_claim', 'claimed power', claimed, 'W')],
    result: val('Δ%', 'deviation from the claim', claimDeviationPct, '%'),
    references: [CLAIM_TOLERANCE],
  })

  let apparentClaimDeviationPct: number | null = null
  if (input.claimedApparentPower !== undefined) {
    apparentClaimDeviationPct = (S / input.claimedApparentPower - 1) * 100
    if (Math.abs(apparentClaimDeviationPct) > input.claimTolerancePct) {
      warnings.push({
        code: 'apparent-claim-deviates',
        severity: 'warning',
        field: 'claimedApparentPower',
        message: `The measured apparent power (${fmt(S)} VA) is ${fmt(Math.abs(apparentClaimDeviationPct))} % ${apparentClaimDeviationPct > 0 ? 'above' : 'below'} the declared ${fmt(input.claimedApparentPower)} VA.`,
      })
    }
  }

  // --- d.c. side: LED power on mains and battery, charging power.
  const ledPowerMainsW = input.ledVoltageMains !== undefined && input.ledCurrentMains !== undefined ? input.ledVoltageMains * input.ledCurrentMains : null
  const ledPowerBatteryW =
    input.ledVoltageBattery !== undefined && input.ledCurrentBattery !== undefined ? input.ledVoltageBattery * input.ledCurrentBattery : null
  const standbyChargePowerW =
    input.batteryVoltage !== undefined && input.batteryChargeCurrent !== undefined ? input.batteryVoltage * input.batteryChargeCurrent : null

  if (ledPowerMainsW !== null) {
    working.push({
      id: 'ledPowerMains',
      label: 'LED power on mains',
      formula: 'P_LED,m = V_LED,m · I_LED,m',
      explanation: 'Power delivered to the LEDs, from the d.c. voltage across them and the current through them, lit from mains.',
      inputs: [
        val('V_LED,m', 'LED voltage on mains', input.ledVoltageMains as number, 'V'),
        val('I_LED,m', 'LED current on mains', input.ledCurrentMains as number, 'A'),
      ],
      result: val('P_LED,m', 'LED power on mains', ledPowerMainsW, 'W'),
      references: [DC_POWER],
    })
  }
  if (ledPowerBatteryW !== null) {
    working.push({
      id: 'ledPowerBattery',
      label: 'LED power on battery',
      formula: 'P_LED,b = V_LED,b · I_LED,b',
      explanation: 'Power delivered to the LEDs when lit from the battery (mains off).',
      inputs: [
        val('V_LED,b', 'LED voltage on battery', input.ledVoltageBattery as number, 'V'),
        val('I_LED,b', 'LED current on battery', input.ledCurrentBattery as number, 'A'),
      ],
      result: val('P_LED,b', 'LED power on battery', ledPowerBatteryW, 'W'),
      references: [DC_POWER],
    })
  }

  let emergencyOutputRatio: number | null = null
  if (ledPowerMainsW !== null && ledPowerBatteryW !== null && ledPowerMainsW > 0) {
    emergencyOutputRatio = ledPowerBatteryW / ledPowerMainsW
    working.push({
      id: 'emergencyOutputRatio',
      label: 'Emergency output ratio (approximate)',
      formula: 'r ≈ P_LED,b / P_LED,m',
      explanation:
        'An approximation of the emergency light output ratio. LED light output is not proportional to power or current (efficacy rises as current falls), so at reduced emergency current the true light ratio is usually somewhat higher than this power ratio. Measure illuminance for a firm figure.',
      inputs: [val('P_LED,b', 'LED power on battery', ledPowerBatteryW, 'W'), val('P_LED,m', 'LED power on mains', ledPowerMainsW, 'W')],
      result: val('r', 'emergency output ratio', emergencyOutputRatio, ''),
      references: [{ source: 'Ratio of d.c. LED powers as a stand-in for light output', basis: 'common practice' }],
    })
  }

  let driverEfficiency: number | null = null
  if (ledPowerMainsW !== null) {
    driverEfficiency = ledPowerMainsW / P
    working.push({
      id: 'driverEfficiency',
      label: 'Driver efficiency',
      formula: 'η = P_LED,m / P',
      explanation:
        'LED power on mains divided by the real input power. The input also feeds the charger, so this is the efficiency of the whole luminaire electronics, a little below the driver alone.',
      inputs: [val('P_LED,m', 'LED power on mains', ledPowerMainsW, 'W'), val('P', 'real input power', P, 'W')],
      result: val('η', 'driver efficiency', driverEfficiency, ''),
      references: [{ source: 'Efficiency = output power / input power', basis: 'published' }],
    })
    if (ledPowerMainsW > P) {
      warnings.push({
        code: 'led-power-above-input',
        severity: 'critical',
        field: 'ledCurrentMains',
        message: `LED power on mains (ledVoltageMains × ledCurrentMains = ${fmt(ledPowerMainsW)} W) is above the real input power (measuredPower ${fmt(P)} W): the driver would be more than 100 % efficient. One of these readings is wrong.`,
      })
    } else if (standbyChargePowerW !== null && input.mode === 'maintained' && ledPowerMainsW + standbyChargePowerW > P) {
      warnings.push({
        code: 'outputs-exceed-input',
        severity: 'info',
        field: 'batteryChargeCurrent',
        message: `LED power on mains plus battery charging power (${fmt(ledPowerMainsW + standbyChargePowerW)} W) exceeds the input power (${fmt(P)} W). This is only possible if the charger draws less while the lamp is lit; otherwise a reading is wrong.`,
      })
    }
    if (input.mode === 'non-maintained') {
      warnings.push({
        code: 'mode-lit-on-mains',
        severity: 'info',
        field: 'mode',
        message: 'LED readings on mains were given, but a non-maintained luminaire is not lit on mains; check the mode.',
      })
    }
  }

  if (standbyChargePowerW !== null) {
    working.push({
      id: 'standbyChargePower',
      label: 'Battery charging power (light off)',
      formula: 'P_ch = V_batt · I_ch',
      explanation:
        'd.c. power going into the battery while on mains with the light off. The charger’s own losses come on top, so the mains draw in standby is higher.',
      inputs: [
        val('V_batt', 'battery voltage', input.batteryVoltage as number, 'V'),
        val('I_ch', 'charging current', input.batteryChargeCurrent as number, 'A'),
      ],
      result: val('P_ch', 'charging power', standbyChargePowerW, 'W'),
      references: [DC_POWER],
    })
    if (input.mode === 'non-maintained' && standbyChargePowerW > P) {
      warnings.push({
        code: 'charge-power-above-input',
        severity: 'warning',
        field: 'batteryChargeCurrent',
        message: `Charging power (batteryVoltage × batteryChargeCurrent = ${fmt(standbyChargePowerW)} W) is above the mains input power (measuredPower ${fmt(P)} W) of this non-maintained luminaire; one of these readings is wrong.`,
      })
    }
  }

  // --- What does the claim describe?
  const ledCandidate = ledPowerMainsW ?? ledPowerBatteryW
  const candidates: Array<{ meaning: ClaimMeaning; value: number }> = [{ meaning: 'input power', value: P }]
  if (ledCandidate !== null && ledCandidate > 0) candidates.push({ meaning: 'LED power', value: ledCandidate })
  candidates.push({ meaning: 'apparent power', value: S })
  let claimLikelyMeans: ClaimMeaning = 'something else'
  let bestGap = Number.POSITIVE_INFINITY
  for (const c of candidates) {
    const gap = relativeGap(claimed, c.value)
    if (gap <= tolerance && gap < bestGap) {
      claimLikelyMeans = c.meaning
      bestGap = gap
    }
  }
  const claimExplanation = explainClaim(claimLikelyMeans, claimed, P, S, ledCandidate, ledPowerMainsW !== null, claimDeviationPct)

  // --- Energy and cost over a year.
  if (input.mode === 'maintained' && input.hoursPerDay < 24 && standbyChargePowerW === null) {
    warnings.push({
      code: 'standby-power-unknown',
      severity: 'info',
      field: 'batteryChargeCurrent',
      message:
        'The standby (charging) power is unknown, so the unlit hours count as zero energy and the annual energy is understated. Give batteryVoltage and batteryChargeCurrent.',
    })
  }
  if (input.mode === 'non-maintained' && input.hoursPerDay > 0) {
    warnings.push({
      code: 'hours-not-used',
      severity: 'info',
      field: 'hoursPerDay',
      message: 'A non-maintained luminaire is lit only when the mains fails, so hoursPerDay is not used; its mains draw is the charging power all year.',
    })
  }
  const energy = annualEnergyKWh({ mode: input.mode, measuredPowerW: P, hoursPerDay: input.hoursPerDay, standbyPowerW: standbyChargePowerW })
  working.push({
    id: 'annualEnergy',
    label: 'Energy over a year',
    formula: input.mode === 'maintained' ? 'E = 365 d · (P · h + P_ch · (24 h − h))' : 'E = 8760 h · P',
    explanation:
      input.mode === 'maintained'
        ? 'Maintained: lit for h hours a day at the measured power, and the rest of the day at the charging power (a lower bound for the standby draw, which also includes charger losses; zero when unknown).'
        : 'Non-maintained: on mains the light is off and the measured power is the charging draw, taken all year. Energy used in mains failures and tests is left out.',
    inputs:
      input.mode === 'maintained'
        ? [
            val('P', 'real input power', P, 'W'),
            val('h', 'lit hours per day', input.hoursPerDay, 'h'),
            val('P_ch', 'standby power', standbyChargePowerW ?? 0, 'W'),
          ]
        : [val('P', 'real input power on charge', P, 'W')],
    result: val('E', 'annual energy', energy, 'kWh'),
    references: [ENERGY_DEFINITION],
  })
  const annualCost = energy * input.tariffPerKWh
  working.push({
    id: 'annualCost',
    label: 'Cost over a year',
    formula: 'cost = E · tariff',
    explanation: 'Energy meters and tariffs count real energy (kWh), not apparent energy, so the cost follows the real power.',
    inputs: [val('E', 'annual energy', energy, 'kWh'), val('tariff', 'tariff', input.tariffPerKWh, `${input.currency ?? 'currency'}/kWh`)],
    result: val('cost', 'annual cost', annualCost, input.currency ?? 'currency'),
    references: [ENERGY_DEFINITION],
  })

  // --- Optional context: EU displacement-factor bands (information only).
  const minDf = euMinimumDisplacementFactor(P)
  if (minDf !== null && PF < minDf) {
    warnings.push({
      code: 'displacement-factor-band',
      severity: 'info',
      field: 'powerFactor',
      message: `For mains LED light sources of this power, Regulation (EU) 2019/2020 asks for a displacement factor (cos φ1) of at least ${minDf} (from memory, secondary source; emergency-lighting products may be exempt). The power factor here, ${fmt(PF)}, is below that, but cos φ1 is never lower than the power factor, so this does not show non-compliance: measure cos φ1 to decide.`,
    })
  }

  const realVsApparentNote =
    `Billing: energy meters register real power, so this luminaire costs as ${fmt(P)} W. ` +
    `Circuits: cables, protective devices, switches and relay contacts carry the current, ${fmt(I * 1000)} mA (${fmt(S)} VA), ` +
    `so size them on current or VA (and the driver's switch-on inrush), not on watts. ` +
    `With a power factor of ${fmt(PF)}, each luminaire draws ${fmt(1 / PF)} times the current its watts alone would suggest.`

  return {
    measuredPowerW: P,
    measuredCurrentA: I,
    apparentPowerVA: S,
    powerFactor: PF,
    claimDeviationW,
    claimDeviationPct,
    claimVerdict,
    claimLikelyMeans,
    claimExplanation,
    apparentClaimDeviationPct,
    ledPowerMainsW,
    ledPowerBatteryW,
    emergencyOutputRatio,
    driverEfficiency,
    standbyChargePowerW,
    annualEnergyKWh: energy,
    annualCost,
    currency: input.currency ?? null,
    supplyFrequencyHz: input.supplyFrequency ?? null,
    realVsApparentNote,
    warnings: sortWarnings(warnings),
    working,
  }
}

function explainClaim(meaning: ClaimMeaning, claimed: number, P: number, S: number, led: number | null, ledOnMains: boolean, deviationPct: number): string {
  const c = `${fmt(claimed)} W`
  const side = ledOnMains ? 'on mains' : 'on battery'
  switch (meaning) {
    case 'input power':
      return `The claimed ${c} agrees with the real power the luminaire takes from the supply (${fmt(P)} W, ${fmt(deviationPct, 2)} %).`
    case 'LED power':
      return `The claimed ${c} is close to the power delivered to the LEDs ${side} (${fmt(led as number)} W), not to the ${fmt(P)} W the luminaire takes from the supply: the claim leaves out the driver's and charger's losses.`
    case 'apparent power':
      return `The claimed ${c} is close to the apparent power V·I (${fmt(S)} VA), not to the real power (${fmt(P)} W): the claim was probably worked out from a voltmeter and an ammeter, which give volt-amperes, not watts.`
    default:
      return `The claimed ${c} matches none of the measured figures (real input ${fmt(P)} W${led !== null ? `, LED ${fmt(led)} W` : ''}, apparent ${fmt(S)} VA); ask the maker how the figure was obtained.`
  }
}

export const auditTool = defineTool({
  name: 'audit',
  summary: 'Wattage audit: claimed against measured power, power factor, LED and emergency output, yearly energy and cost.',
  input: auditInput,
  run: computeAudit,
})
