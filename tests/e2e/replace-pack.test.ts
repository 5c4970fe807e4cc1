/** Replace a pack: from the old pack's label to a recommended pack, onto a sheet whose PDF shows voltage, format and the charger check. */
import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import { chooseOption, fillField, newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'
import { pdfText } from '../helpers/pdf-text'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Replace team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

const poll = <T>(fn: () => Promise<T> | T) => expect.poll(fn, { timeout: 20_000, interval: 100 })

describe('replace a pack from its label', () => {
  it('4-cell NiCd 4.8 V 1.6 Ah sub-C, 3 h, nickel charger at 120 mA → recommended pack → sheet PDF with voltage, format and charger check', async () => {
    const b = await newBrowser()
    try {
      const { page } = b
      const pageErrors: string[] = []
      page.on('pageerror', (e) => pageErrors.push(e.message))
      await signInThroughForm(page, app.url, team.users.designer.email, TEST_PASSWORD)
      await page.goto(`${app.url}/replace-pack`)
      await page.locator('[data-test="incomplete"]').waitFor()
      // Nothing measured is filled in for the person.
      expect(await page.locator('#f-charger-chargeCurrent').inputValue()).toBe('')

      await fillField(page, '#f-oldPack-nominalVoltage', '4.8 V')
      await fillField(page, '#f-oldPack-capacity', '1.6 Ah')
      await page.locator('#f-old-format').click()
      await page.keyboard.type('sub-C')
      await page
        .locator('.n-base-select-option')
        .filter({ hasText: /^sub-C$/ })
        .first()
        .click()
      await chooseOption(page, '[data-test="field-charger-type"]', 'Nickel charger')
      await fillField(page, '#f-charger-chargeCurrent', '120 mA')
      await poll(() => page.locator('[data-test="old-voltage"]').textContent()).toContain('4 cells')

      const recommended = page.locator('[data-test="candidates"] li:has([data-test="recommended"])')
      await recommended.waitFor()
      const packText = await recommended.locator('[data-test="candidate-pack"]').textContent()
      expect(packText).toContain('4.8 V')
      expect(packText).toContain('1.6 Ah')
      expect(packText).toContain('sub-C')
      expect(await recommended.textContent()).toContain('Suits this charger')
      // Lithium sits beside it, refused on a nickel charger.
      expect(await page.locator('[data-test="candidates"] li', { hasText: 'Lithium iron phosphate' }).first().textContent()).toContain(
        'Must not go on this charger',
      )
      await screenshot(page, 'replace-pack')

      await page.locator('[data-test="put-on-sheet"]').click()
      await page.waitForURL(/\/sheets\/[0-9a-f-]{36}/)
      const [download] = await Promise.all([page.waitForEvent('download'), page.locator('[data-test="download-pdf"]').click()])
      const text = pdfText(fs.readFileSync((await download.path()) as string)).replace(/\s+/g, ' ')
      expect(text).toContain('Nominal pack voltage: 4.8 V')
      expect(text).toContain('Cell format: sub-C')
      expect(text).toContain('Charger check')
      expect(text).toContain('Nickel charger (constant current, left on)')
      expect(text).toContain('Suits this charger')
      // The sheet judges the pack as the screen did: no critical shortfall on the recommended pack.
      expect(text).not.toContain('short of the 3 h rated duration')
      expect(pageErrors).toEqual([])
    } finally {
      await b.close()
    }
  })
})
