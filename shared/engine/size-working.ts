/** Step 7 of `sizePack`: the working, one step per figure, with its formula, values and sources. */
import { REF } from './chemistries/references'
import { describeCellChoice } from './pack-cells'
import type { SizedPack } from './size-steps'
import { workingValue as v, type Reference, type WorkingStep, type WorkingValue } from './types'

function step(
  id: string,
  label: string,
  formula: string,
  explanation: string,
  inputs: WorkingValue[],
  result: WorkingValue,
  references: Reference[],
): WorkingStep {
  return { id, label, formula, explanation, inputs, result, references }
}

export function sizeWorking(s: SizedPack): WorkingStep[] {
  const { input, chemistry, durationH, ratedH, averageCellV: averageCell, nominalCellV: nominalCell } = s.basis
  const k = s.basis.peukertExponent
  const dod = s.basis.depthOfDischarge
  const designCutoffCell = s.basis.designCutoffCellV
  const { n, choice } = s.cells
  const draw = s.draw
  const currentA = draw.currentA
  const { peukertAh, coldFactor, requiredAh, annexFraction, annexMinAh } = s.need
  const { selectedAh, capacityGiven, ladder } = s.pack
  const { dischargeCRate, cutoffCell, usableBeginAh, usableEndAh, runtimeBeginH, runtimeEndH, energyWh, massKg, volumeL, lifeYears, annexMaxA } = {
    ...s.performance,
    cutoffCell: s.performance.cutoffCellV,
  }
  const se = chemistry.specificEnergyWhPerKg.value
  const ed = chemistry.energyDensityWhPerL.value
  const refs = (...r: Reference[]) => r
  const measured = input.dischargeCurrent !== undefined
  const direct = !measured && input.driver === 'direct'
  const cellWords = describeCellChoice(choice, chemistry, input.load, designCutoffCell, input.converterInput, input.nominalVoltage)
  return [
    step(
      'cellsInSeries',
      'Cells in series',
      'n',
      cellWords.explanation,
      [v('V_cut', 'End-of-discharge voltage per cell', designCutoffCell, 'V')],
      v('n', 'Cells in series', n, ''),
      refs(cellWords.reference),
    ),
    step(
      'averagePowerW',
      'Average power from the pack',
      measured ? 'P = n · V_avg · I_measured' : direct ? 'P = n · V_avg · I_LED' : 'P = P_LED / η',
      measured
        ? 'Measured discharge current: the pack power is that current at the average pack voltage.'
        : direct
          ? 'Direct drive: the pack current is the LED current; the pack power is that current at the average pack voltage.'
          : 'Converter drive: the pack supplies the LED power divided by the converter efficiency.',
      measured || direct
        ? [
            v('n', 'Cells in series', n, ''),
            v('V_avg', 'Average cell voltage', averageCell, 'V'),
            v(measured ? 'I_measured' : 'I_LED', measured ? 'Measured discharge current' : 'LED current', currentA, 'A'),
          ]
        : [v('P_LED', 'LED power', draw.loadPowerW, 'W'), v('η', 'Converter efficiency', input.driverEfficiency, '')],
      v('P', 'Average pack power', draw.powerW, 'W'),
      refs(REF.commonPractice('Power balance of the driver')),
    ),
    step(
      'averageCurrentA',
      'Average current from the pack',
      measured ? 'I = I_measured' : direct ? 'I = I_LED' : 'I = P / (n · V_avg)',
      'The average discharge current over the rated duration, at the average cell voltage.',
      [v('P', 'Average pack power', draw.powerW, 'W'), v('n', 'Cells in series', n, ''), v('V_avg', 'Average cell voltage', averageCell, 'V')],
      v('I', 'Average current', currentA, 'A'),
      refs(chemistry.nominalCellVoltage.ref),
    ),
    step(
      'peukertCapacityAh',
      'Rated capacity for the discharge rate (Peukert)',
      durationH >= ratedH ? 'C_P = I · t   (t ≥ H: no credit for a slower discharge)' : 'C_P = I · H · (t / H)^(1/k)',
      `Capacity, on the ${ratedH} h rating basis, that delivers I for the rated duration: Peukert's law solved for C.`,
      [
        v('I', 'Average current', currentA, 'A'),
        v('t', 'Rated duration', durationH, 'h'),
        v('H', 'Rating basis', ratedH, 'h'),
        v('k', 'Peukert exponent', k, ''),
      ],
      v('C_P', 'Capacity at the discharge rate', peukertAh, 'Ah'),
      refs(REF.peukert(), chemistry.peukertExponent.ref),
    ),
    step(
      'coldCapacityFactor',
      'Capacity available in the cold',
      'f_T = curve(T_min)',
      `Share of rated capacity ${chemistry.name} gives at the lowest ambient, interpolated from the chemistry's temperature curve.`,
      [v('T_min', 'Lowest ambient', input.ambientMin, '°C')],
      v('f_T', 'Cold-capacity factor', coldFactor, ''),
      refs(chemistry.coldCapacityCurve.ref),
    ),
    step(
      'requiredCapacityAh',
      'Required rated capacity',
      'C_req = C_P · (1 + m) / (DoD · f_EoL · f_T)',
      'The Peukert capacity with the design margin added, divided by the usable depth of discharge, the end-of-life capacity fraction and the cold-capacity factor.',
      [
        v('C_P', 'Capacity at the discharge rate', peukertAh, 'Ah'),
        v('m', 'Design margin', input.designMargin, ''),
        v('DoD', 'Depth of discharge', dod, ''),
        v('f_EoL', 'End-of-life capacity fraction', input.endOfLifeCapacity, ''),
        v('f_T', 'Cold-capacity factor', coldFactor, ''),
      ],
      v('C_req', 'Required rated capacity', requiredAh, 'Ah'),
      refs(
        REF.ieee485('from memory', 'Same structure as the IEEE 485 sizing: temperature, ageing and design-margin factors.'),
        chemistry.defaultDepthOfDischarge.ref,
      ),
    ),
    step(
      'annexAMaxCurrentA',
      'IEC 60598-2-22 Annex A discharge limit',
      'I_max = f(t) · C / 1 h,  f(1 h) = 0.60, f(1.5 h) = 0.40, f(3 h) = 0.25',
      'Highest recommended average discharge current for the selected pack; f is interpolated linearly between the durations, held at 0.60 below 1 h, and f·t is held at 0.75 beyond 3 h.',
      [v('f', 'Allowed fraction per hour', annexFraction, ''), v('C', 'Selected capacity', selectedAh, 'Ah'), v('I', 'Average current', currentA, 'A')],
      v('I_max', 'Recommended maximum current', annexMaxA, 'A'),
      refs(REF.annexA('published', 'Worked: 4.5 Ah gives 1.125 A for 3 h and 1.8 A for 90 min.')),
    ),
    step(
      'selectedCapacityAh',
      capacityGiven ? 'Pack being checked' : 'Pack chosen',
      capacityGiven ? 'C = given' : 'C = smallest rung ≥ max(C_req, I · 1 h / f)',
      capacityGiven
        ? 'The existing pack, checked against the need.'
        : `The smallest capacity in the list (${ladder.join(', ')} Ah) that meets both the derated need and the Annex A limit.`,
      [v('C_req', 'Required rated capacity', requiredAh, 'Ah'), v('C_A', 'Capacity for the Annex A limit', annexMinAh, 'Ah')],
      v('C', 'Selected capacity', selectedAh, 'Ah'),
      refs(chemistry.capacityLadderAh.ref),
    ),
    step(
      'dischargeCRate',
      'Discharge rate',
      'c = I / C',
      'Average current as a multiple of the rated capacity per hour.',
      [v('I', 'Average current', currentA, 'A'), v('C', 'Selected capacity', selectedAh, 'Ah')],
      v('c', 'Discharge C-rate', dischargeCRate, 'C'),
      refs(REF.iec61951_1('published', 'It = C/1 h is the IEC way of writing a C-rate.')),
    ),
    step(
      'runtimeH',
      'Runtime, new pack',
      'C_u = C · DoD · f_T;  t = C_u / I if I ≤ C_u / H, else t = H · (C_u / (I · H))^k',
      `Runtime of the new pack at the lowest ambient (${input.ambientMin} °C), with the usable depth of discharge; Peukert above the rated current.`,
      [
        v('C_u', 'Usable capacity', usableBeginAh, 'Ah'),
        v('I', 'Average current', currentA, 'A'),
        v('H', 'Rating basis', ratedH, 'h'),
        v('k', 'Peukert exponent', k, ''),
      ],
      v('t', 'Runtime, new', runtimeBeginH, 'h'),
      refs(REF.peukert()),
    ),
    step(
      'runtimeEndOfLifeH',
      'Runtime at end of life',
      'C_u,EoL = C · DoD · f_T · f_EoL;  t from the same Peukert form',
      'Runtime when the pack has aged to its end-of-life capacity fraction.',
      [v('C_u,EoL', 'Usable capacity at end of life', usableEndAh, 'Ah'), v('I', 'Average current', currentA, 'A')],
      v('t_EoL', 'Runtime at end of life', runtimeEndH, 'h'),
      refs(REF.peukert()),
    ),
    step(
      'cutoffCellVoltageV',
      'End-of-discharge voltage per cell',
      input.cutoffCellVoltage !== undefined ? 'V_cut = given' : chemistry.cutoffByDischargeRate ? 'V_cut = table(c)' : 'V_cut = chemistry value',
      chemistry.cutoffByDischargeRate && input.cutoffCellVoltage === undefined
        ? 'Lead-acid: the final voltage falls as the discharge rate rises.'
        : 'The voltage per cell at which the discharge ends.',
      [v('c', 'Discharge C-rate', dischargeCRate, 'C')],
      v('V_cut', 'Cut-off per cell', cutoffCell, 'V'),
      refs((chemistry.cutoffByDischargeRate ?? chemistry.cutoffCellVoltage).ref),
    ),
    step(
      'cutoffVoltageV',
      'End-of-discharge voltage of the pack',
      'V_pack,cut = n · V_cut',
      'Cells in series times the cut-off per cell.',
      [v('n', 'Cells in series', n, ''), v('V_cut', 'Cut-off per cell', cutoffCell, 'V')],
      v('V_pack,cut', 'Pack cut-off', n * cutoffCell, 'V'),
      refs(chemistry.cutoffCellVoltage.ref),
    ),
    step(
      'energyWh',
      'Nominal energy',
      'E = C · n · V_nom',
      'Rated capacity times nominal pack voltage.',
      [v('C', 'Selected capacity', selectedAh, 'Ah'), v('n', 'Cells in series', n, ''), v('V_nom', 'Nominal cell voltage', nominalCell, 'V')],
      v('E', 'Energy', energyWh, 'Wh'),
      refs(chemistry.nominalCellVoltage.ref),
    ),
    step(
      'massKg',
      'Mass (range)',
      'm = E / e_m',
      `Energy divided by the specific energy of ${chemistry.name} packs (${se.min}–${se.max} Wh/kg).`,
      [v('E', 'Energy', energyWh, 'Wh')],
      v('m_max', 'Heaviest estimate', massKg.max, 'kg'),
      refs(chemistry.specificEnergyWhPerKg.ref),
    ),
    step(
      'volumeL',
      'Volume (range)',
      'V = E / e_v',
      `Energy divided by the energy density of ${chemistry.name} packs (${ed.min}–${ed.max} Wh/L).`,
      [v('E', 'Energy', energyWh, 'Wh')],
      v('V_max', 'Largest estimate', volumeL.max, 'L'),
      refs(chemistry.energyDensityWhPerL.ref),
    ),
    step(
      'serviceLifeYears',
      'Service life at the warmest ambient',
      'L = L_ref · 2^(−max(0, T_max − T_ref) / N)',
      `Standby life halves for every ${chemistry.lifeHalvingIntervalC.value} °C above ${chemistry.lifeReferenceTemperatureC} °C; no extra life is credited for a cooler place.`,
      [
        v('L_ref', 'Life at the reference temperature', chemistry.standbyLifeYearsAt25C.value, 'years'),
        v('T_ref', 'Reference temperature', chemistry.lifeReferenceTemperatureC, '°C'),
        v('N', 'Halving interval', chemistry.lifeHalvingIntervalC.value, '°C'),
        v('T_max', 'Warmest ambient', input.ambientMax, '°C'),
      ],
      v('L', 'Service life', lifeYears, 'years'),
      refs(chemistry.standbyLifeYearsAt25C.ref, chemistry.lifeHalvingIntervalC.ref),
    ),
  ]
}
