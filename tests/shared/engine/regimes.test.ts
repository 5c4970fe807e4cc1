/**
 * Each regime profile's intervals, windows and lengths against the standard or code it follows,
 * and the due calendar reading them. Sources are named per describe block; a point marked
 * "from memory" in the profile is marked the same way here.
 */
import { describe, expect, test } from 'vitest'
import { luminaireDue, REGIMES, testWindow, type TestEvent } from '../../../shared/engine/due'
import { longTestHours, REGIME_IDS, REGIME_PROFILES, regimeProfile, shortTestMinimumS } from '../../../shared/engine/regimes'
import { TestRegimeSchema } from '../../../shared/schemas/site.schema'

const functional = (testedOn: string, passed = true): TestEvent => ({ kind: 'functional', testedOn, passed })
const duration = (testedOn: string, passed = true): TestEvent => ({ kind: 'duration', testedOn, passed })

describe('every profile', () => {
  test.each(REGIME_IDS)('%s names its edition, version, records and retention, with a source on each test', (id) => {
    const p = regimeProfile(id)
    expect(p.id).toBe(id)
    expect(p.edition).toMatch(/\d{4}/)
    expect(p.version).toMatch(/^\d{4}\.\d+$/)
    expect(p.records.length).toBeGreaterThanOrEqual(5)
    expect(p.retention.reference.source.length).toBeGreaterThan(0)
    for (const t of [p.shortTest, p.longTest]) {
      expect(t.reference.source.length).toBeGreaterThan(0)
      expect(['published', 'from memory', 'common practice']).toContain(t.reference.basis)
      if (t.window) expect(t.window.earliestDays).toBeLessThan(t.window.latestDays)
    }
    expect(p.shortTest.kind).toBe('functional')
    expect(p.longTest.kind).toBe('duration')
  })

  test('the site schema accepts exactly the four regimes and names them when refusing another', () => {
    for (const id of REGIME_IDS) expect(TestRegimeSchema.parse(id)).toBe(id)
    const bad = TestRegimeSchema.safeParse('bs5266-1999')
    expect(bad.success).toBe(false)
    if (!bad.success) expect(bad.error.issues[0].message).toContain('asnzs2293')
  })
})

describe('en50172: BS 5266-1:2025 with BS EN 50172:2024, clause 7.2 (monthly functional, yearly full rated duration)', () => {
  const p = REGIME_PROFILES.en50172
  test('monthly short test long enough to see each lamp, yearly test for the rated duration', () => {
    expect(p.shortTest.interval).toEqual({ unit: 'month', count: 1 })
    expect(shortTestMinimumS('en50172')).toBe(0)
    expect(p.longTest.interval).toEqual({ unit: 'month', count: 12 })
    expect(longTestHours('en50172', 3)).toBe(3)
    expect(longTestHours('en50172', 1)).toBe(1)
  })
  test('no tolerance is stated: overdue the day after the calendar month', () => {
    expect(testWindow('en50172', 'functional', '2025-01-31')).toEqual({ opensOn: '2025-02-01', dueOn: '2025-02-28', overdueAfter: '2025-02-28' })
    const tests = [duration('2024-06-01'), functional('2025-01-31')]
    expect(luminaireDue({ regime: 'en50172', since: '2024-01-01', tests }, '2025-02-28').functional.state).toBe('due-soon')
    expect(luminaireDue({ regime: 'en50172', since: '2024-01-01', tests }, '2025-03-01').functional.state).toBe('overdue')
  })
})

describe('nfpa101: NFPA 101 7.9.3.1.1 (monthly 30 s test 3 to 5 weeks apart; annual 1½ h test)', () => {
  const p = REGIME_PROFILES.nfpa101
  test('30-second minimum, 90-minute annual test whatever the rating', () => {
    expect(shortTestMinimumS('nfpa101')).toBe(30)
    expect(REGIMES.nfpa101.functionalMinimumS).toBe(30)
    expect(longTestHours('nfpa101', 3)).toBe(1.5)
    expect(p.longTest.interval).toEqual({ unit: 'month', count: 12 })
  })
  test('the monthly window: opens 3 weeks after the last test, closes 5 weeks after', () => {
    expect(p.shortTest.window).toEqual({ earliestDays: 21, latestDays: 35 })
    expect(testWindow('nfpa101', 'functional', '2025-01-01')).toEqual({ opensOn: '2025-01-22', dueOn: '2025-01-31', overdueAfter: '2025-02-05' })
  })
  test('a test 5 weeks after the last is still on time; the day after, it is overdue', () => {
    const tests = [duration('2024-12-01'), functional('2025-01-01')]
    const lastDay = luminaireDue({ regime: 'nfpa101', since: '2024-01-01', tests }, '2025-02-05').functional
    expect(lastDay).toMatchObject({ nextDueOn: '2025-01-31', overdueAfter: '2025-02-05', daysUntilDue: 0, state: 'due-soon' })
    expect(luminaireDue({ regime: 'nfpa101', since: '2024-01-01', tests }, '2025-02-06').functional).toMatchObject({ state: 'overdue', daysUntilDue: -1 })
  })
})

describe('ca-nfc: National Fire Code of Canada 2020, Division B, 6.5 (from memory: monthly inspection, yearly design-duration test)', () => {
  const p = REGIME_PROFILES['ca-nfc']
  test('monthly inspection, yearly test for the building design duration (30 min, 1 h or 2 h as rated), charger checked after it', () => {
    expect(p.shortTest.interval).toEqual({ unit: 'month', count: 1 })
    expect(p.longTest.interval).toEqual({ unit: 'month', count: 12 })
    for (const rated of [0.5, 1, 2]) expect(longTestHours('ca-nfc', rated)).toBe(rated)
    expect(p.otherChecks.map((c) => c.name).join(' ')).toMatch(/charger/i)
    expect(p.retention.years).toBe(2)
    expect(p.shortTest.reference.basis).toBe('from memory')
  })
})

describe('asnzs2293: AS/NZS 2293.2:2019 (six-monthly discharge test of at least 90 min, yearly service)', () => {
  const p = REGIME_PROFILES.asnzs2293
  test('the discharge test is six-monthly and at least 90 minutes', () => {
    expect(p.longTest.interval).toEqual({ unit: 'month', count: 6 })
    expect(longTestHours('asnzs2293', 1)).toBe(1.5)
    expect(p.otherChecks.find((c) => /yearly service/i.test(c.name))?.interval).toEqual({ unit: 'month', count: 12 })
  })
  test('six months after a passed discharge test the next is due, not twelve', () => {
    const due = luminaireDue({ regime: 'asnzs2293', since: '2024-01-01', tests: [duration('2025-01-15')] }, '2025-02-01')
    expect(due.duration.nextDueOn).toBe('2025-07-15')
    expect(luminaireDue({ regime: 'asnzs2293', since: '2024-01-01', tests: [duration('2025-01-15')] }, '2025-07-16').duration.state).toBe('overdue')
  })
  test('no monthly test is asked for (unconfirmed): the short check goes with the six-monthly test', () => {
    expect(p.shortTest.interval).toEqual({ unit: 'month', count: 6 })
    expect(p.shortTest.reference.basis).toBe('from memory')
  })
})

describe('the same history read under two regimes', () => {
  test('a luminaire tested monthly and yearly is up to date under EN 50172 and under AS/NZS 2293.2 only until six months after its discharge test', () => {
    const tests = [duration('2024-03-10'), functional('2024-10-10'), functional('2024-11-10')]
    expect(luminaireDue({ regime: 'en50172', since: '2024-01-01', tests }, '2024-11-20').state).toBe('ok')
    expect(luminaireDue({ regime: 'asnzs2293', since: '2024-01-01', tests }, '2024-11-20').duration.state).toBe('overdue')
  })
})
