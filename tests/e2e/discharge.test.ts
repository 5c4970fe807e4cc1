/**
 * A technician uploads a logged duration test, checks the column mapping, sees the curve with its
 * cut-off line, and saves the log onto a spec sheet; the sheet page then lists it. Screenshots at
 * desktop width and at 375 px.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { FAILING, logText, PASSING } from '../helpers/discharge-fixtures'
import { chooseOption, fillField, newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'
import { sheetIn } from '../helpers/sheets'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Discharge e2e team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

async function uploadAndSave(viewport: { width: number; height: number }, name: string, text: string, sheetTitle: string, shot: string) {
  const sheet = await sheetIn(team, { title: sheetTitle })
  const b = await newBrowser(viewport)
  try {
    const { page } = b
    await signInThroughForm(page, app.url, team.users.technician.email, TEST_PASSWORD)
    await page.goto(`${app.url}/discharge`)
    await page.locator('[data-test="new-log"]').click()
    await page.waitForURL(/\/discharge\/new/)
    await page.locator('[data-test="discharge-file"]').setInputFiles({ name, mimeType: 'text/csv', buffer: Buffer.from(text) })
    // The mapping step shows the preview with the server's guesses.
    await page.locator('[data-test="preview"]').waitFor()
    await expect.poll(() => page.locator('[data-test="preview"] thead').textContent()).toMatch(/Voltage \(V\)\s*voltage/)
    await page.locator('#opt-duration').fill('3 h')
    await page.locator('[data-test="analyse"]').click()
    await page.locator('[data-test="result"]').waitFor()
    await page.locator('[data-test="discharge-chart"] canvas').first().waitFor()
    // 4 cells × 1.0 V per cell, the usual NiCd end-of-discharge voltage; per cell after the toggle.
    await expect.poll(() => page.locator('[data-test="cutoff-key"]').textContent()).toBe('cut-off 4 V')
    await page.locator('[data-test="axis-cell"]').click()
    await expect.poll(() => page.locator('[data-test="cutoff-key"]').textContent()).toBe('cut-off 1 V')
    await page.locator('[data-test="axis-pack"]').click()
    await screenshot(page, `${shot}-result`)
    await fillField(page, '#save-title', `Log for ${sheetTitle}`)
    await page.locator('[data-test="attach-sheet"]').click()
    await chooseOption(page, '#save-sheet', sheetTitle)
    await page.locator('[data-test="save-log"]').click()
    await page.waitForURL(/\/discharge\/[0-9a-f-]{36}$/)
    await page.locator('[data-test="discharge-summary"]').waitFor()
    await screenshot(page, `${shot}-saved`)
    const verdict = await page.locator('[data-test="verdict"]').textContent()
    await page.goto(`${app.url}/sheets/${sheet.id}`)
    await page.locator('[data-test="sheet-discharge-logs"] a', { hasText: `Log for ${sheetTitle}` }).waitFor()
    await screenshot(page, `${shot}-sheet`)
    return { verdict, sheetId: sheet.id, page }
  } finally {
    await b.close()
  }
}

describe('discharge logs in the browser', () => {
  it('uploads, maps, plots with the cut-off line, and saves onto a sheet (desktop)', async () => {
    const { verdict, sheetId } = await uploadAndSave({ width: 1280, height: 900 }, 'passing.csv', logText(PASSING), 'E2E sheet desktop', 'discharge-desktop')
    expect(verdict).toBe('Passed')
    const rows: Array<{ n: number }> = await dataSource.query('SELECT count(*)::int AS n FROM discharge_logs WHERE spec_sheet_id = $1', [sheetId])
    expect(rows[0].n).toBe(1)
  })

  it('does the same on a 375 px phone with a semicolon, decimal-comma file', async () => {
    const { verdict } = await uploadAndSave(
      { width: 375, height: 780 },
      'failing.csv',
      logText(FAILING, 'semicolon-decimal-comma'),
      'E2E sheet phone',
      'discharge-phone',
    )
    expect(verdict).toBe('Failed')
  })
})
