/** The unit preference: values stay SI; a US-units user sees and types foot-candles, °F and feet. */
import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import { useUnits } from '../../src/composables/useUnits'
import { useAuthStore } from '../../src/stores/auth'

function signedInWith(units: 'si' | 'us') {
  const auth = useAuthStore()
  auth.apply({ user: { units } } as never)
}

beforeEach(() => {
  setActivePinia(createPinia())
})

describe('useUnits', () => {
  it('shows SI values unchanged for an SI user, and when nobody is signed in', () => {
    const units = useUnits()
    expect(units.system.value).toBe('si')
    expect(units.show('illuminance', 1)).toBe('1 lx')
    signedInWith('si')
    expect(units.toDisplay('temperature', 25)).toBe(25)
    expect(units.label('length')).toBe('m')
  })

  it('converts for a US-units user (NIST SP 811: 1 fc = 10.76391 lx, 1 ft = 0.3048 m, °F = 1.8 °C + 32)', () => {
    signedInWith('us')
    const units = useUnits()
    expect(units.system.value).toBe('us')
    expect(units.toDisplay('illuminance', 10.76391)).toBeCloseTo(1, 5)
    expect(units.toDisplay('length', 3.048)).toBeCloseTo(10, 9)
    expect(units.toDisplay('temperature', 25)).toBeCloseTo(77, 9)
    expect(units.toDisplay('temperature', -40)).toBeCloseTo(-40, 9)
    expect(units.label('illuminance')).toBe('fc')
    expect(units.label('temperature')).toBe('°F')
  })

  it('reads what a US-units user types back into SI, so stored values never change system', () => {
    signedInWith('us')
    const units = useUnits()
    expect(units.fromDisplay('length', 10)).toBeCloseTo(3.048, 9)
    expect(units.fromDisplay('temperature', 32)).toBeCloseTo(0, 9)
    expect(units.fromDisplay('illuminance', 1)).toBeCloseTo(10.76391, 4)
    for (const si of [0.5, 1, 20]) expect(units.fromDisplay('illuminance', units.toDisplay('illuminance', si))).toBeCloseTo(si, 9)
  })

  it('follows a change of preference without being created again', () => {
    signedInWith('si')
    const units = useUnits()
    expect(units.show('illuminance', 1)).toBe('1 lx')
    signedInWith('us')
    expect(units.show('illuminance', 1)).toBe('0.0929 fc')
    expect(units.show('length', 1)).toBe('3.28 ft')
  })
})
