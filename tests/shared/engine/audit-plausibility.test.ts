/**
 * Readings no luminaire gives. Ranges: IEC 60038 nominal supply voltages 100–277 V with ±10 % (published);
 * the mains current, power and power-factor ranges of a single emergency luminaire are common practice
 * (docs/method.md, "Plausibility of mains readings"). Each reading outside its range is a warning naming
 * the field and the slip that would bring it back; nothing is corrected silently.
 */
import { describe, expect, it } from 'vitest'
import { auditTool } from '../../../shared/engine/audit'
import { likelySlip } from '../../../shared/engine/audit-plausibility'
import { runTool } from '../../../shared/engine/tool'

const BASE = {
  claimedPower: '3 W',
  supplyVoltage: '230 V',
  measuredPower: '3.2 W',
  measuredCurrent: '25 mA',
  mode: 'maintained',
  hoursPerDay: 24,
  tariffPerKWh: 0.3,
}
function audit(input: Record<string, unknown>) {
  const o = runTool(auditTool, input)
  if (!o.ok) throw new Error(JSON.stringify(o.fields))
  return o.result
}
const find = (r: ReturnType<typeof audit>, code: string) => r.warnings.filter((w) => w.code === code)

describe('plausibility of mains readings', () => {
  it('sound readings raise no plausibility warning', () => {
    const r = audit(BASE)
    expect(find(r, 'implausible-reading')).toEqual([])
    expect(find(r, 'power-factor-implausible')).toEqual([])
  })

  it('a current typed as 28 (amps, meant mA) is critical and names the slip; the claim check still stands on measured power', () => {
    const r = audit({ ...BASE, measuredCurrent: 28 })
    expect(r.powerFactor).toBeCloseTo(3.2 / (230 * 28), 12)
    const [w] = find(r, 'implausible-reading')
    expect(w).toMatchObject({ severity: 'critical', field: 'measuredCurrent' })
    expect(w.message).toContain('0.028 A would fit')
    expect(w.message).toContain('milli-unit')
  })

  it('23 000 V is outside the IEC 60038 band and 230 V is suggested', () => {
    const r = audit({ ...BASE, supplyVoltage: '23000 V' })
    const [w] = find(r, 'implausible-reading')
    expect(w).toMatchObject({ severity: 'critical', field: 'supplyVoltage' })
    expect(w.message).toContain('230 V would fit')
  })

  it('a current in range that gives a power factor no driver has is flagged on the current', () => {
    const r = audit({ ...BASE, measuredCurrent: '0.9 A' })
    const [w] = find(r, 'power-factor-implausible')
    expect(w).toMatchObject({ severity: 'critical', field: 'measuredCurrent' })
  })

  it('a claimed power of 3000 W for one luminaire is flagged, with 3 W suggested', () => {
    const r = audit({ ...BASE, claimedPower: '3000 W' })
    expect(find(r, 'implausible-reading')[0]).toMatchObject({ field: 'claimedPower', message: expect.stringContaining('3 W would fit') })
  })

  it('likelySlip tries milli first, then decimal points', () => {
    expect(likelySlip(28, (v) => v >= 0.001 && v <= 5)?.factor).toBe(1e-3)
    expect(likelySlip(23000, (v) => v >= 90 && v <= 305)?.factor).toBe(1e-2)
    expect(likelySlip(1e12, (v) => v >= 90 && v <= 305)).toBeNull()
  })
})
