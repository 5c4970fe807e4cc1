/** Sealed nickel-cadmium: the standard cell and the high-temperature cell built for warm luminaires. */
import { REF } from './references'
import { sourced as s } from './sourced'
import type { Chemistry } from './types'

const CADMIUM_REGULATORY = [
  'EU Regulation 2023/1542, Annex I: portable batteries may hold at most 0.002 % cadmium by weight. The old emergency-lighting exemption of Directive 2006/66/EC was not carried over.',
  'Whether an emergency-lighting pack counts as a portable or an industrial battery is not settled (some authorities and trade bodies treat packs for building safety systems as industrial). Check the classification with the supplier or a legal adviser before specifying NiCd in the EU.',
  'Packs above 0.002 % Cd carry the chemical symbol Cd under the crossed-out wheeled bin.',
]
const CADMIUM_DISPOSAL = [
  'Cadmium is toxic: never put cells in household waste or incinerate them; return them to a battery collection point or the supplier for recycling.',
]
const NICKEL_HAZARDS = [
  'Isolate the mains before opening the luminaire; a charged pack can deliver a high short-circuit current.',
  'Never reverse-charge a cell: stop discharging a series pack at the end-of-discharge voltage.',
]

const NICD_LADDER = [0.5, 0.8, 1.1, 1.5, 1.6, 2.2, 2.5, 3.0, 4.0, 4.5, 5.0, 7.0, 10.0]

export const NICD: Chemistry = {
  id: 'nicd',
  name: 'Nickel-cadmium (standard cells)',
  family: 'nickel',
  nominalCellVoltage: s(1.2, 'V', REF.iec61951_1()),
  cutoffCellVoltage: s(1.0, 'V', REF.iec61951_1('published', 'End-of-discharge voltage of the rated-capacity test at 0.2 It.')),
  minSafeCellVoltage: s(0.9, 'V', REF.commonPractice('Series NiCd packs: stop near 0.9–1.0 V/cell so no cell is driven into reversal')),
  fullChargeCellVoltage: s(1.45, 'V', REF.handbook('from memory', 'Cell voltage near the end of a 0.1 It charge at 20 °C.')),
  standardChargeRateC: s(0.1, 'C', REF.iec61951_1('from memory', 'Standard charge 0.1 It for 16 h at 20 °C.')),
  chargeFactor: s(1.4, 'Ah/Ah', REF.handbook('from memory', 'About 140 % of the charge taken out at 0.1 It; more at lower rates.')),
  continuousChargeRangeC: s(
    { min: 1 / 30, max: 1 / 20 },
    'C',
    REF.referenceBook(
      'common practice',
      'Standard cells accept permanent charge from about C/30 (enough to offset self-discharge) to C/20; 0.1 It is a timed charge, not a permanent one.',
    ),
  ),
  maxChargeRateC: s(0.1, 'C', REF.commonPractice('Chargers without end-of-charge control stay at or below 0.1 It (the standard charge rate)')),
  chargeTemperatureC: s({ min: 0, max: 40 }, '°C', REF.nickelMakerManual()),
  dischargeTemperatureC: s({ min: -20, max: 40 }, '°C', REF.nickelMakerManual()),
  selfDischargePctPerMonth: s({ min: 10, max: 20 }, '%/month', REF.handbook('published')),
  standbyLifeYearsAt25C: s(
    5,
    'years',
    REF.commonPractice('Standard NiCd on permanent charge in a cool luminaire', 'IEC 60598-2-22 asks for at least 4 years.'),
  ),
  lifeHalvingIntervalC: s(10, '°C', REF.arrhenius10C()),
  lifeReferenceTemperatureC: 25,
  coldCapacityCurve: s(
    [
      [-40, 0.25],
      [-20, 0.55],
      [0, 0.85],
      [20, 1],
      [85, 1],
    ],
    'fraction',
    REF.nickelMakerManual('published', '50–60 % of capacity at −20 °C; the 0 °C and −40 °C points are from memory.'),
  ),
  peukertExponent: s({ min: 1.05, max: 1.2 }, '', REF.handbook('from memory')),
  defaultPeukertExponent: 1.1,
  defaultRatedHours: 5,
  specificEnergyWhPerKg: s({ min: 40, max: 60 }, 'Wh/kg', REF.handbook()),
  energyDensityWhPerL: s({ min: 80, max: 150 }, 'Wh/L', REF.handbook()),
  trickleTolerance: 0.8,
  noChargeBelowFreezing: false,
  capacityLadderAh: s(NICD_LADDER, 'Ah', REF.commonPractice('Common sizes of emergency-lighting NiCd packs (sub-C, C, D and larger cells)')),
  defaultCellsInSeries: s(3, 'cells', REF.commonPractice('3.6 V packs are common in converter-driven LED emergency luminaires')),
  defaultDepthOfDischarge: s(1, 'fraction', REF.commonPractice('Rated capacity is defined to the end-of-discharge voltage')),
  regulatoryBurden: 0.9,
  disposal: CADMIUM_DISPOSAL,
  regulatory: CADMIUM_REGULATORY,
  hazards: NICKEL_HAZARDS,
}

export const NICD_HT: Chemistry = {
  ...NICD,
  id: 'nicd-ht',
  name: 'Nickel-cadmium (high-temperature cells)',
  fullChargeCellVoltage: s(1.42, 'V', REF.handbook('from memory', 'Lower on charge than standard cells at the same rate, warm.')),
  chargeFactor: s(1.5, 'Ah/Ah', REF.handbook('from memory', 'Charge acceptance falls as the cell warms.')),
  continuousChargeRangeC: s(
    { min: 1 / 30, max: 0.1 },
    'C',
    REF.iec60285('from memory', 'Cells built for permanent charge at elevated temperature; about 0.05 It is typical, 0.1 It the usual upper limit.'),
  ),
  chargeTemperatureC: s({ min: 0, max: 55 }, '°C', REF.nickelMakerManual('from memory', 'Permanent charge up to about 50–55 °C.')),
  dischargeTemperatureC: s({ min: -20, max: 55 }, '°C', REF.nickelMakerManual('from memory')),
  standbyLifeYearsAt25C: s(
    4,
    'years',
    REF.annexA('from memory', 'Built to give the 4-year design life on permanent charge up to about 50 °C; no extra life is credited when cooler.'),
  ),
  lifeHalvingIntervalC: s(10, '°C', REF.arrhenius10C()),
  lifeReferenceTemperatureC: 50,
  coldCapacityCurve: s(
    [
      [-40, 0.2],
      [-20, 0.45],
      [0, 0.8],
      [20, 1],
      [85, 1],
    ],
    'fraction',
    REF.nickelMakerManual('published', '40–50 % of capacity at −20 °C for high-temperature cells; the 0 °C and −40 °C points are from memory.'),
  ),
  trickleTolerance: 1,
  capacityLadderAh: s(
    NICD_LADDER.filter((c) => c >= 0.8),
    'Ah',
    REF.commonPractice('Common sizes of high-temperature NiCd emergency packs'),
  ),
}
