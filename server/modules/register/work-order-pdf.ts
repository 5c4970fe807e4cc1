/**
 * The work order of a test plan: the caution first, then each group with its start, end and
 * back-to-full-cover times, and for each group a sheet to fill in at the luminaires.
 */
import { PLAN_CAUTION } from '../../../shared/engine/test-plan'
import { DEFAULT_PREFS, formatDate, formatHours, formatWallClock, type FormatPrefs } from '../../../shared/format'
import { labelOf, PLAN_GROUPING_LABELS, REGIME_LABELS } from '../../../shared/labels'
import { frame, heading, newDocument, pair, signOffBoxes, toBuffer, write, type WriteOptions } from '../../lib/pdf/pdf-kit'
import { findSite } from './register.service'
import { table } from '../../lib/pdf/table'
import { findPlan } from './test-plans.service'

export async function workOrderPdf(
  workspaceId: string,
  siteId: string,
  planId: string,
  prefs: FormatPrefs = DEFAULT_PREFS,
): Promise<{ filename: string; body: Buffer }> {
  const site = await findSite(workspaceId, siteId)
  const { input, plan, createdAt } = await findPlan(workspaceId, siteId, planId)
  const when = (stamp: string) => formatWallClock(stamp, prefs)
  const doc = newDocument({ title: `Work order: full-duration tests — ${site.name}` }, { layout: 'landscape', margin: 36, paper: prefs.paper })
  const left = doc.page.margins.left
  write(doc, 'Work order: full-duration tests', { weight: 'semibold', size: 16 })
  write(doc, `${site.name}${site.address ? ` — ${site.address.replace(/\s*\n\s*/g, ', ')}` : ''}`)
  doc.moveDown(0.4)
  pair(doc, 'Testing regime', labelOf(REGIME_LABELS, site.regime))
  pair(doc, 'Groups', labelOf(PLAN_GROUPING_LABELS, input.grouping))
  pair(doc, 'Out-of-hours window', `${input.windowStart} to ${input.windowEnd}, from ${formatDate(input.firstDay, prefs)}`)
  pair(doc, 'Plan made', formatDate(createdAt, prefs))
  doc.moveDown(0.5)
  write(doc, 'Caution', { weight: 'semibold', size: 11, x: left } as WriteOptions)
  write(doc, PLAN_CAUTION, { size: 9, x: left, width: doc.page.width - left - doc.page.margins.right } as WriteOptions)
  if (plan.warnings.length) {
    doc.moveDown(0.4)
    write(doc, 'Points to settle before the tests', { weight: 'semibold', size: 11, x: left } as WriteOptions)
    for (const w of plan.warnings) write(doc, `• ${w.message}`, { size: 9, x: left } as WriteOptions)
  }
  heading(doc, 'Timetable')
  table(
    doc,
    [
      { title: 'Group', width: 110 },
      { title: 'Luminaires', width: 70 },
      { title: 'Areas', width: 170 },
      { title: 'Test starts', width: 100 },
      { title: 'Test ends', width: 100 },
      { title: 'Back to full cover', width: 110 },
      { title: 'Test / recharge', width: 100 },
    ],
    plan.groups.map((g) => [
      g.name,
      String(g.tags.length),
      g.areas.join(', '),
      when(g.startsAt),
      when(g.endsAt),
      when(g.fullCoverAt),
      `${formatHours(g.testH, prefs)} / ${formatHours(g.rechargeH, prefs)}`,
    ]),
  )
  for (const g of plan.groups) {
    heading(doc, `${g.name}: ${when(g.startsAt)}`)
    write(
      doc,
      `Cut the supply at ${when(g.startsAt)}; every lamp must stay lit until ${when(g.endsAt)}. Restore the supply straight after; the group is back to full cover at ${when(g.fullCoverAt)}.`,
      { size: 9, x: left } as WriteOptions,
    )
    doc.moveDown(0.3)
    table(
      doc,
      [
        { title: 'Tag', width: 80 },
        { title: 'Lit at the start', width: 90 },
        { title: 'Went out at (or lit to the end)', width: 170 },
        { title: 'Pass or fail', width: 90 },
        { title: 'Faults and remedial action', width: 330 },
      ],
      g.tags.map((t) => [t, '', '', '', '']),
      { size: 9, writeIn: 20 },
    )
  }
  doc.moveDown(0.8)
  signOffBoxes(doc, [{ role: 'Tests carried out by' }, { role: 'Supply restored and checked by' }])
  frame(doc, { header: `Work order: full-duration tests — ${site.name}`, footer: `Plan made ${formatDate(createdAt, prefs)} · Lampwright` })
  const slug =
    site.name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 60) || 'site'
  return { filename: `${slug}-work-order-${input.firstDay}.pdf`, body: await toBuffer(doc) }
}
