/**
 * Job 1: import a luminaire schedule for several sites. Each site is found by name (added when
 * missing), and its schedule (CSV) is imported; rows match luminaires by `external_id`, else tag,
 * so running the job again with the same files changes nothing, and a changed row updates its
 * luminaire. `last_functional_test_on` / `last_duration_test_on` carry the previous records, so a
 * first import does not show every luminaire as overdue.
 *   LAMPWRIGHT_TOKEN=lw_… node --import tsx docs/examples/import-schedules.ts site-a.csv "Site A" site-b.csv "Site B"
 */
import fs from 'node:fs'
import { answerOf, clientFromEnv, isMain, type Lampwright } from './client'

export interface SiteSchedule {
  siteName: string
  csv: string
}

export interface SiteImportOutcome {
  siteName: string
  siteId: string
  siteCreated: boolean
  added: number
  updated: number
  unchanged: number
}

export async function importSchedules(api: Lampwright, schedules: SiteSchedule[]): Promise<SiteImportOutcome[]> {
  const overview = answerOf('list sites', await api.GET('/api/sites', { params: { query: { days: 1 } } }))
  const siteIds = new Map(overview.sites.map((s) => [s.name, s.id]))
  const out: SiteImportOutcome[] = []
  for (const { siteName, csv } of schedules) {
    let siteId = siteIds.get(siteName)
    const siteCreated = !siteId
    if (!siteId) {
      const site = answerOf(`add site ${siteName}`, await api.POST('/api/sites', { body: { name: siteName } }))
      siteId = site.id
      siteIds.set(siteName, siteId)
    }
    const done = answerOf(`import into ${siteName}`, await api.POST('/api/sites/{id}/import', { params: { path: { id: siteId } }, body: { csv } }))
    out.push({ siteName, siteId, siteCreated, added: done.imported, updated: done.updated, unchanged: done.unchanged })
  }
  return out
}

if (isMain(import.meta.url)) {
  const args = process.argv.slice(2)
  const schedules: SiteSchedule[] = []
  for (let i = 0; i + 1 < args.length; i += 2) schedules.push({ csv: fs.readFileSync(args[i]!, 'utf8'), siteName: args[i + 1]! })
  for (const r of await importSchedules(clientFromEnv(), schedules))
    console.log(`${r.siteName}: ${r.added} added, ${r.updated} updated, ${r.unchanged} unchanged${r.siteCreated ? ' (new site)' : ''}`)
}
