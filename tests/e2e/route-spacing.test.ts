import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { computeSpacing, spacingInput } from '../../shared/engine/spacing'
import { formatDisplay } from '../../shared/engine/units'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import { chooseOption, newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'
import { corridorLm63 } from '../helpers/photometry'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Spacing team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

const lm63 = corridorLm63('e2e')
const typeName = `Corridor unit ${Date.now()}`

describe('route spacing: photometry to a specification sheet', () => {
  it('uploads a file, refuses a broken one, adds a type, works out spacing and picks the type into a sheet', async () => {
    const b = await newBrowser()
    try {
      const { page } = b
      await signInThroughForm(page, app.url, team.users.designer.email, TEST_PASSWORD)

      // A broken file is refused with its line, and nothing is listed.
      await page.goto(`${app.url}/route-spacing/photometry`)
      const broken = lm63.replace(/^1 1 4\.5$/m, '1 one 4.5')
      await page.locator('[data-test="photometry-file"]').setInputFiles({ name: 'broken.ies', mimeType: 'text/plain', buffer: Buffer.from(broken) })
      await page.locator('[data-test="photometry-upload"]').click()
      await page.locator('[data-test="upload-error"]').waitFor()
      expect(await page.locator('[data-test="upload-error"]').textContent()).toMatch(/line \d+: expected a number .*"one"/)
      expect(await page.locator('[data-test="file-link"]').count()).toBe(0)

      // The good file is stored and opened: header facts and the polar diagram of both planes.
      await page.locator('[data-test="photometry-file"]').setInputFiles({ name: 'corridor.ies', mimeType: 'text/plain', buffer: Buffer.from(lm63) })
      await page.locator('#photometry-name').fill('Corridor test file')
      await page.locator('[data-test="photometry-upload"]').click()
      await page.locator('[data-test="photometry-detail"]').waitFor()
      await page.locator('[data-test="polar-c0"]').waitFor()
      expect(await page.locator('[data-test="polar-c90"]').getAttribute('d')).toMatch(/^M[\d.]+,[\d.]+L/)
      expect(await page.locator('[data-test="photometry-detail"] h2').textContent()).toBe('Corridor test file')
      await screenshot(page, 'route-spacing-photometry')

      // A luminaire type using it, through the catalogue form.
      await page.goto(`${app.url}/route-spacing/types`)
      await page.locator('[data-test="new-type"]').click()
      await page.locator('#lt-name').fill(typeName)
      await chooseOption(page, '[data-test="lt-file"]', 'Corridor test file')
      await page.locator('[data-test="lt-save"]').click()
      await expect.poll(() => page.locator('[data-test="type-name"]').allTextContents()).toContain(typeName)
      await screenshot(page, 'route-spacing-types')

      // The calculator with that type: figures as the engine gives them, the plan, the profile, the height table.
      await page.locator('tr', { hasText: typeName }).getByRole('link', { name: 'Spacing' }).click()
      await page.waitForURL(/\/route-spacing\?type=/)
      // As a person would: the form shows the chosen type (it loads after the page) before we ask.
      await expect.poll(() => page.locator('[data-test="sp-source"]').textContent(), { timeout: 30_000 }).toContain(typeName)
      await page.locator('[data-test="sp-calculate"]').click()
      await page.locator('[data-test="sp-maxSpacing"]').waitFor()
      const expected = computeSpacing(
        spacingInput.parse({
          photometry: lm63,
          mountingHeight: 2.5,
          emergencyOutputFactor: 0.5,
          maintenanceFactor: 0.8,
          criteria: 'en1838-route',
          routeWidth: 2,
          routeLength: 30,
        }),
      )
      expect(await page.locator('[data-test="sp-maxSpacing"]').textContent()).toBe(formatDisplay('length', 'si', expected.maxSpacingM as number))
      expect(await page.locator('[data-test="sp-endSpacing"]').textContent()).toBe(formatDisplay('length', 'si', expected.maxEndSpacingM as number))
      expect(await page.locator('[data-test="sp-luminaires"]').textContent()).toBe(String(expected.luminairesNeeded))
      expect(await page.locator('[data-test="sp-layoutSpacing"]').textContent()).toBe(formatDisplay('length', 'si', expected.layout!.spacingM as number))
      expect(await page.locator('[data-test="sp-routeAverage"]').textContent()).toBe(formatDisplay('illuminance', 'si', expected.layout!.averageLx))
      expect(await page.locator('[data-test="diagram-luminaire"]').count()).toBe(expected.luminairesNeeded)
      await page.locator('[data-test="profile-chart"] canvas').waitFor()
      expect(await page.locator('[data-test="sp-height-table"] tbody tr').count()).toBe(9)
      expect(await page.locator('[data-test="warning-info"]').count()).toBeGreaterThan(0)
      await screenshot(page, 'route-spacing-calculator')

      // The selector finds the type and puts it on a new draft sheet.
      await page.goto(`${app.url}/route-spacing/selector`)
      await page.locator('[data-test="ts-find"]').click()
      const row = page.locator('[data-test="selector-table"] tr', { hasText: typeName })
      await row.waitFor()
      expect(await row.locator('[data-test="sel-count"]').textContent()).toBe(String(expected.luminairesNeeded))
      await screenshot(page, 'route-spacing-selector')
      await row.locator('[data-test="sel-pick"]').click()
      await page.locator('[data-test="pick-dialog"]').waitFor()
      await page.locator('#pick-title').fill(`Picked ${typeName}`)
      await page.locator('[data-test="pick-confirm"]').click()
      await page.waitForURL(/\/sheets\/[0-9a-f-]{36}$/)
      // The sheet page shows the pick: the count in its luminaire description.
      await expect.poll(() => page.locator('#main').textContent()).toContain(`${expected.luminairesNeeded} luminaires evenly spaced`)
      expect(await page.locator('#main').textContent()).toContain('emergency output factor 0.5 (taken from the type)')
      expect(await page.locator('#main').textContent()).toContain(`Picked ${typeName}`)
      await screenshot(page, 'route-spacing-sheet')
    } finally {
      await b.close()
    }
  })

  it('shows the calculator, the photometry and the selector at 375 px, in feet and foot-candles for a US-units user', async () => {
    const b = await newBrowser({ width: 375, height: 812 })
    try {
      const { page } = b
      await signInThroughForm(page, app.url, team.users.viewer.email, TEST_PASSWORD)
      // The viewer prefers US units.
      const set = await page.evaluate(async () => {
        const csrf = ((await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string }).csrfToken
        return (
          await fetch('/api/auth/me', {
            method: 'PATCH',
            headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrf },
            body: JSON.stringify({ units: 'us' }),
          })
        ).status
      })
      expect(set).toBe(200)
      await page.goto(`${app.url}/route-spacing`)
      await page.locator('[data-test="sp-calculate"]').click()
      await page.locator('[data-test="sp-maxSpacing"], [data-test="sp-error"]').first().waitFor()
      expect(await page.locator('[data-test="sp-error"]').count(), (await page.locator('[data-test="sp-error"]').allTextContents()).join()).toBe(0)
      expect(await page.locator('[data-test="sp-maxSpacing"]').textContent()).toMatch(/ ft$/)
      expect(await page.locator('[data-test="sp-minLux"]').textContent()).toMatch(/ fc$/)
      // The default 2 m width shown in feet comes back as 2 m, not a hair over (which would warn about wide routes).
      expect(await page.locator('[data-test="warning-warning"]').count()).toBe(0)
      // Viewers see no upload, add or pick actions.
      await screenshot(page, 'route-spacing-calculator-375')
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
      expect(overflow).toBeLessThanOrEqual(1)
      await page.goto(`${app.url}/route-spacing/photometry`)
      await page.locator('[data-test="file-link"]').first().click()
      await page.locator('[data-test="polar-plot"]').waitFor()
      expect(await page.locator('[data-test="photometry-upload"]').count()).toBe(0)
      await screenshot(page, 'route-spacing-photometry-375')
      await page.goto(`${app.url}/route-spacing/selector`)
      await page.locator('[data-test="ts-find"]').click()
      await page.locator('[data-test="selector-table"] tbody tr').first().waitFor()
      expect(await page.locator('[data-test="sel-pick"]').count()).toBe(0)
      await screenshot(page, 'route-spacing-selector-375')
    } finally {
      await b.close()
    }
  })

  it('NFPA 101 in US units: a 100 ft route at 10 ft shows feet, foot-candles and the average beside the minimum', async () => {
    const b = await newBrowser()
    try {
      const { page } = b
      await signInThroughForm(page, app.url, team.users.viewer.email, TEST_PASSWORD)
      const set = await page.evaluate(async () => {
        const csrf = ((await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string }).csrfToken
        return (
          await fetch('/api/auth/me', {
            method: 'PATCH',
            headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrf },
            body: JSON.stringify({ units: 'us' }),
          })
        ).status
      })
      expect(set).toBe(200)
      await page.goto(`${app.url}/route-spacing`)
      await expect.poll(() => page.locator('[data-test="sp-source"]').textContent(), { timeout: 30_000 }).toContain(typeName)
      await chooseOption(page, '[data-test="sp-criteria"]', 'NFPA 101')
      expect(await page.locator('label[for="sp-length"]').textContent()).toContain('(ft)')
      await page.locator('#sp-length').fill('100')
      await page.locator('#sp-height').fill('10')
      await page.locator('#sp-height').blur()
      await page.locator('[data-test="sp-calculate"]').click()
      await page.locator('[data-test="sp-routeAverage"]').waitFor()
      // The engine's answer for the same route in SI: 100 ft = 30.48 m, 10 ft = 3.048 m, the default width of 6.5 ft = 1.9812 m.
      const expected = computeSpacing(
        spacingInput.parse({
          photometry: lm63,
          mountingHeight: 3.048,
          emergencyOutputFactor: 0.5,
          maintenanceFactor: 0.8,
          criteria: 'nfpa101',
          routeWidth: 1.9812,
          routeLength: 30.48,
          endOfDurationFactor: 1,
        }),
      )
      const layout = expected.layout!
      expect(await page.locator('[data-test="sp-luminaires"]').textContent()).toBe(String(layout.count))
      expect(await page.locator('[data-test="sp-layoutSpacing"]').textContent()).toBe(formatDisplay('length', 'us', layout.spacingM as number))
      expect(await page.locator('[data-test="sp-layoutSpacing"]').textContent()).toMatch(/ ft$/)
      expect(await page.locator('[data-test="sp-routeAverage"]').textContent()).toBe(formatDisplay('illuminance', 'us', layout.averageLx))
      expect(await page.locator('[data-test="sp-routeAverage"]').textContent()).toMatch(/ fc$/)
      expect(await page.locator('[data-test="sp-routeMin"]').textContent()).toBe(formatDisplay('illuminance', 'us', layout.minLx))
      expect(await page.locator('[data-test="sp-endAverage"]').textContent()).toMatch(/ fc$/)
      expect(await page.locator('[data-test="sp-requiredAverage"]').textContent()).toBe(formatDisplay('illuminance', 'us', 10.8))
      await screenshot(page, 'route-spacing-nfpa-us')
    } finally {
      await b.close()
    }
  })

  it('marks an exit door and a call point, and shows which luminaire serves each, within 2 m', async () => {
    const b = await newBrowser()
    try {
      const { page } = b
      await signInThroughForm(page, app.url, team.users.designer.email, TEST_PASSWORD)
      await page.goto(`${app.url}/route-spacing`)
      await expect.poll(() => page.locator('[data-test="sp-source"]').textContent(), { timeout: 30_000 }).toContain(typeName)
      // The checklist reminds of the usual points, none looked at yet.
      await page.locator('[data-test="sp-checklist"] summary').click()
      expect(await page.locator('[data-test="sp-checklist"] summary').textContent()).toMatch(/10 not looked at yet/)
      await page.locator('[data-test="sp-check-exit-door"] button').click()
      await page.locator('[data-test="sp-point-at-0"] input').fill('30')
      await page.locator('[data-test="sp-check-call-point"] button').click()
      await page.locator('[data-test="sp-point-at-1"] input').fill('12')
      await page.locator('[data-test="sp-point-at-1"] input').blur()
      expect(await page.locator('[data-test="sp-check-exit-door"]').textContent()).toContain('1 marked')
      await page.locator('[data-test="sp-calculate"]').click()
      await page.locator('[data-test="sp-served"]').waitFor()
      const served = await page.locator('[data-test="sp-served"] li').allTextContents()
      expect(served).toHaveLength(2)
      expect(served[0]).toMatch(/^Exit door at 30 m: luminaire \d+ at [\d.]+ m, [\d.]+ m away/)
      expect(served[1]).toMatch(/^Fire alarm call point at 12 m: luminaire \d+/)
      // Every distance shown is within 2 m.
      for (const line of served) expect(Number(/, ([\d.]+) m away/.exec(line)![1])).toBeLessThanOrEqual(2)
      expect(await page.locator('[data-test="diagram-point"]').count()).toBe(2)
      await screenshot(page, 'route-spacing-points')
    } finally {
      await b.close()
    }
  })
})
