/**
 * The "Discharge logs" section of a specification sheet's PDF: each log attached to the sheet with
 * its verdict, figures and a small plot of the pack voltage against the cut-off.
 */
import type { EngineWarning } from '../../../shared/engine/types'
import { labelOf, RUNTIME_END_LABELS as END_WORDS, SEVERITY_LABELS } from '../../../shared/labels'
import { DEFAULT_PREFS, formatDate, formatNumber, type FormatPrefs } from '../../../shared/format'
import { ensureSpace, heading, pair, write, type Doc } from '../../lib/pdf/pdf-kit'
import type { PdfSection } from '../sheets/sheet-pdf'
import type { DischargeLogDto } from './discharge.service'

function verdict(pass: unknown): string {
  return pass === true
    ? 'Passed: lasted its rated duration'
    : pass === false
      ? 'Failed: did not last its rated duration'
      : 'Inconclusive: the log stops too early to tell'
}

/** Pack voltage against hours, with the cut-off dashed; at most a few hundred segments. */
function plot(doc: Doc, curve: { tH: number[]; v: number[] }, cutoffV: number, prefs: FormatPrefs) {
  const n = curve.tH.length
  if (n < 2) return
  ensureSpace(doc, 130)
  const left = doc.page.margins.left + 30
  const width = doc.page.width - doc.page.margins.right - left
  const top = doc.y + 6
  const height = 100
  const tMax = curve.tH[n - 1] || 1
  let vMin = Math.min(cutoffV, ...curve.v)
  let vMax = Math.max(cutoffV, ...curve.v)
  const pad = (vMax - vMin) * 0.08 || 0.1
  vMin -= pad
  vMax += pad
  const x = (t: number) => left + (t / tMax) * width
  const y = (v: number) => top + height - ((v - vMin) / (vMax - vMin)) * height
  doc.save()
  doc.rect(left, top, width, height).lineWidth(0.4).strokeColor('#9aa7ae').stroke()
  const step = Math.max(1, Math.floor(n / 400))
  doc.moveTo(x(curve.tH[0]), y(curve.v[0]))
  for (let k = step; k < n; k += step) doc.lineTo(x(curve.tH[k]), y(curve.v[k]))
  doc.lineTo(x(curve.tH[n - 1]), y(curve.v[n - 1]))
  doc.lineWidth(1).strokeColor('#1f6f8b').stroke()
  doc
    .moveTo(left, y(cutoffV))
    .lineTo(left + width, y(cutoffV))
    .dash(3, { space: 3 })
    .lineWidth(0.8)
    .strokeColor('#a3161a')
    .stroke()
    .undash()
  doc.restore()
  write(doc, `${formatNumber(vMax, { unit: 'V' }, prefs)}`, { size: 7, color: '#5b6b75', x: doc.page.margins.left, y: top - 3, lineBreak: false } as never)
  write(doc, `${formatNumber(vMin, { unit: 'V' }, prefs)}`, {
    size: 7,
    color: '#5b6b75',
    x: doc.page.margins.left,
    y: top + height - 6,
    lineBreak: false,
  } as never)
  write(doc, `0 h … ${formatNumber(tMax, { unit: 'h' }, prefs)}; dashed: cut-off ${formatNumber(cutoffV, { unit: 'V' }, prefs)}`, {
    size: 7.5,
    color: '#5b6b75',
    x: left,
    y: top + height + 3,
  } as never)
  doc.x = doc.page.margins.left
  doc.moveDown(0.3)
}

export function dischargeLogsSection(logs: DischargeLogDto[]): PdfSection {
  return (doc, d) => {
    const prefs = d.prefs ?? DEFAULT_PREFS
    heading(doc, 'Discharge logs')
    write(doc, 'Logged full-duration tests attached to this sheet, read by the Lampwright engine. Attached logs are listed whatever the revision shown.', {
      size: 9,
      color: '#3c4a52',
    })
    for (const log of logs) {
      const s = log.summary as Record<string, unknown>
      const read = (s.read ?? {}) as { rows?: number; badRows?: { count?: number } }
      ensureSpace(doc, 160)
      doc.moveDown(0.4)
      write(doc, log.title, { weight: 'semibold', size: 11.5, color: '#1f3b4d' })
      write(
        doc,
        `Saved by ${log.author?.name ?? '—'} on ${formatDate(log.createdAt, prefs)} · engine ${log.engineVersion} · ${read.rows ?? 0} readings${read.badRows?.count ? `, ${read.badRows.count} unreadable rows left out` : ''}`,
        { size: 8.5, color: '#5b6b75' },
      )
      if (log.notes) write(doc, log.notes, { size: 9.5 })
      pair(doc, 'Verdict', verdict(s.pass))
      pair(
        doc,
        'Runtime',
        `${formatNumber(s.runtimeH, { unit: 'h' }, prefs)} (ended because ${labelOf(END_WORDS, String(s.runtimeEnd)).toLowerCase()}); margin ${formatNumber(s.marginH, { unit: 'h' }, prefs)}`,
      )
      pair(doc, 'Cut-off used', formatNumber(s.cutoffVoltageV, { unit: 'V' }, prefs))
      if (typeof s.deliveredAh === 'number')
        pair(
          doc,
          s.estimated ? 'Delivered (estimated)' : 'Delivered',
          `${formatNumber(s.deliveredAh, { unit: 'Ah' }, prefs)}, ${formatNumber(s.deliveredWh, { unit: 'Wh' }, prefs)}`,
        )
      pair(doc, 'Mid-point voltage', formatNumber(s.midpointVoltageV, { unit: 'V' }, prefs))
      if (typeof s.stateOfHealth === 'number') pair(doc, 'State of health', `${Math.round(s.stateOfHealth * 100)} % of the rated capacity`)
      if (log.curve) plot(doc, log.curve, Number(s.cutoffVoltageV), prefs)
      const warnings = ((s.warnings ?? []) as EngineWarning[]).filter((w) => w.severity !== 'info')
      for (const w of warnings) {
        ensureSpace(doc, 24)
        write(doc, `${SEVERITY_LABELS[w.severity]}: `, {
          weight: 'semibold',
          continued: true,
          size: 9.5,
          color: w.severity === 'critical' ? '#a3161a' : '#a4460f',
        })
        write(doc, w.message, { size: 9.5 })
      }
    }
  }
}

/** The sheet's sections with the discharge logs placed before the cautions; unchanged without logs. */
export function withDischargeLogs(sections: PdfSection[], logs: DischargeLogDto[], cautions?: PdfSection): PdfSection[] {
  if (!logs.length) return sections
  const out = [...sections]
  const at = cautions ? out.indexOf(cautions) : -1
  out.splice(at < 0 ? out.length : at, 0, dischargeLogsSection(logs))
  return out
}
