/** The site register and log book API. */
import type { DueCounts, DueItem, LuminaireDue, PackForecast, RegimeRules } from '@shared/engine/due'
import type { LuminaireInput } from '@shared/schemas/luminaire.schema'
import type { RegimeProfile } from '@shared/engine/regimes'
import type { SiteInput, TestRegimeId } from '@shared/schemas/site.schema'
import type { TestRecordInput } from '@shared/schemas/test-record.schema'
import { http } from './http'

export type { DueCounts } from '@shared/engine/due'

export interface Site {
  id: string
  name: string
  address: string
  responsibleName: string
  responsibleEmail: string
  regime: TestRegimeId
  ceilingTemperatureC: number
}

export interface SiteSummary extends Site {
  counts: DueCounts
  packsToReplace: number
}

export interface UpcomingTest {
  siteId: string
  siteName: string
  luminaireId: string
  tag: string
  kind: 'functional' | 'duration'
  dueOn: string
  daysUntilDue: number
}

/** A test due now or overdue across the workspace (retest, commissioning, routine past its day). */
export interface AttentionItem extends UpcomingTest {
  reason: DueItem['reason']
  state: 'overdue' | 'due-now'
  overdueAfter: string
  failedOn: string | null
  faults: string
  remedialAction: string
}

export interface RegisterSettings {
  repairWindowDays: number
}

export interface Luminaire {
  id: string
  siteId: string
  areaId: string | null
  areaName: string | null
  tag: string
  location: string
  typeLabel: string
  purpose: 'escape-route' | 'open-area' | 'high-risk' | 'exit-sign'
  mode: 'maintained' | 'non-maintained'
  ratedDurationH: number
  chemistry: string
  cellsInSeries: number
  capacityAh: number
  packFittedOn: string
  walkOrder: number | null
  circuit: string
  rechargeH: number | null
  specSheetId: string | null
  luminaireTypeId: string | null
}

export interface LuminaireStatus extends Luminaire {
  due: LuminaireDue
  forecast: PackForecast
}

export interface SiteStatus {
  today: string
  site: Site
  regime: { label: string; references: RegimeRules['references'] }
  /** The full regime profile (tests, windows, records, retention, edition). */
  profile?: RegimeProfile
  regimeHistory?: RegimeChange[]
  settings: RegisterSettings
  areas: Array<{ id: string; name: string }>
  counts: DueCounts
  luminaires: LuminaireStatus[]
}

export interface LogBookEntry {
  id: string
  clientId: string
  luminaireId: string
  tag: string
  kind: 'functional' | 'duration'
  testedOn: string
  passed: boolean
  achievedDurationH: number | null
  faults: string
  remedialAction: string
  dischargeLogId: string | null
  checklist: Record<string, boolean>
  verdictOverrideReason: string
  runtimeNote: string
  roundClientId: string | null
  recordedByName: string | null
  recordedAt: string
  /** Marked as recorded in error: shown struck through, left out of the state. */
  recordedInErrorAt?: string | null
  recordedInErrorReason?: string
  recordedInErrorByName?: string | null
}

/** A pack fitted or its details corrected, from the audit trail, with its note. */
export interface PackChangeEntry {
  id: string
  luminaireId: string
  tag: string
  changedOn: string
  before: Record<string, unknown> | null
  after: Record<string, unknown> | null
  note: string
  recordedByName: string | null
  recordedAt: string
}

export interface RegimeChange {
  id: string
  fromRegime: TestRegimeId | null
  toRegime: TestRegimeId
  profileVersion: string
  reason: string
  changedByName: string | null
  changedAt: string
}

export interface ImportIssue {
  row: number
  column: string
  reason: string
}

export interface ImportPreview {
  columns: string[]
  /** The first rows only; totalRows counts them all. */
  rows: Array<{ row: number; values: Record<string, unknown> | null }>
  /** The first problems only; errorCount counts them all. */
  errors: ImportIssue[]
  errorCount?: number
  validRows: number
  totalRows?: number
  newAreas: string[]
}

export const fetchOverview = (days = 60) =>
  http.get<{ today: string; days: number; settings: RegisterSettings; sites: SiteSummary[]; attention: AttentionItem[]; upcoming: UpcomingTest[] }>('/sites', { days })
export const fetchRegisterSettings = () => http.get<RegisterSettings>('/register/settings')
export const updateRegisterSettings = (body: Partial<RegisterSettings>) => http.patch<RegisterSettings>('/register/settings', body)
export const createSite = (body: SiteInput) => http.post<Site>('/sites', body)
export const updateSite = (id: string, body: Partial<SiteInput> & { regimeChangeReason?: string }) => http.patch<Site>(`/sites/${id}`, body)
export const deleteSite = (id: string) => http.del<void>(`/sites/${id}`)
export const fetchSite = (id: string) => http.get<SiteStatus>(`/sites/${id}`)
export const createArea = (siteId: string, name: string) => http.post<{ id: string; name: string }>(`/sites/${siteId}/areas`, { name })
export const createLuminaire = (siteId: string, body: LuminaireInput) => http.post<Luminaire>(`/sites/${siteId}/luminaires`, body)
export const fetchLuminaire = (id: string) => http.get<{ today: string; site: Site; luminaire: LuminaireStatus }>(`/luminaires/${id}`)
export const updateLuminaire = (id: string, body: Partial<LuminaireInput>) => http.patch<Luminaire>(`/luminaires/${id}`, body)
export const deleteLuminaire = (id: string) => http.del<void>(`/luminaires/${id}`)
export const replacePack = (id: string, body: { packFittedOn: string; chemistry?: string; cellsInSeries?: number; capacityAh?: number; note?: string }) =>
  http.post<Luminaire>(`/luminaires/${id}/pack`, body)
export const fetchLuminaireTests = (id: string) => http.get<{ tests: LogBookEntry[] }>(`/luminaires/${id}/tests`)
export const fetchLogBook = (siteId: string) => http.get<{ tests: LogBookEntry[]; packChanges?: PackChangeEntry[] }>(`/sites/${siteId}/tests`)
export const markRecordedInError = (testId: string, reason: string) => http.post<LogBookEntry>(`/tests/${testId}/recorded-in-error`, { reason })
export const renameArea = (id: string, name: string) => http.patch<{ id: string; name: string }>(`/areas/${id}`, { name })
export const deleteArea = (id: string) => http.del<void>(`/areas/${id}`)
export const recordTests = (records: TestRecordInput[]) =>
  http.post<{ records: Array<{ clientId: string; id: string; outcome: 'created' | 'updated' | 'unchanged' }> }>('/tests', { records })
export const previewImport = (siteId: string, csv: string) => http.post<ImportPreview>(`/sites/${siteId}/import/preview`, { csv })
export const commitImport = (siteId: string, csv: string) => http.post<{ imported: number; areasCreated: number }>(`/sites/${siteId}/import`, { csv })
/** A plain link: the browser downloads the file with the session cookie. */
export const exportUrl = (siteId: string, file: 'register.csv' | 'logbook.csv' | 'register.pdf' | 'logbook.pdf') => `/api/sites/${siteId}/export/${file}`
