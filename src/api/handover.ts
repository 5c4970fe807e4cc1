/** Handover packs of a site and their read-only links. Types come from the answers the routes declare. */
import type { Answer } from '@shared/schemas/answers/common'
import type {
  HandoverLinkAnswer,
  HandoverPackAnswer,
  HandoverPackListAnswer,
  HandoverPackSummary,
  SharedHandoverAnswer,
} from '@shared/schemas/answers/handover'
import type { HandoverRequestSchema } from '@shared/schemas/handover.schema'
import type { z } from 'zod'
import { http, request } from './http'

export type HandoverPack = Answer<typeof HandoverPackAnswer>
export type HandoverPackItem = Answer<typeof HandoverPackSummary>
export type HandoverLink = Answer<typeof HandoverLinkAnswer>
export type SharedHandover = Answer<typeof SharedHandoverAnswer>
export type HandoverFields = z.input<typeof HandoverRequestSchema>

export const fetchPacks = (siteId: string) => http.get<Answer<typeof HandoverPackListAnswer>>(`/sites/${siteId}/handover-packs`)
export const makePack = (siteId: string, body: HandoverFields) => http.post<HandoverPack>(`/sites/${siteId}/handover-packs`, body)
export const makeLink = (siteId: string, n: number, expiresOn: string | null) =>
  http.post<HandoverLink>(`/sites/${siteId}/handover-packs/${n}/links`, { expiresOn })
export const packPdfUrl = (siteId: string, n: number) => `/api/sites/${siteId}/handover-packs/${n}/pdf`
export const fetchSharedPack = (token: string) => request<SharedHandover>(`/handover-links/${encodeURIComponent(token)}`, { quiet401: true })
export const sharedPackPdfUrl = (token: string) => `/api/handover-links/${encodeURIComponent(token)}/pdf`
