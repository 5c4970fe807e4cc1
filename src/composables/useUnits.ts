import { computed } from 'vue'
import {
  displayUnit,
  formatDisplay,
  formatTemperatureStep,
  inUserUnits,
  fromDisplay,
  regionDefaults,
  roundDefault,
  toDisplay,
  unitLabel,
  type DisplayKind,
  type UnitSystem,
} from '@shared/engine/units'
import { decimalMark, formatDuration } from '@shared/format'
import { readQuantity, type ReadResult } from '@shared/format/input'
import { useAuthStore } from '@/stores/auth'
import { readerPrefs } from './useFormat'

/** The kinds a person types into a form (the engine reads these dimensions). */
export type TypedKind = Extract<DisplayKind, 'illuminance' | 'temperature' | 'length'>

const NOUNS: Record<TypedKind, string> = { illuminance: 'an illuminance', temperature: 'a temperature', length: 'a length' }
const EXAMPLES: Record<TypedKind, Record<UnitSystem, string>> = {
  illuminance: { si: '1 lx', us: '0.1 fc' },
  temperature: { si: '25 °C', us: '77 °F' },
  length: { si: '2.5 m', us: '8 ft' },
}

/**
 * The signed-in user's unit preference: every quantity shown or typed goes through here, so a
 * screen gets °F, ft, fc, lb and in³ (or the metric units) and the reader's decimal mark for free.
 */
export function useUnits() {
  const auth = useAuthStore()
  const prefs = readerPrefs()
  const system = computed<UnitSystem>(() => auth.me?.user.units ?? 'si')
  /** A value in display units as a form shows it: no grouping, the reader's decimal mark, tenths of a degree at most. */
  const inputText = (kind: DisplayKind, si: number | null | undefined): string => {
    if (typeof si !== 'number' || !Number.isFinite(si)) return ''
    const shown = toDisplay(kind, system.value, si)
    const n = kind === 'temperature' ? Math.round(shown * 10) / 10 : Number(shown.toPrecision(4))
    return String(n).replace('.', decimalMark(prefs.locale)).replace('-', '−')
  }
  return {
    system,
    label: (kind: DisplayKind) => unitLabel(kind, system.value),
    show: (kind: DisplayKind, si: number | { min: number; max: number }, digits = 3) => formatDisplay(kind, system.value, si, digits, prefs),
    toDisplay: (kind: DisplayKind, si: number) => toDisplay(kind, system.value, si),
    fromDisplay: (kind: DisplayKind, shown: number) => fromDisplay(kind, system.value, shown),
    /** A default as a round number in the user's units (2.5 m → 8 ft). */
    roundDefault: (kind: DisplayKind, si: number) => roundDefault(kind, system.value, si),
    /** Supply voltage, frequency and paper that fit the user's region; the currency is the workspace's (chosen by an owner, or its owner's region's). */
    region: computed(() => ({ ...regionDefaults(system.value), currency: auth.me?.workspace?.currency ?? regionDefaults(system.value).currency })),
    inputText,
    /** What was typed, read into SI: a bare number in the user's unit, or any unit written out ("27 °C", "10 ft"). */
    read: (kind: TypedKind, typed: unknown): ReadResult =>
      readQuantity(typed, kind, {
        locale: prefs.locale,
        bareUnit: displayUnit(kind, system.value),
        expected: `${NOUNS[kind]} such as "${EXAMPLES[kind][system.value]}"`,
      }),
    /** A temperature difference (10 °C is 18 °F). */
    temperatureStep: (stepC: number) => formatTemperatureStep(system.value, stepC, prefs),
    /** An engine sentence or a figure written in SI, with its quantities in the user's units. */
    text: (s: string) => inUserUnits(s, system.value, prefs),
    /** Seconds as h:mm. */
    duration: (seconds: number | null | undefined) => formatDuration(seconds, prefs),
  }
}
