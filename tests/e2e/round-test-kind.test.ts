/**
 * The test kind is what the technician chose, never what the calendar says is overdue: on a site
 * kept under NFPA 101 (30-second test every 30 days, 1½-hour test every year, NFPA 101 7.9.3),
 * tapping Pass on a luminaire whose annual test is overdue records the short monthly test; the
 * annual test is recorded only when it is chosen and timed.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { addDays, addMonthsClamped } from '../../shared/engine/due'
import { formatHours } from '../../shared/format'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import { newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('US round team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

const today = new Date().toISOString().slice(0, 10)

describe('round on a US site at 375 px', () => {
  it('records a 30-second monthly test on Pass, and the annual test only when chosen and timed', async () => {
    const site = await siteIn(team.workspaceId, { name: 'Cedar Row Middle School (test)', regime: 'nfpa101' })
    // Both luminaires: last annual test 14 months ago, so it is overdue; monthly tests up to date.
    const ids: string[] = []
    for (const tag of ['US-1', 'US-2']) {
      const l = await luminaireIn(team.workspaceId, site.id, { tag, ratedDurationH: 1.5, packFittedOn: addMonthsClamped(today, -30) })
      await testIn(team.workspaceId, l.id, { kind: 'duration', testedOn: addMonthsClamped(today, -14), passed: true, achievedDurationH: 1.6 })
      await testIn(team.workspaceId, l.id, { kind: 'functional', testedOn: addDays(today, -10), passed: true })
      ids.push(l.id)
    }
    // The technician reads US customary units.
    await dataSource.query(`UPDATE users SET units = 'us' WHERE id = $1`, [team.users.technician.id])
    const b = await newBrowser({ width: 375, height: 740 })
    try {
      const { page } = b
      // A fake clock, so the 1½-hour timer can be run forward instead of waited for; set to the
      // morning so running it forward never crosses midnight into another test day.
      await page.clock.install({ time: new Date(`${today}T08:00:00Z`) })
      await signInThroughForm(page, app.url, team.users.technician.email, TEST_PASSWORD)
      await page.goto(`${app.url}/sites/${site.id}/round`)
      const card = page.locator('[data-test="round-card"]')
      await expect.poll(() => card.getAttribute('data-tag')).toBe('US-1')
      // The annual test is overdue, and the card says so, but the chosen test stays the short one.
      await expect.poll(() => card.getAttribute('data-kind')).toBe('functional')
      await expect.poll(() => page.locator('[data-test="minimum-time"]').textContent()).toMatch(/at least 30 seconds/)
      await screenshot(page, 'round-us-overdue-annual')
      // Durations as hours and minutes; nothing metric on the card.
      const cardText = (await card.textContent()) ?? ''
      expect(cardText).toContain(`rated ${formatHours(1.5)}`)
      expect(cardText).not.toMatch(/°C|\d\s?(m|mm|kg|L)\b/)
      await page.locator('[data-test="pass"]').click()
      const recordedToday = (id: string) =>
        dataSource.query('SELECT kind, achieved_duration_h FROM test_records WHERE luminaire_id = $1 AND tested_on = $2', [id, today])
      await expect.poll(() => recordedToday(ids[0])).toEqual([{ kind: 'functional', achieved_duration_h: null }])

      // US-2: the annual test chosen for this luminaire; a verdict without a runtime is refused.
      await expect.poll(() => card.getAttribute('data-tag')).toBe('US-2')
      await page.locator('[data-test="kind-duration"]').click()
      await page.locator('[data-test="save-duration"]').click()
      await expect.poll(() => page.locator('[data-test="round-error"]').textContent()).toMatch(/how long it stayed lit/)
      await page.locator('[data-test="timer-start"]').click()
      await page.clock.runFor('01:31:00')
      // The timer stops by itself at the required time.
      await expect.poll(() => page.locator('[data-test="timer"]').getAttribute('data-running')).toBe('false')
      await expect.poll(() => page.locator('[data-test="duration-verdict"]').textContent()).toMatch(/Pass/)
      await screenshot(page, 'round-us-annual-timed')
      await page.locator('[data-test="save-duration"]').click()
      await page.locator('[data-test="round-finished"]').waitFor()
      await expect.poll(() => page.locator('[data-test="sync-state"]').getAttribute('data-waiting')).toBe('0')

      const rows = await dataSource.query(
        `SELECT l.tag, t.kind, t.passed, t.achieved_duration_h FROM test_records t JOIN luminaires l ON l.id = t.luminaire_id
         WHERE t.luminaire_id = ANY($1::uuid[]) AND t.tested_on = $2 ORDER BY l.tag`,
        [ids, today],
      )
      expect(rows).toEqual([
        { tag: 'US-1', kind: 'functional', passed: true, achieved_duration_h: null },
        { tag: 'US-2', kind: 'duration', passed: true, achieved_duration_h: 1.5 },
      ])
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375)
    } finally {
      await b.close()
    }
  })
})
