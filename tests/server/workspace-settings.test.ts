/**
 * The workspace's currency: until an owner chooses one it is the usual currency of the first
 * owner's region (US customary units: US dollar; metric: euro; regionDefaults in
 * shared/engine/units.ts, docs/method.md "Regional defaults"); an owner chooses it from the list or
 * goes back to the region's; the session carries it for the screens; anything else is refused.
 */
import type { Express } from 'express'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { dataSource } from '../../server/data-source'
import { CURRENCIES } from '../../shared/schemas/workspace-settings.schema'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'

let app: Express
let team: TestTeam
let owner: Client
let designer: Client

beforeAll(async () => {
  app = (await getTestApp()).app
  team = await makeTeam('Currency team')
  owner = await signIn(app, team.users.owner.email)
  designer = await signIn(app, team.users.designer.email)
})
afterAll(closeTestApp)

describe("the workspace's currency", () => {
  it("is the owner's region's until chosen: euro for metric, US dollar once the owner reads US customary units", async () => {
    const metric = await designer.get('/api/workspace/settings')
    expect(metric.status).toBe(200)
    expect(metric.body).toEqual({ currency: 'EUR', currencyChosen: false, regionCurrency: 'EUR' })
    // Only the owner's units decide, not the reader's.
    await dataSource.query(`UPDATE users SET units = 'us' WHERE id = $1`, [team.users.designer.id])
    expect((await designer.get('/api/workspace/settings')).body.currency).toBe('EUR')
    await dataSource.query(`UPDATE users SET units = 'us' WHERE id = $1`, [team.users.owner.id])
    expect((await designer.get('/api/workspace/settings')).body).toEqual({ currency: 'USD', currencyChosen: false, regionCurrency: 'USD' })
    expect((await owner.get('/api/auth/me')).body.workspace.currency).toBe('USD')
  })

  it('is chosen by an owner from the list, carried by the session, and recorded in the audit trail', async () => {
    const res = await owner.patch('/api/workspace/settings', { currency: 'GBP' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toEqual({ currency: 'GBP', currencyChosen: true, regionCurrency: 'USD' })
    expect((await designer.get('/api/auth/me')).body.workspace.currency).toBe('GBP')
    const [audit] = await dataSource.query(
      `SELECT data FROM audit_events WHERE workspace_id = $1 AND action = 'workspace.settings-updated' ORDER BY at DESC LIMIT 1`,
      [team.workspaceId],
    )
    expect(audit.data).toEqual({ currency: { from: null, to: 'GBP' } })
  })

  it('goes back to the region when set to null', async () => {
    const res = await owner.patch('/api/workspace/settings', { currency: null })
    expect(res.body).toEqual({ currency: 'USD', currencyChosen: false, regionCurrency: 'USD' })
  })

  it('refuses a code off the list, a code in lower case, and a missing field, naming the field; only an owner may change it', async () => {
    for (const currency of ['XYZ', 'gbp', 42]) {
      const res = await owner.patch('/api/workspace/settings', { currency })
      expect(res.status, String(currency)).toBe(400)
      expect(res.body.errors[0].pointer).toBe('/currency')
      expect(res.body.errors[0].detail).toContain(CURRENCIES.join(', '))
    }
    expect((await owner.patch('/api/workspace/settings', {})).status).toBe(400)
    expect((await designer.patch('/api/workspace/settings', { currency: 'EUR' })).status).toBe(403)
    expect((await owner.get('/api/workspace/settings')).body.currencyChosen).toBe(false)
  })

  it("keeps one workspace's choice out of another's", async () => {
    const other = await makeTeam('Other currency team')
    const theirOwner = await signIn(app, other.users.owner.email)
    expect((await theirOwner.patch('/api/workspace/settings', { currency: 'CHF' })).status).toBe(200)
    expect((await owner.get('/api/workspace/settings')).body.currency).toBe('USD')
  })
})
