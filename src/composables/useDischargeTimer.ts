/**
 * A stopwatch for a full-duration test: started when the supply is cut, stopped when the lamp goes
 * out, or by itself when the required time is reached. The start time is kept on the device so a
 * reload or a locked phone during a three-hour test loses nothing.
 */
import { computed, onScopeDispose, ref, watch, type Ref } from 'vue'

const STORAGE_PREFIX = 'lw.discharge-timer.'

interface Stored {
  startedAt: number
  stoppedAt: number | null
}

export function useDischargeTimer(key: Ref<string | null>, requiredH: Ref<number>) {
  const startedAt = ref<number | null>(null)
  const stoppedAt = ref<number | null>(null)
  const now = ref(Date.now())
  let tick: ReturnType<typeof setInterval> | null = null

  const storageKey = () => (key.value ? STORAGE_PREFIX + key.value : null)
  const persist = () => {
    const k = storageKey()
    if (!k) return
    if (startedAt.value === null) localStorage.removeItem(k)
    else localStorage.setItem(k, JSON.stringify({ startedAt: startedAt.value, stoppedAt: stoppedAt.value } satisfies Stored))
  }

  const requiredMs = computed(() => requiredH.value * 3_600_000)
  const running = computed(() => startedAt.value !== null && stoppedAt.value === null)
  /** Milliseconds lit so far (never past the required time: the test ends there). */
  const elapsedMs = computed(() => {
    if (startedAt.value === null) return 0
    return Math.min((stoppedAt.value ?? now.value) - startedAt.value, requiredMs.value)
  })
  /** Hours lit, once the timer has stopped; null while running or before it starts. */
  const litH = computed(() => (startedAt.value !== null && stoppedAt.value !== null ? elapsedMs.value / 3_600_000 : null))
  const reachedRequired = computed(() => elapsedMs.value >= requiredMs.value)

  function onTick() {
    now.value = Date.now()
    if (running.value && now.value - startedAt.value! >= requiredMs.value) {
      // The required time is reached: the test is over and the lamp stayed lit.
      stoppedAt.value = startedAt.value! + requiredMs.value
      persist()
    }
    if (!running.value) stopTicking()
  }
  function startTicking() {
    if (!tick) tick = setInterval(onTick, 1000)
  }
  function stopTicking() {
    if (tick) clearInterval(tick)
    tick = null
  }

  function start() {
    startedAt.value = Date.now()
    stoppedAt.value = null
    now.value = startedAt.value
    persist()
    startTicking()
  }
  /** The lamp went out (or the technician ended the test early). */
  function stop() {
    if (!running.value) return
    stoppedAt.value = Math.min(Date.now(), startedAt.value! + requiredMs.value)
    persist()
    stopTicking()
  }
  function reset() {
    startedAt.value = null
    stoppedAt.value = null
    persist()
    stopTicking()
  }

  // Each luminaire has its own timer; pick up one left running before a reload.
  watch(
    key,
    () => {
      stopTicking()
      startedAt.value = null
      stoppedAt.value = null
      const k = storageKey()
      const raw = k ? localStorage.getItem(k) : null
      if (raw) {
        try {
          const s = JSON.parse(raw) as Stored
          startedAt.value = s.startedAt
          stoppedAt.value = s.stoppedAt
        } catch {
          localStorage.removeItem(k!)
        }
      }
      now.value = Date.now()
      if (running.value) {
        onTick()
        startTicking()
      }
    },
    { immediate: true },
  )
  onScopeDispose(stopTicking)

  return { running, elapsedMs, litH, reachedRequired, started: computed(() => startedAt.value !== null), start, stop, reset }
}
