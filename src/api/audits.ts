/** /api/audits: saved wattage audits, and the sheets and luminaires they can hang on. Types only from shared. */
import type { Answer, PersonSchema } from '@shared/schemas/answers/common'
import type { AuditListAnswer, SavedAuditAnswer } from '@shared/schemas/answers/audits'
import { http } from './http'
import type { LuminaireStatus, RegisterOverview, SiteStatus, SiteSummary } from './register'
import type { SheetListItem, SheetPage } from './sheets'

export type Person = Answer<typeof PersonSchema>

/** What the audit form sends. */
export interface AuditFields {
  title: string
  luminaire: string
  inputs: Record<string, unknown>
  specSheetId?: string | null
  luminaireId?: string | null
}

// Answers: typed from the schemas the server's routes declare.
export type SavedAudit = Answer<typeof SavedAuditAnswer>
export type AuditList = Answer<typeof AuditListAnswer>

export interface AuditQuery {
  sheetId?: string
  luminaireId?: string
  ids?: string[]
  q?: string
  limit?: number
}

export const fetchAudits = (q: AuditQuery = {}) =>
  http.get<AuditList>('/audits', { sheetId: q.sheetId, luminaireId: q.luminaireId, ids: q.ids?.join(','), q: q.q, limit: q.limit })
export const fetchAudit = (id: string) => http.get<SavedAudit>(`/audits/${id}`)
export const createAudit = (body: AuditFields) => http.post<SavedAudit>('/audits', body)
export const attachAudit = (id: string, body: { specSheetId?: string | null; luminaireId?: string | null }) =>
  http.post<SavedAudit>(`/audits/${id}/attach`, body)
export const deleteAudit = (id: string) => http.del<void>(`/audits/${id}`)

/** Places an audit can be attached to, for the pickers: parts of the sheet list, the overview and a site. */
export type SheetChoice = Pick<SheetListItem, 'id' | 'title' | 'reference'>
export type SiteChoice = Pick<SiteSummary, 'id' | 'name'>
export type LuminaireChoice = Pick<LuminaireStatus, 'id' | 'tag' | 'location'>

export const fetchSheetChoices = (q?: string) => http.get<SheetPage>('/sheets', { pageSize: 50, sort: 'updatedAt', order: 'desc', q }).then((r) => r.items)
export const fetchSiteChoices = () => http.get<RegisterOverview>('/sites').then((r) => r.sites)
export const fetchLuminaireChoices = (siteId: string) => http.get<SiteStatus>(`/sites/${siteId}`).then((r) => r.luminaires)
