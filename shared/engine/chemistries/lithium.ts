/** Lithium chemistries: LiFePO4 (the one used in emergency lighting) and NMC Li-ion (for comparison). */
import { REF } from './references'
import { sourced as s } from './sourced'
import type { Chemistry } from './types'

const LITHIUM_REGULATORY = [
  'Transport of cells and packs needs UN 38.3 test evidence and the dangerous-goods rules for lithium batteries (UN 3480/3481).',
  'IEC 62133-2 (portable) or IEC 62619 (industrial, including emergency power) covers cell and pack safety; a battery management system with charge-temperature limits is expected.',
  'EU Regulation 2023/1542 applies (collection, labelling, removability).',
]
const LITHIUM_DISPOSAL = [
  'Return packs to a battery collection point; tape the terminals first. Damaged or swollen packs are a fire risk: isolate them outdoors in a non-combustible container.',
]
const LITHIUM_HAZARDS = [
  'Isolate the mains before opening the luminaire.',
  'Lithium cells can overheat and burn when crushed, shorted, overcharged or charged below 0 °C.',
  'Charge only within the pack maker’s temperature window; the charger must stop below 0 °C.',
]

export const LIFEPO4: Chemistry = {
  id: 'lifepo4',
  name: 'Lithium iron phosphate (LiFePO4)',
  family: 'lithium',
  nominalCellVoltage: s(3.2, 'V', REF.lithiumMakerManual('published')),
  cutoffCellVoltage: s(2.5, 'V', REF.lithiumMakerManual('published', 'Some makers allow 2.0–2.8 V.')),
  minSafeCellVoltage: s(2.0, 'V', REF.lithiumMakerManual('published')),
  fullChargeCellVoltage: s(3.6, 'V', REF.lithiumMakerManual('published', 'Charge voltage 3.6–3.65 V per cell.')),
  maxChargeCellVoltage: s(
    3.65,
    'V',
    REF.lithiumMakerManual('published', 'Constant-voltage stage at 3.60–3.65 V per cell; 3.65 V is the top of the band, not an overvoltage.'),
  ),
  coldCharge: {
    belowC: 10,
    maxRateC: s(
      0.1,
      'C',
      REF.lithiumMakerManual(
        'published',
        'LiFePO4 pack makers’ operation manuals: no charge below 0 °C, at most 0.1 C from 0 to 5 °C and 0.1–0.2 C from 5 to 10 °C; 0.1 C is taken for the whole 0–10 °C band.',
      ),
    ),
  },
  standardChargeRateC: s(0.5, 'C', REF.lithiumMakerManual()),
  chargeFactor: s(1.05, 'Ah/Ah', REF.commonPractice('Lithium coulombic efficiency is close to 100 %; 5 % covers the taper phase')),
  continuousChargeRangeC: s(
    { min: 0, max: 0 },
    'C',
    REF.iec62133('common practice', 'No trickle at full voltage: the charger stops and recharges on a voltage drop.'),
  ),
  maxChargeRateC: s(1, 'C', REF.lithiumMakerManual()),
  chargeTemperatureC: s({ min: 0, max: 45 }, '°C', REF.lithiumMakerManual()),
  dischargeTemperatureC: s({ min: -20, max: 60 }, '°C', REF.lithiumMakerManual()),
  selfDischargePctPerMonth: s({ min: 1, max: 3 }, '%/month', REF.handbook('published')),
  standbyLifeYearsAt25C: s(
    8,
    'years',
    REF.lithiumMakerManual('from memory', 'Calendar life held near full charge; LiFePO4 ages much less at high charge than cobalt-based cells.'),
  ),
  lifeHalvingIntervalC: s(10, '°C', REF.arrhenius10C()),
  lifeReferenceTemperatureC: 25,
  coldCapacityCurve: s(
    [
      [-40, 0.3],
      [-20, 0.6],
      [0, 0.85],
      [25, 1],
      [85, 1],
    ],
    'fraction',
    REF.handbook('from memory'),
  ),
  peukertExponent: s({ min: 1.02, max: 1.08 }, '', REF.commonPractice('Battery-monitor makers’ tables of Peukert exponents')),
  defaultPeukertExponent: 1.05,
  defaultRatedHours: 5,
  specificEnergyWhPerKg: s({ min: 90, max: 140 }, 'Wh/kg', REF.handbook('from memory', 'Small packs, including case and protection board.')),
  energyDensityWhPerL: s({ min: 180, max: 300 }, 'Wh/L', REF.handbook('from memory')),
  trickleTolerance: 0.6,
  noChargeBelowFreezing: true,
  capacityLadderAh: s(
    [0.6, 1.0, 1.5, 1.8, 3.0, 3.2, 4.5, 6.0, 10, 20, 40, 100],
    'Ah',
    REF.commonPractice('Common LiFePO4 cell and pack capacities (14500, 18650, 26650, prismatic)'),
  ),
  defaultCellsInSeries: s(1, 'cells', REF.commonPractice('Single-cell 3.2 V packs are common in converter-driven LED emergency luminaires')),
  defaultDepthOfDischarge: s(0.9, 'fraction', REF.commonPractice('The protection board cuts off before the last few per cent')),
  regulatoryBurden: 0.4,
  disposal: LITHIUM_DISPOSAL,
  regulatory: LITHIUM_REGULATORY,
  hazards: LITHIUM_HAZARDS,
}

export const LI_ION: Chemistry = {
  id: 'li-ion',
  name: 'Lithium-ion (NMC)',
  family: 'lithium',
  nominalCellVoltage: s(3.6, 'V', REF.iec61960('published', 'NMC/cobalt cells: 3.6–3.7 V nominal.')),
  cutoffCellVoltage: s(3.0, 'V', REF.commonPractice('Typical end-of-discharge voltage of protected NMC packs')),
  minSafeCellVoltage: s(2.5, 'V', REF.lithiumMakerManual('published', 'Do not discharge below 2.5 V per cell.')),
  fullChargeCellVoltage: s(4.2, 'V', REF.lithiumMakerManual('published')),
  standardChargeRateC: s(0.5, 'C', REF.lithiumMakerManual()),
  chargeFactor: s(1.05, 'Ah/Ah', REF.commonPractice('Lithium coulombic efficiency is close to 100 %; 5 % covers the taper phase')),
  continuousChargeRangeC: s(
    { min: 0, max: 0 },
    'C',
    REF.iec62133('common practice', 'No trickle at full voltage: the charger stops and recharges on a voltage drop.'),
  ),
  maxChargeRateC: s(0.7, 'C', REF.lithiumMakerManual()),
  chargeTemperatureC: s({ min: 0, max: 45 }, '°C', REF.lithiumMakerManual()),
  dischargeTemperatureC: s({ min: -20, max: 60 }, '°C', REF.lithiumMakerManual()),
  selfDischargePctPerMonth: s(
    { min: 2, max: 5 },
    '%/month',
    REF.handbook('published', 'About 1–2 %/month in the cell plus about 3 %/month for the protection circuit.'),
  ),
  standbyLifeYearsAt25C: s(
    2,
    'years',
    REF.handbook('derived', 'Cobalt-type cells kept full lose about 20 % of capacity a year at 25 °C (35 % at 40 °C); that reaches 80 % in 1–2 years.'),
  ),
  lifeHalvingIntervalC: s(10, '°C', REF.arrhenius10C()),
  lifeReferenceTemperatureC: 25,
  coldCapacityCurve: s(
    [
      [-40, 0.3],
      [-20, 0.65],
      [0, 0.85],
      [25, 1],
      [85, 1],
    ],
    'fraction',
    REF.handbook('from memory'),
  ),
  peukertExponent: s({ min: 1.02, max: 1.08 }, '', REF.commonPractice('Battery-monitor makers’ tables of Peukert exponents')),
  defaultPeukertExponent: 1.05,
  defaultRatedHours: 5,
  specificEnergyWhPerKg: s({ min: 120, max: 220 }, 'Wh/kg', REF.handbook('from memory', 'Small packs, including case and protection board.')),
  energyDensityWhPerL: s({ min: 250, max: 500 }, 'Wh/L', REF.handbook('from memory')),
  trickleTolerance: 0.2,
  noChargeBelowFreezing: true,
  capacityLadderAh: s(
    [1.5, 2.0, 2.6, 3.0, 3.5, 5.0, 7.0, 10, 20],
    'Ah',
    REF.commonPractice('Common NMC cell and pack capacities (18650, 21700, parallel packs)'),
  ),
  defaultCellsInSeries: s(1, 'cells', REF.commonPractice('Single-cell packs are common in converter-driven LED luminaires')),
  defaultDepthOfDischarge: s(0.9, 'fraction', REF.commonPractice('The protection board cuts off before the last few per cent')),
  regulatoryBurden: 0.6,
  disposal: LITHIUM_DISPOSAL,
  regulatory: LITHIUM_REGULATORY,
  hazards: LITHIUM_HAZARDS,
}
