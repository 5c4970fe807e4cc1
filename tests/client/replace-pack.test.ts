/** The Replace a pack screen's sheet inputs: the chosen pack reaches the sheet as the tool judged it. */
import { describe, expect, test } from 'vitest'
import { sizeInputSchema, sizePack } from '../../shared/engine/size'
import { recalcReplace, sheetInputsFor } from '../../src/lib/replace-pack'

const LABEL = {
  oldPack: { chemistry: 'nicd', nominalVoltage: '4.8 V', capacity: '1.6 Ah', cellFormat: 'sub-C' },
  duration: '3 h',
  mode: 'non-maintained',
  driver: 'converter',
  driverEfficiency: '0.85',
  charger: { type: 'nickel-constant-current', chargeCurrent: '120 mA' },
  ambientMin: '5 °C',
  ambientMax: '25 °C',
}

describe('the recommended pack on a sheet (size tool, common practice)', () => {
  test.each([LABEL, { ...LABEL, dischargeCurrent: '300 mA' }, { ...LABEL, load: { power: '1.2 W' } }])(
    'keeps voltage, format and charger, and covers the duration there too: %o',
    (raw) => {
      const { result } = recalcReplace(raw)
      if (!result || result.recommended === null) throw new Error('no recommendation')
      const c = result.candidates[result.recommended]
      const sized = sizePack(sizeInputSchema.parse(sheetInputsFor(raw, result, c)))
      expect(sized.nominalVoltageV).toBeCloseTo(c.nominalVoltageV, 9)
      expect(sized.cellFormat).toBe(c.cellFormat)
      expect(sized.chargerCheck?.compatible).toBe(c.chargerCompatible)
      expect(sized.warnings.map((w) => w.code)).not.toContain('pack-too-small-end-of-life')
      expect(sized.warnings.map((w) => w.code)).not.toContain('pack-too-small')
    },
  )
})
