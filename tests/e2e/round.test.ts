/**
 * A technician's round on a phone: five luminaires, the connection lost on the third, no record lost
 * or doubled; a full-duration test that fails on its typed runtime, the failures listed at the end,
 * the round signed off, and the site then showing the luminaire failed with its retest due.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import { luminaireIn, siteIn } from '../helpers/register-fixtures'
import { newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Round team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

describe('test round on a phone', () => {
  it('records five luminaires, survives going offline on the third, and ends with five records and no duplicates', async () => {
    const site = await siteIn(team.workspaceId, { name: 'Round test building' })
    const ids: string[] = []
    for (let i = 1; i <= 5; i++)
      ids.push((await luminaireIn(team.workspaceId, site.id, { tag: `RT-${i}`, location: `Corridor bay ${i}`, packFittedOn: '2025-01-10' })).id)
    const b = await newBrowser({ width: 375, height: 740 })
    try {
      const { page, context } = b
      await signInThroughForm(page, app.url, team.users.technician.email, TEST_PASSWORD)
      await page.goto(`${app.url}/sites/${site.id}/round`)
      const card = page.locator('[data-test="round-card"]')
      const sync = page.locator('[data-test="sync-state"]')

      // 1 and 2: online, both pass.
      for (const tag of ['RT-1', 'RT-2']) {
        await expect.poll(() => card.getAttribute('data-tag')).toBe(tag)
        // Never tested, so the full-duration test is due; the round's chosen test stays the short one.
        await expect.poll(() => card.getAttribute('data-kind')).toBe('functional')
        await page.locator('[data-test="pass"]').click()
      }
      await expect.poll(() => sync.getAttribute('data-waiting')).toBe('0')
      await screenshot(page, 'round-phone-online')

      // 3: the connection drops; a fail with its fault is kept on the phone.
      await expect.poll(() => card.getAttribute('data-tag')).toBe('RT-3')
      await context.setOffline(true)
      await page.locator('[data-test="kind-functional"]').click()
      await page.locator('[data-test="fail"]').click()
      await expect.poll(() => page.locator('[data-test="round-error"]').textContent()).toMatch(/Say what failed/)
      await page.locator('#round-faults').fill('No light in emergency mode')
      await page.locator('#round-remedial').fill('Pack to be replaced')
      await page.locator('[data-test="fail"]').click()
      await expect.poll(() => sync.getAttribute('data-waiting')).toBe('1')
      await page.locator('[data-test="offline-note"]').waitFor()
      // A retry while still offline changes nothing.
      await page.locator('[data-test="retry"]').click()
      await expect.poll(() => sync.getAttribute('data-waiting')).toBe('1')
      const stored = await page.evaluate(() =>
        Object.keys(localStorage)
          .filter((k) => k.startsWith('lw.test-queue.'))
          .map((k) => JSON.parse(localStorage.getItem(k) ?? '[]').length),
      )
      expect(stored).toEqual([1])
      await screenshot(page, 'round-phone-offline')

      // Back online: the browser's "online" event sends what waited.
      await context.setOffline(false)
      await expect.poll(() => sync.getAttribute('data-waiting'), { timeout: 15000 }).toBe('0')

      // 4: a full-duration test, typed from a stopwatch: 2 h 10 min against the rated 3 h is a fail.
      await expect.poll(() => card.getAttribute('data-tag')).toBe('RT-4')
      await page.locator('[data-test="kind-duration"]').click()
      await page.locator('#round-achieved').fill('2:10')
      await expect.poll(() => page.locator('[data-test="duration-verdict"]').getAttribute('data-passed')).toBe('false')
      await page.locator('[data-test="save-duration"]').click()
      await expect.poll(() => page.locator('[data-test="round-error"]').textContent()).toMatch(/Say what failed/)
      await page.locator('#round-faults').fill('Went dark after 2 h 10 min')
      await page.locator('#round-remedial').fill('New pack ordered')
      await page.locator('[data-test="save-duration"]').click()
      await expect.poll(() => card.getAttribute('data-tag')).toBe('RT-5')
      await page.locator('[data-test="kind-functional"]').click()
      await page.locator('[data-test="pass"]').click()
      await page.locator('[data-test="round-finished"]').waitFor()
      await expect.poll(() => sync.getAttribute('data-waiting')).toBe('0')
      // The failures with their remedial actions, then the sign-off by name and date.
      await expect
        .poll(() => page.locator('[data-test="round-failures"] li').evaluateAll((els) => els.map((e) => e.getAttribute('data-tag'))))
        .toEqual(['RT-3', 'RT-4'])
      expect(await page.locator('[data-test="round-failures"]').textContent()).toMatch(
        /RT-4, full-duration test: Went dark after 2 h 10 min\.\s*Remedial action: New pack ordered/,
      )
      await page.locator('#round-signer').fill('')
      await page.locator('[data-test="sign-off"]').click()
      await expect.poll(() => page.locator('[data-test="round-finished"]').textContent()).toMatch(/is required: the name of the person signing off/)
      await page.locator('#round-signer').fill('Morwen Tallis')
      await page.locator('[data-test="sign-off"]').click()
      await page.locator('[data-test="round-signed"]').waitFor()
      await screenshot(page, 'round-phone-finished')
      const signed = await dataSource.query('SELECT signed_off_by_name, signed_off_on::text AS on, client_id FROM test_rounds WHERE site_id = $1', [site.id])
      expect(signed).toHaveLength(1)
      expect(signed[0].signed_off_by_name).toBe('Morwen Tallis')
      const onRound = await dataSource.query('SELECT count(*)::int AS n FROM test_records WHERE round_client_id = $1', [signed[0].client_id])
      expect(onRound[0].n).toBe(5)

      // Sending the whole round again (as a flaky network might) must not double anything.
      const rows = await dataSource.query(
        'SELECT luminaire_id, client_id, kind, tested_on::text AS tested_on, passed, faults, remedial_action, achieved_duration_h, checklist, round_client_id FROM test_records WHERE luminaire_id = ANY($1::uuid[]) ORDER BY recorded_at',
        [ids],
      )
      type Row = {
        luminaire_id: string
        client_id: string
        kind: string
        tested_on: string
        passed: boolean
        faults: string
        remedial_action: string
        achieved_duration_h: number | null
        checklist: Record<string, boolean>
        round_client_id: string
      }
      const resend = rows.map((r: Row) => ({
        clientId: r.client_id,
        luminaireId: r.luminaire_id,
        kind: r.kind,
        testedOn: r.tested_on,
        passed: r.passed,
        faults: r.faults,
        remedialAction: r.remedial_action,
        achievedDurationH: r.achieved_duration_h,
        checklist: r.checklist,
        roundClientId: r.round_client_id,
      }))
      const again = await page.evaluate(async (records) => {
        const csrf = (await (await fetch('/api/auth/csrf')).json()).csrfToken as string
        const res = await fetch('/api/tests', {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrf },
          body: JSON.stringify({ records }),
        })
        return { status: res.status, body: await res.json() }
      }, resend)
      expect(again.status).toBe(200)
      expect(again.body.records.map((r: { outcome: string }) => r.outcome)).toEqual(['unchanged', 'unchanged', 'unchanged', 'unchanged', 'unchanged'])

      const final = await dataSource.query(
        'SELECT l.tag, t.kind, t.passed, t.faults, t.achieved_duration_h FROM test_records t JOIN luminaires l ON l.id = t.luminaire_id WHERE t.luminaire_id = ANY($1::uuid[]) ORDER BY l.tag',
        [ids],
      )
      expect(final).toHaveLength(5)
      expect(final.map((r: { tag: string }) => r.tag)).toEqual(['RT-1', 'RT-2', 'RT-3', 'RT-4', 'RT-5'])
      expect(final[2]).toMatchObject({ kind: 'functional', passed: false, faults: 'No light in emergency mode' })
      expect(final[3]).toMatchObject({ kind: 'duration', passed: false, faults: 'Went dark after 2 h 10 min' })
      expect(final[3].achieved_duration_h).toBeCloseTo(2 + 10 / 60, 4)
      const distinct = await dataSource.query('SELECT count(DISTINCT client_id)::int AS n FROM test_records WHERE luminaire_id = ANY($1::uuid[])', [ids])
      expect(distinct[0].n).toBe(5)
      // The phone-sized page does not scroll sideways.
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375)
      await page.goto(`${app.url}/sites/${site.id}`)
      await page.locator('[data-test="site-counts"]').waitFor()
      await expect.poll(() => page.locator('[data-test="site-counts"]').textContent()).toMatch(/2 failed/)
      // The luminaire that failed its full-duration test shows as failed, its retest due now.
      await expect.poll(() => page.locator('#main').textContent()).toMatch(/RT-4Corridor bay 4[^]*?Failed: full-duration test, retest due now/)
      await screenshot(page, 'site-phone')
    } finally {
      await b.close()
    }
  })
})
