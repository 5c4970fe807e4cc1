/** Sealed nickel-metal hydride. */
import { REF } from './references'
import { sourced as s } from './sourced'
import type { Chemistry } from './types'

export const NIMH: Chemistry = {
  id: 'nimh',
  name: 'Nickel-metal hydride',
  family: 'nickel',
  nominalCellVoltage: s(1.2, 'V', REF.iec61951_2()),
  cutoffCellVoltage: s(1.0, 'V', REF.nimhMakerManual('published', 'End-of-discharge voltage of the capacity test.')),
  minSafeCellVoltage: s(0.9, 'V', REF.commonPractice('Series NiMH packs: stop near 0.9–1.0 V/cell so no cell is driven into reversal')),
  fullChargeCellVoltage: s(1.45, 'V', REF.handbook('from memory', 'Cell voltage near the end of a 0.1 It charge at 20 °C.')),
  standardChargeRateC: s(0.1, 'C', REF.iec61951_2('published', 'Standard charge 0.1 It for 16 h, the capacity test condition.')),
  chargeFactor: s(1.5, 'Ah/Ah', REF.nimhMakerManual('published', 'Charge efficiency about two thirds at 0.1 It.')),
  continuousChargeRangeC: s(
    { min: 1 / 50, max: 1 / 30 },
    'C',
    REF.nimhMakerManual('from memory', 'Permanent trickle above about C/30 warms the cell and shortens its life; C/30–C/50 is the usual recommendation.'),
  ),
  maxChargeRateC: s(0.1, 'C', REF.nimhMakerManual('published', 'Without end-of-charge detection: overcharge at most 0.1 It.')),
  chargeTemperatureC: s({ min: 0, max: 45 }, '°C', REF.nimhMakerManual()),
  dischargeTemperatureC: s({ min: -10, max: 65 }, '°C', REF.nimhMakerManual()),
  selfDischargePctPerMonth: s({ min: 10, max: 30 }, '%/month', REF.handbook('published', 'Modern cells 10–15 %/month, older cells about 30 %.')),
  standbyLifeYearsAt25C: s(4, 'years', REF.commonPractice('NiMH emergency packs on a controlled trickle', 'Shorter if trickled above C/30.')),
  lifeHalvingIntervalC: s(10, '°C', REF.arrhenius10C()),
  lifeReferenceTemperatureC: 25,
  coldCapacityCurve: s(
    [
      [-40, 0.1],
      [-20, 0.35],
      [-10, 0.6],
      [0, 0.8],
      [20, 1],
      [85, 1],
    ],
    'fraction',
    REF.handbook('from memory'),
  ),
  peukertExponent: s({ min: 1.05, max: 1.1 }, '', REF.commonPractice('Battery-monitor makers’ tables of Peukert exponents')),
  defaultPeukertExponent: 1.08,
  defaultRatedHours: 5,
  specificEnergyWhPerKg: s({ min: 60, max: 100 }, 'Wh/kg', REF.handbook()),
  energyDensityWhPerL: s({ min: 140, max: 300 }, 'Wh/L', REF.handbook()),
  trickleTolerance: 0.4,
  noChargeBelowFreezing: false,
  capacityLadderAh: s(
    [0.6, 0.8, 1.1, 1.5, 1.8, 2.2, 2.5, 3.0, 3.5, 4.0, 4.5, 5.0, 7.0, 10.0],
    'Ah',
    REF.commonPractice('Common sizes of NiMH emergency packs (AA, sub-C, C, D cells)'),
  ),
  defaultCellsInSeries: s(3, 'cells', REF.commonPractice('3.6 V packs are common in converter-driven LED emergency luminaires')),
  defaultDepthOfDischarge: s(1, 'fraction', REF.commonPractice('Rated capacity is defined to the end-of-discharge voltage')),
  regulatoryBurden: 0.1,
  disposal: ['Return cells to a battery collection point for nickel recovery; do not put them in household waste.'],
  regulatory: ['EU Regulation 2023/1542 applies (collection, labelling, removability); no substance restriction specific to NiMH.'],
  hazards: [
    'Isolate the mains before opening the luminaire; a charged pack can deliver a high short-circuit current.',
    'A permanent trickle that NiCd tolerates can overheat NiMH: keep the trickle at or below about C/30.',
  ],
}
