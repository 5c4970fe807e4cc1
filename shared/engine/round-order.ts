/**
 * The order of a test round and the times a round's tests must last. Pure.
 *
 * Order: luminaires with a failure not yet put right first (the retest is the most urgent job),
 * then those with an overdue test, then the rest; inside each group the site's walking order
 * (luminaires without a place in it after those with one), then area and tag, so the technician
 * walks the building once instead of criss-crossing it. Common practice.
 */
import { REGIMES, type TestRegime } from './due'

export interface RoundLuminaire {
  tag: string
  areaName: string | null
  walkOrder: number | null
  due: { state: 'failed' | 'overdue' | 'due-now' | 'due-soon' | 'ok' }
}

/** 0 = open failure, 1 = overdue, 2 = everything else. */
export function roundPriority(l: RoundLuminaire): 0 | 1 | 2 {
  return l.due.state === 'failed' ? 0 : l.due.state === 'overdue' ? 1 : 2
}

const byWalk = (a: RoundLuminaire, b: RoundLuminaire) => {
  if (a.walkOrder !== null && b.walkOrder !== null && a.walkOrder !== b.walkOrder) return a.walkOrder - b.walkOrder
  if ((a.walkOrder === null) !== (b.walkOrder === null)) return a.walkOrder === null ? 1 : -1
  return (a.areaName ?? '').localeCompare(b.areaName ?? '') || a.tag.localeCompare(b.tag, undefined, { numeric: true })
}

/** A new array in round order; the input is not changed. */
export function roundOrder<L extends RoundLuminaire>(luminaires: readonly L[]): L[] {
  return [...luminaires].sort((a, b) => roundPriority(a) - roundPriority(b) || byWalk(a, b))
}

/**
 * Hours a full-duration test must last for a luminaire under a regime: its rated duration where the
 * regime asks for the rated duration (EN 50172 / BS 5266-1), the regime's fixed time otherwise
 * (NFPA 101 7.9.3: 1½ h).
 */
export function requiredDurationH(regime: TestRegime, ratedH: number): number {
  const rule = REGIMES[regime].durationTest
  return rule === 'rated' ? ratedH : rule.hours
}

/** The shortest time the short (functional) test must last under a regime, seconds; 0 = no fixed time. */
export function functionalMinimumS(regime: TestRegime): number {
  return REGIMES[regime].functionalMinimumS
}
