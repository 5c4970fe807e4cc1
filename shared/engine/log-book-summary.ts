/**
 * The summary at the front of a site's log book: counts, every failure with what has become of it,
 * and the next tests due. Pure, and built only on the log book's state rules in due.ts: a failure's
 * present state is read by replaying the luminaire's history through `openFailuresOf`, so the
 * summary can never disagree with the luminaire's state on the register.
 */
import { DEFAULT_SOON_DAYS, openFailuresOf, type LuminaireDue, type TestEvent, type TestKind } from './due'
import type { IsoDate } from './calendar'

/**
 * What became of a failed test:
 * - open: not yet put right, the retest due by `retestBy`;
 * - retest-overdue: not yet put right, and the retest is past the repair window;
 * - cleared: a later test passed that clears it (`closedBy`; `newPackOn` when the pack now fitted
 *   went in between the failure and that test);
 * - failed-again: a later test of the same kind failed too; that failure is listed on its own.
 */
export type FailureState = 'open' | 'retest-overdue' | 'cleared' | 'failed-again'

export interface FailureEntry {
  tag: string
  kind: TestKind
  testedOn: IsoDate
  faults: string
  remedialAction: string
  state: FailureState
  /** For an open failure: the last day before its retest is overdue. */
  retestBy: IsoDate | null
  /** For a cleared failure or one failed again: the later test that changed its state. */
  closedBy: { kind: TestKind; testedOn: IsoDate } | null
  /** For a cleared failure: the day the pack now fitted went in, when that lies between the failure and the test that cleared it. */
  newPackOn: IsoDate | null
}

export interface SummaryLuminaire {
  tag: string
  packFittedOn: IsoDate
  /** The luminaire's state from `luminaireDue` on the same day. */
  due: LuminaireDue
  /** The tests its state was worked out from (tests recorded in error left out), oldest first; same-day tests in the order recorded. */
  tests: readonly TestEvent[]
}

/** One date in the list of next tests: the luminaires whose test of that kind falls due (or is overdue) on that day. */
export interface NextDueDate {
  kind: TestKind
  /** For a routine test the day it falls due; for a retest or a first full-duration test, the day it must be done by. */
  dueOn: IsoDate
  reason: LuminaireDue['functional']['reason']
  overdue: boolean
  tags: string[]
}

export interface LogBookSummary {
  today: IsoDate
  /** The horizon of "due soon" in days (the due rules' own). */
  soonDays: number
  luminaires: number
  /** Luminaires whose latest test passed / failed; never tested: neither. */
  passedLastTest: number
  failedLastTest: number
  notTested: number
  /**
   * Luminaires with a failure not yet put right by the open-failure rules (a functional pass after a
   * failed full-duration test leaves it open), and those tested with none open: what a reader counts on.
   */
  failureNotPutRight: number
  inOrder: number
  /** Luminaires with at least one test past its day (routine, retest or first full-duration test). */
  overdue: number
  /** Luminaires with nothing overdue and a test due now or within `soonDays`. */
  dueSoon: number
  /** Every failed test in the log book, newest first, with its present state. */
  failures: FailureEntry[]
  /** The next test dates, earliest first (overdue ones first of all), at most `NEXT_DUE_DATES`. */
  nextDue: NextDueDate[]
  /** How many more dates there are after those listed. */
  moreDueDates: number
}

/** How many dates the summary lists; the register lists them all. */
export const NEXT_DUE_DATES = 6

/** Tests in the order they happened; same-day tests keep the order given (as `openFailuresOf` orders them). */
function chronological(tests: readonly TestEvent[]): TestEvent[] {
  return tests
    .map((t, i) => ({ t, i }))
    .sort((a, b) => (a.t.testedOn < b.t.testedOn ? -1 : a.t.testedOn > b.t.testedOn ? 1 : a.i - b.i))
    .map(({ t }) => t)
}

/**
 * Each failed test of one luminaire with its present state. The history is replayed one test at a
 * time through `openFailuresOf`: a failure is settled by the first later test after which it is no
 * longer the open failure of its kind (a pass that clears it, or another failure of that kind).
 */
export function failureHistory(tag: string, tests: readonly TestEvent[], due: LuminaireDue, packFittedOn: IsoDate, today: IsoDate): FailureEntry[] {
  // Tests dated after today count for nothing, as in luminaireDue.
  const history = chronological(tests.filter((t) => t.testedOn <= today))
  const out: FailureEntry[] = []
  history.forEach((failure, i) => {
    if (failure.passed) return
    const base = { tag, kind: failure.kind, testedOn: failure.testedOn, faults: failure.faults ?? '', remedialAction: failure.remedialAction ?? '' }
    for (let j = i + 1; j < history.length; j++) {
      const open = openFailuresOf(history.slice(0, j + 1))
      if (open[failure.kind] === failure) continue
      const later = history[j]
      const closedBy = { kind: later.kind, testedOn: later.testedOn }
      if (!later.passed) return void out.push({ ...base, state: 'failed-again', retestBy: null, closedBy, newPackOn: null })
      const newPackOn = packFittedOn > failure.testedOn && packFittedOn <= later.testedOn ? packFittedOn : null
      return void out.push({ ...base, state: 'cleared', retestBy: null, closedBy, newPackOn })
    }
    const still = due.openFailures.find((f) => f.kind === failure.kind && f.testedOn === failure.testedOn)
    out.push({ ...base, state: still?.retestOverdue ? 'retest-overdue' : 'open', retestBy: still?.retestBy ?? null, closedBy: null, newPackOn: null })
  })
  return out
}

/** The summary page of a site's log book on `today`. */
export function logBookSummary(luminaires: readonly SummaryLuminaire[], today: IsoDate): LogBookSummary {
  let passedLastTest = 0
  let failedLastTest = 0
  let failureNotPutRight = 0
  let overdue = 0
  let dueSoon = 0
  const failures: FailureEntry[] = []
  const dates = new Map<string, NextDueDate>()
  for (const l of luminaires) {
    const known = chronological(l.tests.filter((t) => t.testedOn <= today))
    const last = known[known.length - 1]
    if (last?.passed) passedLastTest++
    else if (last) failedLastTest++
    if (l.due.openFailures.length) failureNotPutRight++
    const items = [l.due.functional, l.due.duration]
    if (items.some((d) => d.state === 'overdue')) overdue++
    else if (items.some((d) => d.state === 'due-now' || d.state === 'due-soon')) dueSoon++
    failures.push(...failureHistory(l.tag, l.tests, l.due, l.packFittedOn, today))
    for (const d of items) {
      const dueOn = d.reason === 'interval' ? d.nextDueOn : d.overdueAfter
      const isOverdue = d.state === 'overdue'
      const key = `${isOverdue ? 0 : 1}|${dueOn}|${d.kind}|${d.reason}`
      const group = dates.get(key) ?? { kind: d.kind, dueOn, reason: d.reason, overdue: isOverdue, tags: [] }
      group.tags.push(l.tag)
      dates.set(key, group)
    }
  }
  failures.sort((a, b) => (a.testedOn < b.testedOn ? 1 : a.testedOn > b.testedOn ? -1 : a.tag.localeCompare(b.tag, undefined, { numeric: true })))
  const ordered = [...dates.entries()]
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    .map(([, g]) => ({ ...g, tags: g.tags.sort((x, y) => x.localeCompare(y, undefined, { numeric: true })) }))
  return {
    today,
    soonDays: DEFAULT_SOON_DAYS,
    luminaires: luminaires.length,
    passedLastTest,
    failedLastTest,
    notTested: luminaires.length - passedLastTest - failedLastTest,
    failureNotPutRight,
    inOrder: passedLastTest + failedLastTest - failureNotPutRight,
    overdue,
    dueSoon,
    failures,
    nextDue: ordered.slice(0, NEXT_DUE_DATES),
    moreDueDates: Math.max(0, ordered.length - NEXT_DUE_DATES),
  }
}
