/**
 * Job 2: size replacement packs for many register luminaires in one request. The luminaires come
 * from the register (paged by cursor); the register gives each one's pack, rated duration, mode and
 * site ceiling temperature, and the job adds the emergency LED load from its own product table.
 * Each item is answered on its own: a bad item comes back with its errors and the rest are sized.
 *   LAMPWRIGHT_TOKEN=lw_… node --import tsx docs/examples/batch-size.ts
 */
import type { paths } from './api'
import { answerOf, clientFromEnv, isMain, type Lampwright } from './client'

type LuminairePage = paths['/api/luminaires']['get']['responses'][200]['content']['application/json']

export interface SizingLine {
  tag: string
  siteName: string
  ok: boolean
  /** Capacity of the pack to fit, Ah (the name carries the unit, as everywhere in the API). */
  selectedCapacityAh?: number
  problems: string[]
}

/** Up to `max` register luminaires, read page by page. */
async function registerLuminaires(api: Lampwright, max: number) {
  const all: LuminairePage['items'] = []
  let cursor: string | undefined
  do {
    const page: LuminairePage = answerOf(
      'list luminaires',
      await api.GET('/api/luminaires', { params: { query: { limit: Math.min(500, max - all.length), cursor } } }),
    )
    all.push(...page.items)
    cursor = page.nextCursor ?? undefined
  } while (cursor && all.length < max)
  return all
}

/** `loadOf` gives each luminaire's emergency load, e.g. { power: '2.4 W' }, from the integrator's product data. */
export async function batchSize(api: Lampwright, loadOf: (typeLabel: string) => { power: string } | undefined, max = 500): Promise<SizingLine[]> {
  const luminaires = await registerLuminaires(api, max)
  const items = luminaires.map((l) => {
    const load = loadOf(l.typeLabel)
    return { ref: l.tag, luminaireId: l.id, input: load ? { load } : {} }
  })
  const answer = answerOf('size batch', await api.POST('/api/calc/size/batch', { body: { items } }))
  return answer.results.map((r, i) => ({
    tag: luminaires[i]!.tag,
    siteName: luminaires[i]!.siteName,
    ok: r.ok,
    ...(r.ok && typeof r.result?.selectedCapacityAh === 'number' ? { selectedCapacityAh: r.result.selectedCapacityAh } : {}),
    problems: (r.errors ?? []).map((e) => `${e.pointer}: ${e.detail}`),
  }))
}

if (isMain(import.meta.url)) {
  const lines = await batchSize(clientFromEnv(), () => ({ power: '2 W' }))
  for (const l of lines) console.log(l.ok ? `${l.siteName} ${l.tag}: fit ${l.selectedCapacityAh} Ah` : `${l.siteName} ${l.tag}: ${l.problems.join('; ')}`)
}
