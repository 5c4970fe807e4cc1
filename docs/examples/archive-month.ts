/**
 * Job 4: archive a month of log books: one PDF per site that recorded tests that month, holding
 * just that month's tests, written to a folder named after the month.
 *   LAMPWRIGHT_TOKEN=lw_… node --import tsx docs/examples/archive-month.ts 2026-11 ./archive
 */
import fs from 'node:fs'
import path from 'node:path'
import { answerOf, clientFromEnv, isMain, type Lampwright } from './client'

/** First and last day of a month written YYYY-MM. */
export function monthSpan(month: string): { from: string; to: string } {
  const [y, m] = month.split('-').map(Number)
  if (!y || !m || m < 1 || m > 12) throw new Error(`"${month}" is not a month written YYYY-MM`)
  const last = new Date(Date.UTC(y, m, 0)).getUTCDate()
  return { from: `${month}-01`, to: `${month}-${String(last).padStart(2, '0')}` }
}

export interface ArchivedFile {
  siteId: string
  file: string
  bytes: number
  tests: number
}

export async function archiveMonth(api: Lampwright, month: string, folder: string): Promise<ArchivedFile[]> {
  const { from, to } = monthSpan(month)
  // Which sites tested anything that month, from the log book across sites.
  const testsPerSite = new Map<string, number>()
  let cursor: string | undefined
  do {
    const page = answerOf('list tests', await api.GET('/api/tests', { params: { query: { from, to, limit: 500, cursor } } }))
    for (const t of page.items) testsPerSite.set(t.siteId, (testsPerSite.get(t.siteId) ?? 0) + 1)
    cursor = page.nextCursor ?? undefined
  } while (cursor)

  const dir = path.join(folder, month)
  fs.mkdirSync(dir, { recursive: true })
  const out: ArchivedFile[] = []
  for (const [siteId, tests] of testsPerSite) {
    const r = await api.GET('/api/sites/{id}/export/{file}', {
      params: { path: { id: siteId, file: 'logbook.pdf' }, query: { from, to } },
      parseAs: 'arrayBuffer',
    })
    const pdf = Buffer.from(answerOf(`log book of ${siteId}`, r))
    const name = /filename="([^"]+)"/.exec(r.response.headers.get('content-disposition') ?? '')?.[1] ?? `${siteId}-log-book-${from}-to-${to}.pdf`
    fs.writeFileSync(path.join(dir, name), pdf)
    out.push({ siteId, file: path.join(dir, name), bytes: pdf.length, tests })
  }
  return out
}

if (isMain(import.meta.url)) {
  const [month, folder = '.'] = process.argv.slice(2)
  if (!month) throw new Error('usage: archive-month.ts YYYY-MM [folder]')
  for (const f of await archiveMonth(clientFromEnv(), month, folder)) console.log(`${f.file}: ${f.tests} tests, ${f.bytes} bytes`)
}
