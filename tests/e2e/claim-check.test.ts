/** Claim check in the browser: typed readings, inline errors and warnings, working, saving, attaching to a sheet, the sheet's PDF, side by side. */
import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import path from 'node:path'
import { ARTIFACTS, chooseOption, newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'
import { AUDIT_READINGS, auditIn } from '../helpers/audits'
import { pdfText } from '../helpers/pdf-text'
import { sheetIn } from '../helpers/sheets'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Claim check team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

const figure = (page: Page, key: string) => page.locator(`[data-test="value-${key}"]`)

async function retype(page: Page, name: string, text: string) {
  const input = page.locator(`#f-${name}`)
  await input.fill('')
  if (text) await input.pressSequentially(text)
}

describe('claim check', () => {
  it('records an audit from typed readings, attaches it to a sheet, and the sheet and its PDF show it', async () => {
    const sheet = await sheetIn(team, { title: `Sheet for a claim check ${Date.now()}` })
    const b = await newBrowser()
    try {
      const { page } = b
      await signInThroughForm(page, app.url, team.users.technician.email, TEST_PASSWORD)
      await page.goto(`${app.url}/claim-check`)
      // It opens empty, with examples only as placeholders, and says in words what it still needs.
      await page.locator('[data-test="incomplete"]').waitFor()
      expect(await page.locator('#f-measuredPower').inputValue()).toBe('')
      expect(await page.locator('#f-measuredPower').getAttribute('placeholder')).toMatch(/e\.g\. 2\.6 W/)
      expect(await page.locator('[data-test="incomplete"]').textContent()).toMatch(/To see the audit, enter the claimed power/)
      expect(await page.locator('[data-test="incomplete"]').textContent()).not.toMatch(/marked in red/)
      // The example fills it; clearing the readings keeps the tariff and the currency as typed.
      await page.locator('[data-test="use-example"]').click()
      await figure(page, 'measuredPowerW').waitFor()
      await retype(page, 'tariffPerKWh', '0.31')
      await page.locator('[data-test="clear-readings"]').click()
      await page.locator('[data-test="incomplete"]').waitFor()
      expect(await page.locator('#f-measuredPower').inputValue()).toBe('')
      expect(await page.locator('#f-tariffPerKWh').inputValue()).toBe('0.31')
      expect(await page.locator('#f-currency').inputValue()).toBe('EUR')

      for (const name of [
        'claimedPower',
        'measuredPower',
        'measuredCurrent',
        'ledVoltageMains',
        'ledCurrentMains',
        'ledVoltageBattery',
        'ledCurrentBattery',
        'batteryVoltage',
        'batteryChargeCurrent',
      ] as const) {
        await retype(page, name, AUDIT_READINGS[name])
      }
      await retype(page, 'tariffPerKWh', '0.3')
      await retype(page, 'currency', 'EUR')
      // The value understood, beside the field, in the unit the field shows.
      await expect.poll(() => page.locator('[data-test="understood-measuredCurrent"]').textContent()).toBe('= 25.7 mA')
      await expect.poll(() => page.locator('[data-test="understood-supplyVoltage"]').textContent()).toBe('= 230 V')
      await expect.poll(() => figure(page, 'apparentPowerVA').textContent()).toBe('5.91 VA')
      expect(await figure(page, 'measuredPowerW').textContent()).toBe('2.6 W')
      expect(await page.locator('[data-test="claim-verdict"]').textContent()).toMatch(
        /Measured 2\.6 W against a claim of 4 W: it draws less than claimed \(-35 %\)/,
      )

      // An impossible reading is an error on its own field, and the results go.
      await retype(page, 'powerFactor', '1.4')
      await expect.poll(() => page.locator('[data-test="field-powerFactor"]').textContent()).toMatch(/cannot be greater than 1/)
      await page.locator('[data-test="incomplete"]').waitFor()
      await retype(page, 'ledCurrentMains', '')
      await expect.poll(() => page.locator('[data-test="field-ledCurrentMains"]').textContent()).toMatch(/needed together with/)
      await retype(page, 'powerFactor', '')
      await retype(page, 'ledCurrentMains', '75 mA')
      await figure(page, 'measuredPowerW').waitFor()

      // A suspicious one is a warning, in plain words, and the results stay.
      await retype(page, 'measuredCurrent', '5 mA')
      await page.locator('[data-test="warning-critical"]').waitFor()
      const critical = (await page.locator('[data-test="warning-critical"]').textContent()) ?? ''
      expect(critical).toMatch(/The measured power \(2\.6 W\) and the measured current cannot both be right/)
      expect(critical).not.toMatch(/measuredPower/)
      await screenshot(page, 'claim-check-warning')
      await retype(page, 'measuredCurrent', '25.7 mA')
      await page.locator('[data-test="warning-critical"]').waitFor({ state: 'detached' })

      // Each figure opens its working.
      await page.locator('[data-test="figure-claimDeviationPct"]').click()
      await page.locator('[data-test="working-claimDeviation"]').waitFor()
      expect(await page.locator('[data-test="working-claimDeviation"]').textContent()).toContain('ΔP = P − P_claim')
      await screenshot(page, 'claim-check-working')
      await page.keyboard.press('Escape')
      await page.locator('[data-test="working-claimDeviation"]').waitFor({ state: 'detached' })
      await page.locator('[data-test="power-chart"] canvas').waitFor()
      await page.locator('.lw-results').screenshot({ path: path.join(ARTIFACTS, 'claim-check-results.png') })

      // Save, attached to the sheet.
      const title = `Trial bulkhead ${Date.now()}`
      await page.locator('#f-audit-title').fill(title)
      await page.locator('#f-audit-luminaire').fill('Invented "4 W" bulkhead, stair B')
      await chooseOption(page, '[data-test="attach-sheet"]', sheet.title)
      await screenshot(page, 'claim-check')
      await page.locator('[data-test="save-audit"]').click()
      await page.locator('[data-test="current-audit"]', { hasText: `on sheet ${sheet.title}` }).waitFor()
      await page.locator('[data-test="saved-audits"] tbody tr', { hasText: title }).waitFor()
      await page.locator('.lw-saved').screenshot({ path: path.join(ARTIFACTS, 'claim-check-saved.png') })

      // The sheet lists it, and its PDF carries it.
      await page.goto(`${app.url}/sheets/${sheet.id}`)
      await page.locator('[data-test="attached-audits"] li', { hasText: title }).waitFor()
      await page.locator('[data-test="attached-audits"]').screenshot({ path: path.join(ARTIFACTS, 'sheet-with-audit.png') })
      const [download] = await Promise.all([page.waitForEvent('download'), page.locator('[data-test="download-pdf"]').click()])
      const text = pdfText(fs.readFileSync((await download.path()) as string)).replace(/\s+/g, ' ')
      expect(text).toContain('Wattage audits')
      expect(text).toContain(title)
      expect(text).toContain('Claimed power: 4 W')
      expect(text).toContain('Verdict: 2.6 W measured: draws less than claimed')
    } finally {
      await b.close()
    }
  })

  it('sets saved audits side by side', async () => {
    const before = await auditIn(team, { title: 'Before the driver swap' })
    const after = await auditIn(team, { title: 'After the driver swap', inputs: { ...AUDIT_READINGS, measuredPower: '3.9 W', measuredCurrent: '18 mA' } })
    const b = await newBrowser()
    try {
      const { page } = b
      await signInThroughForm(page, app.url, team.users.viewer.email, TEST_PASSWORD)
      await page.goto(`${app.url}/claim-check?compare=${before.id},${after.id}`)
      await page.locator('[data-test="audit-comparison"]').waitFor()
      const table = (await page.locator('[data-test="audit-comparison"] table').textContent()) ?? ''
      expect(table).toContain('Before the driver swap')
      expect(table).toContain('After the driver swap')
      expect(table).toContain('agrees with the claim')
      expect(table).toContain('draws less than claimed')
      await page.locator('[data-test="audit-comparison"] canvas').waitFor()
      // A viewer computes but does not save.
      await page.locator('[data-test="read-only-note"]').waitFor()
      expect(await page.locator('[data-test="save-audit"]').count()).toBe(0)
      await page.locator('[data-test="audit-comparison"]').screenshot({ path: path.join(ARTIFACTS, 'claim-check-side-by-side.png') })
    } finally {
      await b.close()
    }
  })

  it('fits a 375 px wide phone screen', async () => {
    const b = await newBrowser({ width: 375, height: 812 })
    try {
      await signInThroughForm(b.page, app.url, team.users.technician.email, TEST_PASSWORD)
      await b.page.goto(`${app.url}/claim-check`)
      // It opens empty; the example readings show the results on a phone.
      await b.page.locator('[data-test="use-example"]').click()
      await figure(b.page, 'measuredPowerW').waitFor()
      await b.page.locator('[data-test="power-chart"] canvas').waitFor()
      expect(await b.page.locator('#f-claimedPower').inputValue()).toBe('4 W')
      const overflow = await b.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
      expect(overflow).toBeLessThanOrEqual(0)
      await screenshot(b.page, 'claim-check-375')
      await b.page.locator('.lw-results').screenshot({ path: path.join(ARTIFACTS, 'claim-check-375-results.png') })
    } finally {
      await b.close()
    }
  })
})
