/** The Replace a pack form: the engine's schema, the result as you type, the chosen candidate. */
import { computed, ref, watch } from 'vue'
import { replaceInputSchema } from '@shared/engine/replace'
import { useZodForm } from '@/composables/useZodForm'
import { useUnits } from '@/composables/useUnits'
import { recalcReplace } from '@/lib/replace-pack'
import { withoutEmptyFields } from '@/lib/pack-recalc'

/** Nothing measured is filled in: only the usual duty and temperatures start with a value. */
export const REPLACE_DEFAULTS = {
  oldPack: { chemistry: 'nicd' },
  duration: '3 h',
  mode: 'non-maintained',
  driver: 'converter',
  driverEfficiency: '0.85',
  charger: { type: 'unknown' },
  ambientMin: '5 °C',
  ambientMax: '25 °C',
}

export function useReplacePack() {
  const units = useUnits()
  // Temperatures start in the user's units (25 °C is 77 °F); the engine reads either.
  const form = useZodForm(
    replaceInputSchema,
    { ...structuredClone(REPLACE_DEFAULTS), ambientMin: units.text(REPLACE_DEFAULTS.ambientMin), ambientMax: units.text(REPLACE_DEFAULTS.ambientMax) } as never,
    { keepAsTyped: true },
  )
  const values = computed(() => withoutEmptyFields(form.values))
  const calc = computed(() => recalcReplace(values.value))
  const result = computed(() => calc.value.result)
  const chosen = ref<number | null>(null)
  // A new result chooses its recommended pack again.
  watch(
    result,
    (r) => {
      chosen.value = r?.recommended ?? null
    },
    { immediate: true },
  )
  const chosenCandidate = computed(() => (result.value && chosen.value !== null ? (result.value.candidates[chosen.value] ?? null) : null))
  return { form, values, calc, result, chosen, chosenCandidate }
}
