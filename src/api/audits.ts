/** /api/audits: saved wattage audits, and the sheets and luminaires they can hang on. Types only from shared. */
import type { EngineWarning } from '@shared/engine/types'
import { http } from './http'

export interface Person {
  id: string
  name: string
}

export interface AuditFields {
  title: string
  luminaire: string
  inputs: Record<string, unknown>
  specSheetId?: string | null
  luminaireId?: string | null
}

export interface SavedAudit {
  id: string
  title: string
  luminaire: string
  inputs: Record<string, unknown>
  /** The engine's audit result as saved (lists leave out `working`). */
  results: Record<string, unknown> & { warnings: EngineWarning[] }
  claimedPowerW: number
  engineVersion: string
  author: Person | null
  specSheetId: string | null
  luminaireId: string | null
  specSheet: { id: string; title: string } | null
  luminaireLink: { id: string; tag: string; siteId: string; siteName: string } | null
  createdAt: string
  updatedAt: string
}

export interface AuditQuery {
  sheetId?: string
  luminaireId?: string
  ids?: string[]
  q?: string
  limit?: number
}

export const fetchAudits = (q: AuditQuery = {}) =>
  http.get<{ items: SavedAudit[]; total: number }>('/audits', { sheetId: q.sheetId, luminaireId: q.luminaireId, ids: q.ids?.join(','), q: q.q, limit: q.limit })
export const fetchAudit = (id: string) => http.get<SavedAudit>(`/audits/${id}`)
export const createAudit = (body: AuditFields) => http.post<SavedAudit>('/audits', body)
export const attachAudit = (id: string, body: { specSheetId?: string | null; luminaireId?: string | null }) => http.post<SavedAudit>(`/audits/${id}/attach`, body)
export const deleteAudit = (id: string) => http.del<void>(`/audits/${id}`)

/** Places an audit can be attached to, for the pickers. */
export interface SheetChoice {
  id: string
  title: string
  reference: string
}
export interface LuminaireChoice {
  id: string
  tag: string
  location: string
}
export interface SiteChoice {
  id: string
  name: string
}

export const fetchSheetChoices = (q?: string) =>
  http.get<{ items: SheetChoice[] }>('/sheets', { pageSize: 50, sort: 'updatedAt', order: 'desc', q }).then((r) => r.items)
export const fetchSiteChoices = () => http.get<{ sites: SiteChoice[] }>('/sites').then((r) => r.sites)
export const fetchLuminaireChoices = (siteId: string) => http.get<{ luminaires: LuminaireChoice[] }>(`/sites/${siteId}`).then((r) => r.luminaires ?? [])
