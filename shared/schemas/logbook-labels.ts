/**
 * Words for the log book's codes, as screens and PDFs show them. CSV files keep the codes (stable
 * machine values, listed in docs/logbook.md). Kept here until the workspace-wide label maps cover
 * these enumerations.
 */
import type { DueReason, DueState, LuminaireDue, PackForecast, TestKind } from '../engine/due'
import { CHEMISTRIES, type ChemistryId } from '../engine/chemistries'
import type { MODES } from './luminaire.schema'

export const LUMINAIRE_STATE_LABELS: Record<LuminaireDue['state'], string> = {
  failed: 'Failed',
  overdue: 'Overdue',
  'due-now': 'Test due now',
  'due-soon': 'Due soon',
  ok: 'Up to date',
}

export const DUE_STATE_LABELS: Record<DueState, string> = {
  overdue: 'Overdue',
  'due-now': 'Due now',
  'due-soon': 'Due soon',
  scheduled: 'Scheduled',
}

export const DUE_REASON_LABELS: Record<DueReason, string> = {
  interval: 'routine test',
  retest: 'retest after a failure',
  commissioning: 'first full-duration test of this pack',
}

export const TEST_KIND_LABELS: Record<TestKind, string> = {
  functional: 'Functional test',
  duration: 'Full-duration test',
}
/** The same in the middle of a sentence. */
export const testKindWords = (kind: TestKind) => TEST_KIND_LABELS[kind].toLowerCase()

export const FORECAST_STATE_LABELS: Record<PackForecast['state'], string> = {
  'replace-now': 'Replace now',
  'replace-soon': 'Replace soon',
  ok: 'Good',
}

export const FORECAST_REASON_LABELS: Record<PackForecast['reason'], string> = {
  'service-life': 'service life',
  'duration-trend': 'trend of measured durations',
  'latest-test': 'latest test',
}

export const MODE_LABELS: Record<(typeof MODES)[number], string> = {
  maintained: 'Maintained',
  'non-maintained': 'Non-maintained',
}

export const chemistryName = (id: ChemistryId | string) => CHEMISTRIES[id as ChemistryId]?.name ?? id
