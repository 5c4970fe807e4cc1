/** The full-duration test planner: groups, times and the no-dark-area rule. */
import { describe, expect, it } from 'vitest'
import { DEFAULT_RECHARGE_H, minutesOfDay, planDurationTests, windowMinutes, type PlanInput, type PlanLuminaire } from '../../../shared/engine/test-plan'

let n = 0
const lum = (area: string | null, over: Partial<PlanLuminaire> = {}): PlanLuminaire => {
  n++
  return { id: `id-${n}`, tag: `T-${n}`, areaId: area, areaName: area, circuit: '', walkOrder: null, ratedDurationH: 3, rechargeH: null, ...over }
}
const base = (luminaires: PlanLuminaire[], over: Partial<PlanInput> = {}): PlanInput => ({
  regime: 'en50172',
  grouping: 'alternate',
  firstDay: '2027-03-01',
  windowStart: '18:00',
  windowEnd: '23:00',
  defaultRechargeH: DEFAULT_RECHARGE_H,
  luminaires,
  ...over,
})

describe('alternate luminaires (common practice: never every luminaire of an area at once)', () => {
  const site = [lum('Hall'), lum('Hall'), lum('Hall'), lum('Stairs'), lum('Stairs'), lum('Office'), lum('Office'), lum('Office'), lum('Office')]
  const plan = planDurationTests(base(site))

  it('splits every area over two groups', () => {
    expect(plan.groups).toHaveLength(2)
    for (const area of ['Hall', 'Stairs', 'Office']) {
      const inArea = site.filter((l) => l.areaName === area).map((l) => l.id)
      for (const g of plan.groups)
        expect(
          inArea.every((id) => g.luminaireIds.includes(id)),
          `${area} all in ${g.name}`,
        ).toBe(false)
      expect(
        plan.groups
          .flatMap((g) => g.luminaireIds)
          .filter((id) => inArea.includes(id))
          .sort(),
      ).toEqual([...inArea].sort())
    }
    expect(plan.groups.every((g) => g.darkAreas.length === 0)).toBe(true)
  })

  it('times each group: 3 h test from the window opening, full cover 24 h later (IEC 60598-2-22, from memory), the next group after that', () => {
    expect(plan.groups[0]).toMatchObject({ startsAt: '2027-03-01T18:00', endsAt: '2027-03-01T21:00', fullCoverAt: '2027-03-02T21:00', testH: 3, rechargeH: 24 })
    // The window on 2 March opens at 18:00, before group 1 is recharged: group 2 waits for 3 March.
    expect(plan.groups[1]).toMatchObject({ startsAt: '2027-03-03T18:00', endsAt: '2027-03-03T21:00', fullCoverAt: '2027-03-04T21:00' })
    expect(plan.finishesAt).toBe('2027-03-04T21:00')
  })

  it('flags an area with a single luminaire, which no grouping can keep lit', () => {
    const p = planDurationTests(base([lum('Hall'), lum('Hall'), lum('Plant room')]))
    expect(p.warnings.map((w) => w.code)).toEqual(['single-luminaire-area'])
    expect(p.warnings[0].message).toMatch(/Plant room has a single luminaire/)
  })

  it("uses a charger check's recharge figure when it is longer, and the group's longest test", () => {
    const p = planDurationTests(base([lum('Hall', { rechargeH: 36 }), lum('Hall', { ratedDurationH: 1 })]))
    expect(p.groups[0]).toMatchObject({ testH: 3, rechargeH: 36, fullCoverAt: '2027-03-03T09:00' })
    expect(p.groups[1]).toMatchObject({ testH: 1, rechargeH: 24, startsAt: '2027-03-03T18:00' })
  })
})

describe('by area or by circuit', () => {
  it('one group per area, each flagged as left without cover during its test and recharge', () => {
    const p = planDurationTests(base([lum('Hall'), lum('Hall'), lum('Stairs')], { grouping: 'area' }))
    expect(p.groups.map((g) => g.name)).toEqual(['Hall', 'Stairs'])
    expect(p.groups.map((g) => g.darkAreas)).toEqual([['Hall'], ['Stairs']])
    expect(p.warnings.filter((w) => w.code === 'area-dark')).toHaveLength(2)
  })
  it('one group per circuit; an area split over circuits keeps cover', () => {
    const p = planDurationTests(
      base([lum('Hall', { circuit: 'DB1/3' }), lum('Hall', { circuit: 'DB1/4' }), lum('Yard', { circuit: 'DB1/4' })], { grouping: 'circuit' }),
    )
    expect(p.groups.map((g) => g.name)).toEqual(['Circuit DB1/3', 'Circuit DB1/4'])
    expect(p.groups[1].darkAreas).toEqual(['Yard'])
    expect(p.groups[0].darkAreas).toEqual([])
  })
})

describe('windows and regimes', () => {
  it('reads a window past midnight', () => {
    expect(windowMinutes('22:00', '06:00')).toBe(480)
    expect(minutesOfDay('06:30')).toBe(390)
    expect(() => minutesOfDay('24:00')).toThrow(/HH:MM/)
  })
  it('warns when the test does not fit in the window', () => {
    const p = planDurationTests(base([lum('Hall'), lum('Hall')], { windowStart: '19:00', windowEnd: '21:00' }))
    expect(p.warnings.map((w) => w.code)).toContain('window-too-short')
  })
  it('NFPA 101 7.9.3: the annual test lasts 1½ h whatever the rating', () => {
    const p = planDurationTests(base([lum('Aisle'), lum('Aisle')], { regime: 'nfpa101', windowStart: '22:00', windowEnd: '02:00' }))
    expect(p.groups[0]).toMatchObject({ testH: 1.5, startsAt: '2027-03-01T22:00', endsAt: '2027-03-01T23:30', fullCoverAt: '2027-03-02T23:30' })
    expect(p.groups[1].startsAt).toBe('2027-03-03T22:00')
  })
  it('says so when there is nothing to plan', () => {
    expect(planDurationTests(base([])).warnings.map((w) => w.code)).toEqual(['no-luminaires'])
  })
})
