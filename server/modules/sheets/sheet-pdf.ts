/**
 * The specification sheet as a PDF. Each section is a function of (doc, data); a sheet is the list
 * SHEET_SECTIONS, and later features (audits, discharge logs) append their own sections.
 */
import type { EngineWarning, Reference, WorkingStep } from '../../../shared/engine/types'
import { DEFAULT_PREFS, formatDate, formatNumber } from '../../../shared/format'
import { formatForReader, textForReader } from '../../../shared/engine/units'
import { BASIS_LABELS, CHEMISTRY_LABELS, labelOf, SEVERITY_LABELS } from '../../../shared/labels'
import { PACK_RESULT_FIGURES, SHEET_CAUTIONS, sheetInputRows } from '../../../shared/schemas/sheet.schema'
import { ensureSpace, frame, heading, newDocument, pair, toBuffer, write } from '../../lib/pdf/pdf-kit'
import { chargerCheckSection, packToOrderSection } from './pack-pdf-section'
import type { PdfSection, SheetPdfData } from './sheet-pdf-data'

export type { PdfSection, SheetPdfData } from './sheet-pdf-data'

const prefsOf = (d: SheetPdfData) => d.prefs ?? DEFAULT_PREFS

export const titleSection: PdfSection = (doc, d) => {
  const date = (x: Date | string | null) => formatDate(x, prefsOf(d))
  write(doc, `Emergency battery specification${d.issuer ? ` · ${d.issuer}` : ''}`, { size: 9, color: '#5b6b75' })
  write(doc, d.title, { weight: 'semibold', size: 20, color: '#1f3b4d' })
  const state =
    d.status === 'issued' ? `issued ${date(d.issuedAt)}` : d.status === 'superseded' ? `superseded (issued ${date(d.issuedAt)})` : 'draft, not issued'
  write(doc, `Revision ${d.number} · ${state} · engine ${d.engineVersion}`, { size: 10, color: d.status === 'issued' ? '#1b2a33' : '#a4460f' })
  if (d.status !== 'issued') write(doc, 'This revision is not issued: do not build or buy from it.', { weight: 'semibold', size: 10, color: '#a4460f' })
}

export const projectSection: PdfSection = (doc, d) => {
  const date = (x: Date | string | null) => formatDate(x, prefsOf(d))
  heading(doc, 'Project')
  if (d.reference) pair(doc, 'Reference', d.reference)
  if (d.client) pair(doc, 'Client', d.client)
  if (d.site) pair(doc, 'Site', d.site)
  pair(doc, 'Prepared by', `${d.author?.name ?? '—'} on ${date(d.createdAt)}`)
  if (d.issuedBy) pair(doc, 'Issued by', `${d.issuedBy.name} on ${date(d.issuedAt)}`)
  if (d.luminaire) {
    ensureSpace(doc, 30)
    write(doc, 'Luminaire', { weight: 'semibold' })
    write(doc, d.luminaire)
  }
}

export const inputsSection: PdfSection = (doc, d) => {
  heading(doc, 'Inputs (as entered)')
  // As the author typed it; a quantity in other units than the reader's follows in theirs.
  for (const row of sheetInputRows(d.inputs)) {
    const theirs = textForReader(row.value, prefsOf(d))
    pair(doc, row.label, theirs === row.value ? row.value : `${row.value} (${theirs})`)
  }
}

export const resultsSection: PdfSection = (doc, d) => {
  heading(doc, 'Results')
  const r = d.results
  pair(doc, 'Chemistry', labelOf(CHEMISTRY_LABELS, String(r.chemistry)))
  for (const f of PACK_RESULT_FIGURES) {
    if (r[f.key] === undefined) continue
    pair(doc, f.label, formatForReader(r[f.key], { unit: f.unit }, prefsOf(d)))
  }
}

export const warningsSection: PdfSection = (doc, d) => {
  const warnings = (d.results.warnings ?? []) as EngineWarning[]
  heading(doc, 'Warnings and notes')
  if (!warnings.length) write(doc, 'None.')
  for (const w of warnings) {
    ensureSpace(doc, 28)
    write(doc, `${SEVERITY_LABELS[w.severity]}: `, {
      weight: 'semibold',
      continued: true,
      color: w.severity === 'critical' ? '#a3161a' : w.severity === 'warning' ? '#a4460f' : '#1b2a33',
    })
    write(doc, textForReader(w.message, prefsOf(d)))
    doc.moveDown(0.2)
  }
}

const refText = (r: Reference) => `${r.source} (${labelOf(BASIS_LABELS, r.basis)})${r.note ? ` — ${r.note}` : ''}`

export const workingSection: PdfSection = (doc, d) => {
  const steps = (d.results.working ?? []) as WorkingStep[]
  heading(doc, 'Working')
  // The formulas are written in SI, so their values are too (a temperature interval of 10 °C is not 50 °F).
  if (steps.length && prefsOf(d).units === 'us')
    write(doc, 'The working is in the SI units its formulas use; the results above are in yours.', { size: 9, color: '#3c4a52' })
  for (const s of steps) {
    ensureSpace(doc, 70)
    write(doc, s.label, { weight: 'semibold', size: 10.5 })
    write(doc, s.formula, { size: 10, color: '#1f3b4d' })
    write(doc, s.explanation, { size: 9, color: '#3c4a52' })
    const values = s.inputs.map((v) => `${v.symbol} = ${formatNumber(v.value, { unit: v.unit, digits: 4 }, prefsOf(d))}`).join(';  ')
    if (values) write(doc, `With ${values}`, { size: 9 })
    write(doc, `Gives ${s.result.symbol} = ${formatNumber(s.result.value, { unit: s.result.unit, digits: 4 }, prefsOf(d))}`, { size: 9, weight: 'semibold' })
    for (const r of s.references) write(doc, `Ref.: ${refText(r)}`, { size: 8, color: '#5b6b75' })
    doc.moveDown(0.4)
  }
}

export const cautionsSection: PdfSection = (doc, d) => {
  heading(doc, 'Cautions')
  for (const c of SHEET_CAUTIONS) {
    ensureSpace(doc, 30)
    write(doc, `${c.title}. `, { weight: 'semibold', continued: true })
    write(doc, textForReader(c.text, prefsOf(d)))
    doc.moveDown(0.2)
  }
}

/**
 * The references of a sheet's working, each once per source and basis: one source cited both as
 * published and from memory is listed twice, so a from-memory value never appears without its mark.
 */
export function issuedReferences(steps: WorkingStep[]): Reference[] {
  const seen = new Map<string, Reference>()
  for (const s of steps) for (const r of s.references) if (!seen.has(`${r.source}|${r.basis}`)) seen.set(`${r.source}|${r.basis}`, r)
  return [...seen.values()]
}

export const referencesSection: PdfSection = (doc, d) => {
  const refs = issuedReferences((d.results.working ?? []) as WorkingStep[])
  heading(doc, 'References')
  if (!refs.length) write(doc, 'None recorded.')
  for (const r of refs) write(doc, `• ${textForReader(r.source, prefsOf(d))} — ${labelOf(BASIS_LABELS, r.basis)}`, { size: 9 })
}

/** The sheet as issued today; later features push their sections onto a copy of this list. */
export const SHEET_SECTIONS: PdfSection[] = [
  titleSection,
  projectSection,
  packToOrderSection,
  inputsSection,
  resultsSection,
  chargerCheckSection,
  warningsSection,
  workingSection,
  cautionsSection,
  referencesSection,
]

export async function buildSheetPdf(data: SheetPdfData, sections: PdfSection[] = SHEET_SECTIONS): Promise<Buffer> {
  const doc = newDocument({ title: data.title, subject: `Revision ${data.number}` }, { paper: prefsOf(data).paper })
  for (const section of sections) section(doc, data)
  frame(doc, {
    header: `Emergency battery specification · ${data.title}`,
    headerRight: data.issuer,
    footer: `Revision ${data.number} · ${data.status === 'issued' ? `issued ${formatDate(data.issuedAt, prefsOf(data))}` : 'not issued'} · Lampwright engine ${data.engineVersion}`,
  })
  return toBuffer(doc)
}
