/**
 * The summary at the front of a site's log book (the PDF, and the page behind a log book link):
 * the site's state today from `siteStatus`, and each luminaire's history as its state was worked
 * out from, handed to the engine (shared/engine/log-book-summary.ts). Nothing is decided here.
 */
import type { TestEvent } from '../../../shared/engine/due'
import { logBookSummary } from '../../../shared/engine/log-book-summary'
import { siteStatus, testsBeforeRegister, todayIso } from './register.service'
import { siteLogBook, type LogBookEntry } from './tests.service'

/** Every entry of the log book, no limit: the summary and the PDF cover the whole book. */
const WHOLE_BOOK = 100_000

/** The site today, its whole log book (newest first, tests recorded in error included) and its summary. */
export async function siteLogBookSummary(workspaceId: string, siteId: string, today = todayIso()) {
  const status = await siteStatus(workspaceId, siteId, today)
  const entries: LogBookEntry[] = await siteLogBook(workspaceId, siteId, WHOLE_BOOK)
  // Oldest first, same-day tests in the order recorded: the order the due rules read them in.
  const byLuminaire = new Map<string, TestEvent[]>()
  for (const e of [...entries].reverse()) {
    if (e.recordedInErrorAt) continue
    const list = byLuminaire.get(e.luminaireId) ?? []
    list.push({ kind: e.kind, testedOn: e.testedOn, passed: e.passed, faults: e.faults, remedialAction: e.remedialAction })
    byLuminaire.set(e.luminaireId, list)
  }
  const summary = logBookSummary(
    status.luminaires.map((l) => ({
      tag: l.tag,
      packFittedOn: l.packFittedOn,
      due: l.due,
      tests: [...testsBeforeRegister(l), ...(byLuminaire.get(l.id) ?? [])],
    })),
    today,
  )
  return { status, entries, summary }
}
export type SiteLogBookSummary = Awaited<ReturnType<typeof siteLogBookSummary>>
