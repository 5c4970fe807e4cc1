/**
 * Quantity fields read what people type in their own units and keep SI underneath: a bare number
 * is taken in the user's unit (°F for US customary), a written unit is honoured ("27 °C"), and what
 * cannot be read leaves the text as typed with a message beside it and the model not a number, so
 * the form cannot send a guess. °C = (°F − 32) × 5/9 (NIST SP 811, B.8).
 */
import { beforeEach, describe, expect, it } from 'vitest'
import { nextTick, ref } from 'vue'
import { createPinia, setActivePinia } from 'pinia'
import { useAuthStore } from '../../src/stores/auth'
import { useDurationText, useQuantityText } from '../../src/composables/useQuantityText'

function signedInWith(units: 'si' | 'us') {
  const auth = useAuthStore()
  auth.me = {
    user: { id: 'u', email: 'tamsin@quillbrook.example', name: 'Tamsin Vale', units },
    workspace: null,
    role: null,
    workspaces: [],
    csrfToken: '',
  } as never
}

beforeEach(() => setActivePinia(createPinia()))

describe('ceiling temperature field', () => {
  it('US customary: shows °F, reads a bare 80 as 80 °F, and refuses what it cannot read without touching the text', async () => {
    signedInWith('us')
    const model = ref<number | null | undefined>(25)
    const field = useQuantityText('temperature', model, { min: -40, max: 85 })
    expect(field.text.value).toBe('77')
    expect(field.suffix.value).toBe('°F')
    field.onInput('80')
    expect(field.problem.value).toBeNull()
    // Twelve significant digits are kept (docs/method.md, no conversion noise).
    expect(model.value).toBeCloseTo((80 - 32) * (5 / 9), 9)
    field.onInput('104')
    expect(model.value).toBe(40)
    field.onInput('27 °C')
    expect(model.value).toBe(27)
    field.onInput('eighty')
    expect(field.text.value).toBe('eighty')
    expect(field.problem.value).toBe('"eighty" cannot be read: expected a temperature such as "77 °F"')
    expect(model.value).toBeNaN()
    field.onInput('200')
    expect(field.problem.value).toBe('must be at most 185 °F')
    expect(model.value).toBeNaN()
  })

  it('metric: a bare number is °C; a value set from outside is shown, our own reading is not rewritten', async () => {
    signedInWith('si')
    const model = ref<number | null | undefined>(25)
    const field = useQuantityText('temperature', model)
    expect(field.text.value).toBe('25')
    field.onInput('30.0')
    await nextTick()
    expect(model.value).toBe(30)
    expect(field.text.value).toBe('30.0')
    model.value = 18
    await nextTick()
    expect(field.text.value).toBe('18')
  })
})

describe('rated duration field', () => {
  it.each([
    ['3:00', 3],
    ['1:30', 1.5],
    ['90 min', 1.5],
    ['2', 2],
    ['0:45', 0.75],
  ])('reads %s as %s h', (typed, hours) => {
    signedInWith('si')
    const model = ref<number | null | undefined>(3)
    const field = useDurationText(model, { minH: 0.5, maxH: 24 })
    field.onInput(typed)
    expect(field.problem.value).toBeNull()
    expect(model.value).toBe(hours)
  })

  it('shows h:mm and refuses what it cannot read or what is out of range', () => {
    signedInWith('us')
    const model = ref<number | null | undefined>(1.5)
    const field = useDurationText(model, { minH: 0.5, maxH: 24 })
    expect(field.text.value).toBe('1:30')
    field.onInput('soon')
    expect(field.problem.value).toMatch(/^"soon" cannot be read: expected a duration such as "3:00"/)
    expect(field.text.value).toBe('soon')
    expect(model.value).toBeNaN()
    field.onInput('30 h')
    expect(field.problem.value).toBe('must be at most 24:00 h')
    field.onInput('10 min')
    expect(field.problem.value).toBe('must be at least 0:30 h')
  })
})
