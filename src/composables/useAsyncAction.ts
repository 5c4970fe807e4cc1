import { ref, type Ref } from 'vue'

export interface AsyncActionOptions {
  /** Sees the error first, e.g. to put field messages next to their inputs or to show a toast. */
  onError?: (err: unknown) => void
  /**
   * The words shown for an error. `null` shows none (when the fields beside the inputs already say
   * it). Without it: the error's own message, or "Something went wrong." for a thrown non-error.
   */
  describe?: (err: unknown) => string | null
  /** Report into this ref instead of a new one: several actions of one screen that show one message. */
  error?: Ref<string | null>
  /**
   * Keep the last error while the action runs again; it goes only when a run succeeds (a retry
   * queue, whose "no connection" note should not flicker at each try). Otherwise each run clears it.
   */
  keepError?: boolean
}

/**
 * The one way the client runs an async action with a pending flag and a readable error, instead of
 * a hand-rolled loading/error pair in each view (`tests/shared/source-layout.test.ts` enforces it).
 * `run` resolves to the action's result, or `undefined` when it failed; the error is never thrown on.
 * A check made before `run` may put its own refusal in `error` (it is a plain ref).
 */
export function useAsyncAction<A extends unknown[], R>(fn: (...args: A) => Promise<R>, opts: AsyncActionOptions = {}) {
  const pending = ref(false)
  const error = opts.error ?? ref<string | null>(null)
  async function run(...args: A): Promise<R | undefined> {
    pending.value = true
    if (!opts.keepError) error.value = null
    try {
      const result = await fn(...args)
      if (opts.keepError) error.value = null
      return result
    } catch (err) {
      opts.onError?.(err)
      error.value = opts.describe ? opts.describe(err) : err instanceof Error ? err.message : 'Something went wrong.'
      return undefined
    } finally {
      pending.value = false
    }
  }
  return { pending, error, run }
}
