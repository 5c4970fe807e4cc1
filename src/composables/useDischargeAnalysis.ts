/**
 * A new discharge log before it is saved: the upload with its progress, the column mapping (the
 * server's guesses filled in), the pack and test options, and the dry-run analysis. The view and its
 * child panels share this state; nothing is stored until the save panel sends the log.
 */
import { computed, reactive, ref } from 'vue'
import { MAX_LOG_BYTES } from '@shared/schemas/discharge-log.schema'
import * as api from '@/api/discharge'
import { ApiError } from '@/api/http'
import { useAsyncAction } from '@/composables/useAsyncAction'

export const sizeText = (bytes: number) => (bytes < 2 ** 20 ? `${Math.max(1, Math.round(bytes / 1024))} kB` : `${Number((bytes / 2 ** 20).toFixed(1))} MB`)

export function useDischargeAnalysis() {
  // ---- the file ----
  const file = ref<File | null>(null)
  const uploaded = ref(0)
  const upload = ref<api.UploadPreview | null>(null)
  const uploader = useAsyncAction(async (chosen: File) => {
    uploaded.value = 0
    const up = await api.uploadLog(chosen, (loaded) => (uploaded.value = loaded))
    upload.value = up
    applyGuess(up)
  })
  const uploading = uploader.pending
  const uploadError = uploader.error
  const percent = computed(() => (file.value && file.value.size ? Math.min(100, Math.round((uploaded.value / file.value.size) * 100)) : 0))

  // ---- mapping and options ----
  const mapping = reactive<api.Mapping>({
    delimiter: ',',
    decimal: '.',
    header: true,
    firstLine: 1,
    time: { column: 0, format: 'elapsed', unit: 's', dateOrder: 'ymd' },
    voltage: { column: 1, unit: 'V' },
    current: null,
  })
  const currentColumn = ref<number | null>(null)
  const currentUnit = ref<'A' | 'mA'>('A')
  const options = reactive({ chemistry: 'nicd', cellsInSeries: 4 as number | null, ratedDuration: '3 h', cutoffPerCell: '', ratedCapacity: '', thresholds: '' })

  // ---- analysis (a dry run) ----
  const fieldErrors = ref<Array<{ path: string; message: string }>>([])
  const badRows = ref<{ count: number; items: api.BadRow[] } | null>(null)
  const acceptBadRows = ref(false)
  const result = ref<api.DryRun | null>(null)
  const analyser = useAsyncAction(
    async () => {
      fieldErrors.value = []
      badRows.value = null
      result.value = null
      result.value = (await api.analyseLog(body({ dryRun: true }))) as api.DryRun
    },
    {
      onError: (err) => {
        if (err instanceof ApiError) {
          fieldErrors.value = err.fields
          if (err.body.badRows) badRows.value = err.body.badRows as { count: number; items: api.BadRow[] }
        }
      },
    },
  )
  const analysing = analyser.pending
  const analyseError = analyser.error

  function applyGuess(up: api.UploadPreview) {
    Object.assign(mapping, { delimiter: up.delimiter, decimal: up.decimal, header: up.header, firstLine: up.firstLine })
    if (up.guess.time) mapping.time = { ...up.guess.time }
    if (up.guess.voltage) mapping.voltage = { ...up.guess.voltage }
    currentColumn.value = up.guess.current?.column ?? null
    currentUnit.value = up.guess.current?.unit ?? 'A'
  }

  async function chooseFile(chosen: File | null) {
    file.value = chosen
    upload.value = null
    result.value = null
    uploadError.value = null
    if (!chosen) return
    if (chosen.size > MAX_LOG_BYTES) {
      uploadError.value = `The file is ${sizeText(chosen.size)}; a discharge log may be at most ${sizeText(MAX_LOG_BYTES)}. Log less often or split the file.`
      return
    }
    await uploader.run(chosen)
  }

  /** The request body: mapping and options as set, plus whatever the caller adds (title, links, dryRun). */
  function body(extra: Partial<api.AnalyseBody> = {}): api.AnalyseBody {
    const thresholds = options.thresholds
      .split(/[;\s]+/)
      .map((x) => x.trim())
      .filter(Boolean)
    return {
      uploadId: upload.value?.uploadId,
      mapping: { ...mapping, current: currentColumn.value === null ? null : { column: currentColumn.value, unit: currentUnit.value } },
      options: {
        chemistry: options.chemistry,
        cellsInSeries: options.cellsInSeries ?? 0,
        ratedDuration: options.ratedDuration,
        ...(options.cutoffPerCell.trim() ? { cutoffPerCell: options.cutoffPerCell.trim() } : {}),
        ...(options.ratedCapacity.trim() ? { ratedCapacity: options.ratedCapacity.trim() } : {}),
        ...(thresholds.length ? { thresholdsPerCell: thresholds } : {}),
      },
      acceptBadRows: acceptBadRows.value,
      ...extra,
    }
  }

  async function analyse() {
    await analyser.run()
  }

  async function goOnWithoutBadRows() {
    acceptBadRows.value = true
    await analyse()
  }

  /** The luminaire's pack as the defaults: chemistry, cells, capacity and rated duration. */
  function packDefaults(l: { chemistry: string; cellsInSeries: number; capacityAh: number; ratedDurationH: number }) {
    options.chemistry = l.chemistry
    options.cellsInSeries = l.cellsInSeries
    options.ratedCapacity = `${l.capacityAh} Ah`
    options.ratedDuration = `${l.ratedDurationH} h`
  }

  const role = (k: number) => (k === mapping.time.column ? 'time' : k === mapping.voltage.column ? 'voltage' : k === currentColumn.value ? 'current' : '')

  return {
    file,
    uploaded,
    uploading,
    upload,
    uploadError,
    percent,
    chooseFile,
    mapping,
    currentColumn,
    currentUnit,
    options,
    role,
    packDefaults,
    analysing,
    analyseError,
    fieldErrors,
    badRows,
    result,
    analyse,
    goOnWithoutBadRows,
    body,
  }
}
export type DischargeAnalysis = ReturnType<typeof useDischargeAnalysis>
