/** Terms of the trade as Lampwright uses them, in our own words, with where each is defined. */
export interface GlossaryEntry {
  term: string
  meaning: string
  reference?: string
}

export const GLOSSARY: GlossaryEntry[] = [
  {
    term: 'Rated duration',
    meaning: 'How long a luminaire must keep giving its emergency light after mains fails: 1 h, 90 min or 3 h in practice.',
    reference: 'EN 1838 4.2.5 (minimum 1 h); BS 5266-1 (3 h where people stay or return); NFPA 101 7.9.2.1 (90 min)',
  },
  {
    term: 'Maintained / non-maintained',
    meaning: 'A maintained luminaire is lit on mains and on battery; a non-maintained one lights only when mains fails.',
    reference: 'IEC 60598-2-22 (classification)',
  },
  { term: 'Self-contained luminaire', meaning: 'An emergency luminaire with its own battery, charger and control gear inside.', reference: 'IEC 60598-2-22' },
  {
    term: 'Functional test',
    meaning: 'A short switch to emergency mode, long enough to see every lamp lit and the charge indicator come back; monthly.',
    reference: 'EN 50172 / BS 5266-1; NFPA 101 7.9.3 (30 s every 30 days)',
  },
  {
    term: 'Duration test',
    meaning:
      'A full rated-duration discharge under emergency conditions; yearly. Do it when the building can stand low light for the next day while the packs recharge.',
    reference: 'EN 50172 / BS 5266-1; NFPA 101 7.9.3 (90 min yearly)',
  },
  {
    term: 'Log book',
    meaning: 'The record of every test, fault, repair and pack or lamp change for a site, kept for the responsible person and any inspector.',
    reference: 'EN 50172; BS 5266-1',
  },
  {
    term: 'C-rate',
    meaning: 'A current expressed as a fraction of the rated capacity per hour: 0.1 C on a 4 Ah pack is 0.4 A. Written It in IEC cell standards.',
    reference: 'IEC 61951-1',
  },
  {
    term: 'Trickle charge',
    meaning: "A small permanent charging current that keeps a nickel pack full; too much of it shortens the pack's life, especially for NiMH.",
    reference: "cell makers' application manuals (common practice)",
  },
  {
    term: 'Float voltage',
    meaning: 'The constant voltage that holds a lead-acid battery full; lower it about 3 mV per cell for each °C above 25 °C.',
    reference: 'VRLA application manuals (common practice)',
  },
  { term: 'Depth of discharge', meaning: 'The share of the capacity taken out in one discharge.' },
  {
    term: 'End-of-discharge voltage (cut-off)',
    meaning: 'The pack voltage at which the luminaire stops drawing current, so the cells are not damaged by deep discharge.',
  },
  {
    term: 'Peukert exponent',
    meaning: 'How much capacity a battery loses at higher currents: t = H·(C/(I·H))^k; k = 1 means none.',
    reference: 'Peukert (1897); battery handbooks',
  },
  {
    term: 'Power factor',
    meaning: 'Real power divided by apparent power (P/S). Small LED drivers without correction often sit around 0.5.',
    reference: 'IEEE Std 1459',
  },
  { term: 'Apparent power', meaning: 'RMS voltage times RMS current (VA): what the supply and the cables must carry.', reference: 'IEEE Std 1459' },
  { term: 'Illuminance', meaning: 'Light falling on a surface, in lux (lm/m²) or foot-candles (lm/ft² ≈ 10.76 lx).' },
  {
    term: 'Escape route',
    meaning: 'A route to a place of safety; in Europe its centre line must get at least 1 lx on the floor, with max : min no worse than 40 : 1.',
    reference: 'EN 1838 4.2',
  },
  {
    term: 'Open area (anti-panic area)',
    meaning: 'A larger space without defined routes; at least 0.5 lx on the floor of the core area, 0.5 m from the walls excluded.',
    reference: 'EN 1838 4.3',
  },
  {
    term: 'High-risk task area',
    meaning: 'Where a dangerous process must be shut down safely: at least 10 % of normal illuminance and never under 15 lx, within 0.5 s.',
    reference: 'EN 1838 4.4',
  },
  {
    term: 'Emergency output factor',
    meaning: "The share of a luminaire's normal light that it gives on battery; for LED luminaires a declared absolute value is used.",
    reference: 'IEC 61347-2-7 (EBLF); CIE 121-SP1',
  },
  {
    term: 'Maintenance factor',
    meaning: 'An allowance for dirt and ageing when computing illuminance; 0.8 is the usual design value for emergency lighting.',
    reference: 'common practice',
  },
  { term: 'IES LM-63', meaning: "The open text format for a luminaire's photometric data (angles and candela values).", reference: 'ANSI/IES LM-63' },
]
