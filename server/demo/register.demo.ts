/**
 * Demo register: three invented buildings with about 60 luminaires and two years of test history,
 * a handful of failures and two packs near the end of their life. Deterministic (a fixed seed);
 * dates are counted back from the day of seeding so the dashboard always has something due.
 * Idempotent: a building already present is left alone.
 */
import type { EntityManager } from 'typeorm'
import { addDays, addMonthsClamped } from '../../shared/engine/due'
import type { TestRegimeId } from '../../shared/schemas/site.schema'
import type { ChemistryId } from '../../shared/engine/chemistries'
import { AreaEntity } from '../modules/register/area.entity'
import { LuminaireEntity } from '../modules/register/luminaire.entity'
import { SiteEntity } from '../modules/register/site.entity'
import type { DemoContext } from './accounts.demo'
import { seededRandom } from '../../shared/lib/seeded-random'

type Purpose = LuminaireEntity['purpose']
type Mode = LuminaireEntity['mode']

interface LuminaireSpec {
  tag: string
  area: string
  location: string
  type: string
  purpose: Purpose
  mode: Mode
  chemistry: ChemistryId
  cells: number
  capacityAh: number
  /** Age of the pack at seeding, days. */
  packAgeDays: number
  /** Achieved duration falls by this many hours per year (a fading pack). */
  fadeHPerYear?: number
}

interface SiteSpec {
  name: string
  address: string
  responsibleName: string
  responsibleEmail: string
  regime: TestRegimeId
  ceilingTemperatureC: number
  ratedDurationH: number
  luminaires: LuminaireSpec[]
}

function uuidFrom(rand: () => number): string {
  const hex = Array.from({ length: 32 }, () => Math.floor(rand() * 16).toString(16))
  hex[12] = '4'
  hex[16] = ((Math.floor(rand() * 4) + 8) as number).toString(16)
  const s = hex.join('')
  return `${s.slice(0, 8)}-${s.slice(8, 12)}-${s.slice(12, 16)}-${s.slice(16, 20)}-${s.slice(20)}`
}

function buildSites(rand: () => number): SiteSpec[] {
  const pick = <T>(xs: T[]) => xs[Math.floor(rand() * xs.length)]
  const library: LuminaireSpec[] = []
  const libAreas = [
    {
      area: 'Entrance hall',
      n: 6,
      purpose: 'escape-route' as Purpose,
      spots: ['Main doors', 'Lobby', 'Returns desk', 'Cloakroom', 'Lift lobby', 'Accessible toilet'],
    },
    {
      area: 'Reading room',
      n: 6,
      purpose: 'open-area' as Purpose,
      spots: ['North bay', 'South bay', 'Centre tables', 'Periodicals', 'Study carrels', 'Local history'],
    },
    {
      area: 'Stairs and upper floor',
      n: 6,
      purpose: 'escape-route' as Purpose,
      spots: ['Stair A landing', 'Stair A foot', 'Stair B landing', 'Upper corridor', 'Archive door', 'Event room exit'],
    },
  ]
  for (const a of libAreas) {
    a.spots.slice(0, a.n).forEach((spot, i) => {
      library.push({
        tag: `LB-${a.area.slice(0, 1)}${String(i + 1).padStart(2, '0')}`,
        area: a.area,
        location: spot,
        type: a.purpose === 'open-area' ? 'Ceiling panel CP-3' : 'Bulkhead BK-3',
        purpose: a.purpose,
        mode: a.purpose === 'open-area' ? 'maintained' : 'non-maintained',
        chemistry: pick(['nicd', 'nimh'] as ChemistryId[]),
        cells: 3,
        capacityAh: 2.2,
        packAgeDays: 500 + Math.floor(rand() * 600),
      })
    })
  }
  library.push({
    tag: 'LB-X01',
    area: 'Entrance hall',
    location: 'Over main doors',
    type: 'Edge-lit exit sign ES-1',
    purpose: 'exit-sign',
    mode: 'maintained',
    chemistry: 'nicd',
    cells: 3,
    capacityAh: 1.6,
    packAgeDays: 700,
  })
  library.push({
    tag: 'LB-X02',
    area: 'Stairs and upper floor',
    location: 'Event room door',
    type: 'Edge-lit exit sign ES-1',
    purpose: 'exit-sign',
    mode: 'maintained',
    chemistry: 'nicd',
    cells: 3,
    capacityAh: 1.6,
    packAgeDays: 700,
  })

  const care: LuminaireSpec[] = []
  const careAreas = [
    { area: 'Ground floor corridor', spots: ['Reception', 'Corridor west', 'Corridor east', 'Fire door 1', 'Lift lobby', 'Day room exit'] },
    {
      area: 'First floor bedrooms',
      spots: [
        'Corridor by room 11',
        'Corridor by room 15',
        'Corridor by room 19',
        'Stair 1 head',
        'Stair 2 head',
        'Nurse station',
        'Corridor by room 23',
        'Lounge exit',
      ],
    },
    { area: 'Kitchen and laundry', spots: ['Kitchen exit', 'Laundry', 'Store'] },
  ]
  for (const a of careAreas) {
    a.spots.forEach((spot, i) => {
      care.push({
        tag: `CH-${a.area.slice(0, 1)}${String(i + 1).padStart(2, '0')}`,
        area: a.area,
        location: spot,
        type: 'Slim bulkhead SB-3HT',
        purpose: 'escape-route',
        mode: 'non-maintained',
        // Warm ceilings: high-temperature NiCd cells, except two older standard packs.
        chemistry: 'nicd-ht',
        cells: 4,
        capacityAh: 1.6,
        packAgeDays: 300 + Math.floor(rand() * 900),
      })
    })
  }
  // The two packs near the end of their life: standard NiCd at about 35 °C lasts only some 2.5 years.
  Object.assign(care[1], { chemistry: 'nicd', packAgeDays: 830, fadeHPerYear: 0.25 })
  Object.assign(care[8], { chemistry: 'nicd', packAgeDays: 870, fadeHPerYear: 0.2 })
  care.push({
    tag: 'CH-X01',
    area: 'Ground floor corridor',
    location: 'Over reception exit',
    type: 'Edge-lit exit sign ES-1',
    purpose: 'exit-sign',
    mode: 'maintained',
    chemistry: 'nicd-ht',
    cells: 4,
    capacityAh: 1.6,
    packAgeDays: 640,
  })

  const warehouse: LuminaireSpec[] = []
  for (const aisle of ['A', 'B', 'C', 'D']) {
    for (let i = 1; i <= 4; i++) {
      warehouse.push({
        tag: `WH-${aisle}${i}`,
        area: `Aisle ${aisle}`,
        location: `Aisle ${aisle}, bay ${i * 6}`,
        type: 'High-bay module HB-90',
        purpose: 'escape-route',
        mode: 'non-maintained',
        chemistry: 'lifepo4',
        cells: 1,
        capacityAh: 6,
        packAgeDays: 400 + Math.floor(rand() * 500),
      })
    }
  }
  for (const [i, spot] of ['Dock leveller 1', 'Dock leveller 2', 'Forklift charging'].entries()) {
    warehouse.push({
      tag: `WH-L${i + 1}`,
      area: 'Loading bay',
      location: spot,
      type: 'High-bay module HB-90',
      purpose: 'high-risk',
      mode: 'maintained',
      chemistry: 'lead-acid',
      cells: 6,
      capacityAh: 7,
      packAgeDays: 600 + Math.floor(rand() * 300),
    })
  }
  warehouse.push({
    tag: 'WH-X01',
    area: 'Loading bay',
    location: 'Yard door',
    type: 'Edge-lit exit sign ES-1',
    purpose: 'exit-sign',
    mode: 'maintained',
    chemistry: 'lifepo4',
    cells: 1,
    capacityAh: 3,
    packAgeDays: 500,
  })

  return [
    {
      name: 'Wrenfield Public Library (demo)',
      address: '4 Quillon Street, Wrenfield',
      responsibleName: 'Tamsin Reevely',
      responsibleEmail: 'facilities@wrenfield-library.example',
      regime: 'en50172',
      ceilingTemperatureC: 24,
      ratedDurationH: 3,
      luminaires: library,
    },
    {
      name: 'Hollin Grange Care Home (demo)',
      address: 'Hollin Lane, Upper Brackwater',
      responsibleName: 'Gideon Ashcombe',
      responsibleEmail: 'manager@hollin-grange.example',
      regime: 'en50172',
      ceilingTemperatureC: 35,
      ratedDurationH: 3,
      luminaires: care,
    },
    {
      name: 'Larkmoor Distribution Centre (demo)',
      address: 'Unit 9, Larkmoor Trade Park',
      responsibleName: 'Priya Vantongeren',
      responsibleEmail: 'site-safety@larkmoor-dc.example',
      regime: 'nfpa101',
      ceilingTemperatureC: 8,
      ratedDurationH: 1.5,
      luminaires: warehouse,
    },
  ]
}

const FAULTS = [
  ['LED module did not light', 'Replaced the LED module; retested and passed'],
  ['Charge indicator off after the test', 'Loose battery connector re-made; retested'],
  ['Diffuser cracked, lamp dim', 'Diffuser replaced'],
]

/** Adds the demo buildings to the demo workspace (skips any already there). */
export async function seedRegister(m: EntityManager, ctx: DemoContext, today = new Date().toISOString().slice(0, 10)): Promise<void> {
  const rand = seededRandom(0x1a3b5c7d)
  const technician = ctx.users.technician ?? null
  for (const spec of buildSites(rand)) {
    const exists = await m.getRepository(SiteEntity).findOne({ where: { workspaceId: ctx.workspaceId, name: spec.name } })
    if (exists) continue
    const site = await m.getRepository(SiteEntity).save(
      m.getRepository(SiteEntity).create({
        workspaceId: ctx.workspaceId,
        name: spec.name,
        address: spec.address,
        responsibleName: spec.responsibleName,
        responsibleEmail: spec.responsibleEmail,
        regime: spec.regime,
        ceilingTemperatureC: spec.ceilingTemperatureC,
      }),
    )
    const areaIds = new Map<string, string>()
    for (const name of [...new Set(spec.luminaires.map((l) => l.area))]) {
      const area = await m
        .getRepository(AreaEntity)
        .save(m.getRepository(AreaEntity).create({ workspaceId: ctx.workspaceId, siteId: site.id, name, notes: '' }))
      areaIds.set(name, area.id)
    }
    // The site's round falls on about the same day each month; a few luminaires are behind.
    const roundOffset = 3 + Math.floor(rand() * 20)
    for (const [index, l] of spec.luminaires.entries()) {
      const fittedOn = addDays(today, -l.packAgeDays)
      const lum = await m.getRepository(LuminaireEntity).save(
        m.getRepository(LuminaireEntity).create({
          workspaceId: ctx.workspaceId,
          siteId: site.id,
          areaId: areaIds.get(l.area) ?? null,
          tag: l.tag,
          location: l.location,
          typeLabel: l.type,
          purpose: l.purpose,
          mode: l.mode,
          ratedDurationH: spec.ratedDurationH,
          chemistry: l.chemistry,
          cellsInSeries: l.cells,
          capacityAh: l.capacityAh,
          packFittedOn: fittedOn,
          specSheetId: null,
          luminaireTypeId: null,
        }),
      )
      const behind = index % 9 === 4 // about one in nine has missed the latest round
      const rows: unknown[][] = []
      const start = addDays(today, -730)
      // Monthly (or 30-day) functional tests over two years.
      const dates: string[] = []
      if (spec.regime === 'nfpa101') for (let d = addDays(today, -roundOffset); d >= start; d = addDays(d, -30)) dates.push(d)
      else for (let k = 0; k < 24; k++) dates.push(addDays(addMonthsClamped(today, -k), -roundOffset + Math.floor(rand() * 3)))
      const annual = [addMonthsClamped(addDays(today, -roundOffset - 40), -12), addDays(today, -roundOffset - 40)]
      for (const d of dates.slice(behind ? 2 : 0)) {
        if (d < start) continue
        const failed = rand() < 0.005
        const fault = FAULTS[Math.floor(rand() * FAULTS.length)]
        rows.push([d, 'functional', !failed, null, failed ? fault[0] : '', failed ? fault[1] : ''])
        if (failed) rows.push([addDays(d, 2), 'functional', true, null, '', 'Retest after repair'])
      }
      for (const d of annual) {
        const sinceFitted = (Date.parse(d) - Date.parse(fittedOn)) / (365.25 * 86_400_000)
        if (sinceFitted < 0) continue // tests of the previous pack are not part of the demo
        const margin = 0.35 + rand() * 0.2 - (l.fadeHPerYear ?? 0.03) * sinceFitted * 0.8
        const achieved = Math.round((spec.ratedDurationH + margin) * 100) / 100
        const passed = achieved >= spec.ratedDurationH
        rows.push([
          d,
          'duration',
          passed,
          passed ? spec.ratedDurationH + Math.max(0, Math.round(margin * 100) / 100) : achieved,
          passed ? '' : `Went dark after ${achieved} h`,
          passed ? '' : 'Replacement pack ordered',
        ])
      }
      // One recent failure left open, at the care home.
      if (spec.name.startsWith('Hollin') && index === 5)
        rows.push([addDays(today, -6), 'functional', false, null, 'No light in emergency mode', 'Reported to the site manager; pack on order'])
      for (const r of rows) {
        await m.query(
          `INSERT INTO test_records (workspace_id, luminaire_id, client_id, kind, tested_on, passed, achieved_duration_h, faults, remedial_action, recorded_by, recorded_at)
           VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, ($5::date + time '10:00') AT TIME ZONE 'UTC')`,
          [ctx.workspaceId, lum.id, uuidFrom(rand), r[1], r[0], r[2], r[3], r[4], r[5], technician],
        )
      }
    }
  }
}
