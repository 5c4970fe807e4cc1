/** Sources the chemistry data and battery models cite, written once so the wording stays consistent. */
import type { Basis, Reference } from '../types'

const ref = (source: string, basis: Basis, note?: string): Reference => (note ? { source, basis, note } : { source, basis })

export const REF = {
  iec61951_1: (basis: Basis = 'published', note?: string) => ref('IEC 61951-1 (sealed nickel-cadmium cells)', basis, note),
  iec61951_2: (basis: Basis = 'published', note?: string) => ref('IEC 61951-2 (sealed nickel-metal hydride cells)', basis, note),
  iec60285: (basis: Basis = 'from memory', note?: string) => ref('IEC 60285 (sealed cylindrical NiCd, long-term high-temperature charge tests)', basis, note),
  iec61056_1: (basis: Basis = 'published', note?: string) =>
    ref('IEC 61056-1 (general-purpose VRLA batteries, cyclic and float use incl. static emergency supplies)', basis, note),
  iec62133: (basis: Basis = 'published', note?: string) => ref('IEC 62133-2 (safety of portable sealed lithium cells)', basis, note),
  iec61960: (basis: Basis = 'from memory', note?: string) => ref('IEC 61960-3 (lithium cell performance, rated at 0.2 It)', basis, note),
  annexA: (basis: Basis = 'published', note?: string) => ref('IEC 60598-2-22, Annex A (batteries for emergency luminaires)', basis, note),
  handbook: (basis: Basis = 'from memory', note?: string) => ref('Handbook of Batteries, chemistry chapters', basis, note),
  referenceBook: (basis: Basis = 'published', note?: string) => ref('Battery Reference Book, NiCd chapter', basis, note),
  nickelMakerManual: (basis: Basis = 'published', note?: string) =>
    ref("Emergency-lighting NiCd cell maker's application manual (general practice)", basis, note),
  nimhMakerManual: (basis: Basis = 'published', note?: string) => ref("NiMH cell maker's handbook (general practice)", basis, note),
  vrlaMakerManual: (basis: Basis = 'published', note?: string) => ref("VRLA maker's application manual (general practice)", basis, note),
  lithiumMakerManual: (basis: Basis = 'from memory', note?: string) => ref("Lithium cell maker's application manual (general practice)", basis, note),
  lifeHalving8C: (basis: Basis = 'published', note?: string) =>
    ref('Lead-acid life vs temperature: service life halves for every 8 °C above 25 °C (battery handbooks)', basis, note),
  arrhenius10C: (basis: Basis = 'common practice', note?: string) => ref('Arrhenius rule of thumb: ageing rate doubles for every 10 °C rise', basis, note),
  peukert: (basis: Basis = 'published', note?: string) => ref("Peukert's law in the rated-capacity form t = H·(C/(I·H))^k (battery handbooks)", basis, note),
  ieee485: (basis: Basis = 'from memory', note?: string) => ref('IEEE 485 (lead-acid sizing), temperature correction table', basis, note),
  commonPractice: (what: string, note?: string) => ref(what, 'common practice', note),
} as const
