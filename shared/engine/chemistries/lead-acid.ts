/** Valve-regulated lead-acid (VRLA, AGM or gel). */
import { REF } from './references'
import { sourced as s } from './sourced'
import type { Chemistry } from './types'

export const LEAD_ACID: Chemistry = {
  id: 'lead-acid',
  name: 'Lead-acid (VRLA)',
  family: 'lead',
  nominalCellVoltage: s(2.0, 'V', REF.iec61056_1()),
  cutoffCellVoltage: s(1.75, 'V', REF.vrlaMakerManual('published', 'At rates up to 0.2 C; lower at higher rates (see cutoffByDischargeRate).')),
  minSafeCellVoltage: s(
    1.3,
    'V',
    REF.vrlaMakerManual(
      'published',
      'The lowest final voltage of the makers’ rate table (above 1 C). At a known rate the table’s own value is the limit (see cutoffByDischargeRate); below it the block is over-discharged.',
    ),
  ),
  fullChargeCellVoltage: s(2.3, 'V', REF.vrlaMakerManual('published', 'Top of the 2.25–2.30 V/cell float band at 25 °C.')),
  standardChargeRateC: s(0.1, 'C', REF.commonPractice('Standby chargers supply at least 0.1 C10 (central-battery practice)')),
  chargeFactor: s(1.1, 'Ah/Ah', REF.vrlaMakerManual('published', 'About 110 % of the charge taken out must be put back.')),
  continuousChargeRangeC: s(
    { min: 0, max: 0.005 },
    'C',
    REF.vrlaMakerManual(
      'common practice',
      'Lead-acid is floated at constant voltage; a healthy cell then draws about 1 mA per Ah. A fixed trickle current above a few mA per Ah overcharges it.',
    ),
  ),
  float: {
    cellVoltageAt25C: s(2.25, 'V', REF.vrlaMakerManual('published', 'Float set point at 25 °C.')),
    coefficientVPerC: s(-0.003, 'V/°C', REF.vrlaMakerManual('published', '−3 mV per °C per cell (−18 mV/°C per 6-cell block).')),
    bandAt25C: s({ min: 2.25, max: 2.3 }, 'V', REF.vrlaMakerManual('published')),
    compensationLimitsC: { min: 5, max: 40 },
  },
  maxChargeRateC: s(0.3, 'C', REF.vrlaMakerManual('published', 'Maximum initial charge current 0.3 C (0.25 C also common).')),
  chargeTemperatureC: s({ min: -15, max: 50 }, '°C', REF.vrlaMakerManual('published', 'Gel-type range; AGM ranges are similar.')),
  dischargeTemperatureC: s({ min: -20, max: 60 }, '°C', REF.handbook('published')),
  selfDischargePctPerMonth: s({ min: 4, max: 6 }, '%/month', REF.handbook('published')),
  standbyLifeYearsAt25C: s(
    5,
    'years',
    REF.commonPractice('General-purpose small VRLA blocks: 3–5 year design-life class', 'Long-life blocks reach 10–12 years.'),
  ),
  lifeHalvingIntervalC: s(8, '°C', REF.lifeHalving8C()),
  lifeReferenceTemperatureC: 25,
  coldCapacityCurve: s(
    [
      [-40, 0.3],
      [-20, 0.5],
      [0, 0.72],
      [4.4, 0.77],
      [10, 0.84],
      [15.6, 0.9],
      [25, 1],
      [85, 1],
    ],
    'fraction',
    REF.ieee485('from memory', 'Inverse of the temperature correction factors (1.30 at 4.4 °C, 1.19 at 10 °C, 1.11 at 15.6 °C); below 4.4 °C extrapolated.'),
  ),
  peukertExponent: s({ min: 1.05, max: 1.3 }, '', REF.handbook('published', 'AGM 1.05–1.15, gel 1.10–1.20, flooded 1.20–1.30.')),
  defaultPeukertExponent: 1.15,
  defaultRatedHours: 20,
  specificEnergyWhPerKg: s({ min: 30, max: 40 }, 'Wh/kg', REF.handbook()),
  energyDensityWhPerL: s({ min: 60, max: 90 }, 'Wh/L', REF.handbook()),
  trickleTolerance: 0.9,
  noChargeBelowFreezing: false,
  capacityLadderAh: s([0.8, 1.2, 2.3, 3.2, 4.5, 7.0, 12, 18, 26, 40, 65, 100], 'Ah', REF.commonPractice('Common VRLA block capacities (C20)')),
  defaultCellsInSeries: s(3, 'cells', REF.commonPractice('6 V blocks are common in self-contained luminaires')),
  defaultDepthOfDischarge: s(1, 'fraction', REF.commonPractice('Rated capacity is defined to the end-of-discharge voltage')),
  cutoffByDischargeRate: s(
    [
      [0.2, 1.75],
      [0.5, 1.7],
      [1, 1.55],
      [100, 1.3],
    ],
    'V',
    REF.vrlaMakerManual('published', 'Final voltage by discharge rate: ≤ 0.2 C 1.75 V, 0.2–0.5 C 1.70 V, 0.5–1 C 1.55 V, above 1 C 1.30 V per cell.'),
  ),
  regulatoryBurden: 0.4,
  disposal: ['Lead and sulphuric acid: return blocks to a battery recycler (lead-acid recycling is well established); never put them in household waste.'],
  regulatory: [
    'EU Regulation 2023/1542 applies; portable batteries carry Pb under the bin symbol above 0.004 % lead.',
    'Store charged: a block left discharged sulphates and loses capacity for good.',
  ],
  hazards: [
    'Isolate the mains before opening the luminaire; blocks deliver very high short-circuit currents.',
    'Contains sulphuric acid and lead; a damaged or overcharged block can vent hydrogen.',
  ],
}
