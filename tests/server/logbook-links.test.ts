/**
 * A site's log book shared by a read-only link: made by a designer, opened signed out (summary and
 * entries, and the PDF with its summary page), withdrawn, refused once expired, and out of reach of
 * another workspace. The summary's figures are checked against a count made here over the rows this
 * test creates, with the log book rules written out (docs/method.md, "Log book state").
 */
import fs from 'node:fs'
import nodePath from 'node:path'
import type { Response } from 'superagent'
import type { Express } from 'express'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { addDays } from '../../shared/engine/calendar'
import { formatDate } from '../../shared/format'
import { codesIn, layoutProblems, pdfLines } from '../helpers/pdf-checks'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import { anonymous, closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'

function binary(res: Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = []
  res.on('data', (c: Buffer) => chunks.push(c))
  res.on('end', () => done(null, Buffer.concat(chunks)))
}

const TODAY = new Date().toISOString().slice(0, 10)
const ago = (days: number) => addDays(TODAY, -days)
const words = (iso: string) => formatDate(iso, { locale: 'en-GB', timeZone: 'UTC' })

let app: Express
let team: TestTeam
let designer: Client
let viewer: Client
let siteId: string
/** Every test row this file makes, as the log book holds it: the hand count reads these. */
const rows: Array<{ tag: string; kind: 'functional' | 'duration'; testedOn: string; passed: boolean; inError?: boolean }> = []

async function record(
  workspaceId: string,
  luminaireId: string,
  tag: string,
  t: { kind: 'functional' | 'duration'; testedOn: string; passed?: boolean; faults?: string; achievedDurationH?: number },
) {
  const id = await testIn(workspaceId, luminaireId, t)
  rows.push({ tag, kind: t.kind, testedOn: t.testedOn, passed: t.passed ?? true })
  return id
}

beforeAll(async () => {
  app = (await getTestApp()).app
  team = await makeTeam('Invented Fire Care')
  designer = await signIn(app, team.users.designer.email)
  viewer = await signIn(app, team.users.viewer.email)
  const site = await siteIn(team.workspaceId, {
    name: 'Mill Lane Library',
    address: '12 Mill Lane\nOldbridge',
    responsibleName: 'Sam Holder',
    responsibleEmail: 'sam@example.test',
  })
  siteId = site.id
  const w = team.workspaceId
  const lum = (tag: string, packFittedOn: string) => luminaireIn(w, siteId, { tag, packFittedOn })
  // A: full-duration pass 5 days ago. Latest test passed; functional due in 23 days or more; nothing due soon.
  const a = await lum('EL-A', ago(400))
  await record(w, a.id, 'EL-A', { kind: 'duration', testedOn: ago(5), achievedDurationH: 3.2 })
  // B: functional fail 3 days ago, never put right. Latest failed; retest due now (by today + 11): due soon.
  const b = await lum('EL-B', ago(400))
  await record(w, b.id, 'EL-B', { kind: 'duration', testedOn: ago(100), achievedDurationH: 3.1 })
  await record(w, b.id, 'EL-B', { kind: 'functional', testedOn: ago(3), passed: false, faults: 'Lamp out' })
  // C: last full-duration test 400 days ago, functional 60 days ago. Latest passed; both tests overdue.
  const c = await lum('EL-C', ago(800))
  await record(w, c.id, 'EL-C', { kind: 'duration', testedOn: ago(400), achievedDurationH: 3.3 })
  await record(w, c.id, 'EL-C', { kind: 'functional', testedOn: ago(60) })
  // D: pack fitted 10 days ago, never tested. First full-duration test due now: due soon.
  await lum('EL-D', ago(10))
  // E: full-duration fail 50 days ago, new pack 45 days ago, full-duration pass 40 days ago, functional pass 2 days ago.
  // Latest passed; the failure is cleared by the pass after the new pack; nothing due soon.
  const e = await lum('EL-E', ago(45))
  await record(w, e.id, 'EL-E', { kind: 'duration', testedOn: ago(50), passed: false, faults: 'Dark after 40 min', achievedDurationH: 0.67 })
  await record(w, e.id, 'EL-E', { kind: 'duration', testedOn: ago(40), achievedDurationH: 3.4 })
  await record(w, e.id, 'EL-E', { kind: 'functional', testedOn: ago(2) })
  // F: full-duration pass 20 days ago; a functional "fail" yesterday recorded in error counts for nothing.
  // Latest (valid) passed; functional due in 8 to 11 days: due soon.
  const f = await lum('EL-F', ago(400))
  await record(w, f.id, 'EL-F', { kind: 'duration', testedOn: ago(20), achievedDurationH: 3.0 })
  const wrong = await record(w, f.id, 'EL-F', { kind: 'functional', testedOn: ago(1), passed: false, faults: 'Entered against the wrong luminaire' })
  await dataSource.query(`UPDATE test_records SET recorded_in_error_at = now(), recorded_in_error_reason = 'Wrong luminaire' WHERE id = $1`, [wrong])
  rows[rows.length - 1].inError = true
}, 60_000)
afterAll(closeTestApp)

/** The hand count: each luminaire's latest valid test, by date. */
function latestByTag() {
  const latest = new Map<string, { testedOn: string; passed: boolean }>()
  for (const r of rows) if (!r.inError && (!latest.has(r.tag) || latest.get(r.tag)!.testedOn <= r.testedOn)) latest.set(r.tag, r)
  return latest
}

describe('a log book link', () => {
  let token: string
  let linkId: string

  it('is made by a designer (token shown once, a short address), not by a viewer', async () => {
    const refused = await viewer.post(`/api/sites/${siteId}/logbook-links`, { expiresOn: null })
    expect(refused.status).toBe(403)
    const made = await designer.post(`/api/sites/${siteId}/logbook-links`, { expiresOn: addDays(TODAY, 30) })
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    expect(made.body.url).toMatch(/\/l\/[\w-]{40,}$/)
    expect(made.body).toMatchObject({ expiresOn: addDays(TODAY, 30), state: 'active' })
    token = made.body.token
    linkId = made.body.id
    const listed = await designer.get(`/api/sites/${siteId}/logbook-links`)
    expect(listed.status).toBe(200)
    expect(listed.body.links).toHaveLength(1)
    expect(listed.body.links[0]).toMatchObject({ id: linkId, state: 'active', createdBy: { name: expect.any(String) } })
    expect(JSON.stringify(listed.body)).not.toContain(token)
  })

  it('refuses a last day already past and a date it cannot read, naming the field', async () => {
    const past = await designer.post(`/api/sites/${siteId}/logbook-links`, { expiresOn: ago(1) })
    expect(past.status).toBe(400)
    expect(JSON.stringify(past.body)).toContain('expiresOn')
    const unreadable = await designer.post(`/api/sites/${siteId}/logbook-links`, { expiresOn: '31/12/2030' })
    expect(unreadable.status).toBe(400)
    expect(unreadable.body.errors[0].pointer).toBe('/expiresOn')
    // The answer holds the token: it is never stored, so a retry key is refused rather than honoured.
    const keyed = await designer.post(`/api/sites/${siteId}/logbook-links`, { expiresOn: null }).set('Idempotency-Key', 'retry-1')
    expect(keyed.status).toBe(400)
    expect((await designer.get(`/api/sites/${siteId}/logbook-links`)).body.links).toHaveLength(1)
  })

  it('opens signed out with the summary, whose figures match a count over the rows made here', async () => {
    const res = await anonymous(app).get(`/api/logbook-links/${token}`)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.headers['cache-control']).toBe('no-store')
    const b = res.body
    expect(b.firm).toBe('Invented Fire Care')
    expect(b.site).toEqual({ name: 'Mill Lane Library', address: '12 Mill Lane\nOldbridge', responsibleName: 'Sam Holder', regime: 'en50172' })
    expect(JSON.stringify(b)).not.toContain(siteId)
    expect(JSON.stringify(b)).not.toContain(team.workspaceId)
    const latest = latestByTag()
    const passed = [...latest.values()].filter((t) => t.passed).length
    const failed = [...latest.values()].filter((t) => !t.passed).length
    expect([passed, failed]).toEqual([4, 1])
    expect(b.summary).toMatchObject({
      luminaires: 6,
      passedLastTest: passed,
      failedLastTest: failed,
      notTested: 6 - latest.size,
      // Open by the rules: B's functional failure only (E's full-duration failure was cleared after a new pack).
      failureNotPutRight: 1,
      inOrder: latest.size - 1,
      // Overdue: C only (functional due about 30 days ago, full-duration about 35 days ago).
      overdue: 1,
      // Due now or within 14 days: B (retest), D (first full-duration test), F (functional in 8 to 11 days).
      dueSoon: 3,
    })
    // Every failed test made here that is not recorded in error, with what became of it.
    const failedRows = rows.filter((r) => !r.passed && !r.inError).sort((p, q) => q.testedOn.localeCompare(p.testedOn))
    expect(b.summary.failures.map((x: { tag: string; testedOn: string }) => `${x.tag} ${x.testedOn}`)).toEqual(failedRows.map((r) => `${r.tag} ${r.testedOn}`))
    const [bFail, eFail] = b.summary.failures
    expect(bFail).toMatchObject({ tag: 'EL-B', kind: 'functional', state: 'open', retestBy: addDays(ago(3), 14), faults: 'Lamp out' })
    expect(eFail).toMatchObject({ tag: 'EL-E', kind: 'duration', state: 'cleared', closedBy: { kind: 'duration', testedOn: ago(40) }, newPackOn: ago(45) })
    // The entries: every row, newest first, the one recorded in error marked so.
    expect(b.totalEntries).toBe(rows.length)
    expect(b.entries).toHaveLength(rows.length)
    expect(b.entries[0]).toMatchObject({ tag: 'EL-F', recordedInError: true, recordedInErrorReason: 'Wrong luminaire' })
    expect(b.entries.map((x: { testedOn: string }) => x.testedOn)).toEqual(
      [...rows]
        .map((r) => r.testedOn)
        .sort()
        .reverse(),
    )
  })

  it('gives the PDF signed out: the summary page first, then the entries, words and dates only', async () => {
    const res = await anonymous(app).get(`/api/logbook-links/${token}/pdf`).buffer(true).parse(binary)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toBe('application/pdf')
    const pdf = res.body as Buffer
    if (process.env.PDF_OUT_DIR) fs.writeFileSync(nodePath.join(process.env.PDF_OUT_DIR, 'shared-log-book.pdf'), pdf)
    const lines = pdfLines(pdf)
    // A cell's sentence may wrap onto a second line: read the text as one run of words.
    const text = lines.join('\n').replace(/\s+/g, ' ')
    expect(text).toContain('Emergency lighting log book')
    expect(text).toContain('Mill Lane Library')
    expect(text).toContain('Testing regime: ')
    expect(text).toContain('Failures and what became of them')
    expect(text).toContain(`Still failed: retest due by ${words(addDays(ago(3), 14))}`)
    expect(text).toContain(`Cleared by a full-duration test passed on ${words(ago(40))}, after a new pack fitted on ${words(ago(45))}`)
    expect(text).toContain('Next tests due')
    expect(text).toContain('Seen by (inspecting officer)')
    expect(text.indexOf('Failures and what became of them')).toBeLessThan(text.indexOf('Log book entries'))
    expect(text).not.toMatch(/\b\d{4}-\d{2}-\d{2}\b/)
    expect(codesIn(lines)).toEqual([])
    expect(layoutProblems(pdf)).toEqual([])
  })

  it('the signed-in log book PDF has the same summary page', async () => {
    const res = await viewer.get(`/api/sites/${siteId}/export/logbook.pdf`).buffer(true).parse(binary)
    expect(res.status).toBe(200)
    const text = pdfLines(res.body as Buffer).join('\n')
    expect(text).toContain('Failures and what became of them')
    expect(text).toContain(`Still failed: retest due by ${words(addDays(ago(3), 14))}`)
    // An extract of some days is that period's entries only: the summary describes the whole book today.
    const extract = await viewer
      .get(`/api/sites/${siteId}/export/logbook.pdf?from=${ago(10)}&to=${ago(1)}`)
      .buffer(true)
      .parse(binary)
    expect(extract.status).toBe(200)
    const extractText = pdfLines(extract.body as Buffer).join('\n')
    expect(extractText).toContain('Log book entries')
    expect(extractText).not.toContain('Failures and what became of them')
  })

  it('cannot be listed or withdrawn from another workspace', async () => {
    const other = await makeTeam('Other firm')
    const outsider = await signIn(app, other.users.owner.email)
    expect((await outsider.get(`/api/sites/${siteId}/logbook-links`)).status).toBe(404)
    expect((await outsider.delete(`/api/sites/${siteId}/logbook-links/${linkId}`)).status).toBe(404)
    // Its own site cannot reach this site's link either.
    const theirSite = await siteIn(other.workspaceId)
    expect((await outsider.delete(`/api/sites/${theirSite.id}/logbook-links/${linkId}`)).status).toBe(404)
    expect((await anonymous(app).get(`/api/logbook-links/${token}`)).status).toBe(200)
  })

  it('once withdrawn answers 410 with the reason, and the audit trail names both steps', async () => {
    const gone = await designer.delete(`/api/sites/${siteId}/logbook-links/${linkId}`)
    expect(gone.status).toBe(204)
    const page = await anonymous(app).get(`/api/logbook-links/${token}`)
    expect(page.status).toBe(410)
    expect(page.body.code).toBe('revoked')
    expect((await anonymous(app).get(`/api/logbook-links/${token}/pdf`)).status).toBe(410)
    const listed = await designer.get(`/api/sites/${siteId}/logbook-links`)
    expect(listed.body.links[0]).toMatchObject({ id: linkId, state: 'revoked' })
    const audit: Array<{ action: string; data: { linkId: string } }> = await dataSource.query(
      `SELECT action, data FROM audit_events WHERE entity_id = $1 AND action LIKE 'logbook.%' ORDER BY at`,
      [siteId],
    )
    expect(audit.map((x) => x.action)).toEqual(['logbook.shared', 'logbook.link-revoked'])
    expect(audit.every((x) => x.data.linkId === linkId)).toBe(true)
    expect(JSON.stringify(audit)).not.toContain(token)
  })

  it('past its last day answers 410 expired; an unknown token 404', async () => {
    const made = await designer.post(`/api/sites/${siteId}/logbook-links`, { expiresOn: TODAY })
    expect(made.status).toBe(201)
    // Open on its last day.
    expect((await anonymous(app).get(`/api/logbook-links/${made.body.token}`)).status).toBe(200)
    await dataSource.query(`UPDATE logbook_links SET expires_on = $2 WHERE id = $1`, [made.body.id, ago(1)])
    const expired = await anonymous(app).get(`/api/logbook-links/${made.body.token}`)
    expect(expired.status).toBe(410)
    expect(expired.body.code).toBe('expired')
    const listed = await designer.get(`/api/sites/${siteId}/logbook-links`)
    expect(listed.body.links.find((l: { id: string }) => l.id === made.body.id).state).toBe('expired')
    expect((await anonymous(app).get(`/api/logbook-links/${'x'.repeat(43)}`)).status).toBe(404)
  })
})
