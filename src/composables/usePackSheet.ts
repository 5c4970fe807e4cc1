/**
 * The pack bench's specification sheet: load one by `?sheet=`, save a new sheet or a revision with
 * optimistic concurrency, take the other person's version on a conflict, start a new sheet.
 */
import { computed, onMounted, ref, watch, type Ref } from 'vue'
import { useRoute, useRouter } from 'vue-router'
import { useMessage } from 'naive-ui'
import type { FormContext } from 'vee-validate'
import type { SheetMeta } from '@shared/schemas/sheet.schema'
import { ApiError } from '@/api/http'
import * as api from '@/api/sheets'
import { useAsyncAction } from '@/composables/useAsyncAction'
import type SheetDetailsForm from '@/components/sheets/SheetDetailsForm.vue'

type Details = InstanceType<typeof SheetDetailsForm>

export function usePackSheet(form: FormContext<Record<string, unknown>>, inputs: () => Record<string, unknown>, details: Ref<Details | null>) {
  const route = useRoute()
  const router = useRouter()
  const message = useMessage()
  const sheetId = computed(() => (typeof route.query.sheet === 'string' ? route.query.sheet : null))
  const sheet = ref<api.Sheet | null>(null)
  const conflict = ref<api.SaveConflict | null>(null)
  const loadError = ref<string | null>(null)

  async function loadSheet(id: string) {
    loadError.value = null
    try {
      const s = await api.fetchSheet(id)
      sheet.value = s
      form.resetForm({ values: s.inputs as never })
      details.value?.load(s)
    } catch (err) {
      loadError.value = (err as Error).message
    }
  }
  onMounted(() => {
    if (sheetId.value) void loadSheet(sheetId.value)
  })
  watch(sheetId, (id, old) => {
    if (id && id !== old && id !== sheet.value?.id) void loadSheet(id)
    if (!id) sheet.value = null
  })

  /** Moves server messages about "inputs.x" next to field "x" of the pack form. */
  function showServerError(err: unknown) {
    if (err instanceof ApiError && err.fields.length) {
      const pack = err.fields.filter((f) => f.path.startsWith('inputs.'))
      if (pack.length) form.setErrors(Object.fromEntries(pack.map((f) => [f.path.slice(7), f.message])) as never)
      details.value?.applyServerError(
        new ApiError(
          err.status,
          err.message,
          err.code,
          err.fields.filter((f) => !f.path.startsWith('inputs.')),
        ),
      )
    }
  }
  /** Someone else saved the sheet since it was opened: their version, offered instead of a message. */
  const conflictOf = (err: unknown) =>
    err instanceof ApiError && err.status === 409 && err.body.currentVersion ? (err.body as unknown as api.SaveConflict) : null

  const saver = useAsyncAction(
    async (overwrite: boolean, meta: SheetMeta) => {
      const body = { ...meta, inputs: inputs() }
      if (sheet.value) {
        const version = overwrite && conflict.value ? conflict.value.currentVersion : sheet.value.version
        sheet.value = await api.saveSheet(sheet.value.id, { ...body, version })
        message.success(`Saved as revision ${sheet.value.currentRevision}`)
      } else {
        sheet.value = await api.createSheet(body)
        message.success('Sheet saved as revision 1 (draft)')
        await router.replace({ query: { ...route.query, sheet: sheet.value.id } })
      }
      conflict.value = null
    },
    {
      onError: (err) => {
        const theirs = conflictOf(err)
        if (theirs) conflict.value = theirs
        else showServerError(err)
      },
      describe: (err) => (conflictOf(err) ? null : err instanceof Error ? err.message : 'Something went wrong. Try again.'),
    },
  )
  const saving = saver.pending
  const saveError = saver.error

  async function save(overwrite = false) {
    saveError.value = null
    const meta = await details.value?.read()
    const checked = await form.validate()
    if (!meta || !checked.valid) {
      saveError.value = 'Fix the fields marked in red first.'
      return
    }
    await saver.run(overwrite, meta)
  }

  function takeTheirs() {
    if (!conflict.value) return
    sheet.value = conflict.value.current
    form.resetForm({ values: conflict.value.current.inputs as never })
    details.value?.load(conflict.value.current)
    conflict.value = null
  }

  function newSheet() {
    sheet.value = null
    details.value?.load({})
    void router.replace({ query: {} })
  }

  return { sheet, saving, saveError, conflict, loadError, save, takeTheirs, newSheet }
}
