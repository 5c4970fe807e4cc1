/**
 * The summary page at the front of the log book PDF: the site, its regime in words, the counts,
 * every failure with what became of it, the next test dates, and a signature block for the person
 * responsible. Words, units and dates only (shared/labels, shared/format); the figures are the
 * engine's (shared/engine/log-book-summary.ts).
 */
import { formatDate, type FormatPrefs } from '../../../shared/format'
import type { LogBookSummary } from '../../../shared/engine/log-book-summary'
import { labelOf, REGIME_LABELS, TEST_KIND_LABELS } from '../../../shared/labels'
import { failureStateWords, nextDueTestWords, nextDueWhenWords, tagListWords } from '../../../shared/labels/log-book-words'
import { regimeWords } from '../../../shared/labels/regime-words'
import { ensureSpace, heightOf, signOffBoxes, write, type Doc, type WriteOptions } from '../../lib/pdf/pdf-kit'
import type { SiteDto } from './register.service'
import { table } from '../../lib/pdf/table'

export interface SummaryPageData {
  site: Pick<SiteDto, 'name' | 'address' | 'responsibleName' | 'responsibleEmail' | 'regime'>
  repairWindowDays: number
  summary: LogBookSummary
  prefs: FormatPrefs
}

/** What `signOffBoxes` takes: the boxes and the room under them. */
const SIGN_OFF_HEIGHT = 106

const left = (doc: Doc) => ({ x: doc.page.margins.left }) as WriteOptions

function subheading(doc: Doc, text: string, room = 60) {
  ensureSpace(doc, room)
  doc.moveDown(0.5)
  write(doc, text, { weight: 'semibold', size: 12, color: '#1f3b4d', ...left(doc) })
  doc.moveDown(0.2)
}

/** The counts in one line of figures each with its words: no colour is needed to read them. */
export function summaryFigures(s: LogBookSummary): Array<[string, number]> {
  return [
    ['Luminaires', s.luminaires],
    // By the open-failure rules, not by the latest test: a functional pass leaves a failed full-duration test open.
    ['Tested, no failure open', s.inOrder],
    ['Failure not yet put right', s.failureNotPutRight],
    ['Never tested', s.notTested],
    ['With a test overdue', s.overdue],
    [`Due now or within ${s.soonDays} days`, s.dueSoon],
  ]
}

export function summaryPage(doc: Doc, d: SummaryPageData) {
  const s = d.summary
  const date = (v: string) => formatDate(v, d.prefs)
  write(doc, 'Emergency lighting log book', { weight: 'semibold', size: 16 })
  write(doc, `${d.site.name}${d.site.address ? ` — ${d.site.address.replace(/\s*\n\s*/g, ', ')}` : ''}`, { weight: 'semibold', size: 11 })
  write(
    doc,
    `Responsible person: ${d.site.responsibleName || 'not named'}${d.site.responsibleEmail ? ` <${d.site.responsibleEmail}>` : ''}. Summary on ${date(s.today)}.`,
  )
  write(doc, `Testing regime: ${labelOf(REGIME_LABELS, d.site.regime)}. Failures are put right and retested within ${d.repairWindowDays} days.`)
  subheading(doc, 'The luminaires today')
  const figures = summaryFigures(s)
  table(
    doc,
    figures.map(([title]) => ({ title, width: 118 })),
    [figures.map(([, n]) => ({ text: String(n), weight: 'semibold' as const }))],
    { size: 10 },
  )

  subheading(doc, 'Failures and what became of them', 70)
  if (!s.failures.length) write(doc, 'No failed test in the log book.', left(doc))
  else {
    table(
      doc,
      [
        { title: 'Tag', width: 56 },
        { title: 'Failed', width: 150 },
        { title: 'Fault found', width: 170 },
        { title: 'Remedial action', width: 150 },
        { title: 'Now', width: 240 },
      ],
      s.failures.map((f) => [
        f.tag,
        `${TEST_KIND_LABELS[f.kind]} on ${date(f.testedOn)}`,
        f.faults || '—',
        f.remedialAction || '—',
        { text: failureStateWords(f, date), weight: f.state === 'open' || f.state === 'retest-overdue' ? 'semibold' : 'regular' },
      ]),
    )
  }

  const dates = s.nextDue.length + s.moreDueDates
  subheading(doc, s.moreDueDates ? `Next tests due: the first ${s.nextDue.length} of ${dates} dates (the register lists them all)` : 'Next tests due', 70)
  if (!s.nextDue.length) write(doc, 'No luminaires in the register.', left(doc))
  else {
    table(
      doc,
      [
        { title: 'Test', width: 230 },
        { title: 'When', width: 190 },
        { title: 'Luminaires', width: 346 },
      ],
      s.nextDue.map((n) => [
        nextDueTestWords(n),
        nextDueWhenWords(n, date),
        n.tags.length === 1 ? n.tags[0] : `${n.tags.length} luminaires: ${tagListWords(n.tags, 10)}`,
      ]),
    )
  }

  // The signature block and the caution under it stay together: on this page if they fit, else at the top of the next.
  const words = regimeWords(d.site.regime)
  const caution = `${words.isolateCaution} Spent nickel-cadmium and lithium packs go to a battery collection point. ${words.localCodes}`
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right
  doc.moveDown(0.4)
  ensureSpace(doc, SIGN_OFF_HEIGHT + heightOf(doc, caution, width, { size: 8 }) + 4)
  signOffBoxes(doc, [{ role: 'Responsible person', name: d.site.responsibleName || undefined }, { role: 'Seen by (inspecting officer)' }])
  write(doc, caution, { size: 8, color: '#3c4a52', ...left(doc) })
}
