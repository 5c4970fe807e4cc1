/**
 * Storage per workspace: stored discharge-log files, photometric files and uploads waiting to be
 * saved count against a quota (507 with a clear answer past it, nothing kept); a staged upload is
 * deleted when saved, and an upload nobody saves is deleted after an hour.
 */
import crypto from 'node:crypto'
import fs from 'node:fs'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { stagingDir, sweepStagedUploads } from '../../server/modules/discharge/discharge.service'
import { COMMA_MAPPING, FAILING, logText, NICD_3H, PASSING } from '../helpers/discharge-fixtures'
import { corridorLm63 } from '../helpers/photometry'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

async function uploadFile(client: Client, text: string, name = 'log.csv') {
  return client.agent.post('/api/discharge/uploads').set('X-CSRF-Token', client.csrf).attach('file', Buffer.from(text), name)
}

const setQuota = (team: TestTeam, bytes: number | null) =>
  dataSource.query('UPDATE workspaces SET storage_quota_bytes = $2 WHERE id = $1', [team.workspaceId, bytes])
const stagedRows = async (team: TestTeam) =>
  Number((await dataSource.query('SELECT count(*)::int AS n FROM staged_uploads WHERE workspace_id = $1', [team.workspaceId]))[0].n)
const onDisk = (uploadId: string) => fs.existsSync(path.join(stagingDir(), `${uploadId}.upload`))

describe('storage quota per workspace', () => {
  it('refuses an upload past the quota with 507 saying what is used, and keeps nothing of it', async () => {
    const team = await makeTeam('Small quota')
    const tech = await signIn(built.app, team.users.technician.email)
    const text = logText(PASSING)
    const size = Buffer.byteLength(text)
    await setQuota(team, Math.round(size * 1.5))
    const first = await uploadFile(tech, text)
    expect(first.status, JSON.stringify(first.body)).toBe(201)
    const filesBefore = fs.readdirSync(stagingDir()).length
    const second = await uploadFile(tech, logText(FAILING))
    expect(second.status, JSON.stringify(second.body)).toBe(507)
    expect(second.body.code).toBe('storage_full')
    expect(second.body.error).toMatch(/uses 0\.\d MB of its 0\.\d MB/)
    expect(second.body.error).toMatch(/uploads waiting to be saved/)
    expect(second.body.fields[0].path).toBe('file')
    expect(fs.readdirSync(stagingDir()).length).toBe(filesBefore)
    expect(await stagedRows(team)).toBe(1)

    const use = await tech.get('/api/workspace/storage')
    expect(use.status).toBe(200)
    expect(use.body).toMatchObject({
      usedBytes: size,
      quotaBytes: Math.round(size * 1.5),
      stagedBytes: size,
      stagedUploads: 1,
      storedLogBytes: 0,
      photometricBytes: 0,
    })
  })

  it('counts stored logs and photometric files too, and refuses a photometric file past the quota', async () => {
    const team = await makeTeam('Stored files count')
    const tech = await signIn(built.app, team.users.technician.email)
    const designer = await signIn(built.app, team.users.designer.email)
    const text = logText(PASSING)
    const size = Buffer.byteLength(text)
    const up = await uploadFile(tech, text)
    const saved = await tech.post('/api/discharge/logs', { uploadId: up.body.uploadId, title: 'Kept', mapping: COMMA_MAPPING, options: NICD_3H })
    expect(saved.status, JSON.stringify(saved.body)).toBe(201)
    const lm63 = corridorLm63()
    await setQuota(team, size + Math.floor(Buffer.byteLength(lm63) / 2))
    const use = (await tech.get('/api/workspace/storage')).body
    expect(use).toMatchObject({ usedBytes: size, storedLogBytes: size, stagedBytes: 0 })
    const res = await designer.post('/api/photometry', { name: 'Too much', text: lm63 })
    expect(res.status, JSON.stringify(res.body)).toBe(507)
    expect(res.body.code).toBe('storage_full')
    expect(Number((await dataSource.query('SELECT count(*)::int AS n FROM photometric_files WHERE workspace_id = $1', [team.workspaceId]))[0].n)).toBe(0)
  })

  it('lets exactly one of two uploads in when there is room for one (any process: a lock in PostgreSQL)', async () => {
    const team = await makeTeam('Two at once')
    const tech = await signIn(built.app, team.users.technician.email)
    const text = logText(PASSING)
    await setQuota(team, Math.round(Buffer.byteLength(text) * 1.5))
    const answers = await Promise.all([uploadFile(tech, text, 'a.csv'), uploadFile(tech, text, 'b.csv'), uploadFile(tech, text, 'c.csv')])
    expect(answers.map((a) => a.status).sort()).toEqual([201, 507, 507])
    expect(await stagedRows(team)).toBe(1)
  })

  it('refuses before reading the body when the workspace is already full', async () => {
    const team = await makeTeam('Already full')
    const tech = await signIn(built.app, team.users.technician.email)
    await setQuota(team, 0)
    const res = await uploadFile(tech, logText(PASSING))
    expect(res.status).toBe(507)
    expect(res.body.code).toBe('storage_full')
  })
})

describe('staged uploads go when saved or abandoned', () => {
  it('deletes the staged file when the log is saved, and an upload nobody saved after an hour', async () => {
    const team = await makeTeam('Staging')
    const tech = await signIn(built.app, team.users.technician.email)
    const up = await uploadFile(tech, logText(PASSING))
    expect(up.status).toBe(201)
    const waits = new Date(up.body.expiresAt).getTime() - Date.now()
    expect(waits).toBeGreaterThan(59 * 60_000)
    expect(waits).toBeLessThanOrEqual(60 * 60_000)
    expect(onDisk(up.body.uploadId)).toBe(true)
    const saved = await tech.post('/api/discharge/logs', { uploadId: up.body.uploadId, title: 'Saved', mapping: COMMA_MAPPING, options: NICD_3H })
    expect(saved.status).toBe(201)
    expect(onDisk(up.body.uploadId)).toBe(false)
    expect(await stagedRows(team)).toBe(0)

    const abandoned = await uploadFile(tech, logText(FAILING))
    expect(abandoned.status).toBe(201)
    // An hour and a minute later.
    await dataSource.query("UPDATE staged_uploads SET created_at = now() - interval '61 minutes', expires_at = now() - interval '1 minute' WHERE id = $1", [
      abandoned.body.uploadId,
    ])
    const counted = (await tech.get('/api/workspace/storage')).body
    expect(counted.stagedBytes).toBe(0)
    expect(await sweepStagedUploads()).toBeGreaterThanOrEqual(1)
    expect(onDisk(abandoned.body.uploadId)).toBe(false)
    const late = await tech.post('/api/discharge/logs', { uploadId: abandoned.body.uploadId, title: 'Too late', mapping: COMMA_MAPPING, options: NICD_3H })
    expect(late.status).toBe(404)
    expect(late.body.fields).toEqual([expect.objectContaining({ path: 'uploadId' })])
    expect(late.body.error).toMatch(/an hour/)
  })

  it('removes a file no upload claims (a transfer cut off half-way) once it is an hour old', async () => {
    const stray = path.join(stagingDir(), `${crypto.randomUUID()}.upload`)
    fs.writeFileSync(stray, 'half a log')
    const old = new Date(Date.now() - 2 * 3600_000)
    fs.utimesSync(stray, old, old)
    await sweepStagedUploads()
    expect(fs.existsSync(stray)).toBe(false)
  })
})
