/** useAsyncAction: the pending flag, the readable error and its options, as the views rely on them. */
import { ref } from 'vue'
import { describe, expect, it, vi } from 'vitest'
import { useAsyncAction } from '../../src/composables/useAsyncAction'

/** A promise the test settles by hand, so the state while the action is out can be read. */
function deferred<T>() {
  let resolve!: (v: T) => void
  let reject!: (e: unknown) => void
  const promise = new Promise<T>((res, rej) => {
    resolve = res
    reject = rej
  })
  return { promise, resolve, reject }
}

describe('useAsyncAction', () => {
  it('is pending while the action is out and hands back its result', async () => {
    const d = deferred<number>()
    const action = useAsyncAction((x: number) => d.promise.then((v) => v + x))
    expect(action.pending.value).toBe(false)
    const out = action.run(2)
    expect(action.pending.value).toBe(true)
    d.resolve(40)
    expect(await out).toBe(42)
    expect(action.pending.value).toBe(false)
    expect(action.error.value).toBeNull()
  })

  it("keeps the error's message, answers undefined and never throws on", async () => {
    const action = useAsyncAction(async () => {
      throw new Error('That site is not in this workspace.')
    })
    await expect(action.run()).resolves.toBeUndefined()
    expect(action.error.value).toBe('That site is not in this workspace.')
    expect(action.pending.value).toBe(false)
  })

  it('says something readable for a thrown value that is not an error', async () => {
    const action = useAsyncAction(() => Promise.reject('offline'))
    await action.run()
    expect(action.error.value).toBe('Something went wrong.')
  })

  it('clears the last error when it runs again', async () => {
    let fail = true
    const d = deferred<void>()
    const action = useAsyncAction(() => (fail ? Promise.reject(new Error('Refused')) : d.promise))
    await action.run()
    expect(action.error.value).toBe('Refused')
    fail = false
    const again = action.run()
    expect(action.error.value).toBeNull()
    d.resolve()
    await again
    expect(action.error.value).toBeNull()
  })

  it('lets onError see the error before the message is set', async () => {
    const seen: Array<string | null> = []
    const failure = new Error('Some inputs need attention')
    const action = useAsyncAction(() => Promise.reject(failure), { onError: (err) => seen.push(err === failure ? action.error.value : 'other') })
    await action.run()
    expect(seen).toEqual([null])
    expect(action.error.value).toBe('Some inputs need attention')
  })

  it('shows the words describe gives, and none when it answers null', async () => {
    const fieldError = Object.assign(new Error('Invalid body'), { fields: [{ path: 'price', message: 'must be 0 or more' }] })
    const describeFn = vi.fn((err: unknown) => ((err as { fields?: unknown[] }).fields?.length ? null : 'Saving failed. Try again.'))
    const action = useAsyncAction(() => Promise.reject(fieldError), { describe: describeFn })
    await action.run()
    expect(describeFn).toHaveBeenCalledWith(fieldError)
    expect(action.error.value).toBeNull()

    const plain = useAsyncAction(() => Promise.reject(new Error('socket hang up')), { describe: describeFn })
    await plain.run()
    expect(plain.error.value).toBe('Saving failed. Try again.')
  })

  it('with keepError, keeps the last error while it runs again and drops it on success', async () => {
    let fail = true
    const d = deferred<void>()
    const action = useAsyncAction(() => (fail ? Promise.reject(new Error('No connection')) : d.promise), { keepError: true })
    await action.run()
    expect(action.error.value).toBe('No connection')
    await action.run()
    expect(action.error.value).toBe('No connection')
    fail = false
    const retry = action.run()
    expect(action.pending.value).toBe(true)
    expect(action.error.value).toBe('No connection')
    d.resolve()
    await retry
    expect(action.error.value).toBeNull()
  })

  it('reports into a shared error ref, so two actions of one screen show one message', async () => {
    const error = ref<string | null>(null)
    const list = useAsyncAction(() => Promise.reject(new Error('The list did not load')), { error })
    const save = useAsyncAction(() => Promise.resolve('saved'), { error })
    expect(list.error).toBe(error)
    await list.run()
    expect(error.value).toBe('The list did not load')
    expect(await save.run()).toBe('saved')
    expect(error.value).toBeNull()
    expect(list.pending.value).toBe(false)
    expect(save.pending.value).toBe(false)
  })
})
