/**
 * The state of a test round: the site's luminaires in round order, the test kind the technician
 * chose (for the round, or for one luminaire), what has been recorded, and the sign-off. The round
 * and its results are kept on the device, so a reload halfway down a corridor loses nothing.
 */
import { computed, onMounted, ref, watch } from 'vue'
import { roundOrder } from '@shared/engine/round-order'
import { TestRecordSchema, type TestRecordInput } from '@shared/schemas/test-record.schema'
import type { TestKind } from '@shared/engine/due'
import { fetchSite, signOffRound, type LuminaireStatus, type RoundSignOffResult, type SiteStatus } from '@/api/register'
import { fetchTestPlan } from '@/api/test-plans'
import { newClientId, useTestQueue } from '@/composables/useTestQueue'
import { useAuthStore } from '@/stores/auth'

/** One luminaire's result as recorded on this round. */
export interface RoundResult {
  luminaireId: string
  tag: string
  kind: TestKind
  passed: boolean
  achievedDurationH: number | null
  faults: string
  remedialAction: string
}

/** What the card gives when the technician records a result. */
export type RoundEntry = Pick<TestRecordInput, 'kind' | 'passed' | 'achievedDurationH' | 'faults' | 'remedialAction' | 'checklist' | 'verdictOverrideReason'>

interface StoredRound {
  clientId: string
  kind: TestKind
  kindById: Record<string, TestKind>
  results: RoundResult[]
  /** Record ids by luminaire, so recording a luminaire again corrects its record instead of adding one. */
  recordIds: Record<string, string>
}

/** The device's own calendar day: the day the technician stands in front of the luminaire. */
export function localToday(): string {
  const d = new Date()
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`
}

/** A round of a test plan: only that group's luminaires, full-duration tests chosen by the plan. */
export interface PlannedGroup {
  planId: string
  group: number
}

export function useRound(siteId: string, planned: PlannedGroup | null = null) {
  const auth = useAuthStore()
  const who = `${auth.me?.user.id ?? 'me'}.${siteId}`
  const queue = useTestQueue(who)
  const storageKey = `lw.round.${who}${planned ? `.${planned.planId}.${planned.group}` : ''}`
  const planTitle = ref<string | null>(null)
  const onlyIds = ref<Set<string> | null>(null)
  const status = ref<SiteStatus | null>(null)
  const loadError = ref<string | null>(null)

  const fresh = (): StoredRound => ({ clientId: newClientId(), kind: planned ? 'duration' : 'functional', kindById: {}, results: [], recordIds: {} })
  const load = (): StoredRound => {
    try {
      const raw = localStorage.getItem(storageKey)
      return raw ? { ...fresh(), ...(JSON.parse(raw) as StoredRound) } : fresh()
    } catch {
      return fresh()
    }
  }
  const round = ref<StoredRound>(load())
  watch(round, (r) => localStorage.setItem(storageKey, JSON.stringify(r)), { deep: true })

  const order = computed<LuminaireStatus[]>(() => roundOrder((status.value?.luminaires ?? []).filter((l) => !onlyIds.value || onlyIds.value.has(l.id))))
  const index = ref(0)
  const ended = ref(false)
  const signedOff = ref<RoundSignOffResult | null>(null)
  const current = computed(() => (ended.value ? null : (order.value[index.value] ?? null)))
  const finished = computed(() => status.value !== null && (ended.value || index.value >= order.value.length))
  const recordedIds = computed(() => new Set(round.value.results.map((r) => r.luminaireId)))
  const failures = computed(() => round.value.results.filter((r) => !r.passed))

  onMounted(async () => {
    try {
      if (planned) {
        const stored = await fetchTestPlan(siteId, planned.planId)
        const group = stored.plan.groups.find((g) => g.index === planned.group)
        if (!group) throw new Error(`The plan has no group ${planned.group}.`)
        onlyIds.value = new Set(group.luminaireIds)
        planTitle.value = group.name
      }
      status.value = await fetchSite(siteId)
      // Carry on where a reloaded round left off: the first luminaire not yet recorded.
      const next = order.value.findIndex((l) => !recordedIds.value.has(l.id))
      index.value = next === -1 ? (round.value.results.length ? order.value.length : 0) : next
    } catch (err) {
      loadError.value = (err as Error).message
    }
  })

  /** The test chosen for a luminaire: its own choice, else the round's. Never taken from what is due. */
  const kindOf = (id: string): TestKind => round.value.kindById[id] ?? round.value.kind
  function setRoundKind(kind: TestKind) {
    round.value.kind = kind
  }
  function setKind(id: string, kind: TestKind) {
    round.value.kindById = { ...round.value.kindById, [id]: kind }
  }

  /** Validates and queues one result; answers the refusal in words, or null when it was kept. */
  function record(entry: RoundEntry): { path: string; message: string } | null {
    const l = current.value
    if (!l) return null
    const candidate: TestRecordInput = {
      clientId: round.value.recordIds[l.id] ?? newClientId(),
      luminaireId: l.id,
      testedOn: localToday(),
      roundClientId: round.value.clientId,
      ...entry,
    }
    const checked = TestRecordSchema.safeParse(candidate)
    if (!checked.success) {
      const issue = checked.error.issues[0]
      const path = String(issue.path[0] ?? '')
      return { path, message: path === 'faults' ? 'Say what failed before saving a fail.' : `${path}: ${issue.message}` }
    }
    queue.add(candidate)
    void queue.flush()
    round.value.recordIds = { ...round.value.recordIds, [l.id]: candidate.clientId }
    const result: RoundResult = {
      luminaireId: l.id,
      tag: l.tag,
      kind: checked.data.kind,
      passed: checked.data.passed,
      achievedDurationH: checked.data.achievedDurationH,
      faults: checked.data.faults,
      remedialAction: checked.data.remedialAction,
    }
    round.value.results = [...round.value.results.filter((r) => r.luminaireId !== l.id), result]
    // On to the next luminaire not yet recorded (or the end of the round).
    const after = order.value.findIndex((x, i) => i > index.value && !recordedIds.value.has(x.id))
    index.value = after === -1 ? order.value.length : after
    return null
  }

  function jumpTo(i: number) {
    ended.value = false
    index.value = Math.max(0, Math.min(i, order.value.length - 1))
  }
  const skip = () => (index.value = Math.min(index.value + 1, order.value.length))
  const back = () => (index.value = Math.max(index.value - 1, 0))
  const endRound = () => (ended.value = true)

  /** Signs the round off once every result has reached the server. */
  async function signOff(name: string, date: string, notes: string): Promise<string | null> {
    await queue.flush()
    if (queue.waiting.value) return `${queue.waiting.value} result(s) are still on this device: send them before signing off.`
    signedOff.value = await signOffRound(siteId, { clientId: round.value.clientId, signedOffByName: name, signedOffOn: date, notes })
    // The next visit starts a new round.
    localStorage.removeItem(storageKey)
    return null
  }

  return {
    status,
    loadError,
    queue,
    planTitle,
    order,
    index,
    current,
    finished,
    failures,
    recordedIds,
    signedOff,
    roundKind: computed(() => round.value.kind),
    results: computed(() => round.value.results),
    kindOf,
    setRoundKind,
    setKind,
    record,
    jumpTo,
    skip,
    back,
    endRound,
    signOff,
  }
}
