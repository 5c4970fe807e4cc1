/** The portfolio screen for an owner: failed and overdue luminaires across two sites, filtered, and the pack budget priced on screen. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { addDays, addMonthsClamped } from '../../shared/engine/due'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import { chooseOption, newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'

let app: RunningApp
let team: TestTeam
const today = new Date().toISOString().slice(0, 10)
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Portfolio screen team')
  const school = await siteIn(team.workspaceId, { name: 'Fernbank School (invented)' })
  const depot = await siteIn(team.workspaceId, { name: 'Coldharbour Depot (invented)' })
  // Overdue: last tested four months ago, pack fitted twenty years ago (past its life: in the budget).
  const late = await luminaireIn(team.workspaceId, school.id, { tag: 'FS-01', typeLabel: 'Corridor bulkhead', packFittedOn: addMonthsClamped(today, -240) })
  await testIn(team.workspaceId, late.id, { kind: 'duration', testedOn: addMonthsClamped(today, -4), achievedDurationH: 3.2 })
  // Failed three days ago at the depot.
  const failed = await luminaireIn(team.workspaceId, depot.id, { tag: 'CD-07', typeLabel: 'Exit sign', packFittedOn: addMonthsClamped(today, -6) })
  await testIn(team.workspaceId, failed.id, { kind: 'duration', testedOn: addMonthsClamped(today, -5), achievedDurationH: 3.3 })
  await testIn(team.workspaceId, failed.id, { kind: 'functional', testedOn: addDays(today, -3), passed: false, faults: 'Lamp dark on mains failure' })
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

describe('portfolio screen', () => {
  it('lists the failed and the overdue luminaire across sites, filters by site, and costs the pack budget once a price is set', async () => {
    const b = await newBrowser({ width: 375, height: 812 })
    try {
      const { page } = b
      await signInThroughForm(page, app.url, team.users.owner.email, TEST_PASSWORD)
      await page.goto(`${app.url}/portfolio`)
      await page.locator('[data-test="pf-item"]').first().waitFor()
      const items = await page.locator('[data-test="pf-item"]').allTextContents()
      expect(items).toHaveLength(2)
      expect(items[0]).toMatch(/Failed.*CD-07.*Coldharbour Depot/)
      expect(items[0]).toContain('Lamp dark on mains failure')
      expect(items[1]).toMatch(/Overdue.*FS-01.*Fernbank School/)
      await chooseOption(page, '[data-test="pf-site"]', 'Fernbank School (invented)')
      await expect.poll(() => page.locator('[data-test="pf-item"]').count()).toBe(1)
      // The budget names its window and counts the pack past its life, unpriced until a price is set.
      expect(await page.locator('[data-test="pf-window"]').textContent()).toMatch(/from .+ up to .+/)
      expect(await page.locator('[data-test="pf-budget-total"]').textContent()).toMatch(/All sites1.*—1$/)
      await page.getByLabel('Pack price for Corridor bulkhead').fill('18.5')
      await page.getByLabel('Currency for Corridor bulkhead').fill('GBP')
      await page.locator('[data-test="pf-save-prices"]').click()
      await expect.poll(() => page.locator('[data-test="pf-budget-total"]').textContent()).toMatch(/£18\.50/)
      await screenshot(page, 'portfolio-375')
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
      expect(overflow).toBeLessThanOrEqual(1)
    } finally {
      await b.close()
    }
  })
})
