/** The charger check's form: nothing measured is filled in for the person (common practice: a verdict only for a measured current). */
import { describe, expect, test } from 'vitest'
import { CHEMISTRY_IDS } from '../../shared/engine/chemistries'
import { chargerDefaultsFor } from '../../src/lib/charger-form'
import { recalcCharge } from '../../src/lib/pack-recalc'

describe('charger check starting values', () => {
  test.each(CHEMISTRY_IDS)('%s: charge and trickle currents start empty, so no verdict shows for a current nobody measured', (chemistry) => {
    const values = chargerDefaultsFor(chemistry)
    expect(values.chargeCurrent).toBeUndefined()
    expect(values.trickleCurrent).toBeUndefined()
    expect(recalcCharge(values).result).toBeUndefined()
  })
})
