/** /api/sheets and /api/shared: specification sheets, revisions, issue, shares. Types only from shared (no engine code here). */
import type { FieldChange } from '@shared/schemas/sheet-diff'
import type { Answer, PersonSchema } from '@shared/schemas/answers/common'
import type {
  NewShareAnswer,
  RevisionAnswer,
  RevisionListAnswer,
  RevisionSummaryAnswer,
  SentAnswer,
  SharedSheetAnswer,
  ShareLinkAnswer,
  ShareListAnswer,
  SheetAnswer,
  SheetAuthorsAnswer,
  SheetListItemAnswer,
  SheetPageAnswer,
} from '@shared/schemas/answers/sheets'
import { http, request } from './http'

export type Person = Answer<typeof PersonSchema>

/** What the sheet form sends (the shared content schema's input). */
export interface SheetFields {
  title: string
  reference: string
  client: string
  site: string
  luminaire: string
  inputs: Record<string, unknown>
}

// Answers: typed from the schemas the server's routes declare, never retyped here.
export type Sheet = Answer<typeof SheetAnswer>
export type SheetListItem = Answer<typeof SheetListItemAnswer>
export type SheetPage = Answer<typeof SheetPageAnswer>
export type RevisionSummary = Answer<typeof RevisionSummaryAnswer>
export type Revision = Answer<typeof RevisionAnswer>
export type SharedSheet = Answer<typeof SharedSheetAnswer>
export type ShareLink = Answer<typeof ShareLinkAnswer>
export type NewShare = Answer<typeof NewShareAnswer>

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
  http.get<SheetPage>('/sheets', {
    ...q,
    archived: q.archived ? 'true' : undefined,
    chemistry: q.chemistry ?? undefined,
    status: q.status ?? undefined,
    author: q.author ?? undefined,
  })
export const fetchSheetAuthors = () => http.get<Answer<typeof SheetAuthorsAnswer>>('/sheets/authors')
export const fetchSheet = (id: string) => http.get<Sheet>(`/sheets/${id}`)
export const createSheet = (body: SheetFields) => http.post<Sheet>('/sheets', body)
export const saveSheet = (id: string, body: SheetFields & { version: number }) => http.put<Sheet>(`/sheets/${id}`, body)
export const fetchRevisions = (id: string) => http.get<Answer<typeof RevisionListAnswer>>(`/sheets/${id}/revisions`)
export const fetchRevision = (id: string, n: number) => http.get<Revision>(`/sheets/${id}/revisions/${n}`)
export const issueSheet = (id: string, version: number) => http.post<Sheet>(`/sheets/${id}/issue`, { version })
export const cloneSheet = (id: string) => http.post<Sheet>(`/sheets/${id}/clone`)
export const archiveSheet = (id: string) => http.post<Sheet>(`/sheets/${id}/archive`)
export const restoreSheet = (id: string) => http.post<Sheet>(`/sheets/${id}/restore`)
export const fetchShares = (id: string) => http.get<Answer<typeof ShareListAnswer>>(`/sheets/${id}/shares`)
export const createShare = (id: string, expiresAt: string | null) => http.post<NewShare>(`/sheets/${id}/shares`, expiresAt ? { expiresAt } : {})
export const revokeShare = (id: string, shareId: string) => http.del<void>(`/sheets/${id}/shares/${shareId}`)
export const emailShare = (id: string, shareId: string, body: { to: string; message: string; token: string }) =>
  http.post<Answer<typeof SentAnswer>>(`/sheets/${id}/shares/${shareId}/email`, body)
export const fetchShared = (token: string) => request<SharedSheet>(`/shared/${encodeURIComponent(token)}`, { quiet401: true })
export const sheetPdfUrl = (id: string, revision?: number) => `/api/sheets/${id}/pdf${revision ? `?revision=${revision}` : ''}`
export const sharedPdfUrl = (token: string) => `/api/shared/${encodeURIComponent(token)}/pdf`
