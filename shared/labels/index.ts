/**
 * Words for every enumeration code the app stores or computes: one map per enumeration, used by
 * screens, PDFs, e-mails and shared pages so a client never reads a code such as "nicd-ht" or
 * "replace-now". Pure data, no engine code, so read-only pages stay small.
 *
 * Add a code here when you add it to an enumeration; `ENUMERATIONS` lists every map, and the
 * no-codes checks read it to know which codes must never appear as text.
 */

export const CHEMISTRY_LABELS = {
  nicd: 'Nickel-cadmium (standard cells)',
  'nicd-ht': 'Nickel-cadmium (high-temperature cells)',
  nimh: 'Nickel-metal hydride',
  lifepo4: 'Lithium iron phosphate (LiFePO4)',
  'lead-acid': 'Lead-acid (VRLA)',
  'li-ion': 'Lithium-ion (NMC)',
} as const

/** Short chemistry names for tight table cells. */
export const CHEMISTRY_SHORT_LABELS: Record<keyof typeof CHEMISTRY_LABELS, string> = {
  nicd: 'NiCd',
  'nicd-ht': 'NiCd, high-temperature',
  nimh: 'NiMH',
  lifepo4: 'LiFePO4',
  'lead-acid': 'Lead-acid',
  'li-ion': 'Lithium-ion',
}

export const DRIVER_LABELS = {
  converter: 'Converter (DC-DC driver)',
  direct: 'Direct (current limiter)',
} as const

export const MODE_LABELS = {
  maintained: 'Maintained',
  'non-maintained': 'Non-maintained',
} as const

export const PURPOSE_LABELS = {
  'escape-route': 'Escape route',
  'open-area': 'Open area',
  'high-risk': 'High-risk task area',
  'exit-sign': 'Exit sign',
} as const

export const REGIME_LABELS = {
  en50172: 'EN 50172 / BS 5266-1: monthly functional test, annual full-duration test',
  nfpa101: 'NFPA 101: 30-second test monthly (3 to 5 weeks apart), 90-minute test every year',
  'ca-nfc': 'Canadian fire codes: monthly inspection, yearly test for the design duration',
  asnzs2293: 'AS/NZS 2293.2: six-monthly 90-minute discharge test, yearly service',
} as const

/** The regime in a few words, for table cells and titles. */
export const REGIME_SHORT_LABELS: Record<keyof typeof REGIME_LABELS, string> = {
  en50172: 'EN 50172 / BS 5266-1',
  nfpa101: 'NFPA 101',
  'ca-nfc': 'National Fire Code of Canada',
  asnzs2293: 'AS/NZS 2293.2',
}

export const CRITERIA_LABELS = {
  'en1838-route': 'EN 1838 escape route',
  'en1838-open-area': 'EN 1838 open (anti-panic) area',
  'en1838-high-risk': 'EN 1838 high-risk task area',
  nfpa101: 'NFPA 101 egress path',
} as const

/** Points along a route that need a luminaire near them. */
export const EMPHASIS_POINT_LABELS = {
  'exit-door': 'Exit door',
  'final-exit': 'Outside a final exit',
  'change-of-direction': 'Change of direction',
  intersection: 'Corridor intersection',
  stairs: 'Stairs',
  'change-of-level': 'Change of floor level',
  'fire-fighting-equipment': 'Fire-fighting equipment',
  'call-point': 'Fire alarm call point',
  'first-aid-point': 'First-aid point',
  'safety-sign': 'Exit or safety sign',
} as const

export const ROLE_NAMES = {
  viewer: 'Viewer',
  technician: 'Technician',
  designer: 'Designer',
  owner: 'Owner',
} as const

export const ROLE_LABELS: Record<keyof typeof ROLE_NAMES, string> = {
  viewer: 'Viewer: reads everything in the workspace',
  technician: 'Technician: also records tests and uploads logs',
  designer: 'Designer: also edits specifications, sites and luminaire data',
  owner: 'Owner: also manages members and the workspace',
}

/** What an API token may do. */
export const TOKEN_SCOPE_LABELS = {
  read: 'Read records',
  write: 'Change records',
  calc: 'Run calculations',
} as const

export const TEST_KIND_LABELS = {
  functional: 'Functional test',
  duration: 'Full-duration test',
} as const

export const SHEET_STATUS_LABELS = {
  draft: 'Draft',
  issued: 'Issued',
  superseded: 'Superseded',
} as const

/** Whether a read-only link still opens. */
export const SHARE_STATE_LABELS = {
  active: 'Active',
  expired: 'Expired',
  revoked: 'Revoked',
} as const

/** When a luminaire's next test falls. */
export const DUE_STATE_LABELS = {
  overdue: 'Overdue',
  'due-now': 'Due now',
  'due-soon': 'Due soon',
  scheduled: 'Scheduled',
} as const

/** A luminaire's test state in the register. */
export const TEST_STATE_LABELS = {
  failed: 'Failed',
  overdue: 'Overdue',
  'due-now': 'Test due now',
  'due-soon': 'Due soon',
  ok: 'Up to date',
} as const

/** Why a test is due. */
export const DUE_REASON_LABELS = {
  interval: 'routine test',
  retest: 'retest after a failure',
  commissioning: 'first full-duration test of this pack',
} as const

/** Whether a battery pack is due for replacement. */
export const PACK_STATE_LABELS = {
  'replace-now': 'Replace now',
  'replace-soon': 'Replace soon',
  ok: 'Good',
} as const

/** The currencies a workspace may choose, by their ISO 4217 names. */
export const CURRENCY_LABELS = {
  EUR: 'Euro (EUR)',
  GBP: 'Pound sterling (GBP)',
  USD: 'US dollar (USD)',
  CAD: 'Canadian dollar (CAD)',
  AUD: 'Australian dollar (AUD)',
  NZD: 'New Zealand dollar (NZD)',
  CHF: 'Swiss franc (CHF)',
  SEK: 'Swedish krona (SEK)',
  NOK: 'Norwegian krone (NOK)',
  DKK: 'Danish krone (DKK)',
  PLN: 'Polish zloty (PLN)',
} as const

/** What became of a failed test, on the log book's summary page. */
export const FAILURE_STATE_LABELS = {
  open: 'Still failed',
  'retest-overdue': 'Still failed, retest overdue',
  cleared: 'Cleared',
  'failed-again': 'Failed again',
} as const

export const PACK_REPLACE_REASON_LABELS = {
  'service-life': 'service life',
  'duration-trend': 'trend of measured durations',
  'latest-test': 'latest test',
} as const

export const SEVERITY_LABELS = {
  critical: 'Critical',
  warning: 'Warning',
  info: 'Note',
} as const

/** Where a value of the trade comes from. */
export const BASIS_LABELS = {
  published: 'published',
  'common practice': 'common practice',
  'from memory': 'from memory, to be confirmed',
  derived: 'derived',
} as const

/** Why a discharge run was taken to end where it did. */
export const RUNTIME_END_LABELS = {
  cutoff: 'the pack fell through the cut-off',
  dropout: 'the load dropped out',
  'end-of-log': 'the log ended',
} as const

export const TIME_FORMAT_LABELS = {
  elapsed: 'Elapsed time as a number',
  clock: 'Elapsed time as hh:mm:ss',
  timestamp: 'Date and time',
} as const

export const DATE_ORDER_LABELS = {
  ymd: 'year-month-day',
  dmy: 'day/month/year',
  mdy: 'month/day/year',
} as const

export const DELIMITER_LABELS = { ',': 'comma', ';': 'semicolon', '\t': 'tab' } as const

export const VOLTAGE_BASIS_LABELS = {
  pack: 'Whole pack',
  cell: 'Per cell',
} as const

export const DIODE_TYPE_LABELS = {
  silicon: 'Silicon diode',
  schottky: 'Schottky diode',
} as const

export const UNIT_SYSTEM_LABELS = {
  si: 'Metric (lx, °C, m)',
  us: 'US customary (fc, °F, ft)',
} as const

export const CLAIM_VERDICT_LABELS = {
  'within tolerance': 'Within tolerance',
  'above claim': 'Above the claim',
  'below claim': 'Below the claim',
} as const

/** The claim verdict in the middle of a sentence ("it … (+4 %)"). */
export const CLAIM_VERDICT_PHRASES: Record<keyof typeof CLAIM_VERDICT_LABELS, string> = {
  'within tolerance': 'agrees with the claim',
  'above claim': 'draws more than claimed',
  'below claim': 'draws less than claimed',
}

/** What a luminaire's declared power most likely describes. */
export const CLAIM_MEANING_LABELS = {
  'input power': 'the power taken from the supply',
  'LED power': 'the power reaching the LEDs',
  'apparent power': 'volt-amperes, not watts',
  'something else': 'none of the measured figures',
} as const

/** How a luminaire type fares against the chosen criteria in the type selector. */
export const TYPE_VERDICT_LABELS = {
  meets: 'Meets',
  pack: 'Light yes, duration no',
  light: 'Light falls short',
  both: 'Light and duration fall short',
} as const

/** How a pack size was chosen from the ladder of capacities. */
export const SIZE_RULE_LABELS = {
  given: 'the capacity given',
  direct: 'the smallest capacity that covers the need',
  'window-min': 'the lowest capacity the charger window allows',
  'window-max': 'the highest capacity the charger window allows',
  usual: 'the usual capacity for this duty',
} as const

export const CHARGER_TYPE_LABELS = {
  'nickel-constant-current': 'Nickel charger (constant current, left on)',
  'lithium-cc-cv': 'Lithium charger (constant current then constant voltage, stops when full)',
  'lead-acid-float': 'Lead-acid float charger (constant voltage)',
  unknown: 'Not known',
} as const

export const CHARGER_FIT_LABELS = {
  yes: 'Suits this charger',
  conditional: 'Suits this charger only on conditions',
  no: 'Must not go on this charger',
} as const

/**
 * Unit symbols as people write them: the engine's mathjs names ("degC", "ohm") become the usual
 * symbols. Symbols that are already right need no entry.
 */
export const UNIT_LABELS: Record<string, string> = {
  degC: '°C',
  degF: '°F',
  ohm: 'Ω',
  kohm: 'kΩ',
  Mohm: 'MΩ',
  mohm: 'mΩ',
  uA: 'µA',
  days: 'days',
  'in^3': 'in³',
}

/** How the full-duration tests of a site are put in groups. */
export const PLAN_GROUPING_LABELS = {
  alternate: 'Alternate luminaires in every area',
  area: 'One area at a time',
  circuit: 'One circuit at a time',
} as const

/** Every enumeration's map by name; the no-codes checks read this list. */
export const ENUMERATIONS = {
  chemistry: CHEMISTRY_LABELS,
  driver: DRIVER_LABELS,
  mode: MODE_LABELS,
  purpose: PURPOSE_LABELS,
  regime: REGIME_LABELS,
  criteria: CRITERIA_LABELS,
  emphasisPoint: EMPHASIS_POINT_LABELS,
  role: ROLE_NAMES,
  tokenScope: TOKEN_SCOPE_LABELS,
  testKind: TEST_KIND_LABELS,
  sheetStatus: SHEET_STATUS_LABELS,
  shareState: SHARE_STATE_LABELS,
  dueState: DUE_STATE_LABELS,
  testState: TEST_STATE_LABELS,
  dueReason: DUE_REASON_LABELS,
  packState: PACK_STATE_LABELS,
  packReplaceReason: PACK_REPLACE_REASON_LABELS,
  failureState: FAILURE_STATE_LABELS,
  severity: SEVERITY_LABELS,
  basis: BASIS_LABELS,
  runtimeEnd: RUNTIME_END_LABELS,
  timeFormat: TIME_FORMAT_LABELS,
  dateOrder: DATE_ORDER_LABELS,
  voltageBasis: VOLTAGE_BASIS_LABELS,
  diodeType: DIODE_TYPE_LABELS,
  unitSystem: UNIT_SYSTEM_LABELS,
  claimVerdict: CLAIM_VERDICT_LABELS,
  claimMeaning: CLAIM_MEANING_LABELS,
  typeVerdict: TYPE_VERDICT_LABELS,
  sizeRule: SIZE_RULE_LABELS,
  chargerType: CHARGER_TYPE_LABELS,
  chargerFit: CHARGER_FIT_LABELS,
  planGrouping: PLAN_GROUPING_LABELS,
} as const

export type EnumerationName = keyof typeof ENUMERATIONS

/**
 * The words for a code. An unknown code (a value stored before a code was added) is written with
 * its hyphens as spaces rather than shown raw, so no code reaches a client even then.
 */
export function labelOf<M extends Record<string, string>>(map: M, code: string | null | undefined, empty = '—'): string {
  if (code === null || code === undefined || code === '') return empty
  const word = (map as Record<string, string>)[code]
  if (word !== undefined) return word
  const spaced = code
    .replace(/[-_]+/g, ' ')
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .toLowerCase()
  return spaced.charAt(0).toUpperCase() + spaced.slice(1)
}

/** A test kind in the middle of a sentence ("the functional test is due"). */
export function testKindWords(kind: keyof typeof TEST_KIND_LABELS): string {
  return TEST_KIND_LABELS[kind].toLowerCase()
}

/** A chemistry's full name; an unknown code is spelled out rather than shown raw. */
export function chemistryName(id: string): string {
  return labelOf(CHEMISTRY_LABELS, id)
}

/** The usual symbol for a unit ("degC" → "°C"). */
export function unitLabel(unit: string): string {
  return UNIT_LABELS[unit] ?? unit
}

/**
 * Codes that look like words of ordinary English ("ok", "draft", "maintained", "published") are
 * fine as text; the no-codes checks look only for codes a reader would not write: those with a
 * hyphen, digits, or mixed case.
 */
export function isTellTaleCode(code: string): boolean {
  return /[-_]/.test(code) || /\d/.test(code) || /[a-z][A-Z]/.test(code) || NON_WORD_CODES.has(code)
}

/** Lower-case codes that are no English word. */
const NON_WORD_CODES = new Set(['nicd', 'nimh', 'ymd', 'dmy', 'mdy'])

/** Every code across the enumerations that must never appear as text on a client-facing page. */
export function tellTaleCodes(): string[] {
  const codes = new Set<string>()
  for (const map of Object.values(ENUMERATIONS)) for (const code of Object.keys(map)) if (isTellTaleCode(code)) codes.add(code)
  for (const unit of Object.keys(UNIT_LABELS)) if (unit !== UNIT_LABELS[unit]) codes.add(unit)
  return [...codes]
}
