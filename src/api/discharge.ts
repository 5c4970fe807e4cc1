/** /api/discharge: upload a log (with upload progress), analyse it with a mapping, save, list, compare. */
import type { Answer } from '@shared/schemas/answers/common'
import type {
  AnalyseAnswer,
  CurveAnswer,
  LogComparisonAnswer,
  LogListAnswer,
  LogMapping,
  LogOptions,
  SavedLogAnswer,
  UploadPreviewAnswer,
} from '@shared/schemas/answers/discharge'
import { CONFIG } from '@/config'
import { ApiError, http, problemToError } from './http'

export type { BadRow, DischargeSummary as Summary, LogMapping as Mapping, LogOptions as Options } from '@shared/schemas/answers/discharge'

// Answers: typed from the schemas the server's routes declare.
export type UploadPreview = Answer<typeof UploadPreviewAnswer>
export type Curve = Answer<typeof CurveAnswer>
export type SavedLog = Answer<typeof SavedLogAnswer>
export type AnalyseResult = Answer<typeof AnalyseAnswer>
export type DryRun = Extract<AnalyseResult, { saved: false }>
export type LogComparison = Answer<typeof LogComparisonAnswer>

export interface AnalyseBody {
  uploadId?: string
  fileId?: string
  title?: string
  notes?: string
  mapping: LogMapping
  options: LogOptions
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

export const analyseLog = (body: AnalyseBody) => http.post<AnalyseResult>('/discharge/logs', body)
export const fetchLogs = (q: { sheetId?: string; testRecordId?: string; luminaireId?: string } = {}) =>
  http.get<Answer<typeof LogListAnswer>>('/discharge/logs', q)
export const fetchLog = (id: string) => http.get<SavedLog>(`/discharge/logs/${id}`)
export const deleteLog = (id: string) => http.del<void>(`/discharge/logs/${id}`)
export const compareLogs = (a: string, b: string) => http.get<LogComparison>('/discharge/compare', { a, b })
