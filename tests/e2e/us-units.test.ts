/**
 * The main screens for someone who works in US customary units, on the demo workspace: no metric
 * unit anywhere in the text, the form values or the placeholders (°F, ft, fc, lb, in³ instead of
 * °C, m, lx, kg, L), no A4, and no figure with more digits than the screen's rounding (three
 * significant digits, the figure formatter's rounding, unless a screen declares more below).
 */
import bcrypt from 'bcryptjs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { dataSource } from '../../server/data-source'
import { seedDemo } from '../../server/demo/index'
import { DEMO_USERS } from '../../server/scripts/demo-users'
import { UNIT_SYSTEM_LABELS } from '../../shared/labels'
import { Membership } from '../../server/modules/workspaces/membership.entity'
import { User } from '../../server/modules/users/user.entity'
import { Workspace } from '../../server/modules/workspaces/workspace.entity'
import { newBrowser, screenshot, signInThroughForm, startE2eApp, type RunningApp } from '../helpers/browser'
import { closeTestApp, TEST_PASSWORD, uniqueEmail } from '../helpers/test-app'

let app: RunningApp
let email: string
/** A workspace of the US user's own, where the new-site test saves its site, so the demo keeps its three. */
let ownWorkspaceId: string
beforeAll(async () => {
  app = await startE2eApp()
  await seedDemo(dataSource)
  // A designer of the demo workspace of their own, so the demo users keep their metric preference for other tests.
  const owner = await dataSource.getRepository(User).findOneByOrFail({ email: DEMO_USERS[0].email })
  const { workspaceId } = await dataSource.getRepository(Membership).findOneByOrFail({ userId: owner.id })
  email = uniqueEmail('us-units')
  const user = await dataSource
    .getRepository(User)
    .save(
      dataSource
        .getRepository(User)
        .create({ email, name: 'Imogen Tarrow', passwordHash: await bcrypt.hash(TEST_PASSWORD, 4), units: 'us', emailConfirmedAt: new Date() }),
    )
  await dataSource.getRepository(Membership).insert({ workspaceId, userId: user.id, role: 'owner' })
  const own = await dataSource.getRepository(Workspace).save(dataSource.getRepository(Workspace).create({ name: 'Tarrow scratch' }))
  ownWorkspaceId = own.id
  await dataSource.getRepository(Membership).insert({ workspaceId: own.id, userId: user.id, role: 'owner' })
})
afterAll(async () => {
  await app.close()
  await closeTestApp()
})

/** A number followed by a metric unit ("25 °C", "2.5 m", "1 lx", "0.3 kg", "1.2 L"), or a metric unit in brackets as a field's unit ("(°C)", "(m)"). */
const METRIC = /(?:\d\s?(?:°C|lx|lux|kg|g|mm|cm|km|m|m²|L|mL|litres?|metres?)(?![\w²³])|\((?:°C|lx|kg|m|mm|L)\)|°C\b|(?<![\w-])A4(?![\w-]))/

/** Decimal figures in a text, with the number of significant digits each shows. */
export function figuresIn(text: string): Array<{ figure: string; digits: number }> {
  const out: Array<{ figure: string; digits: number }> = []
  // A figure: digits, one decimal point, digits; not part of a dotted version ("1.4.1"), a time ("12:30") or an id.
  for (const m of text.matchAll(/(?<![\w.:/-])(\d[\d,]*\.\d+)(?![\w.:/]*\d)/g)) {
    const digits = m[1].replace(/[,.]/g, '').replace(/^0+/, '').length
    out.push({ figure: m[1], digits })
  }
  return out
}

/** Screens whose figures are deliberately given to more digits, and why. */
const DECLARED: Record<string, number> = {}

/**
 * The page's text, form values and placeholders; elements that declare their own rounding
 * (data-digits) apart, with it; what an author typed (data-as-entered) left out.
 */
async function textOf(page: Page): Promise<{ text: string; declared: Array<{ text: string; digits: number }> }> {
  return page.evaluate(() => {
    const fields = [...document.querySelectorAll('input, textarea')]
      .filter((e) => (e as HTMLInputElement).type !== 'hidden' && (e as HTMLInputElement).type !== 'password')
      .map((e) => `${(e as HTMLInputElement).value} ${(e as HTMLInputElement).placeholder}`)
    const own = [...document.querySelectorAll<HTMLElement>('[data-digits]')]
    const declared = own.map((e) => ({ text: e.innerText, digits: Number(e.dataset.digits) }))
    // What an author typed (a sheet's inputs "as entered", their description) is their record, shown as written; the reader's units follow it.
    own.push(...document.querySelectorAll<HTMLElement>('[data-as-entered]'))
    const shown = own.map((e) => e.style.display)
    own.forEach((e) => (e.style.display = 'none'))
    const text = `${document.body.innerText}\n${fields.join('\n')}`
    own.forEach((e, i) => (e.style.display = shown[i]))
    return { text, declared }
  })
}

function problemsIn(path: string, text: string, allowed = DECLARED[path] ?? 3): string[] {
  const problems: string[] = []
  for (const line of text.split('\n')) {
    const metric = METRIC.exec(line)
    if (metric) problems.push(`${path}: metric unit "${metric[0]}" in "${line.trim().slice(0, 120)}"`)
    for (const f of figuresIn(line))
      if (f.digits > allowed)
        problems.push(`${path}: ${f.figure} has ${f.digits} significant digits (the screen rounds to ${allowed}) in "${line.trim().slice(0, 120)}"`)
  }
  return problems
}

/** Everything a screen shows, checked: the page at its rounding, each declared element at its own. */
async function screenProblems(page: Page, path: string): Promise<string[]> {
  const { text, declared } = await textOf(page)
  // The account page names both systems so one can be chosen; the metric choice's own label is not a quantity shown.
  const shown = text.split(UNIT_SYSTEM_LABELS.si).join('')
  return [...problemsIn(path, shown), ...declared.flatMap((d) => problemsIn(`${path} [declared ${d.digits} digits]`, d.text, d.digits))]
}

describe('US customary units on the main screens', () => {
  it('finds the figures the check looks at', () => {
    expect(figuresIn('8.2021 ft, 3.4699999999999998 h, 35.00000000000015 °F, 0.093 fc, engine 1.4.1, at 12:30, 2,300.5 lb')).toEqual([
      { figure: '8.2021', digits: 5 },
      { figure: '3.4699999999999998', digits: 17 },
      { figure: '35.00000000000015', digits: 16 },
      { figure: '0.093', digits: 2 },
      { figure: '2,300.5', digits: 5 },
    ])
    expect(problemsIn('/x', 'ceiling about 25 °C')).toHaveLength(1)
    expect(problemsIn('/x', 'Paper: A4')).toHaveLength(1)
    expect(problemsIn('/x', 'WH-A4 at the dock')).toEqual([])
    expect(problemsIn('/x', 'Mounting height (m)')).toHaveLength(1)
    expect(problemsIn('/x', 'Route length 98.4 ft, 3 min, 30 mA, 2 mm')).toHaveLength(1)
    expect(problemsIn('/x', 'Route length 98.4 ft, 3 min, 30 mA, 0.3 lb, 77 °F, Letter')).toEqual([])
  })

  it('render with no metric unit, no A4 and no figure beyond the declared rounding', { timeout: 600_000 }, async () => {
    const b = await newBrowser()
    const problems: string[] = []
    try {
      const { page } = b
      await signInThroughForm(page, app.url, email, TEST_PASSWORD)
      const sites = (await page.evaluate(async () => (await fetch('/api/sites')).json())) as { sites?: Array<{ id: string }>; items?: Array<{ id: string }> }
      const siteId = (sites.sites ?? sites.items ?? [])[0]?.id
      expect(siteId).toBeTruthy()
      const site = (await page.evaluate(async (id) => (await fetch(`/api/sites/${id}`)).json(), siteId)) as { luminaires: Array<{ id: string }> }
      const luminaireId = site.luminaires[0]?.id
      const sheets = (await page.evaluate(async () => (await fetch('/api/sheets')).json())) as { items?: Array<{ id: string }>; sheets?: Array<{ id: string }> }
      const sheetId = (sheets.items ?? sheets.sheets ?? [])[0]?.id
      const logs = (await page.evaluate(async () => (await fetch('/api/discharge/logs')).json())) as {
        items?: Array<{ id: string }>
        logs?: Array<{ id: string }>
      }
      const logId = (logs.items ?? logs.logs ?? [])[0]?.id
      const screens = [
        '/home',
        '/sites',
        `/sites/${siteId}`,
        `/luminaires/${luminaireId}`,
        '/pack-bench',
        '/replace-pack',
        '/charger-check',
        '/claim-check',
        '/route-spacing',
        '/route-spacing/selector',
        '/route-spacing/types',
        '/account',
        '/sheets',
        sheetId ? `/sheets/${sheetId}` : null,
        '/discharge',
        logId ? `/discharge/${logId}` : null,
      ].filter((p): p is string => !!p)
      for (const path of screens) {
        await page.goto(`${app.url}${path}`)
        await page.locator('main h1, #main h1').first().waitFor()
        await page.waitForLoadState('networkidle')
        problems.push(...(await screenProblems(page, path)))
        await screenshot(page, `us-units${path.replace(/\/[0-9a-f-]{36}/g, '-id').replace(/\//g, '-')}`)
        // Every tab of a screen, as a reader would open it.
        const tabs = page.locator('[role="tab"]')
        for (let i = 0; i < (await tabs.count()); i++) {
          await tabs.nth(i).click()
          await page.waitForLoadState('networkidle')
          problems.push(...(await screenProblems(page, `${path} (${(await tabs.nth(i).innerText()).trim()})`)))
        }
      }
    } finally {
      await b.close()
    }
    expect(problems).toEqual([])
  })

  it('the new-site form takes the ceiling temperature in °F, reads a bare number as °F and says so when it cannot read one', { timeout: 300_000 }, async () => {
    const b = await newBrowser()
    try {
      const { page } = b
      await signInThroughForm(page, app.url, email, TEST_PASSWORD)
      // Into the user's own workspace: the demo workspace is read by other files and keeps its three sites.
      const switched = await page.evaluate(async (workspaceId) => {
        const { csrfToken } = (await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string }
        const res = await fetch('/api/workspaces/switch', {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrfToken },
          body: JSON.stringify({ workspaceId }),
        })
        return res.status
      }, ownWorkspaceId)
      expect(switched).toBe(200)
      await page.goto(`${app.url}/sites`)
      await page.locator('[data-test="add-site"]').click()
      const ceiling = page.locator('#site-ceiling')
      await ceiling.waitFor()
      expect(await ceiling.inputValue()).toBe('77')
      expect(await page.locator('label[for="site-ceiling"]').innerText()).toContain('°F')
      await ceiling.fill('eighty')
      await page.getByText('cannot be read: expected a temperature such as "77 °F"').waitFor()
      expect(await ceiling.inputValue()).toBe('eighty')
      await ceiling.fill('200')
      await page.getByText('must be at most 185 °F').waitFor()
      // 80 typed by someone in US units is 80 °F (26.7 °C), never 80 °C: the site is saved with that.
      await ceiling.fill('80')
      await page.locator('#site-name').fill('Harrowgate middle school')
      await page.locator('[data-test="save-site"]').click()
      await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/)
      await page.getByText('ceiling about 80 °F').waitFor()
      const id = page.url().split('/').pop()
      const saved = (await page.evaluate(async (siteId) => (await fetch(`/api/sites/${siteId}`)).json(), id)) as { site: { ceilingTemperatureC: number } }
      expect(saved.site.ceilingTemperatureC).toBeCloseTo(26.6667, 3)
      await screenshot(page, 'us-units-new-site-saved')
    } finally {
      await b.close()
    }
  })
})
