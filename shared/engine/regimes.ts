/**
 * Routine-test regimes as versioned profiles: for each jurisdiction's practice, the short and the
 * long test (interval, the window in which a test counts, length, pass rule), the other periodic
 * checks, what the log book records, how long records are kept, and the edition the profile
 * follows. Pure data and small pure functions; the due calendar (due.ts) reads these.
 *
 * Standards' texts are paywalled: each point names its source and is marked `published` only
 * where a published text or a faithful summary of it was found; the rest say `from memory`.
 * A profile's `version` changes whenever any of its rules change, so a site's regime history
 * records which rules applied from which day.
 */
import type { TestInterval } from './calendar'
import type { Reference } from './types'

export const REGIME_IDS = ['en50172', 'nfpa101', 'ca-nfc', 'asnzs2293'] as const
export type RegimeId = (typeof REGIME_IDS)[number]
/** The two kinds of routine test the log book stores: the short (functional) test and the long (discharge) test. */
export type RoutineTestKind = 'functional' | 'duration'

export type { TestInterval }

/**
 * The days after the last test in which the next one counts as on time: not before `earliestDays`
 * (a test sooner than that does not stand for the next period) and overdue after `latestDays`.
 */
export interface TestWindow {
  earliestDays: number
  latestDays: number
}

export interface RegimeTest {
  kind: RoutineTestKind
  /** The test's name in this regime's words. */
  name: string
  /** Where the next test falls due after the last one. */
  interval: TestInterval
  /** The tolerance the regime states around the due day; null where it states none (due on the day). */
  window: TestWindow | null
  /** How long the luminaire runs on battery: the rated duration, a fixed time, or at least a minimum (0 = long enough to see every lamp lit). */
  length: { rated: true } | { hours: number } | { minimumS: number }
  /** When the test passes, in words. */
  passRule: string
  reference: Reference
}

/** A periodic check outside the two routine tests (a yearly service, a charger check): listed, not yet scheduled by the calendar. */
export interface OtherCheck {
  name: string
  interval: TestInterval | null
  reference: Reference
}

export interface RegimeProfile {
  id: RegimeId
  /** Bumped whenever a rule of this profile changes. */
  version: string
  /** Standards and codes the profile follows, with editions. */
  edition: string
  /** Where it applies. */
  jurisdiction: string
  shortTest: RegimeTest
  longTest: RegimeTest
  otherChecks: OtherCheck[]
  /** What each log-book entry records. */
  records: string[]
  /** Least time records are kept, years; null where no period was confirmed. */
  retention: { years: number | null; reference: Reference }
  references: Reference[]
}

const month = (count: number): TestInterval => ({ unit: 'month', count })

const COMMON_RECORDS = [
  'date of the test',
  'luminaire tested',
  'kind of test and how long it ran',
  'pass or fail',
  'faults found and the action taken',
  'who tested',
]

export const REGIME_PROFILES: Readonly<Record<RegimeId, RegimeProfile>> = {
  en50172: {
    id: 'en50172',
    version: '2026.1',
    edition: 'BS 5266-1:2025 with BS EN 50172:2024 (EN 50172:2004 usable in the EU until 27 May 2027)',
    jurisdiction: 'United Kingdom and Europe',
    shortTest: {
      kind: 'functional',
      name: 'Monthly functional test',
      interval: month(1),
      window: null,
      length: { minimumS: 0 },
      passRule: 'Every lamp lights on simulated mains failure, and the charge indicator lights again when mains returns.',
      reference: {
        source: 'EN 50172:2024, clause 7.2 (routine tests); BS 5266-1:2025',
        basis: 'published',
        note: 'Monthly, only long enough to see each lamp lit, switched by a test key rather than the main isolator. Clause number of the 2024 edition from desk research; no tolerance on the month was found.',
      },
    },
    longTest: {
      kind: 'duration',
      name: 'Annual full rated duration test',
      interval: month(12),
      window: null,
      length: { rated: true },
      passRule: 'The luminaire stays lit for its full rated duration (1 h or 3 h as marked).',
      reference: {
        source: 'EN 50172:2024, clause 7.2; BS 5266-1:2025',
        basis: 'published',
        note: 'Yearly, for the full rated duration; run it before a low-risk period, allow about 24 h to recharge, or test alternate luminaires.',
      },
    },
    otherChecks: [
      {
        name: 'Photometric verification of light levels',
        interval: month(60),
        reference: {
          source: 'BS 5266-1:2025',
          basis: 'from memory',
          note: 'Reported as new in the 2025 edition by secondary sources; not confirmed against the text.',
        },
      },
      {
        name: 'Six-monthly visual check',
        interval: month(6),
        reference: { source: 'BS 5266-1:2025', basis: 'from memory', note: 'Reported by secondary sources; not confirmed against the text.' },
      },
    ],
    records: [...COMMON_RECORDS, 'commissioning, alterations, battery and lamp replacements'],
    retention: {
      years: null,
      reference: {
        source: 'BS 5266-1:2025, log book',
        basis: 'from memory',
        note: 'The log book is kept on the premises; no fixed retention period was confirmed.',
      },
    },
    references: [
      { source: 'BS EN 50172:2024 (emergency escape lighting systems)', basis: 'published', note: 'In force; the 2004 edition may be used until 27 May 2027.' },
      { source: 'BS 5266-1:2025 (code of practice), in effect 31 October 2025', basis: 'published', note: 'Replaced the 2016 edition.' },
    ],
  },
  nfpa101: {
    id: 'nfpa101',
    version: '2026.1',
    edition: 'NFPA 101 Life Safety Code, 7.9.3 (wording of the 2012 edition, later editions believed unchanged)',
    jurisdiction: 'United States',
    shortTest: {
      kind: 'functional',
      name: 'Monthly 30-second test',
      interval: { unit: 'day', count: 30 },
      window: { earliestDays: 21, latestDays: 35 },
      length: { minimumS: 30 },
      passRule: 'Every lamp stays lit on battery for at least 30 seconds.',
      reference: {
        source: 'NFPA 101, 7.9.3.1.1',
        basis: 'published',
        note: 'Monthly, not less than 30 s, at least 3 and at most 5 weeks apart (earlier editions: at 30-day intervals). The authority having jurisdiction may allow other arrangements.',
      },
    },
    longTest: {
      kind: 'duration',
      name: 'Annual 90-minute test',
      interval: month(12),
      window: null,
      length: { hours: 1.5 },
      passRule: 'Every lamp stays lit on battery for at least 1½ hours.',
      reference: { source: 'NFPA 101, 7.9.3.1.1', basis: 'published', note: 'Annually, for not less than 1½ h. No tolerance on the year was found.' },
    },
    otherChecks: [],
    records: [...COMMON_RECORDS],
    retention: {
      years: 3,
      reference: {
        source: 'Fire codes adopted with NFPA 101 (records of tests)',
        basis: 'from memory',
        note: 'Written records kept for inspection by the authority having jurisdiction; at least 3 years per desk research, clause not confirmed.',
      },
    },
    references: [
      { source: 'NFPA 101 (Life Safety Code), 7.9.3: periodic testing of emergency lighting equipment', basis: 'published' },
      {
        source: 'NFPA 101, 7.9.3.1.2 to 7.9.3.1.3: self-testing and computer-based testing',
        basis: 'from memory',
        note: 'Allowed as alternatives; a person still inspects and the records are still kept.',
      },
    ],
  },
  'ca-nfc': {
    id: 'ca-nfc',
    version: '2026.1',
    edition: 'National Fire Code of Canada 2020 as adopted by the provinces; CSA C22.2 No. 141:2024 for equipment',
    jurisdiction: 'Canada',
    shortTest: {
      kind: 'functional',
      name: 'Monthly inspection and simulated power failure',
      interval: month(1),
      window: null,
      length: { minimumS: 0 },
      passRule: 'Every lamp lights when normal power is cut, and the unit shows it is charging again when power returns.',
      reference: {
        source: 'National Fire Code of Canada 2020, Division B, 6.5 (emergency lighting)',
        basis: 'from memory',
        note: 'Monthly inspection with a simulated failure per desk research; clause numbers not confirmed, and each province adopts its own code.',
      },
    },
    longTest: {
      kind: 'duration',
      name: 'Annual test for the design duration',
      interval: month(12),
      window: null,
      length: { rated: true },
      passRule: "The luminaire stays lit for the building's design duration (30 min, 1 h or 2 h by building type, as rated); then the charger is checked.",
      reference: {
        source: 'National Fire Code of Canada 2020, Division B, 6.5; National Building Code of Canada 3.2.7',
        basis: 'from memory',
        note: 'Design duration set by the building code by occupancy and height; clause numbers not confirmed.',
      },
    },
    otherChecks: [
      {
        name: 'Charger voltage, current and recharge check after the annual test',
        interval: month(12),
        reference: {
          source: 'National Fire Code of Canada 2020, Division B, 6.5',
          basis: 'from memory',
          note: 'Per desk research; not confirmed against the text.',
        },
      },
    ],
    records: [...COMMON_RECORDS, 'charger voltage and current after the annual test'],
    retention: {
      years: 2,
      reference: {
        source: 'National Fire Code of Canada 2020, Division C (records)',
        basis: 'from memory',
        note: 'At least 2 years; the first verification for the life of the system (desk research, clause not confirmed).',
      },
    },
    references: [{ source: 'National Fire Code of Canada 2020, provincial fire codes', basis: 'from memory' }],
  },
  asnzs2293: {
    id: 'asnzs2293',
    version: '2026.1',
    edition: 'AS/NZS 2293.2:2019 (inspection and maintenance)',
    jurisdiction: 'Australia and New Zealand',
    shortTest: {
      kind: 'functional',
      name: 'Six-monthly inspection',
      interval: month(6),
      window: null,
      length: { minimumS: 0 },
      passRule: 'Every lamp lights on simulated failure and the indicators are correct.',
      reference: {
        source: 'AS/NZS 2293.2:2019',
        basis: 'from memory',
        note: 'No separate monthly test was found in the standard; the inspection goes with the six-monthly discharge test (unconfirmed).',
      },
    },
    longTest: {
      kind: 'duration',
      name: 'Six-monthly discharge test',
      interval: month(6),
      window: null,
      length: { hours: 1.5 },
      passRule: 'Every lamp stays lit on battery for at least 90 minutes.',
      reference: {
        source: 'AS/NZS 2293.2:2019, routine service',
        basis: 'published',
        note: 'Six-monthly discharge test of at least 90 min, per bodies that summarise the standard; clause numbers not confirmed.',
      },
    },
    otherChecks: [
      {
        name: 'Yearly service',
        interval: month(12),
        reference: { source: 'AS/NZS 2293.2:2019', basis: 'published', note: 'Content of the yearly service not confirmed against the text.' },
      },
    ],
    records: [...COMMON_RECORDS],
    retention: {
      years: 2,
      reference: {
        source: 'New Zealand building warrant of fitness reports',
        basis: 'from memory',
        note: 'Reports kept 2 years in New Zealand; no Australian period confirmed.',
      },
    },
    references: [{ source: 'AS/NZS 2293.2:2019 (emergency lighting and exit signs: inspection and maintenance)', basis: 'published' }],
  },
}

export function isRegimeId(value: string): value is RegimeId {
  return (REGIME_IDS as readonly string[]).includes(value)
}

export function regimeProfile(id: RegimeId): RegimeProfile {
  const p = REGIME_PROFILES[id]
  if (!p) throw new Error(`"${id}" is not a testing regime`)
  return p
}

/** The regime's test of one kind. */
export function regimeTest(id: RegimeId, kind: RoutineTestKind): RegimeTest {
  const p = regimeProfile(id)
  return kind === 'functional' ? p.shortTest : p.longTest
}

/** Shortest time a short (functional) test must run in this regime, seconds; 0 = long enough to see every lamp lit. */
export function shortTestMinimumS(id: RegimeId): number {
  const length = regimeProfile(id).shortTest.length
  return 'minimumS' in length ? length.minimumS : 0
}

/** Hours a long test must run: the luminaire's rated duration, or the regime's fixed time. */
export function longTestHours(id: RegimeId, ratedDurationH: number): number {
  const length = regimeProfile(id).longTest.length
  return 'hours' in length ? length.hours : ratedDurationH
}
