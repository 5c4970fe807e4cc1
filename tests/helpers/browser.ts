/** End-to-end helpers: the real app on a random loopback port, driven in Debian's Chromium. */
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import type { Server } from 'node:http'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { createApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { getTestApp, ROOMY_LIMITS } from './test-app'

export const ARTIFACTS = path.resolve('test-artifacts')

export interface RunningApp {
  url: string
  close(): Promise<void>
}

/** Serves the built client and the API on 127.0.0.1 with a free port. */
export async function startE2eApp(): Promise<RunningApp> {
  await getTestApp()
  const built = createApp({ clientDir: path.resolve('dist'), signInWindowMs: 60_000, limits: ROOMY_LIMITS })
  const server: Server = await new Promise((resolve) => {
    const s = built.app.listen(0, '127.0.0.1', () => resolve(s))
  })
  const port = (server.address() as { port: number }).port
  return {
    url: `http://127.0.0.1:${port}`,
    close: async () => {
      server.closeAllConnections()
      await new Promise((r) => server.close(() => r(undefined)))
      await built.close()
      void dataSource
    },
  }
}

const ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-dev-shm-usage',
]

/** A fresh browser profile (no cookies): each call is a separate person. */
export async function newBrowser(viewport = { width: 1280, height: 860 }): Promise<{ context: BrowserContext; page: Page; close: () => Promise<void> }> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-chromium-'))
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ARGS,
    viewport,
    acceptDownloads: true,
  })
  // A busy CI machine can take a while to render; wait longer than Playwright's 30 s default.
  context.setDefaultTimeout(90_000)
  const page = context.pages()[0] ?? (await context.newPage())
  return {
    context,
    page,
    close: async () => {
      await context.close()
      fs.rmSync(dir, { recursive: true, force: true })
    },
  }
}

export async function screenshot(page: Page, name: string) {
  fs.mkdirSync(ARTIFACTS, { recursive: true })
  await page.screenshot({ path: path.join(ARTIFACTS, `${name}.png`), fullPage: true })
}

export async function signInThroughForm(page: Page, baseUrl: string, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`)
  await page.locator('#sign-in-email').fill(email)
  await page.locator('#sign-in-password').fill(password)
  await page.locator('[data-test="sign-in-submit"]').click()
  await page.waitForURL(/\/home/)
}

/**
 * Types into a field and makes sure it holds the text: on a busy machine a late re-render can land
 * between the fill and the next step, which a person would notice and retype.
 */
export async function fillField(page: Page, selector: string, text: string) {
  const input = page.locator(selector)
  for (let attempt = 0; attempt < 3; attempt++) {
    await input.fill(text)
    if ((await input.inputValue()) === text) return
  }
  throw new Error(`${selector} would not hold ${JSON.stringify(text)}`)
}

/**
 * Opens a naive-ui select by clicking `trigger`, picks the option showing `text`, and makes sure
 * the select now shows it (a click that lands while the menu is still animating in can be lost;
 * a person would see the empty select and pick again).
 */
export async function chooseOption(page: Page, trigger: string, text: string) {
  for (let attempt = 0; attempt < 3; attempt++) {
    await page.locator(trigger).click()
    await page.locator('.n-base-select-option', { hasText: text }).first().click()
    // A focused filterable select hides its label; leave it to read what it took.
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur())
    try {
      await page.waitForFunction(
        ([sel, want]) => {
          const el = document.querySelector(sel)
          return (el?.closest('.n-select') ?? el)?.textContent?.includes(want) ?? false
        },
        [trigger, text] as const,
        { timeout: 5_000 },
      )
      return
    } catch {
      await page.keyboard.press('Escape')
    }
  }
  throw new Error(`the select ${trigger} would not take ${JSON.stringify(text)}`)
}
