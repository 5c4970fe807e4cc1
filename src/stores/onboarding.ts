import { defineStore } from 'pinia'
import { computed, ref, watch } from 'vue'
import { useAuthStore } from './auth'

/** The guided first job: size a pack for an invented luminaire, save it, check its charger, share the sheet. */
export const ONBOARDING_STEPS = ['size', 'save', 'charger', 'share', 'done'] as const
export type OnboardingStep = (typeof ONBOARDING_STEPS)[number]

/** The invented luminaire the tour uses (no real product). */
export const EXAMPLE_LUMINAIRE = {
  title: 'Guided job: Larkfield corridor bulkhead',
  luminaire: 'Invented "Larkfield" LED corridor bulkhead, non-maintained, 3 h; 3 W at the LEDs on battery through a converter.',
  pack: { chemistry: 'nicd', duration: '3 h', driver: 'converter', load: { power: '3 W' }, driverEfficiency: '0.85', ambientMin: '5 °C', ambientMax: '30 °C' },
  charger: { chargeCurrent: '150 mA', trickleCurrent: '150 mA' },
}

interface Saved {
  step: OnboardingStep | null
  sheetId: string | null
}

export const useOnboardingStore = defineStore('onboarding', () => {
  const auth = useAuthStore()
  const key = computed(() => `lw-onboarding:${auth.me?.user.id ?? 'anonymous'}`)
  /** The current step of the tour, or null when it is not running. */
  const step = ref<OnboardingStep | null>(null)
  /** The sheet the tour saved, so later steps can point at it. */
  const sheetId = ref<string | null>(null)

  function load() {
    try {
      const saved = JSON.parse(localStorage.getItem(key.value) ?? 'null') as Saved | null
      step.value = saved?.step ?? null
      sheetId.value = saved?.sheetId ?? null
    } catch {
      step.value = null
    }
  }
  watch(key, load, { immediate: true })
  watch([step, sheetId], () => localStorage.setItem(key.value, JSON.stringify({ step: step.value, sheetId: sheetId.value } satisfies Saved)))

  function start() {
    step.value = 'size'
    sheetId.value = null
  }
  /** Moves on only from the step named, so a hint acted on twice does not skip ahead. */
  function advance(from: OnboardingStep) {
    if (step.value !== from) return
    step.value = ONBOARDING_STEPS[ONBOARDING_STEPS.indexOf(from) + 1] ?? 'done'
  }
  function dismiss() {
    step.value = null
  }
  function $reset() {
    step.value = null
    sheetId.value = null
  }
  return { step, sheetId, start, advance, dismiss, $reset }
})
