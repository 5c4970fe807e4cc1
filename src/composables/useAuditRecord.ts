/**
 * Saving a claim check and attaching it to a sheet or a register luminaire: the title, the
 * pickers' choices and the audit saved or opened last. The view opens it once; the save panel and
 * the saved list act on the same state.
 */
import { ref, watch } from 'vue'
import type { FormContext } from 'vee-validate'
import * as api from '@/api/audits'
import { ApiError } from '@/api/http'
import { withoutEmpty } from '@/lib/audit-recalc'
import { useAsyncAction } from '@/composables/useAsyncAction'

type Choice = { label: string; value: string }

export function useAuditRecord(
  form: Pick<FormContext, 'values' | 'validate' | 'setErrors'>,
  start: { sheetId?: string | null; luminaireId?: string | null } = {},
) {
  const title = ref('')
  const titleError = ref<string | null>(null)
  const description = ref('')
  /** The audit saved or opened last: the attach controls act on it. */
  const current = ref<api.SavedAudit | null>(null)

  const sheetOptions = ref<Choice[]>([])
  const siteOptions = ref<Choice[]>([])
  const luminaireOptions = ref<Choice[]>([])
  const attachSheet = ref<string | null>(start.sheetId ?? null)
  const attachSite = ref<string | null>(null)
  const attachLuminaire = ref<string | null>(start.luminaireId ?? null)
  const attacher = useAsyncAction(
    async (id: string) => {
      current.value = await api.attachAudit(id, { specSheetId: attachSheet.value, luminaireId: attachLuminaire.value })
      return true
    },
    {
      describe: (err) => (err instanceof ApiError && err.fields.length ? err.fields.map((f) => `${f.path}: ${f.message}`).join('; ') : (err as Error).message),
    },
  )
  const attaching = attacher.pending
  const attachError = attacher.error

  async function loadChoices() {
    try {
      const [sheets, sites] = await Promise.all([api.fetchSheetChoices(), api.fetchSiteChoices()])
      sheetOptions.value = sheets.map((s) => ({ label: s.reference ? `${s.title} (${s.reference})` : s.title, value: s.id }))
      siteOptions.value = sites.map((s) => ({ label: s.name, value: s.id }))
    } catch {
      // The pickers stay empty; saving still works without attaching.
    }
  }
  watch(attachSite, async (siteId) => {
    luminaireOptions.value = []
    if (!siteId) return
    try {
      luminaireOptions.value = (await api.fetchLuminaireChoices(siteId)).map((l) => ({ label: l.location ? `${l.tag} · ${l.location}` : l.tag, value: l.id }))
    } catch (err) {
      attachError.value = (err as Error).message
    }
  })

  const saver = useAsyncAction(
    async () => {
      current.value = await api.createAudit({
        title: title.value.trim(),
        luminaire: description.value.trim(),
        inputs: withoutEmpty(form.values),
        specSheetId: attachSheet.value ?? undefined,
        luminaireId: attachLuminaire.value ?? undefined,
      })
      return true
    },
    {
      onError: (err) => {
        if (err instanceof ApiError && err.fields.length) {
          const readings = err.fields.filter((f) => f.path.startsWith('inputs.'))
          if (readings.length) form.setErrors(Object.fromEntries(readings.map((f) => [f.path.slice('inputs.'.length), f.message])) as never)
          titleError.value = err.fields.find((f) => f.path === 'title')?.message ?? null
        }
      },
      describe: (err) => (err instanceof Error ? err.message : 'Something went wrong. Try again.'),
    },
  )
  const saving = saver.pending
  const saveError = saver.error

  /** Saves the readings as a new audit; field errors land next to their inputs. True when saved. */
  async function save(): Promise<boolean> {
    saveError.value = null
    titleError.value = title.value.trim() ? null : 'is required'
    const checked = await form.validate()
    if (titleError.value || !checked.valid) {
      saveError.value = 'Fix the fields marked in red first.'
      return false
    }
    return (await saver.run()) === true
  }

  /** Saves where the current audit hangs. True when saved. */
  async function attach(): Promise<boolean> {
    if (!current.value) return false
    return (await attacher.run(current.value.id)) === true
  }

  /** Takes over a saved audit's title and attachments (its readings go to the form separately). */
  function fill(a: api.SavedAudit) {
    current.value = a
    title.value = a.title
    description.value = a.luminaire
    attachSheet.value = a.specSheetId
    attachLuminaire.value = a.luminaireId
    if (a.luminaireLink) attachSite.value = a.luminaireLink.siteId
  }

  return {
    title,
    titleError,
    description,
    saving,
    saveError,
    current,
    sheetOptions,
    siteOptions,
    luminaireOptions,
    attachSheet,
    attachSite,
    attachLuminaire,
    attaching,
    attachError,
    loadChoices,
    save,
    attach,
    fill,
  }
}

export type AuditRecord = ReturnType<typeof useAuditRecord>
