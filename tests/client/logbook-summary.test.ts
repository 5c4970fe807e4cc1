/**
 * The log book summary as the shared page shows it: the counts in words, each failure with what
 * became of it, the next tests due; no codes. The summary is the engine's own, from a small history
 * (log book state rules, docs/method.md).
 */
import { mount } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import { luminaireDue, type TestEvent } from '../../shared/engine/due'
import { logBookSummary } from '../../shared/engine/log-book-summary'
import LogBookSummary from '../../src/components/register/LogBookSummary.vue'

const TODAY = '2026-03-01'
const lum = (tag: string, tests: TestEvent[], packFittedOn = '2025-01-01') => ({
  tag,
  packFittedOn,
  tests,
  due: luminaireDue({ regime: 'en50172', since: packFittedOn, packFittedOn, tests }, TODAY),
})

describe('LogBookSummary', () => {
  const summary = logBookSummary(
    [
      lum('EL-1', [
        { kind: 'duration', testedOn: '2025-02-01', passed: true },
        { kind: 'duration', testedOn: '2026-02-20', passed: false, faults: 'Dark after 1 h' },
      ]),
      lum('EL-2', [
        { kind: 'duration', testedOn: '2025-02-01', passed: true },
        { kind: 'functional', testedOn: '2026-01-10', passed: false },
        { kind: 'functional', testedOn: '2026-01-12', passed: true },
      ]),
    ],
    TODAY,
  )

  it('writes the counts, the failures and the next tests in words', () => {
    const w = mount(LogBookSummary, { props: { summary } })
    expect(w.get('[data-test="figure-luminaires"]').text()).toBe('2 Luminaires')
    // EL-1's full-duration failure is open; EL-2's functional failure was put right two days later.
    expect(w.get('[data-test="figure-not-put-right"]').text()).toBe('1 Failure not yet put right')
    expect(w.get('[data-test="figure-in-order"]').text()).toBe('1 Tested, no failure open')
    const rows = w.findAll('[data-test="summary-failures"] tbody tr')
    expect(rows).toHaveLength(2)
    expect(rows[0].text()).toContain('EL-1')
    expect(rows[0].text()).toContain('Still failed: retest due by')
    expect(rows[0].attributes('data-state')).toBe('still-failed')
    expect(rows[1].text()).toContain('Cleared by a functional test passed on')
    expect(w.get('[data-test="summary-next"]').text()).toContain('Retest after a failure (full-duration test)')
    expect(w.text()).not.toMatch(/retest-overdue|failed-again|due-soon|\d{4}-\d{2}-\d{2}/)
  })
})
