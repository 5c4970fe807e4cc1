/**
 * Demo discharge logs: a passing and a failing 3 h full-duration test of a 4-cell NiCd pack,
 * generated from a simple model (a slow fall, then the knee of a flat pack), not measured. The
 * passing one is attached to a demo sheet, the failing one to a failed duration test of the demo
 * register when those exist. Idempotent: a log whose title exists is skipped.
 */
import crypto from 'node:crypto'
import { Readable } from 'node:stream'
import type { EntityManager } from 'typeorm'
import { ENGINE_VERSION } from '../../shared/engine/version'
import { ColumnMappingSchema, DischargeOptionsSchema } from '../../shared/schemas/discharge-log.schema'
import { analyseStream } from '../modules/discharge/discharge.service'
import type { DemoContext } from './accounts.demo'

interface DemoLog {
  title: string
  /** Hours until the pack is flat. */
  flatAtH: number
  amps: number
  attach: 'sheet' | 'failed-test'
}

const LOGS: DemoLog[] = [
  { title: 'Demo: 3 h test that passes (modelled, not measured)', flatAtH: 3.45, amps: 0.46, attach: 'sheet' },
  { title: 'Demo: 3 h test that fails (modelled, not measured)', flatAtH: 2.55, amps: 0.46, attach: 'failed-test' },
]
const CELLS = 4
const NOTES = 'Generated for the demo from a simple model of a 4-cell NiCd pack (gentle fall, then the knee); invented, not a measurement.'

/** The modelled log as a semicolon file with decimal commas and clock times, the way many loggers write it. */
export function modelledLog(flatAtH: number, amps: number): string {
  const lines = ['Elapsed;Pack voltage (V);Current (A)']
  const endH = flatAtH + 0.15
  for (let s = 0; s <= endH * 3600; s += 10) {
    const h = s / 3600
    const loaded = h < flatAtH + 0.05
    const perCell = loaded ? 1.31 - 0.07 * (h / flatAtH) - 0.33 * Math.exp((h - flatAtH) / 0.09) + 0.002 * Math.sin(s / 70) : 1.16
    const current = loaded ? amps + 0.004 * Math.sin(s / 130) : 0
    const clock = `${Math.floor(s / 3600)}:${String(Math.floor((s % 3600) / 60)).padStart(2, '0')}:${String(s % 60).padStart(2, '0')}`
    lines.push(`${clock};${(perCell * CELLS).toFixed(3).replace('.', ',')};${current.toFixed(3).replace('.', ',')}`)
  }
  return `${lines.join('\r\n')}\r\n`
}

const MAPPING = ColumnMappingSchema.parse({
  delimiter: ';',
  decimal: ',',
  header: true,
  firstLine: 1,
  time: { column: 0, format: 'clock' },
  voltage: { column: 1, unit: 'V' },
  current: { column: 2, unit: 'A' },
})
const OPTIONS = DischargeOptionsSchema.parse({
  chemistry: 'nicd',
  cellsInSeries: CELLS,
  ratedDuration: '3 h',
  ratedCapacity: '1.6 Ah',
  thresholdsPerCell: ['1.1 V'],
})

export async function seedDischarge(m: EntityManager, ctx: DemoContext): Promise<void> {
  for (const demo of LOGS) {
    const exists: unknown[] = await m.query('SELECT 1 FROM discharge_logs WHERE workspace_id = $1 AND title = $2', [ctx.workspaceId, demo.title])
    if (exists.length) continue
    const bytes = Buffer.from(modelledLog(demo.flatAtH, demo.amps), 'utf8')
    const analysis = await analyseStream(Readable.from([bytes]), bytes.subarray(0, 64 * 1024), bytes.length, {
      mapping: MAPPING,
      options: OPTIONS,
      acceptBadRows: false,
    })
    const sha256 = crypto.createHash('sha256').update(bytes).digest('hex')
    const file: Array<{ id: string }> = await m.query(
      `INSERT INTO discharge_files (workspace_id, sha256, original_name, bytes, size, uploaded_by) VALUES ($1, $2, $3, $4, $5, $6)
       ON CONFLICT (workspace_id, sha256) DO UPDATE SET sha256 = EXCLUDED.sha256 RETURNING id`,
      [ctx.workspaceId, sha256, `demo-${demo.attach}.csv`, bytes, bytes.length, ctx.users.technician],
    )
    let specSheetId: string | null = null
    let testRecordId: string | null = null
    if (demo.attach === 'sheet') {
      const rows: Array<{ id: string }> = await m.query('SELECT id FROM spec_sheets WHERE workspace_id = $1 ORDER BY created_at, id LIMIT 1', [ctx.workspaceId])
      specSheetId = rows[0]?.id ?? null
    } else {
      const rows: Array<{ id: string }> = await m.query(
        `SELECT id FROM test_records WHERE workspace_id = $1 AND kind = 'duration' AND passed = false AND discharge_log_id IS NULL ORDER BY tested_on DESC, id LIMIT 1`,
        [ctx.workspaceId],
      )
      testRecordId = rows[0]?.id ?? null
    }
    const log: Array<{ id: string }> = await m.query(
      `INSERT INTO discharge_logs (workspace_id, file_id, title, notes, mapping, options, summary, curve, engine_version, created_by, spec_sheet_id, test_record_id)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12) RETURNING id`,
      [
        ctx.workspaceId,
        file[0].id,
        demo.title,
        NOTES,
        MAPPING,
        { chemistry: 'nicd', cellsInSeries: CELLS, ratedDuration: '3 h', ratedCapacity: '1.6 Ah', thresholdsPerCell: ['1.1 V'] },
        { ...analysis.result, read: analysis.read },
        analysis.curve,
        ENGINE_VERSION,
        ctx.users.technician,
        specSheetId,
        testRecordId,
      ],
    )
    if (testRecordId) await m.query('UPDATE test_records SET discharge_log_id = $1 WHERE id = $2', [log[0].id, testRecordId])
  }
}
