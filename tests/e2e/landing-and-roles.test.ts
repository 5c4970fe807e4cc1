import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { Membership } from '../../server/modules/workspaces/membership.entity'
import { closeTestApp, makeTeam, TEST_PASSWORD, type TestTeam } from '../helpers/test-app'
import { newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'

let app: RunningApp
let team: TestTeam
beforeAll(async () => {
  app = await startE2eApp()
  team = await makeTeam('Browser team')
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

describe('landing page', () => {
  it('says what Lampwright does, in the shipped Source Sans 3 font', async () => {
    const b = await newBrowser()
    try {
      await b.page.goto(app.url)
      await expect.poll(() => b.page.locator('[data-test="pitch"]').textContent()).toMatch(/emergency luminaires/)
      await b.page.evaluate(() => document.fonts.ready)
      const family = await b.page.locator('h1').evaluate((el) => getComputedStyle(el).fontFamily)
      expect(family).toMatch(/Source Sans 3/)
      const loaded = await b.page.evaluate(() => document.fonts.check('16px "Source Sans 3"'))
      expect(loaded).toBe(true)
      // No font or script from another host.
      const foreign = await b.page.evaluate(() =>
        performance
          .getEntriesByType('resource')
          .map((e) => e.name)
          .filter((n) => !n.startsWith(location.origin)),
      )
      expect(foreign).toEqual([])
      await screenshot(b.page, 'landing')
    } finally {
      await b.close()
    }
  })

  it('logs no console error for a signed-out visitor (the session check on load is not a failed request)', async () => {
    const b = await newBrowser()
    const errors: string[] = []
    b.page.on('console', (m) => {
      if (m.type() === 'error') errors.push(`${m.text()} @ ${m.location().url}`)
    })
    try {
      for (const path of ['/', '/sign-in', '/sign-up', '/forgot-password']) {
        await b.page.goto(`${app.url}${path}`)
        await b.page.locator('h1, .n-card-header').first().waitFor()
        await b.page.waitForLoadState('networkidle')
      }
      expect(errors).toEqual([])
    } finally {
      await b.close()
    }
  })
})

describe('roles in the browser', () => {
  it('shows the viewer no invite or role controls, and the owner both', async () => {
    const viewer = await newBrowser()
    try {
      await signInThroughForm(viewer.page, app.url, team.users.viewer.email, TEST_PASSWORD)
      await viewer.page.goto(`${app.url}/team`)
      await viewer.page.locator('[data-test="members"]').waitFor()
      await expect.poll(() => viewer.page.locator('[data-test="members"] tbody tr').count()).toBe(4)
      expect(await viewer.page.locator('[data-test="invite"]').count()).toBe(0)
      expect(await viewer.page.getByRole('button', { name: 'Remove' }).count()).toBe(0)
      await screenshot(viewer.page, 'team-as-viewer')
    } finally {
      await viewer.close()
    }
    const owner = await newBrowser()
    try {
      await signInThroughForm(owner.page, app.url, team.users.owner.email, TEST_PASSWORD)
      await owner.page.goto(`${app.url}/team`)
      await owner.page.locator('[data-test="invite"]').waitFor()
      await expect.poll(() => owner.page.getByRole('button', { name: 'Remove' }).count()).toBe(4)
      await screenshot(owner.page, 'team-as-owner')
    } finally {
      await owner.close()
    }
  })
  it('names the role in words beside each workspace in the switcher and in the header', async () => {
    // The designer of the browser team also reads a second workspace, so the switcher shows.
    const other = await makeTeam('Browser second team')
    await dataSource.getRepository(Membership).insert({ workspaceId: other.workspaceId, userId: team.users.designer.id, role: 'viewer' })
    const b = await newBrowser()
    try {
      await signInThroughForm(b.page, app.url, team.users.designer.email, TEST_PASSWORD)
      const switcher = b.page.locator('.lw-ws')
      await switcher.waitFor()
      const badge = b.page.locator('[data-test="role"]')
      await expect.poll(() => badge.textContent()).toMatch(/^(Designer|Viewer)$/)
      await switcher.click()
      const options = b.page.locator('.n-base-select-option')
      await expect.poll(() => options.count()).toBe(2)
      expect((await options.allTextContents()).map((t) => t.trim()).sort()).toEqual(['Browser second team (Viewer)', 'Browser team (Designer)'])
      await screenshot(b.page, 'workspace-switcher')
    } finally {
      await b.close()
    }
  })
})
