/**
 * The printed record of a signed-off round: the visit, every luminaire tested with its result, the
 * checklist items found wrong, the failures with their remedial actions, and the signatures.
 */
import { DEFAULT_PREFS, formatDate, formatDateTime, formatHours, type FormatPrefs } from '../../../shared/format'
import { CHECKLIST_ITEMS } from '../../../shared/schemas/test-record.schema'
import { labelOf, REGIME_LABELS, TEST_KIND_LABELS } from '../../../shared/labels'
import { dataSource } from '../../data-source'
import { NotFoundError } from '../../errors/app-error'
import { frame, newDocument, pair, signOffBoxes, toBuffer, write, heading as sectionHeading, type WriteOptions } from '../../lib/pdf/pdf-kit'
import { findSite } from './register.service'
import { resultCell, table, type Column } from '../../lib/pdf/table'
import { LOG_SELECT, type LogBookEntry } from './tests.service'

const CHECK_LABEL = new Map<string, string>(CHECKLIST_ITEMS.map((i) => [i.id, i.label]))

/** The checklist in words: the items found wrong, or that all ticked were fine. */
export function checklistWords(checklist: Record<string, boolean>): string {
  const entries = Object.entries(checklist ?? {})
  if (!entries.length) return 'Not ticked'
  const wrong = entries.filter(([, fine]) => !fine).map(([id]) => CHECK_LABEL.get(id) ?? labelOf({}, id))
  return wrong.length ? `Found wrong: ${wrong.join('; ')}` : `${entries.length} checked, all fine`
}

export async function roundRecord(workspaceId: string, siteId: string, roundId: string) {
  const site = await findSite(workspaceId, siteId)
  const rounds: Array<{
    id: string
    client_id: string
    signed_off_by_name: string
    signed_off_on: string
    notes: string
    recorded_at: Date
    recorded_by_name: string | null
  }> = await dataSource.query(
    `SELECT r.id, r.client_id, r.signed_off_by_name, r.signed_off_on::text AS signed_off_on, r.notes, r.recorded_at, u.name AS recorded_by_name
     FROM test_rounds r LEFT JOIN users u ON u.id = r.recorded_by WHERE r.workspace_id = $1 AND r.site_id = $2 AND r.id = $3`,
    [workspaceId, siteId, roundId],
  )
  if (!rounds.length) throw new NotFoundError('That round')
  const records: LogBookEntry[] = await dataSource.query(`${LOG_SELECT} WHERE t.workspace_id = $1 AND t.round_client_id = $2 ORDER BY t.tested_on, l.tag`, [
    workspaceId,
    rounds[0].client_id,
  ])
  return { site, round: rounds[0], records }
}

export async function roundRecordPdf(
  workspaceId: string,
  siteId: string,
  roundId: string,
  prefs: FormatPrefs = DEFAULT_PREFS,
): Promise<{ filename: string; body: Buffer }> {
  const { site, round, records } = await roundRecord(workspaceId, siteId, roundId)
  const date = (d: string) => formatDate(d, prefs)
  const doc = newDocument({ title: `Record of a test round — ${site.name}` }, { layout: 'landscape', margin: 36, paper: prefs.paper })
  write(doc, 'Record of a test round', { weight: 'semibold', size: 16 })
  write(doc, `${site.name}${site.address ? ` — ${site.address.replace(/\s*\n\s*/g, ', ')}` : ''}`)
  doc.moveDown(0.4)
  pair(doc, 'Testing regime', labelOf(REGIME_LABELS, site.regime))
  pair(doc, 'Signed off by', `${round.signed_off_by_name} on ${date(round.signed_off_on)}`)
  pair(doc, 'Entered by', `${round.recorded_by_name ?? 'a removed member'}, ${formatDateTime(round.recorded_at, prefs)}`)
  const failed = records.filter((r) => !r.passed)
  pair(doc, 'Luminaires tested', `${records.length}: ${records.length - failed.length} passed, ${failed.length} failed`)
  if (round.notes) pair(doc, 'Notes', round.notes)
  doc.moveDown(0.6)

  const columns: Column[] = [
    { title: 'Tag', width: 58 },
    { title: 'Date', width: 62 },
    { title: 'Test', width: 78 },
    { title: 'Result', width: 46 },
    { title: 'Lit for', width: 52 },
    { title: 'Checklist', width: 170 },
    { title: 'Faults found', width: 150 },
    { title: 'Remedial action', width: 150 },
  ]
  if (records.length) {
    table(
      doc,
      columns,
      records.map((r) => [
        r.tag,
        date(r.testedOn),
        labelOf(TEST_KIND_LABELS, r.kind),
        resultCell(r.passed),
        r.achievedDurationH === null ? '' : formatHours(r.achievedDurationH, prefs),
        checklistWords(r.checklist),
        [r.faults, r.verdictOverrideReason ? `Verdict recorded against the runtime: ${r.verdictOverrideReason}` : ''].filter(Boolean).join('. '),
        r.remedialAction,
      ]),
    )
  } else write(doc, 'No test records carry this round.')

  sectionHeading(doc, 'Failures to put right')
  if (failed.length) {
    table(
      doc,
      [
        { title: 'Tag', width: 58 },
        { title: 'Failed', width: 160 },
        { title: 'Fault', width: 270 },
        { title: 'Remedial action', width: 278 },
      ],
      failed.map((r) => [r.tag, `${labelOf(TEST_KIND_LABELS, r.kind)} on ${date(r.testedOn)}`, r.faults, r.remedialAction || 'None written yet']),
    )
    doc.moveDown(0.3)
    write(doc, 'A failed luminaire needs a retest after repair; a failed full-duration test stays open until a later full-duration test passes.', {
      size: 9,
      x: doc.page.margins.left,
    } as WriteOptions)
  } else write(doc, 'None: every luminaire tested on this round passed.')

  doc.moveDown(0.8)
  write(
    doc,
    'Isolate the mains before opening a luminaire. After a full-duration test the luminaires give no cover until they have recharged (24 h unless the charger says otherwise); restore the supply afterwards. Spent nickel-cadmium and lithium packs go to a battery collection point, never into general waste. Local codes and a competent, licensed person decide what the installation needs.',
    { size: 8, x: doc.page.margins.left } as WriteOptions,
  )
  doc.moveDown(0.8)
  signOffBoxes(doc, [
    { role: 'Tested and signed off by', name: round.signed_off_by_name, date: date(round.signed_off_on) },
    { role: 'Received for the building by' },
  ])
  frame(doc, { header: `Record of a test round — ${site.name}`, footer: `Round signed off ${date(round.signed_off_on)} · Lampwright` })
  const slug =
    site.name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 60) || 'site'
  return { filename: `${slug}-round-${round.signed_off_on}.pdf`, body: await toBuffer(doc) }
}
