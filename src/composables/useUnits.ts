import { computed } from 'vue'
import { formatDisplay, fromDisplay, toDisplay, unitLabel, type DisplayKind, type UnitSystem } from '@shared/engine/units'
import { useAuthStore } from '@/stores/auth'

/** The signed-in user's unit preference, with converters for lux/fc, °C/°F and m/ft. */
export function useUnits() {
  const auth = useAuthStore()
  const system = computed<UnitSystem>(() => auth.me?.user.units ?? 'si')
  return {
    system,
    label: (kind: DisplayKind) => unitLabel(kind, system.value),
    show: (kind: DisplayKind, si: number, digits = 3) => formatDisplay(kind, system.value, si, digits),
    toDisplay: (kind: DisplayKind, si: number) => toDisplay(kind, system.value, si),
    fromDisplay: (kind: DisplayKind, shown: number) => fromDisplay(kind, system.value, shown),
  }
}
