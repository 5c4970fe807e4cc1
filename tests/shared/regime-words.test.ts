/**
 * Words, supply and notes by regime. Sources: IEC 60038:2009 table 1 (230 V 50 Hz; 120/208 V,
 * 277/480 V and 347/600 V 60 Hz systems, from memory); NFPA 101 7.2.1 and 7.9 ("means of egress",
 * "authority having jurisdiction"); EU Regulation 2023/1542 (cadmium in portable batteries) applies
 * in the EU and, for this purpose, UK practice follows it (common practice); IEC 60598-2-22 annexes
 * apply where luminaires are certified to IEC (UK, EU, AS/NZS 2293.3 from memory), not under UL 924
 * or CSA C22.2 No. 141.
 */
import { describe, expect, test } from 'vitest'
import { REGIME_IDS } from '../../shared/engine/regimes'
import { REGIME_WORDS, regimeWords, warningsForRegime } from '../../shared/labels/regime-words'

const NICD_NOTES = [
  { code: 'cadmium-restricted', message: 'Cadmium: EU Regulation 2023/1542 …' },
  { code: 'annex-a-discharge-exceeded', message: 'IEC 60598-2-22 Annex A …' },
  { code: 'design-life-below-4-years', message: 'at least 4 years …' },
  { code: 'competent-person', message: 'A competent person …' },
]

describe('words by regime', () => {
  test('a US site reads egress path, normal power, battery unit or emergency driver, the authority having jurisdiction, 120/277 V 60 Hz', () => {
    const w = REGIME_WORDS.nfpa101
    expect([w.escapeRoute, w.normalSupply, w.batteryUnit, w.authority, w.supplyVoltage, w.supplyFrequencyHz]).toEqual([
      'egress path',
      'normal power',
      'battery unit or emergency driver',
      'authority having jurisdiction',
      '120/277 V',
      60,
    ])
    expect(w.isolateCaution).not.toMatch(/mains/i)
    expect(w.spacingCriteria).toBe('nfpa101')
  })

  test('a UK or EU site reads escape route and mains at 230 V 50 Hz, with EN 1838 as the spacing default', () => {
    const w = REGIME_WORDS.en50172
    expect([w.escapeRoute, w.normalSupply, w.supplyVoltage, w.supplyFrequencyHz, w.spacingCriteria]).toEqual([
      'escape route',
      'mains',
      '230 V',
      50,
      'en1838-route',
    ])
  })

  test('a Canadian site is 60 Hz with 347 V lighting circuits; Australia and New Zealand 230 V 50 Hz', () => {
    expect(REGIME_WORDS['ca-nfc']).toMatchObject({ supplyVoltage: '120/347 V', supplyFrequencyHz: 60, authority: 'authority having jurisdiction' })
    expect(REGIME_WORDS.asnzs2293).toMatchObject({ supplyVoltage: '230 V', supplyFrequencyHz: 50 })
  })

  test('every regime says that local rules and a competent or licensed person decide', () => {
    for (const id of REGIME_IDS) expect(REGIME_WORDS[id].localCodes).toMatch(/decide/)
  })

  test('an unknown regime reads as the UK/EU one instead of breaking the page', () => {
    expect(regimeWords('bs5266-1999')).toBe(REGIME_WORDS.en50172)
    expect(regimeWords(undefined)).toBe(REGIME_WORDS.en50172)
  })
})

describe('notes only where they apply', () => {
  test('a NiCd result on a US site drops the EU cadmium and IEC annex notes but keeps the competent-person caution', () => {
    expect(warningsForRegime(NICD_NOTES, 'nfpa101').map((w) => w.code)).toEqual(['competent-person'])
    expect(warningsForRegime(NICD_NOTES, 'ca-nfc').map((w) => w.code)).toEqual(['competent-person'])
  })
  test('a UK/EU site keeps all of them; AS/NZS keeps the IEC annex notes but not the EU cadmium limit', () => {
    expect(warningsForRegime(NICD_NOTES, 'en50172')).toHaveLength(4)
    expect(warningsForRegime(NICD_NOTES, 'asnzs2293').map((w) => w.code)).toEqual([
      'annex-a-discharge-exceeded',
      'design-life-below-4-years',
      'competent-person',
    ])
  })
})

describe('myths corrected where they surface', () => {
  test('superseded UK regimes are corrected only for UK/EU sites, with the edition that superseded them', () => {
    const uk = REGIME_WORDS.en50172.myths.find((m) => /three years/.test(m.claim))
    expect(uk?.source).toMatch(/BS 5266-1:2025/)
    for (const id of ['nfpa101', 'ca-nfc', 'asnzs2293'] as const) expect(REGIME_WORDS[id].myths.some((m) => /three years/.test(m.claim))).toBe(false)
  })
  test('"replace every 4 years" and "self-testing units need no records" are corrected everywhere, each with a source', () => {
    for (const id of REGIME_IDS) {
      const claims = REGIME_WORDS[id].myths.map((m) => m.claim).join(' ')
      expect(claims).toMatch(/every 4 years/)
      expect(claims).toMatch(/Self-testing/)
      for (const m of REGIME_WORDS[id].myths) expect(m.source.length).toBeGreaterThan(10)
    }
  })
  test('"the annual test is always 90 minutes" is corrected where it is false, not under NFPA 101 where it is the rule', () => {
    expect(REGIME_WORDS.nfpa101.myths.some((m) => /90 minutes/.test(m.claim))).toBe(false)
    for (const id of ['en50172', 'ca-nfc', 'asnzs2293'] as const) expect(REGIME_WORDS[id].myths.some((m) => /90 minutes/.test(m.claim))).toBe(true)
  })
})

describe("purpose labels in the site's words", () => {
  test('an escape-route luminaire reads "Egress path" on a US site and "Escape route" on a UK one; other purposes keep their label', async () => {
    const { PURPOSE_LABELS } = await import('../../shared/labels')
    const { purposeLabelFor } = await import('../../shared/labels/regime-words')
    expect(purposeLabelFor('escape-route', 'nfpa101', PURPOSE_LABELS)).toBe('Egress path')
    expect(purposeLabelFor('escape-route', 'en50172', PURPOSE_LABELS)).toBe('Escape route')
    expect(purposeLabelFor('open-area', 'nfpa101', PURPOSE_LABELS)).toBe(PURPOSE_LABELS['open-area'])
  })
})
