/**
 * Synthetic discharge logs with answers worked out by hand (invented data, not measurements):
 * a 4-cell NiCd pack whose voltage falls in a straight line at a constant current, so the time it
 * crosses the 4.0 V cut-off (4 × 1.0 V per cell) and the charge delivered are exact:
 * runtime = (V0 − 4.0) / slope, charge = current × runtime.
 */
import fs from 'node:fs'
import { analyseAndMaybeSave, newStagingPath, stageUpload } from '../../server/modules/discharge/discharge.service'
import type { TestTeam } from './test-app'

export interface LineLog {
  /** Volts at the start. */
  v0: number
  /** Volts lost per hour. */
  slopePerH: number
  /** Amps, constant. */
  amps: number
  /** Seconds between samples. */
  every: number
  /** Hours logged. */
  hours: number
}

/** Passes a 3 h rated duration: 5.6 V falling 0.5 V/h reaches 4.0 V at 3.2 h; 0.5 A × 3.2 h = 1.6 Ah. */
export const PASSING: LineLog = { v0: 5.6, slopePerH: 0.5, amps: 0.5, every: 60, hours: 3.5 }
/** Fails it: 0.6 V/h reaches 4.0 V at 2 h 40 min; 0.5 A × 2.6667 h = 1.3333 Ah. */
export const FAILING: LineLog = { v0: 5.6, slopePerH: 0.6, amps: 0.5, every: 60, hours: 3.5 }

export interface Sample {
  s: number
  v: number
  a: number
}

export function samples(log: LineLog): Sample[] {
  const out: Sample[] = []
  for (let s = 0; s <= log.hours * 3600 + 1e-9; s += log.every) out.push({ s, v: log.v0 - (log.slopePerH * s) / 3600, a: log.amps })
  return out
}

const pad = (n: number) => String(n).padStart(2, '0')
const hms = (s: number) => `${Math.floor(s / 3600)}:${pad(Math.floor((s % 3600) / 60))}:${pad(s % 60)}`

export type Style = 'comma' | 'semicolon-decimal-comma' | 'tab' | 'clock' | 'iso' | 'dmy' | 'millis-minutes'

/** The same readings written the ways loggers write them. */
export function logText(log: LineLog, style: Style = 'comma'): string {
  const rows = samples(log)
  const start = Date.UTC(2026, 2, 1, 14, 5, 9) / 1000
  const iso = (s: number) => new Date((start + s) * 1000).toISOString().replace('.000Z', 'Z')
  const dmy = (s: number) => {
    const d = new Date((start + s) * 1000)
    return `${pad(d.getUTCDate())}/${pad(d.getUTCMonth() + 1)}/${d.getUTCFullYear()} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:${pad(d.getUTCSeconds())}`
  }
  const f = (x: number, digits = 4) => x.toFixed(digits)
  switch (style) {
    case 'comma':
      return ['Elapsed (s),Voltage (V),Current (A)', ...rows.map((r) => `${r.s},${f(r.v)},${f(r.a)}`)].join('\n') + '\n'
    case 'semicolon-decimal-comma':
      return ['Elapsed (s);Voltage (V);Current (A)', ...rows.map((r) => `${r.s};${f(r.v).replace('.', ',')};${f(r.a).replace('.', ',')}`)].join('\r\n') + '\r\n'
    case 'tab':
      return (
        ['# bench logger export (invented)', '# channel 1: pack', 'time_s\tpack_v\tcurrent_a', ...rows.map((r) => `${r.s}\t${f(r.v)}\t${f(r.a)}`)].join('\n') +
        '\n'
      )
    case 'clock':
      return ['Time,Voltage (V),Current (A)', ...rows.map((r) => `${hms(r.s)},${f(r.v)},${f(r.a)}`)].join('\n') + '\n'
    case 'iso':
      return ['Timestamp,Voltage (V),Current (A)', ...rows.map((r) => `${iso(r.s)},${f(r.v)},${f(r.a)}`)].join('\n') + '\n'
    case 'dmy':
      return ['Date time;Voltage (V);Current (A)', ...rows.map((r) => `${dmy(r.s)};${f(r.v).replace('.', ',')};${f(r.a).replace('.', ',')}`)].join('\n') + '\n'
    case 'millis-minutes':
      return ['t (min),U (mV),I (mA)', ...rows.map((r) => `${f(r.s / 60, 6)},${f(r.v * 1000, 1)},${f(r.a * 1000, 1)}`)].join('\n') + '\n'
  }
}

export const NICD_3H = { chemistry: 'nicd', cellsInSeries: 4, ratedDuration: '3 h', ratedCapacity: '1.6 Ah' }

export const COMMA_MAPPING = {
  delimiter: ',',
  decimal: '.',
  header: true,
  firstLine: 1,
  time: { column: 0, format: 'elapsed', unit: 's' },
  voltage: { column: 1, unit: 'V' },
  current: { column: 2, unit: 'A' },
}

/** A staged upload in a workspace, as the upload route leaves it. */
export async function stagedIn(team: TestTeam, text = logText(PASSING), name = 'passing.csv') {
  const staged = newStagingPath()
  fs.writeFileSync(staged.file, text)
  return stageUpload(team.workspaceId, team.users.technician.id, staged.file, name)
}

/** A saved log in a workspace (optionally on a sheet). */
export async function savedLogIn(team: TestTeam, log: LineLog = PASSING, extra: { specSheetId?: string; title?: string } = {}) {
  const up = await stagedIn(team, logText(log))
  const out = await analyseAndMaybeSave(team.workspaceId, team.users.technician.id, {
    uploadId: up.uploadId,
    title: extra.title ?? 'Synthetic log',
    notes: '',
    mapping: COMMA_MAPPING as never,
    options: NICD_3H as never,
    acceptBadRows: false,
    dryRun: false,
    specSheetId: extra.specSheetId ?? null,
    runtimeNote: '',
  })
  if (!out.saved) throw new Error('not saved')
  return out
}
