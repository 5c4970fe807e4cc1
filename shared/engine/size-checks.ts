/**
 * Step 6 of `sizePack`: the checks on the sized (or given) pack: duration, end of life, Annex A, the
 * nominal voltage, temperatures, service life, deep discharge, the LED string, the converter window.
 * Each rule and its source: docs/method.md, "Battery packs".
 */
import { deepDischargeLimitCellV } from './battery-models'
import { DIRECT_DRIVE_HEADROOM_V } from './pack-cells'
import { roundToSignificant as round } from './round'
import type { SizedPack } from './size-steps'
import type { EngineWarning } from './types'

export function packChecks(s: SizedPack, warnings: EngineWarning[]): void {
  const { input, chemistry, durationH } = s.basis
  const fullCell = s.basis.fullCellV
  const designCutoffCell = s.basis.designCutoffCellV
  const { n, choice } = s.cells
  const currentA = s.draw.currentA
  const { requiredAh, annexFraction } = s.need
  const { selectedAh, capacityGiven } = s.pack
  const { runtimeBeginH, runtimeEndH, annexMaxA, lifeYears } = s.performance
  const cutoffCell = s.performance.cutoffCellV
  voltageChecks(s, warnings)
  if (capacityGiven) {
    if (runtimeBeginH < durationH) {
      warnings.push({
        code: 'pack-too-small',
        severity: 'critical',
        field: 'capacity',
        message: `The ${round(selectedAh)} Ah pack runs about ${round(runtimeBeginH)} h when new at ${input.ambientMin} °C, short of the ${round(durationH)} h rated duration.`,
      })
    } else if (runtimeEndH < durationH) {
      warnings.push({
        code: 'pack-too-small-end-of-life',
        severity: 'critical',
        field: 'capacity',
        message: `At end of life (${round(input.endOfLifeCapacity * 100)} % capacity) the ${round(selectedAh)} Ah pack runs about ${round(runtimeEndH)} h, short of the ${round(durationH)} h rated duration; it needs about ${round(requiredAh)} Ah with the design margin.`,
      })
    } else if (selectedAh < requiredAh * (1 - 1e-9)) {
      warnings.push({
        code: 'margin-not-met',
        severity: 'warning',
        field: 'capacity',
        message: `The pack covers the rated duration at end of life but not the ${round(input.designMargin * 100)} % design margin (${round(requiredAh)} Ah would).`,
      })
    }
    if (currentA > annexMaxA * (1 + 1e-9)) {
      warnings.push({
        code: 'annex-a-discharge-exceeded',
        severity: 'warning',
        field: 'capacity',
        message: `Average discharge ${round(currentA)} A exceeds the IEC 60598-2-22 Annex A recommendation of ${round(annexFraction * 100)} % of rated capacity per hour for ${round(durationH)} h (${round(annexMaxA)} A for ${round(selectedAh)} Ah).`,
      })
    }
  }
  if (durationH < 1) {
    warnings.push({
      code: 'duration-below-minimum',
      severity: 'warning',
      field: 'duration',
      message:
        'Escape-route emergency lighting needs at least 1 h (EN 1838); 3 h where people sleep or return before recharge (BS 5266-1), 90 min under NFPA 101.',
    })
  }
  if (chemistry.noChargeBelowFreezing && input.ambientMin < 0) {
    warnings.push({
      code: 'charge-forbidden-cold',
      severity: 'critical',
      field: 'ambientMin',
      message: `${chemistry.name} must not be charged below 0 °C (lithium plating, fire risk); the site goes down to ${input.ambientMin} °C. Use a charger that stops below 0 °C, a heated enclosure, or a nickel chemistry.`,
    })
  } else if (input.ambientMin < chemistry.chargeTemperatureC.value.min) {
    warnings.push({
      code: 'charge-temperature-low',
      severity: 'warning',
      field: 'ambientMin',
      message: `${chemistry.name} should be charged at ${chemistry.chargeTemperatureC.value.min} °C or above; the site goes down to ${input.ambientMin} °C.`,
    })
  }
  if (input.ambientMax > chemistry.chargeTemperatureC.value.max) {
    warnings.push({
      code: 'charge-temperature-high',
      severity: 'warning',
      field: 'ambientMax',
      message: `${chemistry.name} should be charged at ${chemistry.chargeTemperatureC.value.max} °C or below; the site reaches ${input.ambientMax} °C.`,
    })
  }
  const dischargeRange = chemistry.dischargeTemperatureC.value
  if (input.ambientMin < dischargeRange.min || input.ambientMax > dischargeRange.max) {
    warnings.push({
      code: 'discharge-temperature-range',
      severity: 'warning',
      field: input.ambientMin < dischargeRange.min ? 'ambientMin' : 'ambientMax',
      message: `${chemistry.name} is specified for discharge between ${dischargeRange.min} and ${dischargeRange.max} °C; the site range is ${input.ambientMin} to ${input.ambientMax} °C.`,
    })
  }
  if (lifeYears < input.designLifeYears) {
    warnings.push({
      code: 'service-life-short',
      severity: 'warning',
      field: 'designLifeYears',
      message: `At ${input.ambientMax} °C ${chemistry.name} lasts about ${round(lifeYears, 2)} years on standby, less than the ${input.designLifeYears}-year design life.`,
    })
  }
  if (input.designLifeYears < 4) {
    warnings.push({
      code: 'design-life-below-4-years',
      severity: 'info',
      field: 'designLifeYears',
      message: 'Emergency-luminaire batteries are designed for at least 4 years of normal operation (IEC 60598-2-22 Annex A, IEC 61347-2-7).',
    })
  }
  // One deep-discharge rule with the makers' rate table where there is one (the same table chose the default cut-off).
  const rateC = currentA / selectedAh
  const safeCell = deepDischargeLimitCellV(chemistry, rateC)
  if (cutoffCell < safeCell - 1e-9) {
    warnings.push({
      code: 'deep-discharge',
      severity: 'critical',
      field: 'cutoffCellVoltage',
      message: `An end-of-discharge voltage of ${cutoffCell} V per cell is below the safe minimum of ${safeCell} V for ${chemistry.name}${chemistry.cutoffByDischargeRate ? ` at ${round(rateC, 2)} C` : ''}: deep discharge damages the cells.`,
    })
  }
  if (input.driver === 'direct' && input.load?.ledVoltage !== undefined) {
    const packCutoffV = n * cutoffCell
    if (packCutoffV < input.load?.ledVoltage * (1 - 1e-9)) {
      warnings.push({
        code: 'led-string-drops-out',
        severity: choice.rule === 'given' ? 'critical' : 'warning',
        field: 'cellsInSeries',
        message: `At the end-of-discharge voltage the pack gives ${round(packCutoffV)} V, below the LED string's ${round(input.load?.ledVoltage)} V: the light fades out before the pack is used up.`,
      })
    } else if (packCutoffV - input.load.ledVoltage < DIRECT_DRIVE_HEADROOM_V - 1e-9) {
      warnings.push({
        code: 'direct-drive-headroom',
        severity: 'warning',
        field: 'cellsInSeries',
        message: `At the end-of-discharge voltage the pack gives ${round(packCutoffV)} V, only ${round(packCutoffV - input.load.ledVoltage, 2)} V above the LED string's ${round(input.load.ledVoltage)} V; the current limiter needs about ${DIRECT_DRIVE_HEADROOM_V} V, so the LED current (and the light) falls before the cut-off. Add a cell or use a converter.`,
      })
    }
  }
  const window = input.converterInput
  if (input.driver === 'converter' && window) {
    if (window.min !== undefined && n * designCutoffCell < window.min * (1 - 1e-9)) {
      warnings.push({
        code: 'converter-window-low',
        severity: 'critical',
        field: 'cellsInSeries',
        message: `At cut-off the pack gives ${round(n * designCutoffCell)} V, below the converter's minimum input of ${window.min} V.`,
      })
    }
    if (window.max !== undefined && n * fullCell > window.max * (1 + 1e-9)) {
      warnings.push({
        code: 'converter-window-high',
        severity: 'critical',
        field: 'cellsInSeries',
        message: `On charge the pack reaches ${round(n * fullCell)} V, above the converter's maximum input of ${window.max} V.`,
      })
    }
  }
  if (input.peukertExponent !== undefined) {
    const typical = chemistry.peukertExponent.value
    if (input.peukertExponent < typical.min || input.peukertExponent > typical.max) {
      warnings.push({
        code: 'peukert-untypical',
        severity: 'info',
        field: 'peukertExponent',
        message: `A Peukert exponent of ${input.peukertExponent} is outside the usual ${typical.min}–${typical.max} for ${chemistry.name}.`,
      })
    }
  }
  if (input.load?.mainsPower !== undefined || input.mode === 'maintained') {
    warnings.push({
      code: 'maintained-heat',
      severity: 'info',
      field: 'ambientMax',
      message: 'In maintained mode the lamp runs from the mains and warms the luminaire: use the temperature inside the battery compartment for ambientMax.',
    })
  }
  if (input.mode === 'maintained' && chemistry.id === 'nicd') {
    warnings.push({
      code: 'maintained-standard-cells',
      severity: 'warning',
      field: 'chemistry',
      message: 'A maintained luminaire keeps its battery compartment warm: high-temperature NiCd cells are the usual choice there.',
    })
  }
}

/** The pack keeps the nominal voltage asked for, or says critically that it does not. */
function voltageChecks(s: SizedPack, warnings: EngineWarning[]): void {
  const { input, chemistry } = s.basis
  const match = s.cells.voltageMatch
  if (!match || input.nominalVoltage === undefined) return
  const asked = input.nominalVoltage
  if (s.cells.choice.rule === 'voltage' && !match.exact) {
    warnings.push({
      code: 'pack-voltage-changed',
      severity: 'critical',
      field: 'nominalVoltage',
      message: `No whole number of ${chemistry.name} cells (${s.basis.nominalCellV} V each) gives ${round(asked)} V: ${s.cells.n} cells give ${round(s.cells.nominalVoltageV)} V. A pack of another voltage needs a luminaire whose charger and driver are made for it; keep the chemistry or choose one that makes ${round(asked)} V.`,
    })
  } else if (s.cells.choice.rule === 'given' && Math.abs(s.cells.nominalVoltageV - asked) > 0.01 * asked) {
    warnings.push({
      code: 'pack-voltage-changed',
      severity: 'critical',
      field: 'cellsInSeries',
      message: `${s.cells.n} ${chemistry.name} cells make ${round(s.cells.nominalVoltageV)} V, not the ${round(asked)} V pack voltage given.`,
    })
  }
}
