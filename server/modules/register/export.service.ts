/**
 * Exports of a site's register and log book: CSV for spreadsheets, PDF for the building's file.
 * CSV cells that begin with = + - @ (or a tab / carriage return) are prefixed with a single quote so
 * a spreadsheet shows them as text instead of running them as a formula.
 */
import Papa from 'papaparse'
import { DEFAULT_PREFS, formatDate, formatHours, formatNumber, type FormatPrefs } from '../../../shared/format'
import { frame, newDocument, toBuffer, write, type Doc, type WriteOptions } from '../../lib/pdf/pdf-kit'
import { resultCell, table, type Column } from '../../lib/pdf/table'
import { PURPOSE_LABELS, REGISTER_DERIVED_COLUMNS } from '../../../shared/schemas/luminaire.schema'
import { REGIME_LABELS } from '../../../shared/schemas/site.schema'
import {
  chemistryName,
  DUE_REASON_LABELS,
  labelOf,
  PACK_STATE_LABELS,
  TEST_KIND_LABELS,
  TEST_STATE_LABELS,
  MODE_LABELS,
  testKindWords,
} from '../../../shared/labels'
import type { LuminaireStatus } from './register.service'
import { siteStatus, todayIso } from './register.service'
import type { LogBookSummary } from '../../../shared/engine/log-book-summary'
import { siteLogBookSummary } from './logbook-summary.service'
import { summaryPage } from './logbook-summary-pdf'
import { siteLogBook } from './tests.service'

/** Any text cell starting like a formula; unlike a `.*$` pattern this also catches multi-line cells. */
export const FORMULA_START = /^[=+\-@\t\r]/

export function toCsv(header: string[], rows: Array<Array<string | number | boolean | null>>): string {
  // Numbers stay numbers (a negative number is not a formula); every text cell is checked.
  return Papa.unparse({ fields: header, data: rows.map((r) => r.map((c) => (c === null ? '' : c))) }, { escapeFormulae: FORMULA_START, newline: '\r\n' })
}

const round = (v: number, digits = 2) => Number(v.toFixed(digits))

export async function registerRows(workspaceId: string, siteId: string) {
  const status = await siteStatus(workspaceId, siteId, todayIso())
  // The import's columns (the last three at the end, after the computed ones, so older readers keep their positions).
  const header = [
    'tag',
    'area',
    'location',
    'type',
    'purpose',
    'mode',
    'rated_duration_h',
    'chemistry',
    'cells',
    'capacity_ah',
    'pack_fitted_on',
    ...REGISTER_DERIVED_COLUMNS,
    'external_id',
    'last_functional_test_on',
    'last_duration_test_on',
  ]
  const rows = status.luminaires.map((l) => {
    const f = l.due.lastFailure
    return [
      l.tag,
      l.areaName ?? '',
      l.location,
      l.typeLabel,
      l.purpose,
      l.mode,
      l.ratedDurationH,
      l.chemistry,
      l.cellsInSeries,
      l.capacityAh,
      l.packFittedOn,
      l.due.functional.lastTestedOn,
      l.due.functional.nextDueOn,
      l.due.duration.lastTestedOn,
      l.due.duration.nextDueOn,
      l.due.state,
      l.forecast.replaceBy,
      l.due.functional.reason,
      l.due.functional.overdueAfter,
      l.due.duration.reason,
      l.due.duration.overdueAfter,
      f?.kind ?? '',
      f?.testedOn ?? '',
      f?.faults ?? '',
      f?.remedialAction ?? '',
      f?.retestBy ?? '',
      f ? String(f.retestOverdue) : '',
      l.externalId ?? '',
      l.lastFunctionalTestOn ?? '',
      l.lastDurationTestOn ?? '',
    ]
  })
  return { status, header, rows }
}

/** Days of the log book to include (YYYY-MM-DD, both included); either end may be open. */
export interface LogBookPeriod {
  from?: string
  to?: string
}

export async function logBookRows(workspaceId: string, siteId: string, period: LogBookPeriod = {}) {
  const entries = (await siteLogBook(workspaceId, siteId, 100_000)).filter(
    (e) => (!period.from || e.testedOn >= period.from) && (!period.to || e.testedOn <= period.to),
  )
  // A test recorded in error stays in the log book with its reason, so the record is complete.
  const header = ['tested_on', 'tag', 'test', 'result', 'achieved_duration_h', 'faults', 'remedial_action', 'recorded_by', 'recorded_at', 'recorded_in_error']
  const rows = entries.map((e) => [
    e.testedOn,
    e.tag,
    e.kind,
    e.passed ? 'pass' : 'fail',
    e.achievedDurationH === null ? null : round(e.achievedDurationH),
    e.faults,
    e.remedialAction,
    e.recordedByName ?? '',
    new Date(e.recordedAt).toISOString(),
    e.recordedInErrorAt ? e.recordedInErrorReason || 'yes' : '',
  ])
  return { header, rows }
}

export const EXPORT_FILES = ['register.csv', 'logbook.csv', 'register.pdf', 'logbook.pdf'] as const
export type ExportFile = (typeof EXPORT_FILES)[number]

export interface ExportResult {
  filename: string
  mediaType: string
  body: Buffer
}

const slug = (s: string) =>
  s
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 60) || 'site'

/** `period` limits the log book files to the tests between two days (the register files ignore it). */
export async function exportFile(
  workspaceId: string,
  siteId: string,
  file: ExportFile,
  prefs: FormatPrefs = DEFAULT_PREFS,
  period: LogBookPeriod = {},
): Promise<ExportResult> {
  const reg = await registerRows(workspaceId, siteId)
  const span = file.startsWith('logbook') && (period.from || period.to) ? `${period.from ?? 'start'}-to-${period.to ?? reg.status.today}` : reg.status.today
  const base = `${slug(reg.status.site.name)}-${file.startsWith('register') ? 'register' : 'log-book'}-${span}`
  if (file === 'register.csv') return { filename: `${base}.csv`, mediaType: 'text/csv; charset=utf-8', body: Buffer.from(toCsv(reg.header, reg.rows), 'utf8') }
  const log = await logBookRows(workspaceId, siteId, period)
  if (file === 'logbook.csv') return { filename: `${base}.csv`, mediaType: 'text/csv; charset=utf-8', body: Buffer.from(toCsv(log.header, log.rows), 'utf8') }
  // The summary describes the site today: it opens the whole log book, not an extract of some days (an archive of a month holds that month only).
  const extract = !!(period.from || period.to)
  const body =
    file === 'register.pdf'
      ? await registerPdf(reg, prefs)
      : await logBookPdf(reg.status, extract ? null : (await siteLogBookSummary(workspaceId, siteId, reg.status.today)).summary, log.rows, prefs, period)
  return { filename: `${base}.pdf`, mediaType: 'application/pdf', body }
}

// ---------------------------------------------------------------- PDF

type SiteStatus = Awaited<ReturnType<typeof siteStatus>>

/** A due test in words: "2026-01-31", or "retest due by 2026-01-31", "overdue: first full-duration test of this pack, by …". */
function dueWords(t: LuminaireStatus['due']['functional'], prefs: FormatPrefs): string {
  const date = (d: string | null) => formatDate(d, prefs)
  if (t.reason === 'interval') return t.state === 'overdue' ? `${date(t.nextDueOn)} (overdue)` : date(t.nextDueOn)
  return `${t.state === 'overdue' ? 'Overdue' : 'Due now'}: ${DUE_REASON_LABELS[t.reason]}, by ${date(t.overdueAfter)}`
}

// Landscape with narrow margins: the register is a wide table.
const newDoc = (title: string, prefs: FormatPrefs) => newDocument({ title }, { layout: 'landscape', margin: 36, paper: prefs.paper })

function heading(doc: Doc, title: string, status: SiteStatus, prefs: FormatPrefs) {
  write(doc, title, { weight: 'semibold', size: 16 })
  write(doc, `${status.site.name}${status.site.address ? ` — ${status.site.address.replace(/\s*\n\s*/g, ', ')}` : ''}`)
  write(doc, `Responsible person: ${status.site.responsibleName || '—'} ${status.site.responsibleEmail ? `<${status.site.responsibleEmail}>` : ''}`)
  write(doc, `Testing regime: ${REGIME_LABELS[status.site.regime]}. Printed ${formatDate(status.today, prefs)}.`)
  doc.moveDown(0.6)
}

/** Header and footer bands of the register and log book. */
function frameSiteDocument(doc: Doc, title: string, status: SiteStatus, prefs: FormatPrefs) {
  frame(doc, { header: `${title} — ${status.site.name}`, footer: `Printed ${formatDate(status.today, prefs)} · Lampwright` })
}

async function registerPdf(reg: Awaited<ReturnType<typeof registerRows>>, prefs: FormatPrefs): Promise<Buffer> {
  const s = reg.status
  const date = (d: string | null) => formatDate(d, prefs)
  const doc = newDoc(`Emergency lighting register — ${s.site.name}`, prefs)
  heading(doc, 'Emergency lighting register', s, prefs)
  write(
    doc,
    `${s.counts.luminaires} luminaires: ${s.counts.failed} with a failure not yet put right (${s.counts.retestOverdue} of them past the ${s.settings.repairWindowDays}-day repair window), ${s.counts.overdue} overdue, ${s.counts.dueNow} with a test due now, ${s.counts.dueSoon} due within 14 days.`,
  )
  doc.moveDown(0.6)
  const columns: Column[] = [
    { title: 'Tag', width: 52 },
    { title: 'Area / location', width: 130 },
    { title: 'Purpose', width: 70 },
    { title: 'Mode', width: 62 },
    { title: 'Rated', width: 36 },
    { title: 'Pack', width: 92 },
    { title: 'Fitted', width: 56 },
    { title: 'Next functional', width: 62 },
    { title: 'Next full duration', width: 62 },
    { title: 'State', width: 52 },
    { title: 'Replace pack by', width: 62 },
  ]
  table(
    doc,
    columns,
    s.luminaires.map((l) => [
      l.tag,
      [l.areaName, l.location].filter(Boolean).join(' — '),
      PURPOSE_LABELS[l.purpose],
      MODE_LABELS[l.mode],
      formatHours(l.ratedDurationH, prefs),
      `${chemistryName(l.chemistry)}, ${l.cellsInSeries} cells, ${formatNumber(l.capacityAh, { unit: 'Ah' }, prefs)}`,
      date(l.packFittedOn),
      dueWords(l.due.functional, prefs),
      dueWords(l.due.duration, prefs),
      TEST_STATE_LABELS[l.due.state],
      `${date(l.forecast.replaceBy)} (${PACK_STATE_LABELS[l.forecast.state].toLowerCase()})`,
    ]),
  )
  const failures = s.luminaires.filter((l) => l.due.openFailures.length)
  if (failures.length) {
    doc.moveDown(0.8)
    write(doc, 'Failures not yet put right', { weight: 'semibold', size: 12, x: doc.page.margins.left } as WriteOptions)
    table(
      doc,
      [
        { title: 'Tag', width: 52 },
        { title: 'Failed', width: 150 },
        { title: 'Fault', width: 190 },
        { title: 'Remedial action', width: 190 },
        { title: 'Retest', width: 150 },
      ],
      failures.flatMap((l) =>
        l.due.openFailures.map((f) => [
          l.tag,
          `${testKindWords(f.kind)} on ${date(f.testedOn)}`,
          f.faults,
          f.remedialAction || '—',
          f.retestOverdue ? `overdue: was due by ${date(f.retestBy)}` : `due now, by ${date(f.retestBy)}`,
        ]),
      ),
    )
  }
  doc.moveDown(1)
  write(
    doc,
    'Isolate the mains before opening a luminaire. Spent nickel-cadmium and lithium packs go to a battery collection point, never into general waste. Local codes and a competent, licensed person decide what the installation needs.',
    { size: 8, x: doc.page.margins.left } as WriteOptions,
  )
  frameSiteDocument(doc, 'Emergency lighting register', s, prefs)
  return toBuffer(doc)
}

/**
 * The log book: the whole book opens with its summary page (the site as it stands today), then every
 * entry; an extract of some days has the site's heading and that period's entries only.
 */
async function logBookPdf(
  status: SiteStatus,
  summary: LogBookSummary | null,
  rows: Array<Array<string | number | boolean | null>>,
  prefs: FormatPrefs,
  period: LogBookPeriod = {},
): Promise<Buffer> {
  const doc = newDoc(`Emergency lighting log book — ${status.site.name}`, prefs)
  if (summary) {
    summaryPage(doc, { site: status.site, repairWindowDays: status.settings.repairWindowDays, summary, prefs })
    doc.addPage()
  } else heading(doc, 'Emergency lighting log book', status, prefs)
  write(doc, 'Log book entries', { weight: 'semibold', size: 14 })
  write(
    doc,
    period.from || period.to
      ? `Tests ${period.from ? `from ${formatDate(period.from, prefs)} ` : ''}${period.to ? `to ${formatDate(period.to, prefs)}` : 'to today'}, newest first.`
      : 'Every test recorded, newest first.',
    { size: 9.5, color: '#3c4a52' },
  )
  doc.moveDown(0.4)
  const columns: Column[] = [
    { title: 'Date', width: 58 },
    { title: 'Tag', width: 52 },
    { title: 'Test', width: 70 },
    { title: 'Result', width: 44 },
    { title: 'Lit for', width: 40 },
    { title: 'Faults found', width: 160 },
    { title: 'Remedial action', width: 160 },
    { title: 'By', width: 90 },
  ]
  table(
    doc,
    columns,
    rows.map((r) => [
      // The CSV's machine values turned into words, the result with a mark that needs no colour; a test recorded in error reads "Void" with its reason.
      formatDate(String(r[0]), prefs),
      String(r[1]),
      labelOf(TEST_KIND_LABELS, String(r[2])),
      r[9] ? 'Void' : resultCell(r[3] === 'pass'),
      typeof r[4] === 'number' ? formatHours(r[4], prefs) : '',
      r[9] ? `Recorded in error (${String(r[9])}). ${String(r[5] ?? '')}` : String(r[5] ?? ''),
      String(r[6] ?? ''),
      String(r[7] ?? ''),
    ]),
  )
  if (!rows.length) write(doc, period.from || period.to ? 'No tests recorded in this period.' : 'No tests recorded yet.')
  frameSiteDocument(doc, 'Emergency lighting log book', status, prefs)
  return toBuffer(doc)
}
