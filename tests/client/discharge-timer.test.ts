/**
 * The full-duration timer of a round: stops by itself at the required time (the test is over and
 * the lamp stayed lit), stops early when the lamp goes out, and survives a reload of the page.
 */
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest'
import { effectScope, nextTick, ref } from 'vue'
import { useDischargeTimer } from '../../src/composables/useDischargeTimer'

beforeEach(() => {
  vi.useFakeTimers()
  vi.setSystemTime(new Date('2027-03-01T18:00:00Z'))
  localStorage.clear()
})
afterEach(() => vi.useRealTimers())

const timerFor = (key: string, requiredH: number) => {
  const scope = effectScope()
  const timer = scope.run(() => useDischargeTimer(ref(key), ref(requiredH)))!
  return { timer, stop: () => scope.stop() }
}

describe('full-duration timer', () => {
  test('stops by itself at the required 1½ h and gives exactly 1.5 h lit', async () => {
    const { timer } = timerFor('lum-a', 1.5)
    timer.start()
    vi.advanceTimersByTime(60 * 60_000)
    expect(timer.running.value).toBe(true)
    expect(timer.litH.value).toBeNull()
    vi.advanceTimersByTime(45 * 60_000)
    await nextTick()
    expect(timer.running.value).toBe(false)
    expect(timer.litH.value).toBe(1.5)
    expect(timer.reachedRequired.value).toBe(true)
  })

  test('stopped when the lamp goes out: the time lit so far, short of the required time', () => {
    const { timer } = timerFor('lum-b', 3)
    timer.start()
    vi.advanceTimersByTime(2 * 3_600_000 + 10 * 60_000)
    timer.stop()
    expect(timer.litH.value).toBeCloseTo(2 + 10 / 60, 9)
    expect(timer.reachedRequired.value).toBe(false)
  })

  test('a timer left running is picked up again after a reload, and its elapsed time kept', () => {
    const first = timerFor('lum-c', 3)
    first.timer.start()
    vi.advanceTimersByTime(40 * 60_000)
    first.stop()
    const again = timerFor('lum-c', 3)
    expect(again.timer.running.value).toBe(true)
    expect(again.timer.elapsedMs.value).toBe(40 * 60_000)
    again.timer.reset()
    expect(timerFor('lum-c', 3).timer.started.value).toBe(false)
  })
})
