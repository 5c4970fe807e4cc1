/**
 * Correcting the register in the browser, as a US designer working in °F: the site page speaks the
 * regime's words, the ceiling temperature is typed in °F and stored in °C, the regime is changed
 * with a reason and the history shows it, and a test recorded in error is struck through in the log
 * book while pass and fail read differently without colour.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import { luminaireIn, siteIn, testIn } from '../helpers/register-fixtures'
import { chooseOption, fillField, newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Corrections team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

describe('correcting the register', () => {
  it('edits a US site in °F, changes its regime with a reason, and strikes through a test recorded in error', async () => {
    await dataSource.query(`UPDATE users SET units = 'us' WHERE email = $1`, [team.users.designer.email])
    const site = await siteIn(team.workspaceId, { name: 'Oakridge Middle School (demo)', regime: 'nfpa101', ceilingTemperatureC: 25 })
    await dataSource.query(
      `INSERT INTO site_regime_changes (workspace_id, site_id, from_regime, to_regime, profile_version) VALUES ($1, $2, NULL, 'nfpa101', '2026.1')`,
      [team.workspaceId, site.id],
    )
    const l = await luminaireIn(team.workspaceId, site.id, { tag: 'EG-1', packFittedOn: '2024-01-10' })
    const today = new Date().toISOString().slice(0, 10)
    await testIn(team.workspaceId, l.id, { kind: 'duration', testedOn: '2025-06-01', achievedDurationH: 1.6 })
    const wrongId = await testIn(team.workspaceId, l.id, { kind: 'functional', testedOn: today, passed: false, faults: 'No light' })

    const b = await newBrowser({ width: 1200, height: 900 })
    try {
      const { page } = b
      await signInThroughForm(page, app.url, team.users.designer.email, TEST_PASSWORD)
      await page.goto(`${app.url}/sites/${site.id}`)
      await page.locator('.n-tabs-tab', { hasText: 'Site and regime' }).click()
      const profile = page.locator('[data-test="regime-profile"]')
      await profile.waitFor()
      const words = await profile.textContent()
      expect(words).toContain('authority having jurisdiction')
      expect(words).toContain('120/277 V 60 Hz')
      expect(words).toMatch(/3 to 5 weeks after the last test/)
      expect(words).not.toMatch(/\bmains\b/)
      expect(await page.locator('[data-test="myths"]').textContent()).not.toMatch(/90 minutes/)
      expect(await page.locator('.panel').textContent()).toContain('77 °F')

      await page.locator('[data-test="edit-site"]').click()
      expect(await page.locator('#site-ceiling').inputValue()).toBe('77')
      await fillField(page, '#site-ceiling', '86')
      await chooseOption(page, '[data-test="site-regime"]', 'Canadian fire codes')
      await fillField(page, '#site-reason', 'Building is across the border')
      await screenshot(page, 'site-edit-us-units')
      await page.locator('[data-test="save-site"]').click()
      await page.locator('[data-test="edit-site"]').waitFor()
      const [saved] = await dataSource.query('SELECT regime, ceiling_temperature_c FROM sites WHERE id = $1', [site.id])
      expect(saved.regime).toBe('ca-nfc')
      expect(saved.ceiling_temperature_c).toBeCloseTo(30, 9) // 86 °F = 30 °C exactly
      await expect
        .poll(() => page.locator('[data-test="regime-history"]').textContent())
        .toMatch(/NFPA 101 → National Fire Code of Canada.*Building is across the border/)

      await page.locator('.n-tabs-tab', { hasText: 'Log book' }).click()
      const book = page.locator('[data-test="log-book"]')
      await book.waitFor()
      expect(await book.locator('[data-result="pass"]').first().textContent()).toMatch(/✓\s*Pass/)
      expect(await book.locator('[data-result="fail"]').first().textContent()).toMatch(/✗\s*Fail/)
      await page.locator(`[data-test="mark-error-${wrongId}"]`).click()
      await fillField(page, `#reason-${wrongId}`, 'Entered against the wrong luminaire')
      await page.locator('[data-test="confirm-mark"]').click()
      const voided = book.locator('tr[data-in-error="yes"]')
      await voided.waitFor()
      expect(await voided.locator('[data-test="in-error-note"]').textContent()).toContain('Entered against the wrong luminaire')
      expect(
        await voided
          .locator('.strike')
          .first()
          .evaluate((el) => getComputedStyle(el).textDecorationLine),
      ).toBe('line-through')
      await screenshot(page, 'log-book-recorded-in-error')
      const [row] = await dataSource.query('SELECT recorded_in_error_reason FROM test_records WHERE id = $1', [wrongId])
      expect(row.recorded_in_error_reason).toBe('Entered against the wrong luminaire')
    } finally {
      await b.close()
    }
  })

  it('the site and regime tab fits a 375 px phone without sideways scrolling', async () => {
    const site = await siteIn(team.workspaceId, { name: 'Kestrel Bay Clinic (demo)', regime: 'asnzs2293' })
    const phone = await newBrowser({ width: 375, height: 740 })
    try {
      const { page } = phone
      await signInThroughForm(page, app.url, team.users.technician.email, TEST_PASSWORD)
      await page.goto(`${app.url}/sites/${site.id}`)
      await page.locator('.n-tabs-tab', { hasText: 'Site and regime' }).click()
      await page.locator('[data-test="regime-profile"]').waitFor()
      expect(await page.locator('[data-test="regime-profile"]').textContent()).toMatch(/Six-monthly discharge test.*every 6 months, at least 1:30 h/)
      await page.locator('[data-test="myths"] summary').click()
      expect(await page.locator('[data-test="myths"]').textContent()).toMatch(/always 90 minutes/)
      await screenshot(page, 'site-regime-phone')
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375)
    } finally {
      await phone.close()
    }
  })
})
