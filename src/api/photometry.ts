/** /api/photometry, /api/luminaire-types, /api/route-spacing and the engine's spacing tool. Types only from shared. */
import type { RouteNeedInput } from '@shared/schemas/photometry.schema'
import type { SpacingResult } from '@shared/engine/spacing'
import type { Answer } from '@shared/schemas/answers/common'
import type {
  LuminaireTypeAnswer,
  LuminaireTypeListAnswer,
  ParsedPhotometryAnswer,
  PhotometryFileAnswer,
  PhotometryFileListAnswer,
  PhotometryFileSummaryAnswer,
  PickAnswer,
  TypeSelectionAnswer,
} from '@shared/schemas/answers/photometry'
import { http } from './http'

// Answers: typed from the schemas the server's routes declare.
export type PhotometryFileSummary = Answer<typeof PhotometryFileSummaryAnswer>
export type IntensityTableData = Pick<Answer<typeof ParsedPhotometryAnswer>, 'verticalAngles' | 'horizontalAngles' | 'candela'>
export type PhotometryFile = Answer<typeof PhotometryFileAnswer>
export type LuminaireType = Answer<typeof LuminaireTypeAnswer>
export type TypeSelectionResult = Answer<typeof TypeSelectionAnswer>
export type PickResult = Answer<typeof PickAnswer>

/** What the type form sends (the shared schema's input). */
export interface LuminaireTypeFields {
  name: string
  photometricFileId: string | null
  emergencyOutputFactor: number
  ratedDuration: string | number
  modes: string[]
  chemistry: string
  cellsInSeries: number
  capacityAh: number | null
  emergencyPower: number
  inputPower: number
  notes: string
}

export type RouteNeedFields = { [K in keyof RouteNeedInput]?: RouteNeedInput[K] | string }

export const fetchPhotometryFiles = () => http.get<Answer<typeof PhotometryFileListAnswer>>('/photometry')
export const fetchPhotometryFile = (id: string) => http.get<PhotometryFile>(`/photometry/${id}`)
export function uploadPhotometry(file: File, name?: string) {
  const form = new FormData()
  form.append('file', file)
  if (name) form.append('name', name)
  return http.post<PhotometryFile>('/photometry', form)
}
export const deletePhotometryFile = (id: string) => http.del<void>(`/photometry/${id}`)

export const fetchLuminaireTypes = () => http.get<Answer<typeof LuminaireTypeListAnswer>>('/luminaire-types')
export const createLuminaireType = (body: LuminaireTypeFields) => http.post<LuminaireType>('/luminaire-types', body)
export const updateLuminaireType = (id: string, body: Partial<LuminaireTypeFields>) => http.patch<LuminaireType>(`/luminaire-types/${id}`, body)
export const deleteLuminaireType = (id: string) => http.del<void>(`/luminaire-types/${id}`)

export const selectTypes = (route: RouteNeedFields) => http.post<TypeSelectionResult>('/route-spacing/select', route)
export const pickType = (body: { typeId: string; route: RouteNeedFields; title?: string; sheetId?: string; version?: number }) =>
  http.post<PickResult>('/route-spacing/pick', body)

export type SpacingResponse = SpacingResult & { tool: string; engineVersion: string }
export const calcSpacing = (input: Record<string, unknown>) => http.post<SpacingResponse>('/calc/spacing', input)
