/** The battery chemistries the engine knows, by id. */
import { NICD, NICD_HT } from './nicd'
import { NIMH } from './nimh'
import { LEAD_ACID } from './lead-acid'
import { LIFEPO4, LI_ION } from './lithium'
import type { Chemistry, ChemistryId } from './types'

export type { Chemistry, ChemistryId, Range, Sourced } from './types'

export const CHEMISTRY_IDS = ['nicd', 'nicd-ht', 'nimh', 'lifepo4', 'lead-acid', 'li-ion'] as const satisfies readonly ChemistryId[]

export const CHEMISTRIES: Readonly<Record<ChemistryId, Chemistry>> = {
  nicd: NICD,
  'nicd-ht': NICD_HT,
  nimh: NIMH,
  lifepo4: LIFEPO4,
  'lead-acid': LEAD_ACID,
  'li-ion': LI_ION,
}

export function getChemistry(id: ChemistryId): Chemistry {
  const chemistry = CHEMISTRIES[id]
  if (!chemistry) throw new Error(`unknown chemistry "${String(id)}"`)
  return chemistry
}
