/** Answers of /api/discharge: staged uploads, analysed and saved logs, comparisons. */
import { z } from 'zod'
import type { MappingGuess } from '../../engine/discharge-log'
import type { EngineWarning, WorkingStep } from '../../engine/types'
import { DELIMITERS } from '../discharge-log.schema'
import { engineShape, PersonSchema, storedAs, Timestamp } from './common'

/** A row of the log that could not be read. */
export interface BadRow {
  row: number
  column: string
  value: string
  reason: string
}

/** The engine's discharge summary as saved, with how the file was read. */
export interface DischargeSummary {
  runtimeH: number
  runtimeEnd: 'cutoff' | 'dropout' | 'end-of-log'
  cutoffTimeH: number | null
  dropoutTimeH: number | null
  cutoffVoltageV: number
  thresholdCrossings: Array<{ perCellV: number; packV: number; timeH: number | null }>
  deliveredAh: number | null
  deliveredWh: number | null
  estimated: boolean
  midpointVoltageV: number
  pass: boolean | null
  marginH: number
  stateOfHealth: number | null
  samplesUsed: number
  warnings: EngineWarning[]
  /** Lists leave out the working. */
  working?: WorkingStep[]
  read: { rows: number; badRows: { count: number; items: BadRow[] }; currentInverted: boolean }
}

/** How the columns of a log are read (as sent when it was analysed). */
export interface LogMapping {
  delimiter: ',' | ';' | '\t'
  decimal: '.' | ','
  header: boolean
  firstLine: number
  time: { column: number; format: 'elapsed' | 'clock' | 'timestamp'; unit: 's' | 'min' | 'h'; dateOrder: 'ymd' | 'dmy' | 'mdy' }
  voltage: { column: number; unit: 'V' | 'mV' }
  current: { column: number; unit: 'A' | 'mA' } | null
}

/** The analysis options as typed ("3 h", "1.0 V"). */
export interface LogOptions {
  chemistry: string
  cellsInSeries: number
  ratedDuration: string
  cutoffPerCell?: string
  ratedCapacity?: string
  thresholdsPerCell?: string[]
  assumedPower?: string
}

/** The down-sampled curve: hours, volts and (when logged) amperes. */
export const CurveAnswer = z.object({ tH: z.array(z.number()), v: z.array(z.number()), i: z.array(z.number()).nullable() })

const Summary = storedAs<DischargeSummary>("The engine's discharge summary, with how the file was read")

export const UploadPreviewAnswer = z.object({
  uploadId: z.string(),
  sha256: z.string(),
  size: z.number().int(),
  name: z.string(),
  /** Save it before then; an upload nobody saves is deleted. */
  expiresAt: z.string(),
  /** The same file is already stored in this workspace (it will not be stored twice). */
  storedFileId: z.string().nullable(),
  delimiter: z.enum(DELIMITERS),
  decimal: z.enum(['.', ',']),
  header: z.boolean(),
  firstLine: z.number().int(),
  columns: z.array(z.string()),
  preview: z.array(z.array(z.string())),
  guess: engineShape<MappingGuess>('Which column is time, voltage and current, as guessed (shared/engine/discharge-log)'),
})

export const SavedLogAnswer = z.object({
  id: z.string(),
  title: z.string(),
  notes: z.string(),
  fileId: z.string(),
  mapping: storedAs<LogMapping>('The column mapping as sent'),
  options: storedAs<LogOptions & Record<string, unknown>>('The analysis options as typed'),
  summary: Summary,
  /** One log carries its curve; lists leave it out. */
  curve: CurveAnswer.optional(),
  engineVersion: z.string(),
  author: PersonSchema.nullable(),
  specSheetId: z.string().nullable(),
  testRecordId: z.string().nullable(),
  luminaireId: z.string().nullable(),
  specSheet: z.object({ id: z.string(), title: z.string() }).nullable(),
  testRecord: z.object({ id: z.string(), testedOn: z.string(), luminaireId: z.string(), luminaireTag: z.string() }).nullable(),
  luminaire: z.object({ id: z.string(), tag: z.string(), siteId: z.string() }).nullable(),
  createdAt: Timestamp,
})

/** A dry run answers without storing; otherwise the saved log. */
export const AnalyseAnswer = z.union([
  z.object({ saved: z.literal(false), columns: z.array(z.string()), summary: Summary, curve: CurveAnswer }),
  SavedLogAnswer.extend({ saved: z.literal(true), columns: z.array(z.string()) }),
])

export const LogListAnswer = z.object({ items: z.array(SavedLogAnswer), total: z.number().int() })

const Change = z.number().nullable()
export const LogComparisonAnswer = z.object({
  a: SavedLogAnswer,
  b: SavedLogAnswer,
  /** b minus a; null where either lacks the figure. */
  change: z.object({ runtimeH: Change, deliveredAh: Change, deliveredWh: Change, midpointVoltageV: Change, marginH: Change, stateOfHealth: Change }),
})
