/**
 * Planning a site's full-duration tests around the building. Pure: the site's luminaires and the
 * designer's choices in, groups with their times out.
 *
 * A full discharge leaves a luminaire without cover until its battery has recharged: 24 h under
 * IEC 60598-2-22 (the charge period a self-contained luminaire is rated for; from memory), or the
 * figure its charger check gave. So the tests go in groups, and the next group starts only when the
 * previous one is back to full cover:
 * - `alternate`: inside every area (in walking order) every other luminaire goes in the first group,
 *   the rest in the second, so no area is ever left with all its luminaires under test or
 *   recharging (common practice). An area with a single luminaire cannot meet that: it is flagged.
 * - `area`: one group per area; each area is without cover during its own test and recharge, so it
 *   must be kept unoccupied then (flagged on every group).
 * - `circuit`: one group per final circuit, as switched at the distribution board; an area whose
 *   luminaires are all on one circuit is flagged.
 * Each test starts when the out-of-hours window opens on the first day it may, and must end before
 * the window closes. Times are the site's wall-clock times ("YYYY-MM-DDTHH:MM", no time zone): a
 * change to or from daylight saving inside the plan moves the real times by an hour.
 */
import { addDays, parseIsoDate, type IsoDate, type TestRegime } from './due'
import { requiredDurationH } from './round-order'

export type PlanGrouping = 'alternate' | 'area' | 'circuit'

/** The caution shown with every plan and printed on its work order (common practice). */
export const PLAN_CAUTION =
  'A full-duration test leaves the luminaires tested without emergency cover until their batteries have recharged (24 h unless the charger check gives another figure). ' +
  'Test when the building can spare that cover (out of hours, the areas concerned unoccupied or with other lighting), and restore the normal supply to every luminaire afterwards. ' +
  'Simulate the supply failure with the test switch or key; isolate the mains before opening a luminaire. Local codes and a competent, licensed person decide what the installation needs.'

/** IEC 60598-2-22: a self-contained luminaire recharges within 24 h (from memory). */
export const DEFAULT_RECHARGE_H = 24

export interface PlanLuminaire {
  id: string
  tag: string
  areaId: string | null
  areaName: string | null
  circuit: string
  walkOrder: number | null
  ratedDurationH: number
  /** Hours to full charge from the charger check, when known. */
  rechargeH: number | null
}

export interface PlanInput {
  regime: TestRegime
  grouping: PlanGrouping
  /** The first day a test may run. */
  firstDay: IsoDate
  /** The out-of-hours window, "HH:MM"; an end at or before the start runs past midnight. */
  windowStart: string
  windowEnd: string
  /** Recharge time for luminaires without a charger check figure, hours. */
  defaultRechargeH: number
  luminaires: readonly PlanLuminaire[]
}

export interface PlanGroup {
  index: number
  /** "Group 1", or the area's / circuit's name. */
  name: string
  luminaireIds: string[]
  /** Tags in walking order: the round that carries the group out. */
  tags: string[]
  areas: string[]
  testH: number
  rechargeH: number
  startsAt: string
  endsAt: string
  /** When every luminaire of the group is recharged: back to full cover. */
  fullCoverAt: string
  /** Areas left with every luminaire under test in this group. */
  darkAreas: string[]
}

export type PlanWarningCode = 'single-luminaire-area' | 'area-dark' | 'window-too-short' | 'no-luminaires'

export interface PlanWarning {
  code: PlanWarningCode
  message: string
}

export interface TestPlan {
  groups: PlanGroup[]
  warnings: PlanWarning[]
  /** When the last group is back to full cover. */
  finishesAt: string | null
  working: string[]
}

// ---------------------------------------------------------------- wall-clock minutes

const HH_MM = /^([01]\d|2[0-3]):([0-5]\d)$/

/** "18:30" → 1110 minutes after midnight; throws on anything else. */
export function minutesOfDay(hhmm: string): number {
  const m = HH_MM.exec(hhmm)
  if (!m) throw new Error(`"${hhmm}" is not a time of day in the form HH:MM`)
  return Number(m[1]) * 60 + Number(m[2])
}

const DAY_MIN = 1440
const pad = (n: number) => String(n).padStart(2, '0')

/** Minutes counted from `origin` at 00:00 → "YYYY-MM-DDTHH:MM". */
function stamp(origin: IsoDate, minutes: number): string {
  const day = Math.floor(minutes / DAY_MIN)
  const m = minutes - day * DAY_MIN
  return `${addDays(origin, day)}T${pad(Math.floor(m / 60))}:${pad(m % 60)}`
}

/** The window's length in minutes (past midnight when the end is not after the start). */
export function windowMinutes(windowStart: string, windowEnd: string): number {
  const s = minutesOfDay(windowStart)
  const e = minutesOfDay(windowEnd)
  return e > s ? e - s : e + DAY_MIN - s
}

// ---------------------------------------------------------------- grouping

const NO_AREA = 'No area'
const areaOf = (l: PlanLuminaire) => l.areaName ?? NO_AREA
const walk = (a: PlanLuminaire, b: PlanLuminaire) =>
  (a.walkOrder ?? Number.MAX_SAFE_INTEGER) - (b.walkOrder ?? Number.MAX_SAFE_INTEGER) ||
  areaOf(a).localeCompare(areaOf(b)) ||
  a.tag.localeCompare(b.tag, undefined, { numeric: true })

function byKey(luminaires: readonly PlanLuminaire[], key: (l: PlanLuminaire) => string): Map<string, PlanLuminaire[]> {
  const out = new Map<string, PlanLuminaire[]>()
  for (const l of [...luminaires].sort(walk)) out.set(key(l), [...(out.get(key(l)) ?? []), l])
  return new Map([...out.entries()].sort(([a], [b]) => a.localeCompare(b)))
}

function groupsOf(input: PlanInput): Array<{ name: string; members: PlanLuminaire[] }> {
  if (input.grouping === 'area') return [...byKey(input.luminaires, areaOf).entries()].map(([name, members]) => ({ name, members }))
  if (input.grouping === 'circuit')
    return [...byKey(input.luminaires, (l) => l.circuit.trim() || 'No circuit given').entries()].map(([name, members]) => ({
      name: `Circuit ${name}`,
      members,
    }))
  // Alternate inside each area, walking order kept.
  const first: PlanLuminaire[] = []
  const second: PlanLuminaire[] = []
  for (const members of byKey(input.luminaires, areaOf).values()) members.forEach((l, i) => (i % 2 === 0 ? first : second).push(l))
  return [
    { name: 'Group 1', members: first.sort(walk) },
    { name: 'Group 2', members: second.sort(walk) },
  ].filter((g) => g.members.length)
}

// ---------------------------------------------------------------- the plan

export function planDurationTests(input: PlanInput): TestPlan {
  parseIsoDate(input.firstDay)
  const open = minutesOfDay(input.windowStart)
  const windowLen = windowMinutes(input.windowStart, input.windowEnd)
  const warnings: PlanWarning[] = []
  const working: string[] = [
    `Grouping: ${input.grouping}; out-of-hours window ${input.windowStart} to ${input.windowEnd} (${windowLen} min) from ${input.firstDay}.`,
    `Recharge: each luminaire's charger figure where known, else ${input.defaultRechargeH} h; the next group starts at the first window opening after the previous group is back to full cover.`,
  ]
  if (!input.luminaires.length) {
    warnings.push({ code: 'no-luminaires', message: 'The site has no luminaires to plan.' })
    return { groups: [], warnings, finishesAt: null, working }
  }
  const areaSizes = new Map<string, number>()
  for (const l of input.luminaires) areaSizes.set(areaOf(l), (areaSizes.get(areaOf(l)) ?? 0) + 1)
  if (input.grouping === 'alternate') {
    for (const [area, n] of areaSizes) {
      if (n === 1)
        warnings.push({
          code: 'single-luminaire-area',
          message: `${area} has a single luminaire: it is without cover during its test and recharge. Keep the area unoccupied then, or provide temporary lighting.`,
        })
    }
  }

  let earliest = open // minutes from firstDay 00:00
  const groups: PlanGroup[] = []
  for (const [i, g] of groupsOf(input).entries()) {
    const testH = Math.max(...g.members.map((l) => requiredDurationH(input.regime, l.ratedDurationH)))
    const rechargeH = Math.max(...g.members.map((l) => l.rechargeH ?? input.defaultRechargeH))
    const testMin = Math.round(testH * 60)
    if (testMin > windowLen && !warnings.some((w) => w.code === 'window-too-short')) {
      warnings.push({
        code: 'window-too-short',
        message: `A ${testH} h test does not fit in the ${windowLen} min window: widen the window, or the tests run into occupied hours.`,
      })
    }
    // The first window opening at or after `earliest`.
    const day = Math.max(0, Math.ceil((earliest - open) / DAY_MIN))
    const start = day * DAY_MIN + open
    const end = start + testMin
    const fullCover = end + Math.round(rechargeH * 60)
    const areas = [...new Set(g.members.map(areaOf))]
    const darkAreas = areas.filter((a) => g.members.filter((l) => areaOf(l) === a).length === areaSizes.get(a))
    const flagged = input.grouping === 'alternate' ? [] : darkAreas
    if (flagged.length)
      warnings.push({
        code: 'area-dark',
        message: `${g.name}: ${flagged.join(', ')} without emergency cover from ${stamp(input.firstDay, start).replace('T', ' ')} to ${stamp(input.firstDay, fullCover).replace('T', ' ')}. Keep ${flagged.length > 1 ? 'them' : 'it'} unoccupied then.`,
      })
    groups.push({
      index: i + 1,
      name: g.name,
      luminaireIds: g.members.map((l) => l.id),
      tags: g.members.map((l) => l.tag),
      areas,
      testH,
      rechargeH,
      startsAt: stamp(input.firstDay, start),
      endsAt: stamp(input.firstDay, end),
      fullCoverAt: stamp(input.firstDay, fullCover),
      darkAreas,
    })
    working.push(
      `${g.name}: ${g.members.length} luminaires, test ${testH} h, recharge ${rechargeH} h: ${stamp(input.firstDay, start)} to ${stamp(input.firstDay, end)}, full cover ${stamp(input.firstDay, fullCover)}.`,
    )
    earliest = fullCover
  }
  return { groups, warnings, finishesAt: groups.length ? groups[groups.length - 1].fullCoverAt : null, working }
}
