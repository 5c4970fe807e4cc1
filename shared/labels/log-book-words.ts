/**
 * The log book's summary in sentences, the same on the shared page and in the PDF: what became of
 * each failure, and each next test date. Dates are written by the caller's `date` (shared/format
 * with the reader's preferences), so this stays free of locale and clock.
 */
import type { FailureEntry, NextDueDate } from '../engine/log-book-summary'
import { DUE_REASON_LABELS, FAILURE_STATE_LABELS, testKindWords } from './index'

type DateWords = (isoDay: string) => string

/** "Still failed: retest due by 12 Feb 2026", "Cleared by a full-duration test passed on 3 Mar 2026, after a new pack fitted on 1 Mar 2026". */
export function failureStateWords(f: FailureEntry, date: DateWords): string {
  switch (f.state) {
    case 'open':
      return `${FAILURE_STATE_LABELS.open}: retest due by ${f.retestBy ? date(f.retestBy) : 'now'}`
    case 'retest-overdue':
      return `${FAILURE_STATE_LABELS.open}: retest overdue, was due by ${f.retestBy ? date(f.retestBy) : 'now'}`
    case 'cleared':
      return `${FAILURE_STATE_LABELS.cleared} by a ${f.closedBy ? `${testKindWords(f.closedBy.kind)} passed on ${date(f.closedBy.testedOn)}` : 'later pass'}${f.newPackOn ? `, after a new pack fitted on ${date(f.newPackOn)}` : ''}`
    case 'failed-again':
      return `${FAILURE_STATE_LABELS['failed-again']}: ${f.closedBy ? `${testKindWords(f.closedBy.kind)} on ${date(f.closedBy.testedOn)}` : 'later'} (listed on its own)`
  }
}

/** "Functional test" or "Retest after a failure (full-duration test)". */
export function nextDueTestWords(d: NextDueDate): string {
  const kind = testKindWords(d.kind)
  if (d.reason === 'interval') return kind.charAt(0).toUpperCase() + kind.slice(1)
  const why = DUE_REASON_LABELS[d.reason]
  return `${why.charAt(0).toUpperCase() + why.slice(1)}${d.reason === 'retest' ? ` (${kind})` : ''}`
}

/** "due 31 Jan 2026", "by 12 Feb 2026", "overdue since 31 Dec 2025", "overdue, was due by 12 Jan 2026". */
export function nextDueWhenWords(d: NextDueDate, date: DateWords): string {
  if (d.overdue) return d.reason === 'interval' ? `overdue since ${date(d.dueOn)}` : `overdue, was due by ${date(d.dueOn)}`
  return d.reason === 'interval' ? `due ${date(d.dueOn)}` : `by ${date(d.dueOn)}`
}

/** "EL-01, EL-02 and 5 more" */
export function tagListWords(tags: readonly string[], shown = 6): string {
  if (tags.length <= shown) return tags.join(', ')
  return `${tags.slice(0, shown).join(', ')} and ${tags.length - shown} more`
}
