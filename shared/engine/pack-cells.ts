/**
 * How many cells in series a pack has: given, from the nominal voltage on its label, or chosen for
 * the load (direct drive, converter window, or the chemistry's usual pack). Used by size, charge and replace.
 */
import type { ConverterInput, Driver, Load } from './battery-inputs'
import { REF } from './chemistries/references'
import type { Chemistry } from './chemistries/types'
import { roundToSignificant as round } from './round'
import type { Reference } from './types'

export interface CellChoice {
  cells: number
  /** Which rule set the count: given, the nominal voltage, direct drive, converter minimum input, converter maximum input, or the usual pack. */
  rule: 'given' | 'voltage' | 'direct' | 'window-min' | 'window-max' | 'usual'
}

/** Relative difference under which two nominal voltages are the same rating (4.8 V = 4 × 1.2 V). */
export const SAME_VOLTAGE_TOLERANCE = 0.01

export interface VoltageCells {
  /** Nearest whole number of cells (at least 1). */
  cells: number
  /** Nominal voltage of that many cells, V. */
  nominalVoltageV: number
  /** True when that count gives the asked voltage (within 1 %). */
  exact: boolean
}

/** Whole cells of a chemistry nearest to a nominal pack voltage (4.8 V of NiCd → 4; of LiFePO4 → 2, 6.4 V, not exact). */
export function cellsForVoltage(chemistry: Chemistry, volts: number): VoltageCells {
  const cell = chemistry.nominalCellVoltage.value
  // Ties (4.8 V of 3.2 V cells) go to the higher count; either way the voltage is flagged.
  const cells = Math.max(1, Math.round(volts / cell + 1e-9))
  const nominalVoltageV = cells * cell
  return { cells, nominalVoltageV, exact: sameNominalVoltage(nominalVoltageV, volts) }
}

export const sameNominalVoltage = (a: number, b: number) => Math.abs(a - b) <= SAME_VOLTAGE_TOLERANCE * Math.max(a, b)

const GIVEN_CELLS_REF = REF.commonPractice('Cells in series as given by the user')
const VOLTAGE_CELLS_REF = REF.commonPractice(
  'A replacement pack keeps the nominal voltage the luminaire is marked for',
  'IEC 60598-2-22 marking: battery type, nominal voltage and capacity (from memory).',
)
const DIRECT_CELLS_REF = REF.commonPractice('Direct drive: pack voltage at cut-off must reach the LED forward voltage plus the current limiter’s headroom')
/** Volts a direct-drive current limiter (series resistor or linear regulator) needs above the LED string to hold its current. */
export const DIRECT_DRIVE_HEADROOM_V = 0.3
export const DIRECT_DRIVE_HEADROOM_REF = REF.commonPractice(
  'Linear constant-current limiters need about 0.3–0.5 V across them to regulate; a series resistor needs a share of the supply to set the current',
)
const WINDOW_CELLS_REF = REF.commonPractice('Converter drive: the pack must stay inside the converter input window')

/** Fewest cells that keep the load working to the end-of-discharge voltage, or the given count, or the count for the nominal voltage. */
export function chooseCellsInSeries(
  chemistry: Chemistry,
  driver: Driver,
  load: Load | undefined,
  cutoffCellVoltage: number,
  window: ConverterInput | undefined,
  given?: number,
  nominalVoltage?: number,
): CellChoice {
  if (given !== undefined) return { cells: given, rule: 'given' }
  if (nominalVoltage !== undefined) return { cells: cellsForVoltage(chemistry, nominalVoltage).cells, rule: 'voltage' }
  if (driver === 'direct' && load?.ledVoltage !== undefined) {
    // Tiny tolerance so 3 × 1.0 V exactly reaching 3.0 V does not ask for a 4th cell.
    return { cells: Math.max(1, Math.ceil((load.ledVoltage + DIRECT_DRIVE_HEADROOM_V) / cutoffCellVoltage - 1e-9)), rule: 'direct' }
  }
  if (window?.min !== undefined) {
    return { cells: Math.max(1, Math.ceil(window.min / cutoffCellVoltage - 1e-9)), rule: 'window-min' }
  }
  const preferred = chemistry.defaultCellsInSeries.value
  if (window?.max !== undefined) {
    return { cells: Math.max(1, Math.min(preferred, Math.floor(window.max / chemistry.fullChargeCellVoltage.value + 1e-9))), rule: 'window-max' }
  }
  return { cells: preferred, rule: 'usual' }
}

/** Words and source for the working step of a cell choice (built only when the working is shown). */
export function describeCellChoice(
  choice: CellChoice,
  chemistry: Chemistry,
  load: Load | undefined,
  cutoffCellVoltage: number,
  window: ConverterInput | undefined,
  nominalVoltage?: number,
): { explanation: string; reference: Reference } {
  const preferred = chemistry.defaultCellsInSeries.value
  switch (choice.rule) {
    case 'given':
      return { explanation: 'Cells in series as given.', reference: GIVEN_CELLS_REF }
    case 'voltage':
      return {
        explanation: `Whole ${chemistry.name} cells (${chemistry.nominalCellVoltage.value} V each) nearest to the nominal pack voltage ${round(nominalVoltage as number)} V.`,
        reference: VOLTAGE_CELLS_REF,
      }
    case 'direct':
      return {
        explanation: `Fewest cells whose end-of-discharge voltage (n × ${cutoffCellVoltage} V) still reaches the LED string voltage ${round(load?.ledVoltage as number)} V plus ${DIRECT_DRIVE_HEADROOM_V} V for the current limiter, so the string stays lit at its current to the cut-off.`,
        reference: DIRECT_CELLS_REF,
      }
    case 'window-min':
      return {
        explanation: `Fewest cells whose end-of-discharge voltage (n × ${cutoffCellVoltage} V) stays at or above the converter's minimum input ${round(window?.min as number)} V.`,
        reference: WINDOW_CELLS_REF,
      }
    case 'window-max':
      return {
        explanation: `The usual ${preferred}-cell pack for ${chemistry.name}, reduced if needed so the full-charge voltage (n × ${chemistry.fullChargeCellVoltage.value} V) stays at or below the converter's maximum input ${round(window?.max as number)} V.`,
        reference: chemistry.defaultCellsInSeries.ref,
      }
    default:
      return {
        explanation: `No converter input window given: the usual ${preferred}-cell pack for ${chemistry.name}.`,
        reference: chemistry.defaultCellsInSeries.ref,
      }
  }
}
