/**
 * The trade's words, supply and cautions by regime: a US site reads "egress path", "normal power"
 * and "authority having jurisdiction" at 120/277 V 60 Hz; a UK or EU site reads "escape route" and
 * "mains" at 230 V 50 Hz. Notes on the EU cadmium rules and on IEC 60598-2-22 annexes appear only
 * where those texts apply. Also the common myths each regime's users meet, each with its source.
 * Pure data. Sources: docs/method.md, "Words by regime".
 */
import type { RegimeId } from '../engine/regimes'

export interface MythNote {
  /** What people often believe, in their words. */
  claim: string
  /** What the regime actually asks. */
  correction: string
  source: string
}

export interface RegimeWords {
  escapeRoute: string
  exitSign: string
  /** The thing that keeps a lamp lit on battery. */
  batteryUnit: string
  /** The normal supply whose failure the test simulates. */
  normalSupply: string
  /** Who accepts the records and decides. */
  authority: string
  /** Nominal supply of a typical building. */
  supplyVoltage: string
  supplyFrequencyHz: 50 | 60
  /** The EU Battery Regulation's cadmium limit is relevant (UK and EU sites). */
  cadmiumNote: boolean
  /** IEC 60598-2-22 annex notes (battery discharge limit, 4-year design life) are relevant. */
  iecAnnexNotes: boolean
  /** Route-spacing criteria to start from on a site of this regime; null where the app has none for it. */
  spacingCriteria: 'en1838-route' | 'nfpa101' | null
  /** The caution before opening a luminaire, in this regime's words. */
  isolateCaution: string
  /** Where local rules decide, in this regime's words. */
  localCodes: string
  myths: MythNote[]
}

const FOUR_YEARS: MythNote = {
  claim: 'Batteries must be replaced every 4 years.',
  correction:
    'Four years is the least design life the product standards ask of an emergency battery, not a replacement interval. Replace a pack when it fails its long test, or by the forecast from its tests and temperature.',
  source: 'IEC 60598-2-22 Annex A; IEC 61347-2-7 (battery designed for at least 4 years of normal operation)',
}
const SELF_TEST_RECORDS: MythNote = {
  claim: 'Self-testing units need no records.',
  correction: 'A self-testing unit runs its own tests, but a person still checks its indicators and the results still go in the log book.',
  source: 'NFPA 101 7.9.3.1.3 (from memory); EN 50172:2024 clause 7 (automatic test results are recorded)',
}
const NOT_ALWAYS_90: MythNote = {
  claim: 'The annual test is always 90 minutes.',
  correction:
    "Ninety minutes is the US rule (NFPA 101). Under EN 50172 and BS 5266-1 the yearly test runs for the luminaire's full rated duration (often 3 h); Canadian codes test the building's design duration; AS/NZS 2293.2 asks for at least 90 min every six months.",
  source: 'EN 50172:2024 clause 7.2; NFPA 101 7.9.3.1.1; AS/NZS 2293.2:2019',
}

export const REGIME_WORDS: Readonly<Record<RegimeId, RegimeWords>> = {
  en50172: {
    escapeRoute: 'escape route',
    exitSign: 'exit sign',
    batteryUnit: 'self-contained emergency luminaire',
    normalSupply: 'mains',
    authority: 'responsible person',
    supplyVoltage: '230 V',
    supplyFrequencyHz: 50,
    cadmiumNote: true,
    iecAnnexNotes: true,
    spacingCriteria: 'en1838-route',
    isolateCaution: "Isolate the mains (and the luminaire's battery) before opening a luminaire or changing a pack.",
    localCodes: 'The fire risk assessment, local regulations and a competent person decide.',
    myths: [
      {
        claim: 'A monthly short test, a six-monthly one-hour test and a full-duration test every three years are enough.',
        correction:
          'That was the 1999 practice and is superseded: today every luminaire gets a monthly functional test and a yearly test for its full rated duration.',
        source: 'BS 5266-1:2025 with BS EN 50172:2024 clause 7.2 (superseding BS 5266-1:1999)',
      },
      FOUR_YEARS,
      SELF_TEST_RECORDS,
      NOT_ALWAYS_90,
    ],
  },
  nfpa101: {
    escapeRoute: 'egress path',
    exitSign: 'exit sign',
    batteryUnit: 'battery unit or emergency driver',
    normalSupply: 'normal power',
    authority: 'authority having jurisdiction',
    supplyVoltage: '120/277 V',
    supplyFrequencyHz: 60,
    cadmiumNote: false,
    iecAnnexNotes: false,
    spacingCriteria: 'nfpa101',
    isolateCaution: 'De-energize the normal power circuit and disconnect the battery unit or emergency driver before opening a fixture or changing a battery.',
    localCodes: 'The authority having jurisdiction, local codes and a licensed electrician decide.',
    myths: [FOUR_YEARS, SELF_TEST_RECORDS],
  },
  'ca-nfc': {
    escapeRoute: 'egress path',
    exitSign: 'exit sign',
    batteryUnit: 'emergency lighting unit',
    normalSupply: 'normal power',
    authority: 'authority having jurisdiction',
    supplyVoltage: '120/347 V',
    supplyFrequencyHz: 60,
    cadmiumNote: false,
    iecAnnexNotes: false,
    spacingCriteria: null,
    isolateCaution: "De-energize the normal power circuit and disconnect the emergency lighting unit's battery before opening it or changing a battery.",
    localCodes: 'The provincial fire code, the authority having jurisdiction and a licensed electrician decide.',
    myths: [FOUR_YEARS, SELF_TEST_RECORDS, NOT_ALWAYS_90],
  },
  asnzs2293: {
    escapeRoute: 'escape route',
    exitSign: 'exit sign',
    batteryUnit: 'self-contained emergency luminaire',
    normalSupply: 'mains',
    authority: 'relevant building authority',
    supplyVoltage: '230 V',
    supplyFrequencyHz: 50,
    cadmiumNote: false,
    iecAnnexNotes: true,
    spacingCriteria: null,
    isolateCaution: "Isolate the mains (and the luminaire's battery) before opening a luminaire or changing a pack.",
    localCodes: 'State or national building rules, the relevant authority and a licensed electrician decide.',
    myths: [FOUR_YEARS, SELF_TEST_RECORDS, NOT_ALWAYS_90],
  },
}

/** The words of a regime; an unknown regime reads as the UK/EU one rather than failing a page. */
export function regimeWords(regime: string | null | undefined): RegimeWords {
  return (REGIME_WORDS as Record<string, RegimeWords>)[regime ?? ''] ?? REGIME_WORDS.en50172
}

/** Engine notes that apply only where a regime's texts apply: the EU cadmium limit, and IEC 60598-2-22 annex notes. */
const CADMIUM_CODES = new Set(['cadmium-restricted'])
const IEC_ANNEX_CODES = new Set(['annex-a-discharge-exceeded', 'annex-a-set-capacity', 'design-life-below-4-years'])

/** Drops the warnings whose rule does not apply under this regime. */
export function warningsForRegime<W extends { code: string }>(warnings: readonly W[], regime: string | null | undefined): W[] {
  const words = regimeWords(regime)
  return warnings.filter((w) => (words.cadmiumNote || !CADMIUM_CODES.has(w.code)) && (words.iecAnnexNotes || !IEC_ANNEX_CODES.has(w.code)))
}

/** A luminaire's purpose in the site's words: "Egress path" on a US site where a UK one reads "Escape route". */
export function purposeLabelFor(purpose: string, regime: string | null | undefined, labels: Record<string, string>): string {
  if (purpose !== 'escape-route') return labels[purpose] ?? purpose
  const route = regimeWords(regime).escapeRoute
  return route.charAt(0).toUpperCase() + route.slice(1)
}
