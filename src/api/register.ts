/** The site register and log book API. Answers typed from the schemas the server's routes declare. */
import type { LuminaireInput } from '@shared/schemas/luminaire.schema'
import type { SiteInput } from '@shared/schemas/site.schema'
import type { TestRecordInput } from '@shared/schemas/test-record.schema'
import type { Answer } from '@shared/schemas/answers/common'
import type {
  AreaAnswer,
  AttentionItemAnswer,
  DueCountsAnswer,
  ImportPreviewAnswer,
  ImportResultAnswer,
  LogBookAnswer,
  LogBookEntryAnswer,
  LuminaireAnswer,
  LuminaireDetailAnswer,
  LuminaireStatusAnswer,
  PackChangeAnswer,
  RegimeChangeAnswer,
  RegisterOverviewAnswer,
  RegisterSettingsAnswer,
  SiteAnswer,
  SiteStatusAnswer,
  SiteSummaryAnswer,
  TestBatchAnswer,
  RoundSignOffAnswer,
  UpcomingTestAnswer,
} from '@shared/schemas/answers/register'
import { http } from './http'

export type DueCounts = Answer<typeof DueCountsAnswer>
export type Site = Answer<typeof SiteAnswer>
export type SiteSummary = Answer<typeof SiteSummaryAnswer>
export type UpcomingTest = Answer<typeof UpcomingTestAnswer>
/** A test due now or overdue across the workspace (retest, commissioning, routine past its day). */
export type AttentionItem = Answer<typeof AttentionItemAnswer>
export type RegisterSettings = Answer<typeof RegisterSettingsAnswer>
export type Area = Answer<typeof AreaAnswer>
export type Luminaire = Answer<typeof LuminaireAnswer>
export type LuminaireStatus = Answer<typeof LuminaireStatusAnswer>
export type SiteStatus = Answer<typeof SiteStatusAnswer>
export type PackChangeEntry = Answer<typeof PackChangeAnswer>
export type RegimeChange = Answer<typeof RegimeChangeAnswer>
export type LuminaireDetail = Answer<typeof LuminaireDetailAnswer>
export type LogBookEntry = Answer<typeof LogBookEntryAnswer>
export type LogBook = Answer<typeof LogBookAnswer>
export type ImportPreview = Answer<typeof ImportPreviewAnswer>
export type ImportIssue = ImportPreview['errors'][number]
export type ImportResult = Answer<typeof ImportResultAnswer>
export type TestBatchResult = Answer<typeof TestBatchAnswer>
export type RegisterOverview = Answer<typeof RegisterOverviewAnswer>

export const fetchOverview = (days = 60) => http.get<RegisterOverview>('/sites', { days })
export const fetchRegisterSettings = () => http.get<RegisterSettings>('/register/settings')
export const updateRegisterSettings = (body: Partial<RegisterSettings>) => http.patch<RegisterSettings>('/register/settings', body)
export const createSite = (body: SiteInput) => http.post<Site>('/sites', body)
export const updateSite = (id: string, body: Partial<SiteInput> & { regimeChangeReason?: string }) => http.patch<Site>(`/sites/${id}`, body)
export const deleteSite = (id: string) => http.del<void>(`/sites/${id}`)
export const fetchSite = (id: string) => http.get<SiteStatus>(`/sites/${id}`)
export const createArea = (siteId: string, name: string) => http.post<Area>(`/sites/${siteId}/areas`, { name })
export const createLuminaire = (siteId: string, body: LuminaireInput) => http.post<Luminaire>(`/sites/${siteId}/luminaires`, body)
export const fetchLuminaire = (id: string) => http.get<LuminaireDetail>(`/luminaires/${id}`)
export const updateLuminaire = (id: string, body: Partial<LuminaireInput>) => http.patch<Luminaire>(`/luminaires/${id}`, body)
export const deleteLuminaire = (id: string) => http.del<void>(`/luminaires/${id}`)
export const replacePack = (id: string, body: { packFittedOn: string; chemistry?: string; cellsInSeries?: number; capacityAh?: number; note?: string }) =>
  http.post<Luminaire>(`/luminaires/${id}/pack`, body)
export const fetchLuminaireTests = (id: string) => http.get<LogBook>(`/luminaires/${id}/tests`)
export const fetchLogBook = (siteId: string) => http.get<LogBook>(`/sites/${siteId}/tests`)
export const markRecordedInError = (testId: string, reason: string) => http.post<LogBookEntry>(`/tests/${testId}/recorded-in-error`, { reason })
export const renameArea = (id: string, name: string) => http.patch<Area>(`/areas/${id}`, { name })
export const deleteArea = (id: string) => http.del<void>(`/areas/${id}`)
export const recordTests = (records: TestRecordInput[]) => http.post<TestBatchResult>('/tests', { records })
export const previewImport = (siteId: string, csv: string) => http.post<ImportPreview>(`/sites/${siteId}/import/preview`, { csv })
export const commitImport = (siteId: string, csv: string) => http.post<ImportResult>(`/sites/${siteId}/import`, { csv })
/** A plain link: the browser downloads the file with the session cookie. */
export const exportUrl = (siteId: string, file: 'register.csv' | 'logbook.csv' | 'register.pdf' | 'logbook.pdf') => `/api/sites/${siteId}/export/${file}`

export type RoundSignOffResult = Answer<typeof RoundSignOffAnswer>
export const signOffRound = (siteId: string, body: { clientId: string; signedOffByName: string; signedOffOn: string; notes?: string }) =>
  http.post<RoundSignOffResult>(`/sites/${siteId}/rounds`, body)
/** The printable record of a signed-off round (a plain link, like the exports). */
export const roundRecordUrl = (siteId: string, roundId: string) => `/api/sites/${siteId}/rounds/${roundId}/record.pdf`
