/**
 * Discharge-test logs: how the columns of an uploaded CSV/TSV file are read (the mapping), the
 * analysis options (checked by the engine's own discharge schema, stored as typed), where a saved
 * log is attached, and the list query. Used by the server routes and the client's mapping form.
 */
import { z } from 'zod'
import { referenceId, type ReferenceKind } from './reference'
import { dischargeInput } from '../engine/discharge'
import { isIsoDate } from '../engine/due'

export { CURRENT_UNITS, perCellVolts, TIME_UNITS, VOLTAGE_UNITS } from '../engine/discharge-log'

const text = (max: number) => z.string({ invalid_type_error: 'must be text' }).trim().max(max, `must be at most ${max} characters`)
const id = (what: string) => z.string({ invalid_type_error: `must be the id of ${what}` }).uuid(`must be the id of ${what}`)
const ref = (kind: ReferenceKind, what: string) => referenceId(kind, `must be the id of ${what}`, { invalidType: `must be the id of ${what}` })

/** Largest log file accepted, bytes. A million rows of time, voltage and current is about 25 MB. */
export const MAX_LOG_BYTES = 50 * 1024 * 1024
/** Points kept for the stored and plotted curve (down-sampled with LTTB). */
export const CURVE_POINTS = 2000
/** Bad rows listed by number; the rest are only counted. */
export const LISTED_BAD_ROWS = 20
/** A log with a larger share of bad rows is refused even when bad rows are accepted. */
export const MAX_BAD_ROW_SHARE = 0.2

export const DELIMITERS = [',', ';', '\t'] as const
export { DATE_ORDER_LABELS, DELIMITER_LABELS, TIME_FORMAT_LABELS } from '../labels'

/** How the time column is written. */
export const TIME_FORMATS = ['elapsed', 'clock', 'timestamp'] as const
/** Order of day, month and year in a date such as 01/03/2026 (ISO 8601 dates are always year first). */
export const DATE_ORDERS = ['ymd', 'dmy', 'mdy'] as const

const column = z
  .number({ invalid_type_error: 'must be a column number', required_error: 'choose a column' })
  .int('must be a column number')
  .min(0, 'must be a column number')
  .max(999, 'must be a column number')

export const ColumnMappingSchema = z
  .object({
    delimiter: z.enum(DELIMITERS, { errorMap: () => ({ message: 'must be a comma, a semicolon or a tab' }) }),
    decimal: z.enum(['.', ','], { errorMap: () => ({ message: 'must be "." or ","' }) }),
    /** The first row read is a header row (column names), not data. */
    header: z.boolean({ invalid_type_error: 'must be true or false' }),
    /** 1-based line where the table starts (loggers often write a few lines about themselves first). */
    firstLine: z
      .number({ invalid_type_error: 'must be a line number' })
      .int('must be a line number')
      .min(1, 'must be at least 1')
      .max(1000, 'must be at most 1000')
      .default(1),
    time: z.object({
      column,
      format: z.enum(TIME_FORMATS, { errorMap: () => ({ message: 'must be elapsed, clock or timestamp' }) }),
      unit: z.enum(['s', 'min', 'h'], { errorMap: () => ({ message: 'must be s, min or h' }) }).default('s'),
      dateOrder: z.enum(DATE_ORDERS, { errorMap: () => ({ message: 'must be ymd, dmy or mdy' }) }).default('ymd'),
    }),
    voltage: z.object({ column, unit: z.enum(['V', 'mV'], { errorMap: () => ({ message: 'must be V or mV' }) }).default('V') }),
    current: z
      .object({ column, unit: z.enum(['A', 'mA'], { errorMap: () => ({ message: 'must be A or mA' }) }).default('A') })
      .nullable()
      .default(null),
  })
  .superRefine((m, ctx) => {
    const used = [m.time.column, m.voltage.column, ...(m.current ? [m.current.column] : [])]
    if (new Set(used).size !== used.length)
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['voltage', 'column'], message: 'time, voltage and current must be different columns' })
    if (m.delimiter === ',' && m.decimal === ',')
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['decimal'], message: 'a comma cannot be both the delimiter and the decimal mark' })
  })
export type ColumnMapping = z.output<typeof ColumnMappingSchema>

type DischargeShape = z.ZodObject<Record<string, z.ZodTypeAny>>
const engineFields = (dischargeInput as unknown as z.ZodEffects<DischargeShape>).innerType().shape

/** The analysis options as typed ("3 h", "1.1 V"); checked with the engine's own field schemas. */
export const DischargeOptionsSchema = z
  .object({
    chemistry: engineFields.chemistry,
    cellsInSeries: engineFields.cellsInSeries,
    cutoffPerCell: z.union([z.string(), z.number()]).optional(),
    ratedDuration: z.union([z.string(), z.number()], { errorMap: () => ({ message: 'is required: a time, e.g. "3 h"' }) }),
    ratedCapacity: z.union([z.string(), z.number()]).optional(),
    thresholdsPerCell: z
      .array(z.union([z.string(), z.number()]))
      .max(20, 'at most 20 thresholds')
      .optional(),
    assumedPower: z.union([z.string(), z.number()]).optional(),
    assumedResistance: z.union([z.string(), z.number()]).optional(),
  })
  .transform((raw) => Object.fromEntries(Object.entries(raw).filter(([, v]) => v !== undefined && v !== '')) as typeof raw)
  .superRefine((raw, ctx) => {
    // The engine's schema with two dummy samples: the same messages as POST /api/calc/discharge.
    const parsed = dischargeInput.safeParse({
      ...raw,
      samples: [
        { t: 0, v: 1 },
        { t: 1, v: 1 },
      ],
    })
    if (parsed.success) return
    for (const issue of parsed.error.issues) ctx.addIssue({ code: z.ZodIssueCode.custom, path: issue.path, message: issue.message })
  })
export type DischargeOptionsInput = z.output<typeof DischargeOptionsSchema>

/** The options in base units, as the engine reads them. */
export function engineOptions(raw: DischargeOptionsInput) {
  const parsed = dischargeInput.parse({
    ...raw,
    samples: [
      { t: 0, v: 1 },
      { t: 1, v: 1 },
    ],
  })
  const { samples: _samples, ...options } = parsed
  return options
}

/** Analyse an uploaded (or already stored) file; store it unless `dryRun`. */
export const DischargeAnalyseSchema = z
  .object({
    uploadId: ref('stagedUpload', 'an upload').optional(),
    fileId: ref('dischargeFile', 'a stored log file').optional(),
    title: text(200).default(''),
    notes: text(2000).default(''),
    mapping: ColumnMappingSchema,
    options: DischargeOptionsSchema,
    /** Go on although some rows could not be read (they are left out and listed). */
    acceptBadRows: z.boolean({ invalid_type_error: 'must be true or false' }).default(false),
    /** Analyse and answer, store nothing. */
    dryRun: z.boolean({ invalid_type_error: 'must be true or false' }).default(false),
    specSheetId: ref('specSheet', 'a specification sheet').nullable().optional(),
    testRecordId: ref('testRecord', 'a test record').nullable().optional(),
    /** The luminaire whose pack was tested: saving records (or updates) its full-duration test from the log. */
    luminaireId: ref('luminaire', 'a luminaire').nullable().optional(),
    /** Day of the test, for the record made from the log (today when left out). */
    testedOn: z.string({ invalid_type_error: 'must be a date (YYYY-MM-DD)' }).trim().refine(isIsoDate, 'must be a real date written YYYY-MM-DD').optional(),
    /** Why the runtime typed in the attached record differs from the log. */
    runtimeNote: text(500).default(''),
  })
  .superRefine((v, ctx) => {
    if (!v.uploadId === !v.fileId)
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['uploadId'], message: 'give either uploadId (a new upload) or fileId (a stored file)' })
    if (!v.dryRun && !v.title) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['title'], message: 'is required to save the log' })
  })
export type DischargeAnalyse = z.output<typeof DischargeAnalyseSchema>

/** A log sent as text in a JSON body (scripts, tests); the browser sends multipart field "file". */
export const DischargeTextUploadSchema = z.object({
  name: text(200).min(1, 'is required'),
  text: z
    .string({ invalid_type_error: 'must be text', required_error: 'is required' })
    .max(1_000_000, 'is too long for a JSON upload: send the file as multipart/form-data'),
})

export const DischargeListQuerySchema = z.object({
  sheetId: id('a specification sheet').optional(),
  testRecordId: id('a test record').optional(),
  luminaireId: id('a luminaire').optional(),
  limit: z.coerce
    .number({ invalid_type_error: 'must be a number' })
    .int('must be a whole number')
    .min(1, 'must be at least 1')
    .max(200, 'must be at most 200')
    .default(50),
})
export type DischargeListQuery = z.output<typeof DischargeListQuerySchema>

export const DischargeCompareQuerySchema = z.object({ a: id('a discharge log'), b: id('a discharge log') })
