import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import { newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'
import { pdfText } from '../helpers/pdf-text'
import { sheetIn } from '../helpers/sheets'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Bench team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

/** Waits for a value under a loaded machine (the default poll gives up after one second). */
const poll = <T>(fn: () => Promise<T> | T) => expect.poll(fn, { timeout: 20_000, interval: 100 })
const figure = (page: Page, key: string) => page.locator(`[data-test="value-${key}"]`)

async function retype(page: Page, id: string, text: string) {
  const input = page.locator(`#${id}`)
  await input.fill('')
  // One key at a time, as a person types; the results follow each key.
  await input.pressSequentially(text)
}

describe('pack bench to shared sheet', () => {
  it('sizes a pack from typed quantities, saves, issues, shares, and serves the sheet and its PDF', async () => {
    const b = await newBrowser()
    let shareUrl = ''
    let title = ''
    let required = ''
    try {
      const { page } = b
      const pageErrors: string[] = []
      page.on('pageerror', (e) => pageErrors.push(e.message))
      await signInThroughForm(page, app.url, team.users.designer.email, TEST_PASSWORD)
      await page.goto(`${app.url}/pack-bench`)
      await figure(page, 'requiredCapacityAh').waitFor()
      // The defaults are shown as typed, not as the engine's base units.
      expect(await page.locator('#f-duration').inputValue()).toBe('3 h')
      const before = await figure(page, 'requiredCapacityAh').textContent()

      // Units as typed, each shown beside its field as the value understood.
      await retype(page, 'f-load-power', '4.5 W')
      await poll(() => page.locator('[data-test="understood-load.power"]').textContent()).toBe('= 4.5 W')
      await poll(() => figure(page, 'requiredCapacityAh').textContent()).not.toBe(before)
      const afterPower = await figure(page, 'requiredCapacityAh').textContent()
      await retype(page, 'f-duration', '90 min')
      await poll(() => page.locator('[data-test="understood-duration"]').textContent()).toBe('= 1.5 h')
      await poll(() => figure(page, 'requiredCapacityAh').textContent()).not.toBe(afterPower)
      await retype(page, 'f-ambientMin', '-10 °C')
      // Written with the typographic minus, as every figure the app shows.
      await poll(() => page.locator('[data-test="understood-ambientMin"]').textContent()).toBe('= −10 °C')
      await retype(page, 'f-load-ledCurrent', '350 mA')
      await poll(() => page.locator('[data-test="understood-load.ledCurrent"]').textContent()).toBe('= 350 mA')

      // A bad unit gets a message on its field and no results.
      await retype(page, 'f-load-power', '4.5 A')
      await poll(() => page.locator('[data-test="field-load.power"]').textContent()).toMatch(/not a power/)
      await page.locator('[data-test="incomplete"]').waitFor()
      await retype(page, 'f-load-power', '4.5 W')
      await figure(page, 'requiredCapacityAh').waitFor()

      // Every figure opens its working.
      await page.locator('[data-test="figure-requiredCapacityAh"]').click()
      await page.locator('[data-test="working-requiredCapacityAh"]').waitFor()
      expect(await page.locator('[data-test="working-requiredCapacityAh"]').textContent()).toContain('C_req = C_P · (1 + m) / (DoD · f_EoL · f_T)')
      await screenshot(page, 'pack-bench-working')
      await page.keyboard.press('Escape')
      await page.locator('[data-test="working-requiredCapacityAh"]').waitFor({ state: 'detached' })

      await page.locator('[data-test="comparison-table"] tbody tr').first().waitFor()
      expect(await page.locator('[data-test="comparison-table"] tbody tr').count()).toBe(6)
      await page.locator('[data-test="runtime-chart"] canvas').waitFor()
      await page.locator('[data-test="comparison-chart"] canvas').waitFor()
      expect(await page.locator('[data-test="warning-critical"], [data-test="warning-warning"], [data-test="warning-info"]').count()).toBeGreaterThan(0)
      required = (await figure(page, 'requiredCapacityAh').textContent()) ?? ''
      expect(required).toMatch(/^\d+(\.\d+)? Ah$/)

      title = `Stair core test ${Date.now()}`
      await page.locator('#sheet-title').fill(title)
      await page.locator('#sheet-reference').fill('E2E-01')
      await page.locator('#sheet-luminaire').fill('Invented 4.5 W bulkhead, non-maintained')
      await screenshot(page, 'pack-bench')
      await page.locator('[data-test="save-sheet"]').click()
      await page.locator('[data-test="editing-sheet"]').waitFor()
      await poll(() => page.url()).toMatch(/sheet=/)

      // Charger check, with the pack carried across.
      await page.locator('[data-test="check-charger"]').click()
      await page.locator('[data-test="from-pack"]').waitFor()
      // No verdict until the charger's current is measured and typed in.
      await page.locator('[data-test="charger-incomplete"]').waitFor()
      await page.locator('#f-chargeCurrent').fill('400 mA')
      await page.locator('[data-test="recharge-verdict"]').waitFor()
      await page.locator('[data-test="charger-add-to-sheet"]').waitFor()
      expect(await page.locator('#f-capacity').inputValue()).toMatch(/ Ah$/)
      await screenshot(page, 'charger-check')
      await page.goBack()

      await page.locator('[data-test="open-sheet"]').click()
      await page.locator('[data-test="sheet-title"]').waitFor()
      expect(await page.locator('[data-test="sheet-title"]').textContent()).toBe(title)
      await page.locator('[data-test="issue-sheet"]').click()
      await page.getByRole('button', { name: 'Confirm' }).click()
      await poll(() => page.locator('[data-test="sheet-status"]').textContent()).toBe('Issued')
      await page.locator('[data-test="share-sheet"]').click()
      await page.locator('#share-url').waitFor()
      shareUrl = await page.locator('#share-url').inputValue()
      expect(shareUrl).toMatch(/\/s\/[\w-]{22,}$/)
      await screenshot(page, 'sheet-issued-and-shared')

      const [download] = await Promise.all([page.waitForEvent('download'), page.locator('[data-test="download-pdf"]').click()])
      const pdf = fs.readFileSync((await download.path()) as string)
      // Text read back through the PDF's own ToUnicode maps (see tests/helpers/pdf-text.ts).
      const text = pdfText(pdf).replace(/\s+/g, ' ')
      expect(text).toContain(title)
      expect(text).toContain(`Required rated capacity: ${required}`)

      await page.goto(`${app.url}/sheets`)
      await page.locator('[data-test="sheet-link"]', { hasText: title }).waitFor()
      await screenshot(page, 'sheets-list')
      expect(pageErrors).toEqual([])
    } finally {
      await b.close()
    }

    // A different person, no session: the public page shows the issued sheet and no edit action.
    const stranger = await newBrowser()
    try {
      const { page } = stranger
      // The link names the configured public origin; the test server listens on its own port.
      await page.goto(`${app.url}${new URL(shareUrl).pathname}`)
      await page.locator('[data-test="sheet-title"]').waitFor()
      expect(await page.locator('[data-test="sheet-title"]').textContent()).toBe(title)
      expect(await page.locator('[data-test="sheet-revision"]').textContent()).toBe('1')
      expect(await page.locator('[data-test="sheet-status"]').textContent()).toBe('Issued')
      expect(await page.locator('[data-test="sheet-document"]').textContent()).toMatch(/issued (\d{1,2} [A-Z][a-z]+ \d{4}|[A-Z][a-z]+ \d{1,2}, \d{4})/)
      expect(await page.locator('[data-test="sheet-actions"], [data-test="edit-sheet"], [data-test="share-panel"], input, textarea').count()).toBe(0)
      expect(await page.locator(`[data-test="value-requiredCapacityAh"]`).textContent()).toBe(required)
      await page.locator('[data-test="cautions"]').waitFor()
      await screenshot(page, 'shared-sheet')
      const [download] = await Promise.all([page.waitForEvent('download'), page.locator('[data-test="shared-pdf"]').click()])
      expect(pdfText(fs.readFileSync((await download.path()) as string))).toContain(title)
    } finally {
      await stranger.close()
    }
  }, 240_000) // its own time limit: the whole journey (bench, charger check, sheet, share, two PDFs) runs past 120 s on a loaded machine

  it('fits a 375 px wide phone screen', async () => {
    const b = await newBrowser({ width: 375, height: 812 })
    try {
      await signInThroughForm(b.page, app.url, team.users.designer.email, TEST_PASSWORD)
      await b.page.goto(`${app.url}/pack-bench`)
      await figure(b.page, 'requiredCapacityAh').waitFor()
      const overflow = await b.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
      expect(overflow).toBeLessThanOrEqual(0)
      await screenshot(b.page, 'pack-bench-375')
    } finally {
      await b.close()
    }
  })
})

describe('sheet actions by role', () => {
  it('hides edit, issue, share and archive from a viewer and shows them to a designer', async () => {
    const sheet = await sheetIn(team, { issued: false, title: 'Role check sheet' })
    const viewer = await newBrowser()
    try {
      await signInThroughForm(viewer.page, app.url, team.users.viewer.email, TEST_PASSWORD)
      await viewer.page.goto(`${app.url}/sheets/${sheet.id}`)
      await viewer.page.locator('[data-test="sheet-title"]').waitFor()
      for (const action of ['edit-sheet', 'issue-sheet', 'clone-sheet', 'archive-sheet', 'share-panel']) {
        expect(await viewer.page.locator(`[data-test="${action}"]`).count(), action).toBe(0)
      }
      await viewer.page.locator('[data-test="download-pdf"]').waitFor()
      await screenshot(viewer.page, 'sheet-as-viewer')
      await viewer.page.goto(`${app.url}/pack-bench`)
      await viewer.page.locator('[data-test="read-only-note"]').waitFor()
      expect(await viewer.page.locator('[data-test="save-sheet"]').count()).toBe(0)
    } finally {
      await viewer.close()
    }
    const designer = await newBrowser()
    try {
      await signInThroughForm(designer.page, app.url, team.users.designer.email, TEST_PASSWORD)
      await designer.page.goto(`${app.url}/sheets/${sheet.id}`)
      await designer.page.locator('[data-test="edit-sheet"]').waitFor()
      for (const action of ['issue-sheet', 'clone-sheet', 'archive-sheet', 'share-panel']) {
        expect(await designer.page.locator(`[data-test="${action}"]`).count(), action).toBe(1)
      }
      await screenshot(designer.page, 'sheet-as-designer')
      await designer.page.goto(`${app.url}/home`)
      await designer.page.locator('[data-test="recent-sheets"]').waitFor()
      await screenshot(designer.page, 'home-as-designer')
    } finally {
      await designer.close()
    }
  })
})
