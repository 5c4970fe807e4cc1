/** A site's log book shared by read-only link. Types come from the answers the routes declare. */
import type { Answer } from '@shared/schemas/answers/common'
import type { LogBookLinkItem, LogBookLinkListAnswer, NewLogBookLinkAnswer, SharedLogBookAnswer } from '@shared/schemas/answers/logbook'
import { http, request } from './http'

export type NewLogBookLink = Answer<typeof NewLogBookLinkAnswer>
export type LogBookLink = Answer<typeof LogBookLinkItem>
export type SharedLogBook = Answer<typeof SharedLogBookAnswer>

export const fetchLinks = (siteId: string) => http.get<Answer<typeof LogBookLinkListAnswer>>(`/sites/${siteId}/logbook-links`)
export const makeLink = (siteId: string, expiresOn: string | null) => http.post<NewLogBookLink>(`/sites/${siteId}/logbook-links`, { expiresOn })
export const revokeLink = (siteId: string, linkId: string) => http.del<void>(`/sites/${siteId}/logbook-links/${linkId}`)
export const fetchSharedLogBook = (token: string) => request<SharedLogBook>(`/logbook-links/${encodeURIComponent(token)}`, { quiet401: true })
export const sharedLogBookPdfUrl = (token: string) => `/api/logbook-links/${encodeURIComponent(token)}/pdf`
