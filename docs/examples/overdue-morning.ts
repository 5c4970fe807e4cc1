/**
 * Job 3: each morning, list what is overdue or failed across every site, one ticket per luminaire,
 * following the cursor until the last page.
 *   LAMPWRIGHT_TOKEN=lw_… node --import tsx docs/examples/overdue-morning.ts
 */
import { answerOf, clientFromEnv, isMain, type Lampwright } from './client'

export interface Ticket {
  /** Stable key, so the ticket system updates yesterday's ticket instead of opening another. */
  key: string
  title: string
  body: string
}

export async function overdueTickets(api: Lampwright, pageSize = 100): Promise<Ticket[]> {
  const tickets: Ticket[] = []
  let cursor: string | undefined
  do {
    const page = answerOf('list overdue', await api.GET('/api/luminaires', { params: { query: { state: 'overdue,failed', limit: pageSize, cursor } } }))
    for (const l of page.items) {
      const late = [l.due.functional, l.due.duration].filter((d) => d.state === 'overdue').map((d) => `${d.kind} test overdue since ${d.overdueAfter}`)
      const failures = l.due.openFailures.map((f) => `${f.kind} test failed on ${f.testedOn}: ${f.faults || 'no fault written'}`)
      tickets.push({ key: `lampwright-${l.id}`, title: `${l.siteName} — ${l.tag} (${l.location || 'no location'})`, body: [...failures, ...late].join('\n') })
    }
    cursor = page.nextCursor ?? undefined
  } while (cursor)
  return tickets
}

if (isMain(import.meta.url)) {
  for (const t of await overdueTickets(clientFromEnv())) console.log(`${t.title}\n  ${t.body.replace(/\n/g, '\n  ')}`)
}
