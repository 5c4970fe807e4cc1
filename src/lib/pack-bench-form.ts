/**
 * What the pack bench does to its form values when the chemistry changes. Plain TypeScript (no Vue)
 * so the rule is tested on its own.
 */
import type { ChemistryId } from '../../shared/engine/chemistries'
import type { SizeResult } from '../../shared/engine/size'

export type BenchValues = Record<string, unknown>

/**
 * The form values after the chemistry select changes to `next`. The pack keeps its nominal voltage:
 * the voltage is written into the form (unless one is typed already) and the cell count is cleared,
 * so the engine recomputes the cells for the new chemistry and warns critically when no whole
 * number of its cells makes that voltage. Per-cell voltages of the old chemistry are cleared too.
 */
export function changeChemistry(values: BenchValues, next: ChemistryId, previous: Pick<SizeResult, 'nominalVoltageV'> | undefined): BenchValues {
  if (values.chemistry === next) return values
  const { cellsInSeries: _cells, averageCellVoltage: _average, cutoffCellVoltage: _cutoff, ...rest } = values
  const typed = typeof values.nominalVoltage === 'string' ? values.nominalVoltage.trim() : values.nominalVoltage
  const nominalVoltage = typed !== undefined && typed !== '' ? typed : previous ? `${Number(previous.nominalVoltageV.toPrecision(4))} V` : undefined
  return nominalVoltage === undefined ? { ...rest, chemistry: next } : { ...rest, chemistry: next, nominalVoltage }
}
