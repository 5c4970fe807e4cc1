/**
 * POST /api/calc/:tool answers what the engine answers (the same function the CLI and the screens
 * run), with the working by default and without it on ?working=false.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { sizePack, sizeTool } from '../../shared/engine/size'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client } from '../helpers/test-app'

let built: BuiltApp
let viewer: Client
beforeAll(async () => {
  built = await getTestApp()
  const team = await makeTeam('Calc team')
  viewer = await signIn(built.app, team.users.viewer.email)
})
afterAll(closeTestApp)

// An invented luminaire: 3 h, 1.6 W of LEDs behind an 85 % converter, warmest 35 °C.
const INPUT = { chemistry: 'nicd', duration: '3 h', load: { power: '1.6 W' }, driver: 'converter', driverEfficiency: 0.85, ambientMax: '35 degC' }

describe('POST /api/calc/:tool', () => {
  it('answers the engine result with its working, figure for figure', async () => {
    const res = await viewer.post('/api/calc/size', INPUT)
    expect(res.status).toBe(200)
    const expected = sizePack(sizeTool.input.parse(INPUT))
    expect(res.body.tool).toBe('size')
    expect(res.body.selectedCapacityAh).toBe(expected.selectedCapacityAh)
    expect(res.body.working.map((s: { id: string }) => s.id)).toEqual(expected.working.map((s) => s.id))
    expect(res.body.working.length).toBeGreaterThan(5)
  })

  it('leaves the working out on ?working=false and keeps every figure and warning', async () => {
    const full = await viewer.post('/api/calc/size', INPUT)
    const lean = await viewer.post('/api/calc/size?working=false', INPUT)
    expect(lean.status).toBe(200)
    expect(lean.body.working).toEqual([])
    const { working: _w, ...fullFigures } = full.body
    const { working: _l, ...leanFigures } = lean.body
    expect(leanFigures).toEqual(fullFigures)
    expect(JSON.stringify(lean.body).length).toBeLessThan(JSON.stringify(full.body).length / 3)
  })

  it('refuses a working flag that is not true or false, naming the field', async () => {
    const res = await viewer.post('/api/calc/size?working=maybe', INPUT)
    expect(res.status).toBe(400)
    expect(res.body.fields).toEqual([expect.objectContaining({ path: 'working' })])
  })

  it('refuses a bare-number duration or capacity in every tool with 400 naming the field', async () => {
    const samples = Array.from({ length: 10 }, (_, k) => ({ t: k * 600, v: 6.3 - k * 0.01, i: 0.5 }))
    const bare: Array<[string, Record<string, unknown>, string]> = [
      ['size', { ...INPUT, duration: 3 }, 'duration'],
      ['charge', { chemistry: 'nicd', capacity: 4, duration: '3 h', load: { power: '3 W' }, chargeCurrent: '0.2 A' }, 'capacity'],
      ['compare', { duration: 3, load: { power: '3 W' } }, 'duration'],
      [
        'retrofit',
        {
          chemistry: 'nicd',
          cellsInSeries: 3,
          capacity: '4 Ah',
          trickleCurrent: '0.2 A',
          batteryVoltage: '4.35 V',
          secondReading: { kind: 'open-circuit', voltage: '12 V' },
          targetTrickleCurrent: '0.12 A',
          dischargeCurrent: '0.9 A',
          duration: 3,
        },
        'duration',
      ],
      ['discharge', { samples, chemistry: 'nicd', cellsInSeries: 5, ratedDuration: 3 }, 'ratedDuration'],
    ]
    for (const [tool, body, field] of bare) {
      const res = await viewer.post(`/api/calc/${tool}`, body)
      expect(res.status, tool).toBe(400)
      expect(res.body.fields, tool).toContainEqual({ path: field, message: expect.stringContaining('needs a unit') })
    }
  })

  it('refuses an absurd magnitude with 400 naming the field', async () => {
    const res = await viewer.post('/api/calc/audit', {
      claimedPower: '3 W',
      supplyVoltage: '230 V',
      measuredPower: 1e300,
      measuredCurrent: '25 mA',
      mode: 'maintained',
      hoursPerDay: 24,
      tariffPerKWh: 0.3,
    })
    expect(res.status).toBe(400)
    expect(res.body.fields).toContainEqual(expect.objectContaining({ path: 'measuredPower' }))
  })

  it('runs replace from a label: the recommended pack keeps the 4.8 V and suits the charger', async () => {
    const label = {
      oldPack: { chemistry: 'nicd', nominalVoltage: '4.8 V', capacity: '1.6 Ah', cellFormat: 'sub-C' },
      duration: '3 h',
      mode: 'non-maintained',
      charger: { type: 'nickel-constant-current', chargeCurrent: '120 mA' },
    }
    const res = await viewer.post('/api/calc/replace', label)
    expect(res.status).toBe(200)
    expect(res.body.oldPackNominalVoltageV).toBeCloseTo(4.8, 12)
    const best = res.body.candidates[res.body.recommended]
    expect(best).toMatchObject({ cellsInSeries: 4, sameVoltage: true, meetsDuration: true })
    expect(best.chargerCompatible).not.toBe('no')
  })

  it('refuses a replace input whose old pack voltage is not whole cells, naming the field', async () => {
    const res = await viewer.post('/api/calc/replace', {
      oldPack: { chemistry: 'nicd', nominalVoltage: '5 V', capacity: '1.6 Ah' },
      duration: '3 h',
      mode: 'maintained',
      charger: { type: 'unknown', chargeCurrent: '100 mA' },
    })
    expect(res.status).toBe(400)
    expect(res.body.fields).toEqual(expect.arrayContaining([expect.objectContaining({ path: 'oldPack.nominalVoltage' })]))
  })

  it('answers an unknown tool with 404', async () => {
    const res = await viewer.post('/api/calc/nothing-here', INPUT)
    expect(res.status).toBe(404)
  })
})
