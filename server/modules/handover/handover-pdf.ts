/**
 * The handover pack as one PDF: a completion certificate signed off by name and date, the register,
 * the luminaire types with their photometry, spacing per escape route, the first full-duration
 * tests and the log book's opening page. Words and dates only, never codes; written from the
 * pack's frozen content, so the same pack prints the same every time.
 */
import { formatDate, formatHours, formatNumber, type FormatPrefs } from '../../../shared/format'
import { formatForReader, textForReader } from '../../../shared/engine/units'
import { CHEMISTRY_SHORT_LABELS, CRITERIA_LABELS, labelOf, MODE_LABELS, PURPOSE_LABELS, REGIME_LABELS, TEST_KIND_LABELS } from '../../../shared/labels'
import type { HandoverContent } from '../../../shared/schemas/handover.schema'
import { SHEET_CAUTIONS } from '../../../shared/schemas/sheet-text'
import { ensureSpace, frame, heading, newDocument, pair, signOffBoxes, toBuffer, write, type Doc } from '../../lib/pdf/pdf-kit'
import { columnsFor, table } from '../../lib/pdf/table'

export interface HandoverPdfData {
  number: number
  createdAt: Date | string
  content: HandoverContent
  prefs: FormatPrefs
}

const SECTIONS = [
  'Completion certificate',
  'Register of luminaires',
  'Luminaire types and photometry',
  'Spacing on each escape route',
  'First full-duration tests',
  'Log book: opening page',
  'Safety',
] as const

function countWords(n: number, one: string, many = `${one}s`) {
  return `${n} ${n === 1 ? one : many}`
}

function titlePage(doc: Doc, d: HandoverPdfData) {
  const c = d.content
  write(doc, `Emergency lighting · ${c.firm}`, { size: 9, color: '#5b6b75' })
  write(doc, 'Handover pack', { weight: 'semibold', size: 22, color: '#1f3b4d' })
  write(doc, c.site.name, { weight: 'semibold', size: 14 })
  if (c.site.address) write(doc, c.site.address.replace(/\s*\n\s*/g, ', '))
  write(
    doc,
    `Pack ${d.number}, made ${formatDate(d.createdAt, d.prefs)}. Signed by ${c.certificate.signedByName} on ${formatDate(c.certificate.signedOn, d.prefs)}.`,
    { size: 10, color: '#3c4a52' },
  )
  doc.moveDown(0.6)
  write(doc, 'Contents', { weight: 'semibold', size: 10.5 })
  SECTIONS.forEach((s, i) => write(doc, `${i + 1}. ${s}`, { size: 10 }))
}

function certificate(doc: Doc, d: HandoverPdfData) {
  const c = d.content
  heading(doc, `1. ${SECTIONS[0]}`)
  pair(doc, 'Premises', [c.site.name, c.site.address.replace(/\s*\n\s*/g, ', ')].filter(Boolean).join(', '))
  pair(doc, 'Responsible person', [c.site.responsibleName || 'not named', c.site.responsibleEmail].filter(Boolean).join(', '))
  pair(doc, 'Testing regime', REGIME_LABELS[c.site.regime])
  pair(doc, 'Firm handing over', c.firm)
  const byPurpose = Object.entries(PURPOSE_LABELS)
    .map(([code, words]) => [words, c.luminaires.filter((l) => l.purpose === code).length] as const)
    .filter(([, n]) => n > 0)
    .map(([words, n]) => `${n} ${words.toLowerCase()}`)
  pair(doc, 'Luminaires covered', `${c.luminaires.length}${byPurpose.length ? ` (${byPurpose.join(', ')})` : ''}`)
  pair(doc, 'Extent of the installation', c.certificate.extent || 'The whole of the installation listed in the register of this pack.')
  pair(doc, 'Departures from the design or the standard', c.certificate.deviations || 'None stated.')
  const tested = c.firstDurationTests.filter((t) => t.testedOn !== null)
  const passed = tested.filter((t) => t.passed)
  pair(
    doc,
    'Full-duration tests',
    `${passed.length} of ${c.luminaires.length} luminaires passed their first full-duration test; ${c.luminaires.length - tested.length} not yet tested (section 5).`,
  )
  doc.moveDown(0.5)
  ensureSpace(doc, 60)
  doc.x = doc.page.margins.left
  write(
    doc,
    `I certify that the emergency lighting described in this pack, to the extent stated above, has been installed, inspected and tested, that the results are those recorded in sections 2 to 6, and that the departures stated are the only ones known to me. The responsible person keeps this pack with the log book and has the routine tests of the testing regime carried out and recorded.`,
    { size: 9.5 },
  )
  doc.moveDown(0.5)
  signOffBoxes(doc, [
    { role: 'Installed, inspected and tested by', name: c.certificate.signedByName, date: formatDate(c.certificate.signedOn, d.prefs) },
    { role: 'Received for the owner by', name: c.site.responsibleName || undefined },
  ])
}

function register(doc: Doc, d: HandoverPdfData) {
  const c = d.content
  heading(doc, `2. ${SECTIONS[1]}`)
  if (!c.luminaires.length) return void write(doc, 'No luminaires in the register.')
  table(
    doc,
    columnsFor(doc, [
      ['Tag', 48],
      ['Area and location', 120],
      ['Purpose', 70],
      ['Mode', 70],
      ['Rated', 40],
      ['Pack', 110],
      ['Pack fitted', 70],
    ]),
    c.luminaires.map((l) => [
      l.tag,
      [l.areaName, l.location].filter(Boolean).join(', ') || '—',
      PURPOSE_LABELS[l.purpose],
      MODE_LABELS[l.mode],
      formatHours(l.ratedDurationH, d.prefs),
      `${labelOf(CHEMISTRY_SHORT_LABELS, l.chemistry)}, ${l.cellsInSeries} cells, ${formatNumber(l.capacityAh, { unit: 'Ah' }, d.prefs)}`,
      formatDate(l.packFittedOn, d.prefs),
    ]),
  )
}

function types(doc: Doc, d: HandoverPdfData) {
  const c = d.content
  // A heading never stands alone at the foot of a page: it keeps its first block with it.
  ensureSpace(doc, 150)
  heading(doc, `3. ${SECTIONS[2]}`)
  if (!c.types.length) return void write(doc, 'No luminaire types from the catalogue are linked to this site or its routes.')
  for (const t of c.types) {
    ensureSpace(doc, 80)
    doc.x = doc.page.margins.left
    write(doc, t.name, { weight: 'semibold', size: 10.5 })
    pair(doc, 'Modes', t.modes.map((m) => MODE_LABELS[m]).join(' or '))
    pair(doc, 'Rated duration', formatHours(t.ratedDurationS / 3600, d.prefs))
    pair(
      doc,
      'Battery',
      `${labelOf(CHEMISTRY_SHORT_LABELS, t.chemistry)}, ${t.cellsInSeries} cells${t.capacityAh !== null ? `, ${formatNumber(t.capacityAh, { unit: 'Ah' }, d.prefs)}` : ''}`,
    )
    pair(
      doc,
      'Emergency output',
      `${formatNumber(t.emergencyPowerW, { unit: 'W' }, d.prefs)} at the light source, ${formatNumber(t.emergencyOutputFactor * 100, { unit: '%' }, d.prefs)} of the photometric file's output`,
    )
    const p = t.photometry
    pair(
      doc,
      'Photometry',
      p
        ? `${p.fileName} (IES LM-63-${p.edition}); peak ${formatNumber(p.peakIntensityCd, { unit: 'cd' }, d.prefs)} at C ${formatNumber(p.peakAtCDeg, {}, d.prefs)}°, γ ${formatNumber(p.peakAtGammaDeg, {}, d.prefs)}°; ${p.lampLumens === null ? 'absolute photometry' : `${formatNumber(p.lampLumens, { unit: 'lm' }, d.prefs)} lamp lumens`}; input ${formatNumber(p.inputWatts, { unit: 'W' }, d.prefs)}`
        : 'no photometric file',
    )
    pair(doc, 'In this register', countWords(t.luminaires, 'luminaire'))
    doc.moveDown(0.4)
  }
}

function spacing(doc: Doc, d: HandoverPdfData) {
  const c = d.content
  ensureSpace(doc, 150)
  heading(doc, `4. ${SECTIONS[3]}`)
  if (!c.routes.length) return void write(doc, 'No escape routes were given for this pack.')
  const m = (v: number | null) => formatForReader(v, { unit: 'm' }, d.prefs)
  const lx = (v: number | null) => formatForReader(v, { unit: 'lx' }, d.prefs)
  for (const r of c.routes) {
    ensureSpace(doc, 90)
    doc.x = doc.page.margins.left
    write(doc, `${r.name}: ${r.meets ? 'meets the route' : 'does not meet the route'}`, {
      weight: 'semibold',
      size: 10.5,
      color: r.meets ? '#1b2a33' : '#a3161a',
    })
    pair(
      doc,
      'Route',
      `${m(r.routeLengthM)} long, ${m(r.routeWidthM)} wide, luminaires mounted at ${m(r.mountingHeightM)}; ${labelOf(CRITERIA_LABELS, r.criteria)}; ${formatHours(r.ratedDurationS / 3600, d.prefs)} rated duration; maintenance factor ${formatNumber(r.maintenanceFactor, {}, d.prefs)}`,
    )
    pair(doc, 'Luminaire type', r.typeName)
    if (r.count !== null) {
      pair(
        doc,
        'Layout',
        `${countWords(r.count, 'luminaire')}${r.spacingM !== null ? `, ${m(r.spacingM)} apart` : ''}${r.endDistanceM !== null ? `, ${m(r.endDistanceM)} from each end` : ''}`,
      )
      pair(doc, 'On the route', `minimum ${lx(r.minLx)}, average ${lx(r.averageLx)}, maximum to minimum ${formatNumber(r.maxToMin, {}, d.prefs)} to 1`)
    }
    if (r.reasons.length) pair(doc, 'Why not', r.reasons.join('; '))
    doc.moveDown(0.4)
  }
}

function firstTests(doc: Doc, d: HandoverPdfData) {
  const c = d.content
  ensureSpace(doc, 110)
  heading(doc, `5. ${SECTIONS[4]}`)
  write(doc, 'The first full-duration test of each luminaire since its pack was fitted.', { size: 9, color: '#3c4a52' })
  doc.moveDown(0.3)
  if (!c.firstDurationTests.length) return void write(doc, 'No luminaires in the register.')
  table(
    doc,
    columnsFor(doc, [
      ['Tag', 50],
      ['Tested on', 80],
      ['Rated', 50],
      ['Lit for', 55],
      ['Result', 70],
      ['Faults found', 150],
      ['Tested by', 90],
    ]),
    c.firstDurationTests.map((t) => [
      t.tag,
      t.testedOn ? formatDate(t.testedOn, d.prefs) : 'Not yet tested',
      formatHours(t.ratedDurationH, d.prefs),
      t.achievedDurationH !== null ? formatHours(t.achievedDurationH, d.prefs) : '—',
      t.passed === null ? '—' : t.passed ? 'Pass' : 'Fail',
      t.faults || '—',
      t.recordedByName ?? '—',
    ]),
  )
}

function logBook(doc: Doc, d: HandoverPdfData) {
  const c = d.content
  doc.addPage()
  heading(doc, `6. ${SECTIONS[5]}`)
  pair(doc, 'Premises', c.site.name)
  pair(doc, 'Responsible person', c.site.responsibleName || 'not named')
  pair(doc, 'Routine tests', REGIME_LABELS[c.site.regime])
  pair(doc, 'Failures', `put right and retested within ${countWords(c.logBook.repairWindowDays, 'day')}`)
  pair(
    doc,
    'Entries so far',
    `${c.logBook.totalEntries}${c.logBook.totalEntries > c.logBook.firstEntries.length ? `; the first ${c.logBook.firstEntries.length} are shown here` : ''}`,
  )
  doc.moveDown(0.5)
  if (!c.logBook.firstEntries.length) return void write(doc, 'No tests recorded yet.')
  table(
    doc,
    columnsFor(doc, [
      ['Date', 80],
      ['Tag', 50],
      ['Test', 90],
      ['Result', 45],
      ['Lit for', 55],
      ['Faults found', 140],
      ['By', 90],
    ]),
    c.logBook.firstEntries.map((e) => [
      formatDate(e.testedOn, d.prefs),
      e.tag,
      TEST_KIND_LABELS[e.kind],
      e.passed ? 'Pass' : 'Fail',
      e.achievedDurationH !== null ? formatHours(e.achievedDurationH, d.prefs) : '—',
      e.faults || '—',
      e.recordedByName ?? '—',
    ]),
  )
}

function safety(doc: Doc, d: HandoverPdfData) {
  heading(doc, `7. ${SECTIONS[6]}`)
  for (const caution of SHEET_CAUTIONS) {
    ensureSpace(doc, 36)
    doc.x = doc.page.margins.left
    write(doc, `${caution.title}. `, { weight: 'semibold', size: 9, continued: true })
    write(doc, textForReader(caution.text, d.prefs), { size: 9 })
    doc.moveDown(0.2)
  }
}

export async function buildHandoverPdf(d: HandoverPdfData): Promise<Buffer> {
  const doc = newDocument(
    { title: `Handover pack ${d.number} — ${d.content.site.name}`, subject: 'Emergency lighting handover pack' },
    { paper: d.prefs.paper },
  )
  titlePage(doc, d)
  certificate(doc, d)
  register(doc, d)
  types(doc, d)
  spacing(doc, d)
  firstTests(doc, d)
  logBook(doc, d)
  safety(doc, d)
  frame(doc, {
    header: `Handover pack ${d.number} — ${d.content.site.name}`,
    headerRight: d.content.firm,
    footer: `Signed by ${d.content.certificate.signedByName} on ${formatDate(d.content.certificate.signedOn, d.prefs)} · Lampwright`,
  })
  return toBuffer(doc)
}
