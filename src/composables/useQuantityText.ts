/**
 * A quantity field that shows and takes the user's units while the model stays SI: the text is
 * read with readQuantity on every change; a value it cannot read, or one outside the range, leaves
 * a message beside the field and the model not a number (so the form cannot be sent), never a guess.
 */
import { computed, ref, watch, type Ref } from 'vue'
import { withoutConversionNoise } from '@shared/engine/quantity'
import { formatHours } from '@shared/format'
import { readQuantity } from '@shared/format/input'
import { readerPrefs } from './useFormat'
import { useUnits, type TypedKind } from './useUnits'

export interface QuantityTextOptions {
  /** Limits in SI, worded in the user's units when broken. */
  min?: number
  max?: number
}

export function useQuantityText(kind: TypedKind, model: Ref<number | null | undefined>, opts: QuantityTextOptions = {}) {
  const units = useUnits()
  const text = ref(units.inputText(kind, model.value))
  const problem = ref<string | null>(null)
  let lastRead: number | null | undefined = model.value

  // A value set from outside (a reset, a record loaded) is shown as it is now; our own writes are not re-shown.
  watch(model, (si) => {
    if (Object.is(si, lastRead)) return
    lastRead = si
    text.value = units.inputText(kind, si)
    problem.value = null
  })
  // The unit system switched: the same SI value in the new units.
  watch(units.system, () => {
    if (!problem.value) text.value = units.inputText(kind, model.value)
  })

  function onInput(typed: string) {
    text.value = typed
    const r = units.read(kind, typed)
    let reason: string | null = r.ok ? null : r.reason
    if (r.ok && opts.min !== undefined && r.value < opts.min) reason = `must be at least ${units.show(kind, opts.min, 4)}`
    if (r.ok && opts.max !== undefined && r.value > opts.max) reason = `must be at most ${units.show(kind, opts.max, 4)}`
    problem.value = reason
    lastRead = r.ok && !reason ? r.value : Number.NaN
    model.value = lastRead
  }

  return { text, problem, onInput, suffix: computed(() => units.label(kind)) }
}

/**
 * A duration field whose model is in hours: shown as h:mm ("1:30"), read from h:mm, "90 min",
 * "1.5 h" or a bare number of hours; a value it cannot read leaves a message and the model not a number.
 */
export function useDurationText(modelHours: Ref<number | null | undefined>, opts: { minH?: number; maxH?: number } = {}) {
  const prefs = readerPrefs()
  const show = (h: number | null | undefined) => {
    if (typeof h !== 'number' || !Number.isFinite(h)) return ''
    const minutes = Math.round(h * 60)
    return `${Math.floor(minutes / 60)}:${String(minutes % 60).padStart(2, '0')}`
  }
  const text = ref(show(modelHours.value))
  const problem = ref<string | null>(null)
  let lastRead: number | null | undefined = modelHours.value
  watch(modelHours, (h) => {
    if (Object.is(h, lastRead)) return
    lastRead = h
    text.value = show(h)
    problem.value = null
  })
  function onInput(typed: string) {
    text.value = typed
    const r = readQuantity(typed, 'time', { locale: prefs.locale, bareUnit: 'h', expected: 'a duration such as "3:00", "1:30" or "90 min"' })
    const hours = r.ok ? withoutConversionNoise(r.value / 3600, r.value) : Number.NaN
    let reason: string | null = r.ok ? null : r.reason
    if (r.ok && opts.minH !== undefined && hours < opts.minH) reason = `must be at least ${formatHours(opts.minH, prefs)}`
    if (r.ok && opts.maxH !== undefined && hours > opts.maxH) reason = `must be at most ${formatHours(opts.maxH, prefs)}`
    problem.value = reason
    lastRead = r.ok && !reason ? hours : Number.NaN
    modelHours.value = lastRead
  }
  return { text, problem, onInput }
}
