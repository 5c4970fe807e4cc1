/** Round order and the times a round's tests must last. */
import { describe, expect, it } from 'vitest'
import { functionalMinimumS, requiredDurationH, roundOrder } from '../../../shared/engine/round-order'

type State = 'failed' | 'overdue' | 'due-now' | 'due-soon' | 'ok'
const lum = (tag: string, state: State, walkOrder: number | null = null, areaName: string | null = 'Hall') => ({ tag, areaName, walkOrder, due: { state } })

describe('round order (common practice: urgent work first, then one walk through the building)', () => {
  it('puts open failures first, then overdue tests, then the walking order', () => {
    const order = roundOrder([
      lum('A', 'ok', 1),
      lum('B', 'overdue', 5),
      lum('C', 'failed', 9),
      lum('D', 'due-now', 2),
      lum('E', 'overdue', 3),
      lum('F', 'ok', null),
    ])
    expect(order.map((l) => l.tag)).toEqual(['C', 'E', 'B', 'A', 'D', 'F'])
  })
  it('places luminaires without a walking place after those with one, by area then tag (10 after 9)', () => {
    const order = roundOrder([lum('L-10', 'ok', null, 'B'), lum('L-9', 'ok', null, 'B'), lum('L-1', 'ok', null, 'A'), lum('L-5', 'ok', 1, 'Z')])
    expect(order.map((l) => l.tag)).toEqual(['L-5', 'L-1', 'L-9', 'L-10'])
  })
  it('does not change the list it is given', () => {
    const input = [lum('A', 'ok'), lum('B', 'failed')]
    roundOrder(input)
    expect(input.map((l) => l.tag)).toEqual(['A', 'B'])
  })
})

describe('how long the tests of a round must last', () => {
  it('EN 50172 / BS 5266-1 (from memory): the full-duration test lasts the rated duration; no fixed short-test time', () => {
    expect(requiredDurationH('en50172', 3)).toBe(3)
    expect(requiredDurationH('en50172', 1)).toBe(1)
    expect(functionalMinimumS('en50172')).toBe(0)
  })
  it('NFPA 101 7.9.3: the annual test lasts 1½ h whatever the rating; the monthly test at least 30 s', () => {
    expect(requiredDurationH('nfpa101', 3)).toBe(1.5)
    expect(requiredDurationH('nfpa101', 1.5)).toBe(1.5)
    expect(functionalMinimumS('nfpa101')).toBe(30)
  })
})
