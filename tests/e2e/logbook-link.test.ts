/**
 * The demo owner shares a demo site's log book from the site screen; the link is opened in a fresh,
 * signed-out browser, whose page shows the summary in words with figures that match a count made
 * here from the signed-in API (latest test per luminaire from the log book, what is due from the
 * register), with no console error, at 1280 and 375 px. Then the owner withdraws it and the page
 * says so.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { seedDemo } from '../../server/demo/index'
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/scripts/demo-users'
import { newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'
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

interface DueItem {
  state: string
}
interface SiteStatus {
  site: { name: string }
  luminaires: Array<{ id: string; tag: string; due: { functional: DueItem; duration: DueItem; openFailures: unknown[] } }>
}
interface LogEntry {
  luminaireId: string
  testedOn: string
  passed: boolean
  recordedInErrorAt: string | null
  recordedAt: string
}

describe('log book shared by link', () => {
  it('is made by the demo owner and read signed out: summary words and figures, no console error, 1280 and 375 px', { timeout: 300_000 }, async () => {
    const owner = DEMO_USERS.find((u) => u.role === 'owner')!
    const b = await newBrowser()
    try {
      const { page } = b
      await signInThroughForm(page, app.url, owner.email, DEMO_PASSWORD)
      const sites = (await page.evaluate(async () => (await fetch('/api/sites')).json())) as { sites: Array<{ id: string; name: string }> }
      const site = sites.sites[0]
      const status = (await page.evaluate(async (id) => (await fetch(`/api/sites/${id}`)).json(), site.id)) as SiteStatus
      const log = (await page.evaluate(async (id) => (await fetch(`/api/sites/${id}/tests`)).json(), site.id)) as { tests: LogEntry[] }

      // The count by hand: each luminaire's latest valid test (by day, then as recorded), and what is due.
      const latest = new Map<string, LogEntry>()
      for (const t of log.tests.filter((x) => !x.recordedInErrorAt)) {
        const had = latest.get(t.luminaireId)
        if (!had || had.testedOn < t.testedOn || (had.testedOn === t.testedOn && had.recordedAt < t.recordedAt)) latest.set(t.luminaireId, t)
      }
      const items = (l: SiteStatus['luminaires'][number]) => [l.due.functional.state, l.due.duration.state]
      const expected = {
        luminaires: status.luminaires.length,
        // A failure stays open until the rules close it (the site's own status says which are open).
        notPutRight: status.luminaires.filter((l) => l.due.openFailures.length > 0).length,
        inOrder: status.luminaires.filter((l) => latest.has(l.id) && l.due.openFailures.length === 0).length,
        never: status.luminaires.filter((l) => !latest.has(l.id)).length,
        overdue: status.luminaires.filter((l) => items(l).includes('overdue')).length,
        soon: status.luminaires.filter((l) => !items(l).includes('overdue') && items(l).some((s) => s === 'due-now' || s === 'due-soon')).length,
      }
      expect(expected.luminaires).toBeGreaterThan(0)

      await page.goto(`${app.url}/sites/${site.id}`)
      await page.locator('.n-tabs-tab', { hasText: 'Log book' }).click()
      await page.locator('[data-test="logbook-share"]').waitFor()
      await page.locator('[data-test="make-logbook-link"]').click()
      const urlInput = page.locator('[data-test="logbook-link-url"]')
      await urlInput.waitFor()
      const url = await urlInput.inputValue()
      expect(url).toMatch(/\/l\/[\w-]{40,}$/)
      await page.locator('[data-test="logbook-links"] tbody tr').first().waitFor()
      expect(await page.locator('[data-test="logbook-links"]').textContent()).toContain('Active')
      expect(await codesOnScreen(page)).toEqual([])
      await screenshot(page, 'logbook-link-made')

      const visitor = await newBrowser({ width: 1280, height: 860 })
      const consoleErrors: string[] = []
      visitor.page.on('console', (m) => {
        if (m.type() === 'error') consoleErrors.push(m.text())
      })
      visitor.page.on('pageerror', (e) => consoleErrors.push(e.message))
      try {
        const v = visitor.page
        await v.goto(`${app.url}${new URL(url).pathname}`)
        await v.locator('[data-test="logbook-summary"]').waitFor()
        expect(await v.locator('h1').textContent()).toBe(`Log book: ${site.name}`)
        expect(await v.locator('[data-test="shared-regime"]').textContent()).toMatch(/monthly functional test/)
        const figure = async (key: string) => (await v.locator(`[data-test="figure-${key}"]`).textContent())!.replace(/\s+/g, ' ').trim()
        expect(await figure('luminaires')).toBe(`${expected.luminaires} Luminaires`)
        expect(await figure('in-order')).toBe(`${expected.inOrder} Tested, no failure open`)
        expect(await figure('not-put-right')).toBe(`${expected.notPutRight} Failure not yet put right`)
        expect(await figure('never')).toBe(`${expected.never} Never tested`)
        expect(await figure('overdue')).toBe(`${expected.overdue} With a test overdue`)
        expect(await figure('soon')).toBe(`${expected.soon} Due now or within 14 days`)
        const body = (await v.locator('body').textContent())!
        expect(body).toContain('Failures and what became of them')
        expect(body).toContain('Next tests due')
        expect(body).toContain('Isolate the mains')
        expect(await v.locator('[data-test="shared-entries"] tbody tr').count()).toBe(Math.min(log.tests.length, 500))
        expect(await v.locator('[data-test="shared-logbook-pdf"]').getAttribute('href')).toMatch(/\/api\/logbook-links\/.+\/pdf$/)
        expect(await codesOnScreen(v)).toEqual([])
        expect(await splitWords(v)).toEqual([])
        await screenshot(v, 'logbook-shared-1280')
        await v.setViewportSize({ width: 375, height: 760 })
        await v.locator('[data-test="logbook-summary"]').waitFor()
        expect(await splitWords(v)).toEqual([])
        const overflow = await v.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
        expect(overflow).toBeLessThanOrEqual(2)
        await screenshot(v, 'logbook-shared-375')
        expect(consoleErrors).toEqual([])
      } finally {
        await visitor.close()
      }

      // Withdrawn: the same address now says so, signed out.
      await page.locator('[data-test="revoke-logbook-link"]').first().click()
      await page.getByRole('button', { name: 'Confirm' }).click()
      await expect.poll(async () => page.locator('[data-test="logbook-links"] tbody tr').first().textContent()).toContain('Revoked')
      const late = await newBrowser({ width: 375, height: 760 })
      try {
        await late.page.goto(`${app.url}${new URL(url).pathname}`)
        await late.page.locator('[data-test="shared-error"]').waitFor()
        expect(await late.page.locator('[data-test="shared-error"]').textContent()).toContain('withdrawn')
      } finally {
        await late.close()
      }
    } finally {
      await b.close()
    }
  })
})
