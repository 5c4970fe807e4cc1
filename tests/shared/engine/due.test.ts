/** Due-date rules of both testing regimes, and the battery replacement forecast. */
import { describe, expect, test } from 'vitest'
import fc from 'fast-check'
import { chemistryServiceLifeYears } from '../../../shared/engine/battery-models'
import { getChemistry } from '../../../shared/engine/chemistries'
import {
  addDays,
  addMonthsClamped,
  countDue,
  daysBetween,
  dueWithin,
  forecastPack,
  linearFit,
  luminaireDue,
  parseIsoDate,
  REGIMES,
  type TestEvent,
} from '../../../shared/engine/due'

const functional = (testedOn: string, passed = true): TestEvent => ({ kind: 'functional', testedOn, passed })
const duration = (testedOn: string, passed = true): TestEvent => ({ kind: 'duration', testedOn, passed })

describe('calendar arithmetic', () => {
  test.each([
    ['2025-01-31', 1, '2025-02-28'], // month end clamps to a 28-day February
    ['2024-01-31', 1, '2024-02-29'], // leap year: 29 February exists
    ['2024-03-31', 1, '2024-04-30'],
    ['2024-02-29', 12, '2025-02-28'], // a leap day one year on clamps to 28 February
    ['2023-02-28', 12, '2024-02-28'], // no drift to the 29th in a leap year
    ['2025-12-15', 1, '2026-01-15'], // across a year end
    ['2025-05-31', -3, '2025-02-28'],
  ])('%s + %d month(s) = %s', (from, months, expected) => {
    expect(addMonthsClamped(from, months)).toBe(expected)
  })

  test('2000 is a leap year and 1900 is not (Gregorian rule, checked through 29 Feb)', () => {
    expect(addMonthsClamped('2000-01-31', 1)).toBe('2000-02-29')
    expect(addMonthsClamped('1900-01-31', 1)).toBe('1900-02-28')
  })

  test('30 days across February in a leap and a common year', () => {
    expect(addDays('2024-02-01', 30)).toBe('2024-03-02')
    expect(addDays('2025-02-01', 30)).toBe('2025-03-03')
    expect(daysBetween('2024-01-01', '2025-01-01')).toBe(366)
    expect(daysBetween('2025-01-01', '2026-01-01')).toBe(365)
  })

  test('rejects days that do not exist, with the reason', () => {
    expect(() => parseIsoDate('2025-02-29')).toThrow(/not a calendar day/)
    expect(() => parseIsoDate('2025-13-01')).toThrow(/not a calendar day/)
    expect(() => parseIsoDate('1/2/2025')).toThrow(/YYYY-MM-DD/)
  })

  test('adding whole months then going back never lands later than the start (property)', () => {
    fc.assert(
      fc.property(fc.date({ min: new Date('1990-01-01'), max: new Date('2090-12-31'), noInvalidDate: true }), fc.integer({ min: 0, max: 36 }), (d, n) => {
        const day = d.toISOString().slice(0, 10)
        const later = addMonthsClamped(day, n)
        expect(later >= day).toBe(true)
        expect(addMonthsClamped(later, -n) <= day).toBe(true)
      }),
    )
  })
})

describe('EN 50172 / BS 5266-1: monthly functional test, annual full-duration test (EN 50172:2004 cl. 7.2, from memory)', () => {
  test('the regime table holds the intervals the standard sets', () => {
    expect(REGIMES.en50172.functional).toEqual({ unit: 'month', count: 1 })
    expect(REGIMES.en50172.duration).toEqual({ unit: 'month', count: 12 })
    expect(REGIMES.en50172.durationTest).toBe('rated')
  })

  test('a functional test on 31 January falls due again on 28 February in a common year', () => {
    const due = luminaireDue({ regime: 'en50172', since: '2024-06-01', tests: [duration('2024-06-10'), functional('2025-01-31')] }, '2025-02-10')
    expect(due.functional.nextDueOn).toBe('2025-02-28')
    expect(due.functional.daysUntilDue).toBe(18)
    expect(due.functional.state).toBe('scheduled')
    expect(due.duration.nextDueOn).toBe('2025-06-10')
  })

  test('… and on 29 February in a leap year', () => {
    const due = luminaireDue({ regime: 'en50172', since: '2023-06-01', tests: [functional('2024-01-31')] }, '2024-02-20')
    expect(due.functional.nextDueOn).toBe('2024-02-29')
    expect(due.functional.state).toBe('due-soon')
  })

  test('an annual test done on 29 February 2024 is due on 28 February 2025', () => {
    const due = luminaireDue({ regime: 'en50172', since: '2023-06-01', tests: [duration('2024-02-29')] }, '2024-12-01')
    expect(due.duration.nextDueOn).toBe('2025-02-28')
    // the full-duration test also served as February's functional test
    expect(due.functional.nextDueOn).toBe('2024-03-29')
    expect(due.functional.state).toBe('overdue')
  })

  test('a test done early moves the next one earlier: the gap never exceeds a month', () => {
    // Scheduled for 15 March, done on 2 March: next is 2 April, not 15 April.
    const due = luminaireDue({ regime: 'en50172', since: '2024-01-01', tests: [functional('2025-02-15'), functional('2025-03-02')] }, '2025-03-05')
    expect(due.functional.lastTestedOn).toBe('2025-03-02')
    expect(due.functional.nextDueOn).toBe('2025-04-02')
  })

  test('the due day itself is not overdue; the day after is', () => {
    const tests = [functional('2025-01-10'), duration('2024-06-01')]
    expect(luminaireDue({ regime: 'en50172', since: '2024-01-01', tests }, '2025-02-10').functional).toMatchObject({ daysUntilDue: 0, state: 'due-soon' })
    expect(luminaireDue({ regime: 'en50172', since: '2024-01-01', tests }, '2025-02-11').functional).toMatchObject({ daysUntilDue: -1, state: 'overdue' })
  })

  test('never tested: functional due one interval after the pack was fitted; the full-duration test is due now (commissioning, common practice)', () => {
    const due = luminaireDue({ regime: 'en50172', since: '2025-01-31', tests: [] }, '2025-02-01')
    expect(due.functional).toMatchObject({ lastTestedOn: null, nextDueOn: '2025-02-28', reason: 'interval' })
    expect(due.duration).toMatchObject({ reason: 'commissioning', nextDueOn: '2025-01-31', overdueAfter: '2025-02-14', state: 'due-now' })
    expect(due.commissioning).toBe(true)
    expect(due.state).toBe('due-now')
    // After the repair window it is overdue.
    expect(luminaireDue({ regime: 'en50172', since: '2025-01-31', tests: [] }, '2025-02-15').duration.state).toBe('overdue')
    // A luminaire entered in the register long after its pack went in gets the window from the day it was entered.
    expect(luminaireDue({ regime: 'en50172', since: '2020-01-01', registeredOn: '2025-02-01', tests: [] }, '2025-02-10').duration).toMatchObject({
      state: 'due-now',
      overdueAfter: '2025-02-15',
    })
  })

  test('a failed functional test stays failed until a later functional or full-duration pass', () => {
    const failed = luminaireDue(
      { regime: 'en50172', since: '2024-01-01', tests: [duration('2025-01-05'), { ...functional('2025-02-05', false), faults: 'lamp out' }] },
      '2025-02-06',
    )
    expect(failed.failed).toBe(true)
    expect(failed.state).toBe('failed')
    expect(failed.lastFailure).toMatchObject({ kind: 'functional', testedOn: '2025-02-05', faults: 'lamp out', retestBy: '2025-02-19', retestOverdue: false })
    expect(failed.functional).toMatchObject({ reason: 'retest', nextDueOn: '2025-02-05', state: 'due-now' })
    const repaired = luminaireDue(
      { regime: 'en50172', since: '2024-01-01', tests: [duration('2025-01-05'), functional('2025-02-05', false), functional('2025-02-07')] },
      '2025-02-08',
    )
    expect(repaired.failed).toBe(false)
    expect(repaired.state).toBe('ok')
    const byDuration = luminaireDue(
      { regime: 'en50172', since: '2024-01-01', tests: [duration('2025-01-05'), functional('2025-02-05', false), duration('2025-02-07')] },
      '2025-02-08',
    )
    expect(byDuration.failed).toBe(false)
  })

  test('a failed full-duration test is not cleared by a functional pass, only by a later full-duration pass', () => {
    const tests = [duration('2024-02-01'), duration('2025-01-10', false), functional('2025-01-20'), functional('2025-02-18')]
    const due = luminaireDue({ regime: 'en50172', since: '2024-01-01', tests }, '2025-02-20')
    expect(due.state).toBe('failed')
    expect(due.openFailures.map((f) => f.kind)).toEqual(['duration'])
    // Retest due at once and overdue after the 14-day window: not a year later.
    expect(due.duration).toMatchObject({ reason: 'retest', nextDueOn: '2025-01-10', overdueAfter: '2025-01-24', state: 'overdue' })
    expect(due.lastFailure?.retestOverdue).toBe(true)
    // A workspace allowing 60 days.
    expect(luminaireDue({ regime: 'en50172', since: '2024-01-01', tests }, '2025-02-20', { repairWindowDays: 60 }).duration.state).toBe('due-now')
    const cleared = luminaireDue(
      { regime: 'en50172', since: '2024-01-01', packFittedOn: '2025-02-01', tests: [...tests, duration('2025-02-19')] },
      '2025-02-20',
    )
    expect(cleared.state).toBe('ok')
    expect(cleared.duration.nextDueOn).toBe('2026-02-19')
  })

  test('a new pack asks for a commissioning test even after earlier passes', () => {
    const due = luminaireDue(
      { regime: 'en50172', since: '2023-01-01', packFittedOn: '2025-03-01', tests: [duration('2024-06-01'), functional('2025-02-20')] },
      '2025-03-05',
    )
    expect(due.commissioning).toBe(true)
    expect(due.duration).toMatchObject({ reason: 'commissioning', nextDueOn: '2025-03-01', overdueAfter: '2025-03-15' })
  })

  test('a test dated in the future does not push the calendar on', () => {
    const due = luminaireDue({ regime: 'en50172', since: '2024-01-01', tests: [functional('2025-01-10'), functional('2025-09-10')] }, '2025-02-01')
    expect(due.functional.lastTestedOn).toBe('2025-01-10')
  })
})

describe('NFPA 101 7.9.3: 30-second test monthly (nominal 30 days, 3 to 5 weeks apart), 1½ h test annually', () => {
  test('the regime table holds the intervals the code sets', () => {
    expect(REGIMES.nfpa101.functional).toEqual({ unit: 'day', count: 30 })
    expect(REGIMES.nfpa101.functionalMinimumS).toBe(30)
    expect(REGIMES.nfpa101.durationTest).toEqual({ hours: 1.5 })
  })

  test('30 days, not the same day next month: 31 January → 2 March (common year), 1 March (leap year)', () => {
    expect(luminaireDue({ regime: 'nfpa101', since: '2024-06-01', tests: [functional('2025-01-31')] }, '2025-02-01').functional.nextDueOn).toBe('2025-03-02')
    expect(luminaireDue({ regime: 'nfpa101', since: '2023-06-01', tests: [functional('2024-01-31')] }, '2024-02-01').functional.nextDueOn).toBe('2024-03-01')
  })

  test('a test done early restarts the 30 days from that day', () => {
    const due = luminaireDue({ regime: 'nfpa101', since: '2024-06-01', tests: [functional('2025-03-01'), functional('2025-03-20')] }, '2025-03-21')
    expect(due.functional.nextDueOn).toBe('2025-04-19')
    // overdue only after the 5-week window from the last test (NFPA 101 7.9.3.1.1)
    expect(due.functional.overdueAfter).toBe('2025-04-24')
    expect(due.functional.daysUntilDue).toBe(34)
  })

  test('the annual test counts 12 calendar months, clamped on a leap day', () => {
    expect(luminaireDue({ regime: 'nfpa101', since: '2023-01-01', tests: [duration('2024-02-29')] }, '2024-03-01').duration.nextDueOn).toBe('2025-02-28')
  })
})

describe('counting and listing what falls due', () => {
  test('counts each luminaire once, by its worst state', () => {
    const today = '2025-03-01'
    const states = [
      luminaireDue({ regime: 'en50172', since: '2024-01-01', tests: [functional('2025-02-20', false)] }, today),
      luminaireDue({ regime: 'en50172', since: '2020-01-01', tests: [] }, today),
      luminaireDue({ regime: 'en50172', since: '2024-06-01', tests: [duration('2024-06-02'), functional('2025-02-05')] }, today),
      luminaireDue({ regime: 'en50172', since: '2024-06-01', tests: [duration('2024-06-02'), functional('2025-02-25')] }, today),
      luminaireDue({ regime: 'en50172', since: '2025-02-25', tests: [] }, today),
      luminaireDue({ regime: 'en50172', since: '2024-01-01', tests: [duration('2024-06-02'), functional('2025-02-01', false)] }, today),
    ]
    expect(states.map((s) => s.state)).toEqual(['failed', 'overdue', 'due-soon', 'ok', 'due-now', 'failed'])
    expect(countDue(states)).toEqual({ luminaires: 6, failed: 2, overdue: 1, dueNow: 1, dueSoon: 1, ok: 1, retestOverdue: 1 })
  })

  test('lists tests falling due in the window, earliest first, without the overdue ones', () => {
    const today = '2025-03-01'
    const items = [
      { tag: 'A', due: luminaireDue({ regime: 'en50172', since: '2024-04-20', tests: [duration('2024-04-20'), functional('2025-02-20')] }, today) },
      { tag: 'B', due: luminaireDue({ regime: 'en50172', since: '2020-01-01', tests: [] }, today) },
    ]
    const list = dueWithin(items, today, 60)
    expect(list.map((x) => `${x.item.tag} ${x.test.kind} ${x.test.nextDueOn}`)).toEqual(['A functional 2025-03-20', 'A duration 2025-04-20'])
  })
})

describe('battery replacement forecast', () => {
  test('service life at the ceiling temperature comes from the engine life model (Arrhenius 10 °C rule, common practice)', () => {
    const warm = forecastPack({ chemistry: 'nicd', fittedOn: '2022-01-01', ambientC: 35, ratedDurationH: 3, durations: [] }, '2025-01-01')
    // NiCd standard cells: 5 years at 25 °C, halving every 10 °C → 2.5 years at 35 °C
    expect(warm.serviceLifeYears).toBeCloseTo(chemistryServiceLifeYears(getChemistry('nicd'), 35), 12)
    expect(warm.serviceLifeYears).toBeCloseTo(2.5, 12)
    expect(warm.endOfLifeOn).toBe(addDays('2022-01-01', Math.floor(2.5 * 365.25)))
    expect(warm.state).toBe('replace-now')
    expect(warm.reason).toBe('service-life')
    const cool = forecastPack({ chemistry: 'nicd', fittedOn: '2024-01-01', ambientC: 20, ratedDurationH: 3, durations: [] }, '2025-01-01')
    expect(cool.serviceLifeYears).toBeCloseTo(5, 12)
    expect(cool.state).toBe('ok')
    expect(cool.lifeUsed).toBeCloseTo(366 / 365.25 / 5, 9)
  })

  test('least squares matches a hand-worked line (y = 3 − 0.5x through exact points)', () => {
    expect(
      linearFit([
        [0, 3],
        [1, 2.5],
        [2, 2],
        [4, 1],
      ]),
    ).toEqual({ intercept: 3, slope: -0.5 })
    expect(
      linearFit([
        [1, 1],
        [1, 2],
      ]),
    ).toBeNull()
    expect(linearFit([[1, 1]])).toBeNull()
  })

  test('a fading duration trend brings the replacement forward of the service life', () => {
    // 3.4 h, 3.2 h, 3.0 h… a year apart: falls 0.2 h/year and crosses 3 h at the third test.
    const f = forecastPack(
      {
        chemistry: 'lifepo4',
        fittedOn: '2022-01-01',
        ambientC: 25,
        ratedDurationH: 3,
        durations: [
          { testedOn: '2022-01-01', achievedH: 3.4 },
          { testedOn: '2023-01-01', achievedH: 3.2 },
          { testedOn: '2024-01-01', achievedH: 3.0 },
        ],
      },
      '2024-06-01',
    )
    expect(f.trend?.points).toBe(3)
    expect(f.trend?.slopeHPerYear).toBeLessThan(0)
    expect(f.trend?.belowRatedOn).toBe('2024-01-01')
    expect(f.reason).toBe('duration-trend')
    expect(f.replaceBy).toBe('2024-01-01')
    expect(f.state).toBe('replace-now')
  })

  test('fewer than three tests, or three within six months, give no trend: the life model alone (common practice)', () => {
    const base = { chemistry: 'nicd' as const, fittedOn: '2024-01-01', ambientC: 25, ratedDurationH: 3 }
    // Two tests eight weeks apart falling steeply would otherwise put the replacement before the tests.
    const two = forecastPack(
      {
        ...base,
        durations: [
          { testedOn: '2025-01-01', achievedH: 3.4 },
          { testedOn: '2025-02-26', achievedH: 3.05 },
        ],
      },
      '2025-03-01',
    )
    expect(two.trend).toBeNull()
    expect(two.trendStatus).toBe('not-enough-tests')
    expect(two.durationTests).toBe(2)
    expect(two.reason).toBe('service-life')
    const close = forecastPack(
      {
        ...base,
        durations: [
          { testedOn: '2025-01-01', achievedH: 3.4 },
          { testedOn: '2025-03-01', achievedH: 3.3 },
          { testedOn: '2025-06-30', achievedH: 3.1 },
        ],
      },
      '2025-07-01',
    )
    expect(close.trend).toBeNull()
    const spread = forecastPack(
      {
        ...base,
        durations: [
          { testedOn: '2025-01-01', achievedH: 3.4 },
          { testedOn: '2025-03-01', achievedH: 3.3 },
          { testedOn: '2025-07-01', achievedH: 3.1 },
        ],
      },
      '2025-07-02',
    )
    expect(spread.trend?.points).toBe(3)
    expect(spread.trendStatus).toBe('used')
  })

  test('the replace-by date is never before the latest test', () => {
    // Past its modelled life (NiCd at 35 °C: 2.5 years) yet it passed a test in 2025: replace from that test on, not before.
    const f = forecastPack(
      { chemistry: 'nicd', fittedOn: '2020-01-01', ambientC: 35, ratedDurationH: 3, durations: [{ testedOn: '2025-05-01', achievedH: 3.1 }] },
      '2025-06-01',
    )
    expect(f.endOfLifeOn < '2025-05-01').toBe(true)
    expect(f.replaceBy).toBe('2025-05-01')
    expect(f.reason).toBe('latest-test')
    expect(f.state).toBe('replace-now')
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 2000 }), fc.double({ min: 0, max: 6, noNaN: true })), { minLength: 0, maxLength: 8 }), (pts) => {
        const durations = pts.map(([d, h]) => ({ testedOn: addDays('2020-01-01', d), achievedH: h }))
        const out = forecastPack({ chemistry: 'nimh', fittedOn: '2020-01-01', ambientC: 30, ratedDurationH: 3, durations }, '2026-01-01')
        for (const d of durations) expect(out.replaceBy >= d.testedOn).toBe(true)
      }),
    )
  })

  test('tests of an earlier pack do not count towards the new pack', () => {
    const f = forecastPack(
      {
        chemistry: 'nicd',
        fittedOn: '2024-01-01',
        ambientC: 20,
        ratedDurationH: 3,
        durations: [
          { testedOn: '2022-06-01', achievedH: 3.5 },
          { testedOn: '2023-06-01', achievedH: 2.1 },
          { testedOn: '2024-06-01', achievedH: 3.2 },
        ],
      },
      '2024-07-01',
    )
    expect(f.trend).toBeNull()
    expect(f.reason).toBe('service-life')
  })

  test('a rising or flat trend never predicts a crossing, and no output is NaN or infinite', () => {
    const f = forecastPack(
      {
        chemistry: 'nimh',
        fittedOn: '2023-01-01',
        ambientC: -10,
        ratedDurationH: 1,
        durations: [
          { testedOn: '2023-06-01', achievedH: 1.2 },
          { testedOn: '2023-12-01', achievedH: 1.2 },
          { testedOn: '2024-06-01', achievedH: 1.2 },
        ],
      },
      '2024-07-01',
    )
    expect(f.trend?.belowRatedOn).toBeNull()
    for (const v of [f.serviceLifeYears, f.ageYears, f.lifeUsed, f.trend!.slopeHPerYear, f.trend!.fittedTodayH]) expect(Number.isFinite(v)).toBe(true)
  })
})
