/** Retrofit planner in the browser, reached from the pack bench through the charger check with the pack carried by query. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import path from 'node:path'
import { ARTIFACTS, newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Retrofit team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

async function retype(page: Page, id: string, text: string) {
  const input = page.locator(`#${id}`)
  await input.fill('')
  await input.pressSequentially(text)
  // On a busy machine a late form refresh can land between keystrokes: make sure the field holds the text.
  if ((await input.inputValue()) !== text) await input.fill(text)
  await expect.poll(() => input.inputValue()).toBe(text)
}

describe('retrofit planner', () => {
  it('plans a gentler trickle from the pack bench and shows the cautions and the new recharge time', async () => {
    const b = await newBrowser()
    try {
      const { page } = b
      await signInThroughForm(page, app.url, team.users.viewer.email, TEST_PASSWORD)
      await page.goto(`${app.url}/pack-bench`)
      await page.locator('[data-test="value-selectedCapacityAh"]').waitFor()
      const packAh = ((await page.locator('[data-test="value-selectedCapacityAh"]').textContent()) ?? '').trim()
      await page.locator('[data-test="check-charger"]').click()
      await page.locator('#f-chargeCurrent').fill('400 mA')
      await page.locator('[data-test="recharge-verdict"]').waitFor()
      await page.locator('[data-test="plan-retrofit"]').click()
      await page.waitForURL(/\/charger-check\/retrofit\?/)

      // The pack arrived by query: chemistry, cells and capacity.
      const url = new URL(page.url())
      expect(url.searchParams.get('chemistry')).toBe('nicd')
      expect(url.searchParams.get('capacity')).toBe(packAh)
      await page.locator('[data-test="from-pack"]').waitFor()
      expect(await page.locator('#f-capacity').inputValue()).toBe(packAh)
      expect(await page.locator('#f-cellsInSeries').inputValue()).toBe(url.searchParams.get('cells'))

      // The two readings, target and diode, typed with units.
      await retype(page, 'f-trickleCurrent', '300 mA')
      await retype(page, 'f-batteryVoltage', '4.3 V')
      await retype(page, 'f-secondReading-resistance', '10 Ω')
      await expect.poll(() => page.locator('[data-test="understood-secondReading.resistance"]').textContent()).toBe('= 10 Ω')
      await retype(page, 'f-secondReading-current', '180 mA')
      await retype(page, 'f-targetTrickleRateC', '0.04')
      await page.locator('[data-test="retrofit-summary"]').waitFor()

      // The cautions, prominent, whatever the figures.
      const cautions = (await page.locator('[data-test="retrofit-cautions"]').textContent()) ?? ''
      expect(cautions).toMatch(/void its certification and warranty/)
      expect(cautions).toMatch(/competent, licensed person/)
      expect(cautions).toMatch(/repeat the full rated-duration test/)
      expect(cautions).toMatch(/local codes/)

      // The new recharge time on screen, beside the old one, and in the before-and-after table.
      const recharge = (await page.locator('[data-test="recharge-after"]').textContent()) ?? ''
      expect(recharge).toMatch(/New recharge time after a full rated-duration test: \d+(\.\d+)? h \(was \d+(\.\d+)? h; (within|over) the 24 h limit\)/)
      const afterCell = await page.locator('[data-test="row-recharge"] td').nth(1).textContent()
      expect(recharge).toContain(`${afterCell} (was`)
      expect(await page.locator('[data-test="schematic-resistor-value"]').textContent()).toMatch(/^\d+(\.\d+)? (Ω|kΩ) E24$/)

      // A figure opens its working.
      await page.locator('[data-test="figure-rechargeTimeAfterH"]').click()
      await page.locator('[data-test="working-rechargeTime"]').waitFor()
      await page.keyboard.press('Escape')
      await page.locator('[data-test="working-rechargeTime"]').waitFor({ state: 'detached' })

      // An impossible second reading is an error on its field.
      await retype(page, 'f-secondReading-current', '320 mA')
      await page.locator('[data-test="field-secondReading.current"]', { hasText: 'adding resistance cannot raise the current' }).waitFor()
      await page.locator('[data-test="incomplete"]').waitFor()
      await retype(page, 'f-secondReading-current', '180 mA')
      await page.locator('[data-test="retrofit-summary"]').waitFor()
      await expect.poll(() => page.locator('[data-test="field-secondReading.current"]').textContent()).not.toMatch(/cannot|not a current/)
      await screenshot(page, 'retrofit-planner')
      await page.locator('h1').scrollIntoViewIfNeeded()
      await screenshot(page, 'retrofit-planner-top')
      await page.locator('[data-test="retrofit-schematic"]').screenshot({ path: path.join(ARTIFACTS, 'retrofit-planner-schematic.png') })
    } finally {
      await b.close()
    }
  })

  it('fits a 375 px wide phone screen', async () => {
    const b = await newBrowser({ width: 375, height: 812 })
    try {
      await signInThroughForm(b.page, app.url, team.users.viewer.email, TEST_PASSWORD)
      await b.page.goto(`${app.url}/charger-check/retrofit?chemistry=nicd&cells=3&capacity=4%20Ah&duration=3%20h&discharge=0.9%20A`)
      await b.page.locator('[data-test="retrofit-schematic"]').waitFor()
      await b.page.locator('[data-test="retrofit-cautions"]').waitFor()
      const overflow = await b.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
      expect(overflow).toBeLessThanOrEqual(0)
      await screenshot(b.page, 'retrofit-planner-375')
      expect(await b.page.locator('#f-capacity').inputValue()).toBe('4 Ah')
      await b.page.locator('[data-test="retrofit-schematic"]').screenshot({ path: path.join(ARTIFACTS, 'retrofit-planner-375-schematic.png') })
      await b.page.locator('[data-test="before-after"]').screenshot({ path: path.join(ARTIFACTS, 'retrofit-planner-375-table.png') })
      await b.page.locator('[data-test="retrofit-cautions"]').screenshot({ path: path.join(ARTIFACTS, 'retrofit-planner-375-cautions.png') })
    } finally {
      await b.close()
    }
  })
})
