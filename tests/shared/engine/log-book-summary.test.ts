/**
 * The log book's summary page: what became of each failure and the counts, worked by hand from the
 * log book state rules (docs/method.md, "Log book state": a failed full-duration test is cleared only
 * by a later full-duration pass, a failed functional test by any later pass; retest due at once and
 * overdue after the repair window, 14 days, common practice). Regime calendar: EN 50172:2024 clause
 * 7.2 (monthly functional, yearly full-duration), as in due.test.ts.
 */
import { describe, expect, test } from 'vitest'
import { luminaireDue, type TestEvent } from '../../../shared/engine/due'
import { failureHistory, logBookSummary, NEXT_DUE_DATES, type SummaryLuminaire } from '../../../shared/engine/log-book-summary'
import { failureStateWords, nextDueTestWords, nextDueWhenWords, tagListWords } from '../../../shared/labels/log-book-words'

const f = (testedOn: string, passed = true, faults = ''): TestEvent => ({ kind: 'functional', testedOn, passed, faults })
const d = (testedOn: string, passed = true, faults = ''): TestEvent => ({ kind: 'duration', testedOn, passed, faults })
const TODAY = '2026-03-01'

function lum(tag: string, tests: TestEvent[], packFittedOn = '2025-01-01', today = TODAY): SummaryLuminaire {
  return { tag, packFittedOn, tests, due: luminaireDue({ regime: 'en50172', since: packFittedOn, packFittedOn, tests }, today) }
}
const history = (l: SummaryLuminaire, today = TODAY) => failureHistory(l.tag, l.tests, l.due, l.packFittedOn, today)

describe('what became of each failure', () => {
  test.each([
    // [case, tests, pack fitted, expected states in the order of the failures]
    ['a failed duration test with no later test is still failed', [d('2025-02-01'), d('2026-02-20', false)], '2025-01-01', [['open', null]]],
    ['past the 14-day window its retest is overdue', [d('2025-02-01'), d('2026-02-01', false)], '2025-01-01', [['retest-overdue', null]]],
    ['a functional pass does not clear a failed duration test', [d('2025-02-01'), d('2026-02-20', false), f('2026-02-25')], '2025-01-01', [['open', null]]],
    ['a later duration pass clears it', [d('2025-02-01'), d('2026-01-10', false), d('2026-01-20')], '2025-01-01', [['cleared', '2026-01-20']]],
    [
      'a failed functional test is cleared by a later functional pass',
      [d('2025-02-01'), f('2026-01-10', false), f('2026-01-12')],
      '2025-01-01',
      [['cleared', '2026-01-12']],
    ],
    [
      'a failed functional test is cleared by a later duration pass too',
      [d('2025-02-01'), f('2026-01-10', false), d('2026-01-12')],
      '2025-01-01',
      [['cleared', '2026-01-12']],
    ],
    [
      'a second failure of the same kind takes over; the first reads failed again',
      [d('2025-02-01'), d('2026-02-01', false), d('2026-02-20', false)],
      '2025-01-01',
      [
        ['failed-again', '2026-02-20'],
        ['open', null],
      ],
    ],
    [
      'a functional failure is not replaced by a duration failure',
      [d('2025-02-01'), f('2026-02-18', false), d('2026-02-20', false)],
      '2025-01-01',
      [
        ['open', null],
        ['open', null],
      ],
    ],
  ])('%s', (_case, tests, fitted, expected) => {
    const states = history(lum('EL-1', tests as TestEvent[], fitted as string)).map((x) => [x.state, x.closedBy?.testedOn ?? null])
    expect(states).toEqual(expected)
  })

  test('a duration failure cleared after a new pack names the day the pack went in', () => {
    // Failed on 10 Jan with the old pack; new pack on 15 Jan; the first full-duration pass on 20 Jan clears it.
    const l = lum('EL-7', [d('2025-02-01'), d('2026-01-10', false, 'Dark after 1 h'), d('2026-01-20')], '2026-01-15')
    const [only] = history(l)
    expect(only).toMatchObject({ state: 'cleared', closedBy: { kind: 'duration', testedOn: '2026-01-20' }, newPackOn: '2026-01-15', faults: 'Dark after 1 h' })
    expect(failureStateWords(only, (x) => x)).toBe('Cleared by a full-duration test passed on 2026-01-20, after a new pack fitted on 2026-01-15')
  })

  test('the retest day of an open failure is the failure plus the repair window (14 days)', () => {
    const [only] = history(lum('EL-2', [d('2025-02-01'), d('2026-02-20', false)]))
    expect(only.retestBy).toBe('2026-03-06')
    expect(failureStateWords(only, (x) => x)).toBe('Still failed: retest due by 2026-03-06')
  })

  test('a test dated after today changes nothing, as in the due rules', () => {
    const [only] = history(lum('EL-3', [d('2025-02-01'), d('2026-02-20', false), d('2026-04-01')]))
    expect(only.state).toBe('open')
  })
})

describe('the counts of the summary', () => {
  // Hand count on 1 Mar 2026 (EN 50172: functional monthly, full duration yearly):
  // A: duration pass 2026-02-10 → last test passed; next functional due 10 Mar 2026 (within 14 days) → due soon.
  // B: functional fail 2026-02-25 → last test failed; retest due now (by 11 Mar) → due soon, not overdue.
  // C: duration pass 2025-02-01, functional pass 2026-01-15 → last passed; functional due 15 Feb 2026 → overdue; duration due 1 Feb 2026 → overdue.
  // D: never tested, pack fitted 2026-02-20 → not tested; first full-duration test due by 6 Mar → due soon.
  const luminaires = [
    lum('A', [d('2026-02-10')]),
    lum('B', [d('2025-03-20'), f('2026-02-25', false, 'Lamp out')]),
    lum('C', [d('2025-02-01'), f('2026-01-15')]),
    lum('D', [], '2026-02-20'),
  ]
  const s = logBookSummary(luminaires, TODAY)

  test('counts luminaires by their latest test and by what is due', () => {
    expect(s).toMatchObject({ luminaires: 4, passedLastTest: 2, failedLastTest: 1, notTested: 1, overdue: 1, dueSoon: 3 })
  })

  test('counts a failure not yet put right by the state rules, not by the latest test', () => {
    // E: failed its full-duration test, then passed a functional test with no new pack: the latest test
    // passed, but the failure stays open (a functional pass never clears a full-duration failure).
    const e = lum('E', [d('2025-03-20'), d('2026-02-12', false, 'Dark after 2 h'), f('2026-02-20')])
    const withE = logBookSummary([...luminaires, e], TODAY)
    expect(withE).toMatchObject({ luminaires: 5, passedLastTest: 3, failedLastTest: 1, failureNotPutRight: 2, inOrder: 2, notTested: 1 })
  })

  test('lists every failure newest first', () => {
    expect(s.failures.map((x) => [x.tag, x.state])).toEqual([['B', 'open']])
  })

  test('lists the next test dates, overdue first, each with its luminaires', () => {
    const words = s.nextDue.map((x) => `${nextDueTestWords(x)} ${nextDueWhenWords(x, (v) => v)}: ${x.tags.join(' ')}`)
    expect(words[0]).toBe('Full-duration test overdue since 2026-02-01: C')
    expect(words[1]).toBe('Functional test overdue since 2026-02-15: C')
    expect(words).toContain('Retest after a failure (functional test) by 2026-03-11: B')
    expect(words).toContain('First full-duration test of this pack by 2026-03-06: D')
    expect(words).toContain('Functional test due 2026-03-10: A')
  })

  test(`keeps at most ${NEXT_DUE_DATES} dates and says how many more there are`, () => {
    const many = Array.from({ length: 12 }, (_, i) => lum(`L${i + 1}`, [d(`2026-02-${String(i + 10).padStart(2, '0')}`)]))
    const big = logBookSummary(many, TODAY)
    expect(big.nextDue).toHaveLength(NEXT_DUE_DATES)
    // 12 luminaires × 2 kinds, each on its own day: 24 dates.
    expect(big.moreDueDates).toBe(24 - NEXT_DUE_DATES)
    expect(tagListWords(['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H'])).toBe('A, B, C, D, E, F and 2 more')
  })
})
