import { ref } from 'vue'

/** Runs an async action with a pending flag and a readable error. */
export function useAsyncAction<A extends unknown[], R>(fn: (...args: A) => Promise<R>) {
  const pending = ref(false)
  const error = ref<string | null>(null)
  async function run(...args: A): Promise<R | undefined> {
    pending.value = true
    error.value = null
    try {
      return await fn(...args)
    } catch (err) {
      error.value = err instanceof Error ? err.message : 'Something went wrong.'
      return undefined
    } finally {
      pending.value = false
    }
  }
  return { pending, error, run }
}
