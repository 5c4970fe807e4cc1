/** /api/discharge: upload a log (with upload progress), analyse it with a mapping, save, list, compare. */
import type { EngineWarning, WorkingStep } from '@shared/engine/types'
import type { MappingGuess } from '@shared/engine/discharge-log'
import { CONFIG } from '@/config'
import { ApiError, http, problemToError } from './http'

export interface UploadPreview {
  uploadId: string
  sha256: string
  size: number
  name: string
  storedFileId: string | null
  delimiter: ',' | ';' | '\t'
  decimal: '.' | ','
  header: boolean
  firstLine: number
  columns: string[]
  preview: string[][]
  guess: MappingGuess
}

export interface BadRow {
  row: number
  column: string
  value: string
  reason: string
}

export interface Summary {
  runtimeH: number
  runtimeEnd: 'cutoff' | 'dropout' | 'end-of-log'
  cutoffTimeH: number | null
  dropoutTimeH: number | null
  cutoffVoltageV: number
  thresholdCrossings: Array<{ perCellV: number; packV: number; timeH: number | null }>
  deliveredAh: number | null
  deliveredWh: number | null
  estimated: boolean
  midpointVoltageV: number
  pass: boolean | null
  marginH: number
  stateOfHealth: number | null
  samplesUsed: number
  warnings: EngineWarning[]
  working?: WorkingStep[]
  read: { rows: number; badRows: { count: number; items: BadRow[] }; currentInverted: boolean }
}

export interface Curve {
  tH: number[]
  v: number[]
  i: number[] | null
}

export interface Mapping {
  delimiter: ',' | ';' | '\t'
  decimal: '.' | ','
  header: boolean
  firstLine: number
  time: { column: number; format: 'elapsed' | 'clock' | 'timestamp'; unit: 's' | 'min' | 'h'; dateOrder: 'ymd' | 'dmy' | 'mdy' }
  voltage: { column: number; unit: 'V' | 'mV' }
  current: { column: number; unit: 'A' | 'mA' } | null
}

export interface Options {
  chemistry: string
  cellsInSeries: number
  ratedDuration: string
  cutoffPerCell?: string
  ratedCapacity?: string
  thresholdsPerCell?: string[]
  assumedPower?: string
}

export interface AnalyseBody {
  uploadId?: string
  fileId?: string
  title?: string
  notes?: string
  mapping: Mapping
  options: Options
  acceptBadRows?: boolean
  dryRun?: boolean
  specSheetId?: string | null
  testRecordId?: string | null
  /** The luminaire whose pack was tested: saving records (or updates) its full-duration test. */
  luminaireId?: string | null
  testedOn?: string
  /** Why the runtime typed in the attached record differs from the log. */
  runtimeNote?: string
}

export interface SavedLog {
  id: string
  title: string
  notes: string
  fileId: string
  mapping: Mapping
  options: Options & Record<string, unknown>
  summary: Summary
  curve?: Curve
  engineVersion: string
  author: { id: string; name: string } | null
  specSheetId: string | null
  testRecordId: string | null
  specSheet: { id: string; title: string } | null
  testRecord: { id: string; testedOn: string; luminaireId: string; luminaireTag: string } | null
  luminaireId: string | null
  luminaire: { id: string; tag: string; siteId: string } | null
  createdAt: string
}

export interface DryRun {
  saved: false
  columns: string[]
  summary: Summary
  curve: Curve
}

export type Progress = (loaded: number, total: number) => void

async function csrfToken(): Promise<string> {
  const res = await fetch(`${CONFIG.apiBase}/auth/csrf`, { credentials: 'same-origin' })
  return ((await res.json()) as { csrfToken: string }).csrfToken
}

/** Multipart upload through XMLHttpRequest, for its upload progress events (fetch has none). */
export async function uploadLog(file: File, onProgress: Progress, signal?: AbortSignal): Promise<UploadPreview> {
  const token = await csrfToken()
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open('POST', `${CONFIG.apiBase}/discharge/uploads`)
    xhr.setRequestHeader('X-CSRF-Token', token)
    xhr.setRequestHeader('Accept', 'application/json')
    xhr.responseType = 'json'
    xhr.upload.onprogress = (e) => onProgress(e.loaded, e.lengthComputable ? e.total : file.size)
    xhr.onload = () => {
      const body = (xhr.response ?? {}) as Record<string, unknown>
      if (xhr.status >= 200 && xhr.status < 300) resolve(body as unknown as UploadPreview)
      else reject(problemToError(xhr.status, xhr.statusText || 'Upload failed', body))
    }
    xhr.onerror = () => reject(new ApiError(0, 'No connection to Lampwright. Check the network and try again.', 'offline'))
    xhr.onabort = () => reject(new DOMException('Upload cancelled', 'AbortError'))
    signal?.addEventListener('abort', () => xhr.abort())
    const form = new FormData()
    form.append('file', file, file.name)
    xhr.send(form)
  })
}

export const analyseLog = (body: AnalyseBody) => http.post<DryRun | (SavedLog & { saved: true })>('/discharge/logs', body)
export const fetchLogs = (q: { sheetId?: string; testRecordId?: string; luminaireId?: string } = {}) => http.get<{ items: SavedLog[]; total: number }>('/discharge/logs', q)
export const fetchLog = (id: string) => http.get<SavedLog>(`/discharge/logs/${id}`)
export const deleteLog = (id: string) => http.del<void>(`/discharge/logs/${id}`)
export const compareLogs = (a: string, b: string) =>
  http.get<{ a: SavedLog; b: SavedLog; change: Record<'runtimeH' | 'deliveredAh' | 'deliveredWh' | 'midpointVoltageV' | 'marginH' | 'stateOfHealth', number | null> }>('/discharge/compare', { a, b })
