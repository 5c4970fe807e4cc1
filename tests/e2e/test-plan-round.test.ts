/**
 * On the demo library at 375 px: a designer plans the full-duration tests (alternate luminaires,
 * so no area is left dark), opens the first group's round, records two luminaires from their typed
 * runtimes, ends the round early, signs it off and gets the printed round record.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { seedDemo } from '../../server/demo/index'
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/scripts/demo-users'
import { closeTestApp } from '../helpers/test-app'
import { newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'

let app: RunningApp
beforeAll(async () => {
  app = await startE2eApp()
  await seedDemo(dataSource)
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

describe('test plan and its round on the demo data, at 375 px', () => {
  it('plans two groups that leave no area dark, and carries out the first as a signed-off round', async () => {
    const site = (await dataSource.query(`SELECT id FROM sites WHERE name LIKE 'Wrenfield%'`))[0] as { id: string }
    const b = await newBrowser({ width: 375, height: 740 })
    try {
      const { page } = b
      await signInThroughForm(page, app.url, DEMO_USERS.find((u) => u.role === 'designer')!.email, DEMO_PASSWORD)
      await page.goto(`${app.url}/sites/${site.id}/test-plan`)
      await page.locator('[data-test="plan-caution"]').waitFor()
      expect(await page.locator('[data-test="plan-caution"]').textContent()).toMatch(/restore the normal supply/)
      await page.locator('#plan-first-day').fill('2027-03-01')
      await page.locator('[data-test="make-plan"]').click()
      await page.locator('[data-test="plan-group-2"]').waitFor()
      // Group 1 starts when the window opens; group 2 after group 1 is back to full cover (24 h after its 3 h test).
      const row = (n: number) => page.locator(`[data-test="plan-group-${n}"]`)
      const times = async (n: number) => [
        await row(n).getAttribute('data-starts'),
        await row(n).getAttribute('data-ends'),
        await row(n).getAttribute('data-full-cover'),
      ]
      expect(await times(1)).toEqual(['2027-03-01T18:00', '2027-03-01T21:00', '2027-03-02T21:00'])
      expect(await times(2)).toEqual(['2027-03-03T18:00', '2027-03-03T21:00', '2027-03-04T21:00'])
      const g1 = await row(1).textContent()
      expect(g1).toMatch(/Entrance hall, Reading room, Stairs and upper floor/)
      expect(g1).not.toMatch(/left without cover/)
      expect(await page.locator('[data-test="plan-warning"]').count()).toBe(0)
      await screenshot(page, 'test-plan-phone')
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375)

      // The plan becomes a round: group 1 only, full-duration tests chosen by the plan.
      await page.locator('[data-test="plan-round-1"]').click()
      const card = page.locator('[data-test="round-card"]')
      await card.waitFor()
      await expect.poll(() => card.getAttribute('data-kind')).toBe('duration')
      expect(await page.locator('.round-head').textContent()).toMatch(/planned full-duration tests, Group 1/)
      const first = await card.getAttribute('data-tag')
      await page.locator('#round-achieved').fill('3:05')
      await expect.poll(() => page.locator('[data-test="duration-verdict"]').getAttribute('data-passed')).toBe('true')
      await page.locator('[data-test="save-duration"]').click()
      await expect.poll(() => card.getAttribute('data-tag')).not.toBe(first)
      const second = await card.getAttribute('data-tag')
      await page.locator('#round-achieved').fill('2.5')
      await page.locator('#round-faults').fill('Went dark after 2 h 30 min')
      await page.locator('#round-remedial').fill('Replacement pack ordered')
      await page.locator('[data-test="save-duration"]').click()
      await expect.poll(() => card.getAttribute('data-tag')).not.toBe(second)
      await page.locator('[data-test="end-round"]').click()
      await page.locator('[data-test="round-failures"]').waitFor()
      expect(await page.locator('[data-test="round-failures"]').textContent()).toMatch(new RegExp(`${second}, full-duration test: Went dark after 2 h 30 min`))
      await page.locator('[data-test="sign-off"]').click()
      await page.locator('[data-test="round-signed"]').waitFor()
      await screenshot(page, 'test-plan-round-signed')
      const href = await page.locator('[data-test="round-record-pdf"]').getAttribute('href')
      const pdf = await page.evaluate(async (url) => {
        const res = await fetch(url!)
        return { status: res.status, type: res.headers.get('content-type'), size: (await res.arrayBuffer()).byteLength }
      }, href)
      expect(pdf).toMatchObject({ status: 200, type: 'application/pdf' })
      expect(pdf.size).toBeGreaterThan(2000)

      const rows = await dataSource.query(
        `SELECT l.tag, t.kind, t.passed FROM test_records t JOIN luminaires l ON l.id = t.luminaire_id
         JOIN test_rounds r ON r.client_id = t.round_client_id WHERE r.site_id = $1 ORDER BY t.passed DESC`,
        [site.id],
      )
      expect(rows).toEqual([
        { tag: first, kind: 'duration', passed: true },
        { tag: second, kind: 'duration', passed: false },
      ])
    } finally {
      await b.close()
    }
  })
})
