/** /api/photometry, /api/luminaire-types, /api/route-spacing and the engine's spacing tool. Types only from shared. */
import type { RouteNeedInput } from '@shared/schemas/photometry.schema'
import type { TypeSelection } from '@shared/engine/route-select'
import type { SpacingResult } from '@shared/engine/spacing'
import type { Sheet } from './sheets'
import { http } from './http'

export interface Person {
  id: string
  name: string
}

export interface PhotometryFileSummary {
  id: string
  name: string
  sha256: string
  edition: string
  luminaire: string | null
  verticalCount: number
  horizontalCount: number
  absolute: boolean
  inputWatts: number
  createdBy: Person | null
  createdAt: string
}

export interface IntensityTableData {
  verticalAngles: number[]
  horizontalAngles: number[]
  candela: number[][]
}

export interface PhotometryFile extends PhotometryFileSummary {
  parsed: IntensityTableData & { header: { edition: string; keywords: Record<string, string>; tilt: string; lamps: number; lumensPerLamp: number; candelaMultiplier: number; unitsType: 1 | 2; width: number; length: number; height: number; ballastFactor: number; inputWatts: number; absolute: boolean } }
  rawText: string
  usedBy: Array<{ id: string; name: string }>
}

export interface LuminaireType {
  id: string
  name: string
  photometricFileId: string | null
  photometricFileName: string | null
  emergencyOutputFactor: number
  ratedDurationS: number
  modes: Array<'maintained' | 'non-maintained'>
  chemistry: string
  cellsInSeries: number
  capacityAh: number | null
  emergencyPowerW: number
  inputPowerW: number
  notes: string
  createdAt: string
  updatedAt: string
}

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

export const fetchPhotometryFiles = () => http.get<{ files: PhotometryFileSummary[] }>('/photometry')
export const fetchPhotometryFile = (id: string) => http.get<PhotometryFile>(`/photometry/${id}`)
export function uploadPhotometry(file: File, name?: string) {
  const form = new FormData()
  form.append('file', file)
  if (name) form.append('name', name)
  return http.post<PhotometryFile>('/photometry', form)
}
export const deletePhotometryFile = (id: string) => http.del<void>(`/photometry/${id}`)

export const fetchLuminaireTypes = () => http.get<{ types: LuminaireType[] }>('/luminaire-types')
export const createLuminaireType = (body: LuminaireTypeFields) => http.post<LuminaireType>('/luminaire-types', body)
export const updateLuminaireType = (id: string, body: Partial<LuminaireTypeFields>) => http.patch<LuminaireType>(`/luminaire-types/${id}`, body)
export const deleteLuminaireType = (id: string) => http.del<void>(`/luminaire-types/${id}`)

export const selectTypes = (route: RouteNeedFields) => http.post<{ results: TypeSelection[] }>('/route-spacing/select', route)
export const pickType = (body: { typeId: string; route: RouteNeedFields; title?: string; sheetId?: string; version?: number }) =>
  http.post<{ sheet: Sheet; selection: TypeSelection }>('/route-spacing/pick', body)

export type SpacingResponse = SpacingResult & { tool: string; engineVersion: string }
export const calcSpacing = (input: Record<string, unknown>) => http.post<SpacingResponse>('/calc/spacing', input)
