/** A brand-new user completes the guided job (size, save, check the charger, issue and share) by following only the hints. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { closeTestApp, mailTo, uniqueEmail } from '../helpers/test-app'
import { newBrowser, screenshot, startE2eApp, type RunningApp } from '../helpers/browser'

let app: RunningApp
beforeAll(async () => {
  app = await startE2eApp()
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

describe('onboarding', () => {
  it('walks a new user through one complete job', { timeout: 300_000 }, async () => {
    const b = await newBrowser()
    const page = b.page
    try {
      await page.goto(`${app.url}/sign-up`)
      await page.locator('#sign-up-name').fill('Nia Newcomer')
      const email = uniqueEmail('newcomer')
      await page.locator('#sign-up-email').fill(email)
      await page.locator('#sign-up-password').fill('my first emergency job')
      await page.locator('#sign-up-workspace').fill('Newcomer Electrical')
      await page.getByRole('button', { name: 'Create account' }).click()
      // The account confirms its e-mail address first: follow the link from the caught mail.
      await page.locator('[data-test="sign-up-sent"]').waitFor()
      await screenshot(page, 'onboarding-0-check-mail')
      let link: string | undefined
      await expect
        .poll(
          () =>
            (link = mailTo(email)
              .map((m) => /(\/confirm-email\?token=[\w%-]+)/.exec(m.text)?.[1])
              .find(Boolean)),
        )
        .toBeTruthy()
      await page.goto(`${app.url}${link}`)
      await page.locator('[data-test="confirm-done"]').waitFor()
      await screenshot(page, 'onboarding-0-confirmed')
      await page.goto(`${app.url}/sign-in`)
      await page.locator('#sign-in-email').fill(email)
      await page.locator('#sign-in-password').fill('my first emergency job')
      await page.locator('[data-test="sign-in-submit"]').click()
      await page.waitForURL(/\/home/)

      await page.locator('[data-test="onboarding-start"]').click()
      await page.locator('[data-test="hint-size"]').waitFor()
      await screenshot(page, 'onboarding-1-size')
      await page.locator('[data-test="hint-fill-example"]').click()

      await page.locator('[data-test="hint-save"]').waitFor()
      await page.locator('[data-test="hint-fill-details"]').click()
      await expect.poll(() => page.locator('#sheet-title').inputValue()).toContain('Larkfield')
      await page.locator('[data-test="save-sheet"]').click()

      await page.locator('[data-test="hint-charger"]').first().waitFor()
      await screenshot(page, 'onboarding-3-charger')
      await page.locator('[data-test="check-charger"]').click()
      await page.waitForURL(/charger-check/)
      await page.locator('[data-test="hint-fill-charger"]').click()
      await page.locator('[data-test="recharge-verdict"]').waitFor()
      await page.locator('[data-test="hint-go-share"]').click()

      await page.waitForURL(/\/sheets\//)
      await page.locator('[data-test="hint-share"]').waitFor()
      await page.locator('[data-test="issue-sheet"]').click()
      await page.getByRole('button', { name: 'Confirm' }).click()
      await page.locator('[data-test="share-sheet"]').click()
      await page.locator('[data-test="hint-done"]').waitFor()
      await screenshot(page, 'onboarding-4-done')
      expect(await page.locator('[data-test="shares"] tbody tr').count()).toBeGreaterThan(0)
    } finally {
      await b.close()
    }
  })
})
