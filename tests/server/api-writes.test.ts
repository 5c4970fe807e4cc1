/**
 * Writes an integrator can retry safely: an Idempotency-Key makes a retried POST answer the first
 * answer instead of making a second record (conventions of the IETF httpapi Idempotency-Key
 * draft, from memory), a test record's clientId names one record (other content under it is a
 * 409, RFC 9110 §15.5.10), and a test dated in the future is refused (422, RFC 9110 §15.5.21).
 */
import crypto from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { latestTodayAnywhere } from '../../server/modules/register/tests.service'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'
import { luminaireIn, siteIn } from '../helpers/register-fixtures'

let built: BuiltApp
let team: TestTeam
let designer: Client
let technician: Client
beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Retry team')
  designer = await signIn(built.app, team.users.designer.email)
  technician = await signIn(built.app, team.users.technician.email)
})
afterAll(closeTestApp)

const sitesNamed = async (name: string) =>
  Number((await dataSource.query('SELECT count(*)::int AS n FROM sites WHERE workspace_id = $1 AND name = $2', [team.workspaceId, name]))[0].n)
const siteBody = (name: string) => ({ name, regime: 'en50172', ceilingTemperatureC: 22 })
const today = new Date().toISOString().slice(0, 10)

describe('Idempotency-Key', () => {
  it('makes one site when the same POST is sent twice with one key, and answers the retry with the first answer', async () => {
    const name = `Depot ${crypto.randomUUID()}`
    const key = crypto.randomUUID()
    const first = await designer.post('/api/sites', siteBody(name)).set('Idempotency-Key', key)
    expect(first.status, JSON.stringify(first.body)).toBe(201)
    const again = await designer.post('/api/sites', siteBody(name)).set('Idempotency-Key', key)
    expect(again.status).toBe(201)
    expect(again.headers['idempotent-replayed']).toBe('true')
    expect(again.body).toEqual(first.body)
    expect(await sitesNamed(name)).toBe(1)
  })

  it('treats the same body written in another key order as the same request', async () => {
    const name = `Yard ${crypto.randomUUID()}`
    const key = crypto.randomUUID()
    const body = siteBody(name)
    await designer.post('/api/sites', body).set('Idempotency-Key', key)
    const reordered = Object.fromEntries(Object.entries(body).reverse())
    const again = await designer.post('/api/sites', reordered).set('Idempotency-Key', key)
    expect(again.status).toBe(201)
    expect(await sitesNamed(name)).toBe(1)
  })

  it('refuses a reused key with another body with 422 and makes nothing', async () => {
    const key = crypto.randomUUID()
    const a = `Works ${crypto.randomUUID()}`
    const b = `Works ${crypto.randomUUID()}`
    expect((await designer.post('/api/sites', siteBody(a)).set('Idempotency-Key', key)).status).toBe(201)
    const res = await designer.post('/api/sites', siteBody(b)).set('Idempotency-Key', key)
    expect(res.status).toBe(422)
    expect(res.body).toMatchObject({ code: 'idempotency_key_reused', type: '/api/problems/idempotency_key_reused' })
    expect(res.body.errors).toEqual([expect.objectContaining({ pointer: '/Idempotency-Key', in: 'header' })])
    expect(await sitesNamed(b)).toBe(0)
  })

  it('keeps keys apart per caller: another user with the same key makes their own site', async () => {
    const key = crypto.randomUUID()
    const name = `Shared key ${crypto.randomUUID()}`
    const owner = await signIn(built.app, team.users.owner.email)
    expect((await designer.post('/api/sites', siteBody(name)).set('Idempotency-Key', key)).status).toBe(201)
    const res = await owner.post('/api/sites', siteBody(name)).set('Idempotency-Key', key)
    expect(res.status).toBe(201)
    expect(res.headers['idempotent-replayed']).toBeUndefined()
    expect(await sitesNamed(name)).toBe(2)
  })

  it('refuses a key that is not 1 to 255 visible characters, and a key on a route whose answer holds a secret', async () => {
    const bad = await designer.post('/api/sites', siteBody(`Bad key ${crypto.randomUUID()}`)).set('Idempotency-Key', 'x'.repeat(256))
    expect(bad.status).toBe(400)
    expect(bad.body.errors).toEqual([expect.objectContaining({ pointer: '/Idempotency-Key', in: 'header' })])
    const token = await designer.post('/api/tokens', { name: 'with a key', role: 'viewer' }).set('Idempotency-Key', crypto.randomUUID())
    expect(token.status).toBe(400)
    expect(await dataSource.query('SELECT 1 FROM api_tokens WHERE name = $1 AND user_id = $2', ['with a key', team.users.designer.id])).toHaveLength(0)
  })
})

describe('test records', () => {
  it('answers 409 when a clientId is reused with another body, and leaves the log-book entry as it was', async () => {
    const site = await siteIn(team.workspaceId)
    const lum = await luminaireIn(team.workspaceId, site.id, { tag: 'R-1' })
    const record = { clientId: crypto.randomUUID(), luminaireId: lum.id, kind: 'functional', testedOn: today, passed: true }
    expect((await technician.post('/api/tests', { records: [record] })).status).toBe(201)
    const rewrite = await technician.post('/api/tests', { records: [{ ...record, passed: false, faults: 'Lamp did not light' }] })
    expect(rewrite.status).toBe(409)
    expect(rewrite.body).toMatchObject({ code: 'conflict', status: 409 })
    expect(rewrite.body.errors).toEqual([expect.objectContaining({ pointer: '/records/0/clientId' })])
    const [row] = await dataSource.query('SELECT kind, passed FROM test_records WHERE client_id = $1', [record.clientId])
    expect(row).toEqual({ kind: 'functional', passed: true })
    // The same content again is a harmless retry.
    const retry = await technician.post('/api/tests', { records: [record] })
    expect(retry.status).toBe(200)
    expect(retry.body.records[0].outcome).toBe('unchanged')
  })

  it('refuses a test dated after today with 422 naming the field, and stores nothing of the batch', async () => {
    const site = await siteIn(team.workspaceId)
    const lum = await luminaireIn(team.workspaceId, site.id, { tag: 'F-1' })
    const tomorrowAnywhere = new Date(Date.parse(latestTodayAnywhere()) + 86_400_000).toISOString().slice(0, 10)
    const ok = { clientId: crypto.randomUUID(), luminaireId: lum.id, kind: 'functional', testedOn: today, passed: true }
    const future = { clientId: crypto.randomUUID(), luminaireId: lum.id, kind: 'functional', testedOn: tomorrowAnywhere, passed: true }
    const res = await technician.post('/api/tests', { records: [ok, future] })
    expect(res.status).toBe(422)
    expect(res.body.errors).toEqual([{ pointer: '/records/1/testedOn', code: 'future_date', detail: expect.any(String) }])
    expect(await dataSource.query('SELECT 1 FROM test_records WHERE luminaire_id = $1', [lum.id])).toHaveLength(0)
  })

  it('takes "today" as the latest date anywhere on Earth (UTC+14), so a test just after local midnight is not in the future', () => {
    expect(latestTodayAnywhere(new Date('2026-03-01T09:59:00Z'))).toBe('2026-03-01')
    expect(latestTodayAnywhere(new Date('2026-03-01T10:00:00Z'))).toBe('2026-03-02')
  })
})
