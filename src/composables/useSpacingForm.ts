/**
 * The spacing calculator's inputs and its one request: the source (a luminaire type or a stored
 * photometric file), the factors with where each came from, the route and its marked points, all
 * held in the user's display units and sent in SI.
 */
import { computed, onMounted, reactive, ref, watch } from 'vue'
import { useRoute } from 'vue-router'
import type { SelectOption } from 'naive-ui'
import type { EmphasisKind } from '@shared/engine/spacing/emphasis-points'
import { spacingRequestFor } from '@shared/engine/route-select'
import { CRITERIA_IDS } from '@shared/schemas/photometry.schema'
import * as api from '@/api/photometry'
import { fetchAudits, type SavedAudit } from '@/api/audits'
import { ApiError } from '@/api/http'
import { useUnits } from '@/composables/useUnits'
import { useAsyncAction } from '@/composables/useAsyncAction'

/** Mounting heights of the table, metres. */
export const TABLE_HEIGHTS = [2, 2.5, 3, 3.5, 4, 4.5, 5, 5.5, 6]

/** A point marked along the route, its position in the user's length unit. */
export interface RoutePointRow {
  kind: EmphasisKind
  at: number | null
  name: string
}

export function useSpacingForm() {
  const route = useRoute()
  const units = useUnits()
  const files = ref<api.PhotometryFileSummary[]>([])
  const types = ref<api.LuminaireType[]>([])
  const audits = ref<SavedAudit[]>([])
  const source = ref<string | null>(null)
  const auditId = ref<string | null>(null)
  // Lengths and illuminance are held in the user's display units and converted on sending.
  const form = reactive({
    mountingHeight: 2.5 as number | null,
    emergencyOutputFactor: 0.5 as number | null,
    maintenanceFactor: 0.8 as number | null,
    criteria: 'en1838-route' as (typeof CRITERIA_IDS)[number],
    routeWidth: 2 as number | null,
    routeLength: 30 as number | null,
    normalIlluminance: null as number | null,
    endOfDurationFactor: 1 as number | null,
  })
  const points = ref<RoutePointRow[]>([])
  /** Where the emergency output factor shown came from: the chosen type, an audit, or typed. */
  const factorFrom = ref<'type' | 'audit' | 'typed'>('typed')
  const result = ref<api.SpacingResponse | null>(null)
  const fieldErrors = ref<Record<string, string>>({})
  const calc = useAsyncAction(
    async (chosen: string) => {
      const fileId = await fileIdOf(chosen)
      if (!fileId) throw new Error('This luminaire type has no photometric file.')
      result.value = await api.calcSpacing(requestBody(await tableOf(fileId)))
    },
    {
      onError: (err) => {
        result.value = null
        if (err instanceof ApiError) fieldErrors.value = err.fieldMap()
      },
      describe: (err) => (err instanceof ApiError && err.fields.length ? 'Some inputs need attention (see the fields).' : (err as Error).message),
    },
  )
  const error = calc.error
  const busy = calc.pending

  const sourceOptions = computed<SelectOption[]>(() => [
    {
      type: 'group',
      label: 'Luminaire types',
      key: 'types',
      children: types.value.filter((t) => t.photometricFileId).map((t) => ({ label: t.name, value: `type:${t.id}` })),
    },
    { type: 'group', label: 'Photometric files', key: 'files', children: files.value.map((f) => ({ label: f.name, value: `file:${f.id}` })) },
  ])
  const auditOptions = computed(() =>
    audits.value
      .filter((a) => typeof a.results.emergencyOutputRatio === 'number')
      .map((a) => ({ label: `${a.title} (${Number((a.results.emergencyOutputRatio as number).toFixed(3))})`, value: a.id })),
  )

  onMounted(async () => {
    const [f, t] = await Promise.all([api.fetchPhotometryFiles(), api.fetchLuminaireTypes()])
    files.value = f.files
    types.value = t.types
    // Saved wattage audits can supply the emergency output ratio; without them it is typed.
    audits.value = await fetchAudits({ limit: 100 })
      .then((r) => r.items)
      .catch(() => [])
    const fromQuery =
      typeof route.query.type === 'string' ? `type:${route.query.type}` : typeof route.query.file === 'string' ? `file:${route.query.file}` : null
    const firstType = types.value.find((x) => x.photometricFileId)
    source.value = fromQuery ?? (firstType ? `type:${firstType.id}` : files.value[0] ? `file:${files.value[0].id}` : null)
    // Lengths shown in the user's units from the start, as round numbers (2.5 m is 8 ft, not 8.2021 ft).
    form.mountingHeight = units.roundDefault('length', 2.5)
    form.routeWidth = units.roundDefault('length', 2)
    form.routeLength = units.roundDefault('length', 30)
  })

  const chosenType = computed(() => types.value.find((x) => `type:${x.id}` === source.value) ?? null)
  // Choosing a type fills in its factor, marked as taken from it; typing over it is marked too.
  watch(chosenType, (t) => {
    if (t) {
      form.emergencyOutputFactor = t.emergencyOutputFactor
      factorFrom.value = 'type'
    }
  })
  watch(auditId, (id) => {
    const a = audits.value.find((x) => x.id === id)
    if (a && typeof a.results.emergencyOutputRatio === 'number') {
      form.emergencyOutputFactor = Number((a.results.emergencyOutputRatio as number).toFixed(4))
      factorFrom.value = 'audit'
    }
  })
  function typedFactor(v: number | null) {
    form.emergencyOutputFactor = v
    factorFrom.value = chosenType.value && v === chosenType.value.emergencyOutputFactor ? 'type' : 'typed'
  }
  const factorNote = computed(() => {
    const t = chosenType.value
    if (factorFrom.value === 'type' && t) return `Taken from the type "${t.name}"; type over it to use another.`
    if (factorFrom.value === 'audit') return 'Taken from the wattage audit.'
    if (t) return `Typed over the type's ${t.emergencyOutputFactor}.`
    return undefined
  })

  async function fileIdOf(s: string): Promise<string | null> {
    if (s.startsWith('file:')) return s.slice(5)
    return types.value.find((x) => `type:${x.id}` === s)?.photometricFileId ?? null
  }

  const tableCache = new Map<string, api.IntensityTableData>()
  async function tableOf(fileId: string): Promise<api.IntensityTableData> {
    const hit = tableCache.get(fileId)
    if (hit) return hit
    const f = await api.fetchPhotometryFile(fileId)
    const t = { verticalAngles: f.parsed.verticalAngles, horizontalAngles: f.parsed.horizontalAngles, candela: f.parsed.candela }
    tableCache.set(fileId, t)
    return t
  }

  // Back to SI at six figures: a value shown in feet returns as the metres it came from.
  const si = (kind: 'length' | 'illuminance', v: number | null) => (v === null ? undefined : Number(units.fromDisplay(kind, v).toPrecision(6)))

  function requestBody(table: api.IntensityTableData): Record<string, unknown> {
    // A type goes through the same request the type selector builds, so the two agree.
    const t = chosenType.value
    const body: Record<string, unknown> = t
      ? spacingRequestFor(
          {
            routeLengthM: si('length', form.routeLength) as number,
            routeWidthM: si('length', form.routeWidth) as number,
            mountingHeightM: si('length', form.mountingHeight) as number,
            criteria: form.criteria,
            ratedDurationS: t.ratedDurationS,
            maintenanceFactor: form.maintenanceFactor as number,
            ...(form.emergencyOutputFactor !== null ? { emergencyOutputFactor: form.emergencyOutputFactor } : {}),
            ...(form.criteria === 'en1838-high-risk' && form.normalIlluminance !== null
              ? { normalIlluminanceLx: si('illuminance', form.normalIlluminance) }
              : {}),
            ...(form.criteria === 'nfpa101' && form.endOfDurationFactor !== null ? { endOfDurationFactor: form.endOfDurationFactor } : {}),
          },
          { table, emergencyOutputFactor: t.emergencyOutputFactor },
        )
      : {
          photometry: table,
          mountingHeight: si('length', form.mountingHeight),
          emergencyOutputFactor: form.emergencyOutputFactor ?? undefined,
          maintenanceFactor: form.maintenanceFactor ?? undefined,
          criteria: form.criteria,
          routeWidth: si('length', form.routeWidth),
          routeLength: si('length', form.routeLength),
          ...(form.criteria === 'en1838-high-risk' ? { normalIlluminance: si('illuminance', form.normalIlluminance) } : {}),
          ...(form.criteria === 'nfpa101' && form.endOfDurationFactor !== null ? { endOfDurationFactor: form.endOfDurationFactor } : {}),
        }
    // A point without a position goes as missing, so the engine names it.
    if (points.value.length)
      body.points = points.value.map((p) => ({ kind: p.kind, at: si('length', p.at), ...(p.name.trim() ? { name: p.name.trim() } : {}) }))
    // Empty fields go as missing, so the engine names them.
    for (const k of Object.keys(body)) if (body[k] === undefined || body[k] === null) delete body[k]
    body.heights = TABLE_HEIGHTS
    return body
  }

  async function calculate() {
    error.value = null
    fieldErrors.value = {}
    if (!source.value) {
      error.value = 'Choose a luminaire type or a photometric file.'
      return
    }
    await calc.run(source.value)
  }

  return { units, form, points, source, auditId, sourceOptions, auditOptions, factorNote, typedFactor, result, error, fieldErrors, busy, si, calculate }
}
