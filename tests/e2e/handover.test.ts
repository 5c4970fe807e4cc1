/**
 * A designer makes the handover pack of a demo site in the browser, downloads its PDF and reads it
 * back as text (certificate, register, spacing per route, first full-duration tests, sign-off),
 * then opens the read-only link as the owner's side would, signed out.
 */
import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { seedDemo } from '../../server/demo/index'
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/scripts/demo-users'
import { chooseOption, fillField, newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'
import { codesIn, layoutProblems, pdfLines } from '../helpers/pdf-checks'
import { codesOnScreen, splitWords } from '../helpers/screen-text'
import { closeTestApp } from '../helpers/test-app'

let app: RunningApp
beforeAll(async () => {
  app = await startE2eApp()
  await seedDemo(dataSource)
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

describe('handover pack of a demo site', () => {
  it('is made on the screen, read back from its PDF, and opened by its read-only link', { timeout: 300_000 }, async () => {
    const designer = DEMO_USERS.find((u) => u.role === 'designer') ?? DEMO_USERS.find((u) => u.role === 'owner')!
    const b = await newBrowser()
    try {
      const { page } = b
      await signInThroughForm(page, app.url, designer.email, DEMO_PASSWORD)
      const sites = (await page.evaluate(async () => (await fetch('/api/sites')).json())) as { sites: Array<{ id: string; name: string }> }
      const site = sites.sites[0]
      const types = (await page.evaluate(async () => (await fetch('/api/luminaire-types')).json())) as {
        types: Array<{ name: string; photometricFileId: string | null }>
      }
      const type = types.types.find((t) => t.photometricFileId)!
      await page.goto(`${app.url}/sites/${site.id}`)
      await page.locator('[data-test="handover-link"]').click()
      await page.locator('[data-test="make-pack"]').waitFor()

      await fillField(page, '[data-test="signed-by"] input', 'Morgan Fieldworth')
      await fillField(page, '[data-test="extent"] textarea', 'All escape routes of the ground floor')
      await page.locator('[data-test="add-route"]').click()
      await fillField(page, '[data-test="route-0"] [data-test="route-name"] input', 'Ground floor corridor')
      await chooseOption(page, '[data-test="route-0"] [data-test="route-type"]', type.name)
      // A refused value says what was expected, next to the field, and nothing is made.
      await fillField(page, '[data-test="route-0"] [data-test="route-length"] input', 'twenty')
      await page.locator('[data-test="make-pack-submit"]').click()
      await page.locator('[data-test="handover-error"]').waitFor()
      await expect.poll(() => page.locator('[data-test="route-0"] .n-form-item-feedback').first().textContent()).toBeTruthy()
      expect(await page.locator('[data-test="pack-1"]').count()).toBe(0)
      await fillField(page, '[data-test="route-0"] [data-test="route-length"] input', '80 ft')
      await page.locator('[data-test="make-pack-submit"]').click()
      await page.locator('[data-test="pack-1"]').waitFor()
      await screenshot(page, 'handover-made')
      expect(await codesOnScreen(page)).toEqual([])
      expect(await splitWords(page)).toEqual([])

      const pdfBytes = await page.evaluate(
        async (url) => Array.from(new Uint8Array(await (await fetch(url)).arrayBuffer())),
        `/api/sites/${site.id}/handover-packs/1/pdf`,
      )
      const pdf = Buffer.from(pdfBytes)
      if (process.env.PDF_OUT_DIR) fs.writeFileSync(`${process.env.PDF_OUT_DIR}/e2e-handover-pack.pdf`, pdf)
      const lines = pdfLines(pdf)
      const text = lines.join('\n')
      expect(text).toContain('1. Completion certificate')
      expect(text).toContain(`Premises: ${site.name}`)
      expect(text).toContain('Extent of the installation: All escape routes of the ground floor')
      expect(text).toContain('2. Register of luminaires')
      expect(text).toContain('4. Spacing on each escape route')
      // 80 ft is 24.4 m: the route was read with its unit, not as 80 m or 3 m.
      expect(text).toMatch(/Ground floor corridor: (meets|does not meet) the route/)
      expect(text).toContain('Route: 24.4 m long')
      expect(text).toContain('5. First full-duration tests')
      expect(text).toContain('Installed, inspected and tested by')
      expect(lines.some((l) => l.includes('Morgan Fieldworth'))).toBe(true)
      expect(codesIn(lines)).toEqual([])
      expect(layoutProblems(pdf)).toEqual([])

      await page.locator('[data-test="pack-link-1"]').click()
      const url = (await page.locator('[data-test="pack-url-1"]').textContent())!.trim()
      expect(url).toMatch(/\/h\//)
      const visitor = await newBrowser({ width: 375, height: 760 })
      try {
        await visitor.page.goto(`${app.url}${new URL(url).pathname}`)
        await visitor.page.locator('[data-test="shared-signed"]').waitFor()
        expect(await visitor.page.locator('[data-test="shared-signed"]').textContent()).toContain('Morgan Fieldworth')
        expect(await codesOnScreen(visitor.page)).toEqual([])
        expect(await splitWords(visitor.page)).toEqual([])
        await screenshot(visitor.page, 'handover-shared-phone')
      } finally {
        await visitor.close()
      }
    } finally {
      await b.close()
    }
  })
})
