/** /api/sheets and /api/shared: specification sheets, revisions, issue, shares. Types only from shared (no engine code here). */
import type { FieldChange } from '@shared/schemas/sheet-diff'
import type { RevisionStatus, SheetStatus } from '@shared/schemas/sheet.schema'
import { http, request } from './http'

export interface Person {
  id: string
  name: string
}

export interface SheetFields {
  title: string
  reference: string
  client: string
  site: string
  luminaire: string
  inputs: Record<string, unknown>
}

export interface Sheet extends SheetFields {
  id: string
  chemistry: string
  results: Record<string, unknown>
  engineVersion: string
  status: SheetStatus
  currentRevision: number
  issuedRevision: number | null
  version: number
  createdBy: Person | null
  updatedBy: Person | null
  archivedAt: string | null
  createdAt: string
  updatedAt: string
}

export interface SheetListItem {
  id: string
  title: string
  reference: string
  client: string
  site: string
  chemistry: string
  status: SheetStatus
  currentRevision: number
  issuedRevision: number | null
  selectedCapacityAh: number
  requiredCapacityAh: number
  author: Person | null
  archivedAt: string | null
  createdAt: string
  updatedAt: string
}

export interface SheetPage {
  items: SheetListItem[]
  total: number
  page: number
  pageSize: number
}

export interface SheetQuery {
  page?: number
  pageSize?: number
  sort?: string
  order?: 'asc' | 'desc'
  q?: string
  chemistry?: string | null
  status?: string | null
  author?: string | null
  archived?: boolean
}

export interface RevisionSummary {
  number: number
  status: RevisionStatus
  title: string
  engineVersion: string
  author: Person | null
  createdAt: string
  issuedAt: string | null
  issuedBy: Person | null
}

export interface Revision extends RevisionSummary, SheetFields {
  results: Record<string, unknown>
}

export interface SharedSheet extends Revision {
  expiresAt: string | null
  cautions: Array<{ id: string; title: string; text: string }>
}

export interface ShareLink {
  id: string
  createdAt: string
  createdBy: Person | null
  expiresAt: string | null
  revokedAt: string | null
  state: 'active' | 'expired' | 'revoked'
}

export interface NewShare {
  id: string
  token: string
  url: string
  expiresAt: string | null
}

/** The body of a 409 on a stale save. */
export interface SaveConflict {
  currentVersion: number
  yourVersion: number
  changedBy: Person | null
  changedAt: string
  changes: FieldChange[]
  current: Sheet
}

export const fetchSheets = (q: SheetQuery) =>
  http.get<SheetPage>('/sheets', { ...q, archived: q.archived ? 'true' : undefined, chemistry: q.chemistry ?? undefined, status: q.status ?? undefined, author: q.author ?? undefined })
export const fetchSheetAuthors = () => http.get<{ authors: Person[] }>('/sheets/authors')
export const fetchSheet = (id: string) => http.get<Sheet>(`/sheets/${id}`)
export const createSheet = (body: SheetFields) => http.post<Sheet>('/sheets', body)
export const saveSheet = (id: string, body: SheetFields & { version: number }) => http.put<Sheet>(`/sheets/${id}`, body)
export const fetchRevisions = (id: string) => http.get<{ revisions: RevisionSummary[] }>(`/sheets/${id}/revisions`)
export const fetchRevision = (id: string, n: number) => http.get<Revision>(`/sheets/${id}/revisions/${n}`)
export const issueSheet = (id: string, version: number) => http.post<Sheet>(`/sheets/${id}/issue`, { version })
export const cloneSheet = (id: string) => http.post<Sheet>(`/sheets/${id}/clone`)
export const archiveSheet = (id: string) => http.post<Sheet>(`/sheets/${id}/archive`)
export const restoreSheet = (id: string) => http.post<Sheet>(`/sheets/${id}/restore`)
export const fetchShares = (id: string) => http.get<{ shares: ShareLink[] }>(`/sheets/${id}/shares`)
export const createShare = (id: string, expiresAt: string | null) => http.post<NewShare>(`/sheets/${id}/shares`, expiresAt ? { expiresAt } : {})
export const revokeShare = (id: string, shareId: string) => http.del<void>(`/sheets/${id}/shares/${shareId}`)
export const emailShare = (id: string, shareId: string, body: { to: string; message: string; token: string }) => http.post<{ sent: boolean }>(`/sheets/${id}/shares/${shareId}/email`, body)
export const fetchShared = (token: string) => request<SharedSheet>(`/shared/${encodeURIComponent(token)}`, { quiet401: true })
export const sheetPdfUrl = (id: string, revision?: number) => `/api/sheets/${id}/pdf${revision ? `?revision=${revision}` : ''}`
export const sharedPdfUrl = (token: string) => `/api/shared/${encodeURIComponent(token)}/pdf`
