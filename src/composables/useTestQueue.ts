/**
 * Test records waiting to reach the server, kept in localStorage so nothing typed in a corridor is
 * lost when the connection drops or the page reloads. Each record carries its own clientId; the
 * server saves by that id, so sending the same record twice never makes two.
 */
import { computed, onBeforeUnmount, onMounted, ref } from 'vue'
import type { TestRecordInput } from '@shared/schemas/test-record.schema'
import { ApiError } from '@/api/http'
import { recordTests } from '@/api/register'
import { useAsyncAction } from '@/composables/useAsyncAction'

const STORAGE_PREFIX = 'lw.test-queue.'

/** A v4 UUID, also where crypto.randomUUID is missing (plain http on a phone). */
export function newClientId(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID()
  const b = crypto.getRandomValues(new Uint8Array(16))
  b[6] = (b[6] & 0x0f) | 0x40
  b[8] = (b[8] & 0x3f) | 0x80
  const h = [...b].map((x) => x.toString(16).padStart(2, '0')).join('')
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`
}

export function useTestQueue(key: string) {
  const storageKey = STORAGE_PREFIX + key
  const load = (): TestRecordInput[] => {
    try {
      return JSON.parse(localStorage.getItem(storageKey) ?? '[]') as TestRecordInput[]
    } catch {
      return []
    }
  }
  const pending = ref<TestRecordInput[]>(load())
  /** clientIds the server has confirmed in this session. */
  const saved = ref<string[]>([])
  const save = () => localStorage.setItem(storageKey, JSON.stringify(pending.value))

  // The note of the last failed send stays while the next try is out (no flicker at each retry).
  const sender = useAsyncAction(
    async () => {
      const batch = [...pending.value]
      const res = await recordTests(batch)
      const done = new Set(res.records.map((r) => r.clientId))
      saved.value = [...saved.value, ...done]
      pending.value = load().filter((r) => !done.has(r.clientId))
      save()
    },
    {
      keepError: true,
      describe: (err) =>
        err instanceof ApiError && err.status === 0
          ? 'No connection. The results are kept on this device and will be sent when you are back online.'
          : (err as Error).message,
    },
  )
  const sending = sender.pending
  const lastError = sender.error

  /** Drops what is waiting (after the technician has read the server's refusal). */
  function discard() {
    pending.value = []
    save()
    lastError.value = null
  }

  function add(record: TestRecordInput) {
    pending.value = [...pending.value.filter((r) => r.clientId !== record.clientId), record]
    save()
  }

  /** Sends everything waiting; on failure keeps it for the next try. */
  async function flush() {
    if (sending.value || !pending.value.length) return
    await sender.run()
    // Something may have been added while the request was out.
    if (!lastError.value && pending.value.length) await flush()
  }

  const onOnline = () => void flush()
  onMounted(() => {
    window.addEventListener('online', onOnline)
    void flush()
  })
  onBeforeUnmount(() => window.removeEventListener('online', onOnline))

  return { pending, waiting: computed(() => pending.value.length), sending, lastError, saved, add, flush, discard }
}
