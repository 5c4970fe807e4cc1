/** The offline test queue: results typed in a corridor survive a lost connection and a reload, and reach the server once. */
import { mount, flushPromises } from '@vue/test-utils'
import { defineComponent, h } from 'vue'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import type { TestRecordInput } from '../../shared/schemas/test-record.schema'
import { ApiError } from '../../src/api/http'

const recordTests = vi.fn()
vi.mock('@/api/register', () => ({ recordTests: (records: TestRecordInput[]) => recordTests(records) }))
const { newClientId, useTestQueue } = await import('../../src/composables/useTestQueue')

const KEY = 'site-harbour-depot'
const STORED = `lw.test-queue.${KEY}`

function record(tag: string, passed = true): TestRecordInput {
  return { clientId: newClientId(), luminaireId: `00000000-0000-4000-8000-00000000000${tag}`, kind: 'functional', testedOn: '2026-11-30', passed }
}

/** Mounts a component that holds the queue, as the round screen does. */
function mountQueue() {
  let queue!: ReturnType<typeof useTestQueue>
  const Host = defineComponent({
    setup() {
      queue = useTestQueue(KEY)
      return () => h('div')
    },
  })
  const wrapper = mount(Host)
  return { wrapper, queue }
}

const confirmAll = (records: TestRecordInput[]) => ({ records: records.map((r) => ({ clientId: r.clientId, id: `srv-${r.clientId}`, outcome: 'created' })) })
const offline = () => new ApiError(0, 'No connection to Lampwright. Check the network and try again.', 'offline')

beforeEach(() => {
  localStorage.clear()
  recordTests.mockReset()
})
afterEach(() => {
  localStorage.clear()
})

describe('useTestQueue', () => {
  it('makes version-4 UUIDs for clientId', () => {
    const id = newClientId()
    expect(id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/)
    expect(newClientId()).not.toBe(id)
  })

  it('keeps results on the device while there is no connection, and says so', async () => {
    recordTests.mockRejectedValue(offline())
    const { queue, wrapper } = mountQueue()
    await flushPromises()
    queue.add(record('1'))
    queue.add(record('2', false))
    await queue.flush()
    expect(queue.waiting.value).toBe(2)
    expect(queue.lastError.value).toMatch(/kept on this device/)
    expect(JSON.parse(localStorage.getItem(STORED)!)).toHaveLength(2)
    wrapper.unmount()
  })

  it('still holds them after a reload, and sends them when the connection comes back', async () => {
    recordTests.mockRejectedValue(offline())
    const first = mountQueue()
    await flushPromises()
    const a = record('1')
    const b = record('2')
    first.queue.add(a)
    first.queue.add(b)
    await first.queue.flush()
    first.wrapper.unmount()

    // A reload: a new queue on the same key finds both; the first send on mounting fails again.
    const second = mountQueue()
    await flushPromises()
    expect(second.queue.pending.value.map((r) => r.clientId)).toEqual([a.clientId, b.clientId])

    recordTests.mockImplementation(async (records: TestRecordInput[]) => confirmAll(records))
    window.dispatchEvent(new Event('online'))
    await flushPromises()
    expect(recordTests).toHaveBeenLastCalledWith([a, b])
    expect(second.queue.waiting.value).toBe(0)
    expect(second.queue.saved.value).toEqual([a.clientId, b.clientId])
    expect(second.queue.lastError.value).toBeNull()
    expect(JSON.parse(localStorage.getItem(STORED)!)).toEqual([])
    second.wrapper.unmount()
  })

  it('replaces a record typed again with the same clientId instead of queueing it twice', async () => {
    recordTests.mockRejectedValue(offline())
    const { queue, wrapper } = mountQueue()
    await flushPromises()
    const first = record('1')
    queue.add(first)
    queue.add({ ...first, passed: false, faults: 'Lamp did not light' })
    expect(queue.waiting.value).toBe(1)
    expect(queue.pending.value[0]).toMatchObject({ clientId: first.clientId, passed: false, faults: 'Lamp did not light' })
    wrapper.unmount()
  })

  it('keeps what the server did not confirm, and the server’s refusal to read', async () => {
    const { queue, wrapper } = mountQueue()
    await flushPromises()
    const a = record('1')
    const b = record('2')
    queue.add(a)
    queue.add(b)
    recordTests.mockResolvedValueOnce(confirmAll([a]))
    recordTests.mockRejectedValueOnce(new ApiError(400, 'testedOn: cannot be in the future', 'invalid_input'))
    await queue.flush()
    expect(queue.saved.value).toEqual([a.clientId])
    expect(queue.pending.value.map((r) => r.clientId)).toEqual([b.clientId])
    expect(queue.lastError.value).toBe('testedOn: cannot be in the future')
    queue.discard()
    expect(queue.waiting.value).toBe(0)
    expect(JSON.parse(localStorage.getItem(STORED)!)).toEqual([])
    wrapper.unmount()
  })
})
