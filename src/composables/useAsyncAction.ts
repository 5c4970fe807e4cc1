import { ref } from 'vue'

/**
 * Runs an async action with a pending flag and a readable error, instead of a hand-rolled
 * loading/error pair in each view. `onError` sees the error first (e.g. to put field messages next
 * to their inputs); the message is still kept in `error`.
 */
export function useAsyncAction<A extends unknown[], R>(fn: (...args: A) => Promise<R>, opts: { onError?: (err: unknown) => void } = {}) {
  const pending = ref(false)
  const error = ref<string | null>(null)
  async function run(...args: A): Promise<R | undefined> {
    pending.value = true
    error.value = null
    try {
      return await fn(...args)
    } catch (err) {
      opts.onError?.(err)
      error.value = err instanceof Error ? err.message : 'Something went wrong.'
      return undefined
    } finally {
      pending.value = false
    }
  }
  return { pending, error, run }
}
