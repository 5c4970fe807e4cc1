import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import { seedSheets } from '../../server/demo/sheets.demo'
import { AuditEvent } from '../../server/modules/audit/audit-event.entity'
import { ShareLink } from '../../server/modules/sheets/share-link.entity'
import { SpecRevision } from '../../server/modules/sheets/spec-revision.entity'
import { SpecSheet } from '../../server/modules/sheets/spec-sheet.entity'
import { sizePack, sizeInputSchema } from '../../shared/engine/size'
import { hashToken } from '../../server/lib/tokens'
import { pdfText } from '../helpers/pdf-text'
import { PACK_INPUTS, sheetBody } from '../helpers/sheets'
import { anonymous, closeTestApp, getTestApp, mailTo, makeTeam, signIn, uniqueEmail, type Client, type TestTeam } from '../helpers/test-app'

let built: BuiltApp
let team: TestTeam
let designer: Client
let viewer: Client
let technician: Client

beforeAll(async () => {
  built = await getTestApp()
  team = await makeTeam('Sheet team')
  designer = await signIn(built.app, team.users.designer.email)
  viewer = await signIn(built.app, team.users.viewer.email)
  technician = await signIn(built.app, team.users.technician.email)
})
afterAll(closeTestApp)

async function createSheet(client: Client, overrides: Record<string, unknown> = {}) {
  const res = await client.post('/api/sheets', sheetBody(overrides))
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body
}

/** PDF bodies arrive as binary; supertest needs a parser that keeps the bytes. */
type BodyParser = Parameters<ReturnType<Client['get']>['parse']>[0]
const binary = ((res: NodeJS.ReadableStream, done: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = []
  res.on('data', (c: Buffer) => chunks.push(c))
  res.on('end', () => done(null, Buffer.concat(chunks)))
}) as unknown as BodyParser

describe('creating and reading a sheet', () => {
  it('stores the inputs as typed and the engine results computed on the server', async () => {
    const sheet = await createSheet(designer)
    expect(sheet.version).toBe(1)
    expect(sheet.currentRevision).toBe(1)
    expect(sheet.status).toBe('draft')
    expect(sheet.inputs.load.power).toBe('2.5 W')
    expect(sheet.chemistry).toBe('nicd')
    // The server's answer equals the engine run directly on the same inputs.
    const expected = sizePack(sizeInputSchema.parse(PACK_INPUTS))
    expect(sheet.results.requiredCapacityAh).toBeCloseTo(expected.requiredCapacityAh, 12)
    expect(sheet.results.working.map((s: { id: string }) => s.id)).toContain('requiredCapacityAh')
    expect(sheet.engineVersion).toMatch(/^\d+\.\d+\.\d+$/)
    expect(sheet.createdBy.name).toBe('designer person')

    const read = await viewer.get(`/api/sheets/${sheet.id}`)
    expect(read.status).toBe(200)
    expect(read.body.title).toBe('Stair core B, level 2')
  })

  it('refuses inputs the engine refuses, naming the field', async () => {
    const res = await designer.post('/api/sheets', sheetBody({ inputs: { ...PACK_INPUTS, load: { power: '2.5 mA' } } }))
    expect(res.status).toBe(400)
    expect(res.body.fields).toContainEqual(expect.objectContaining({ path: 'inputs.load.power', message: expect.stringMatching(/not a power/) }))
    const noTitle = await designer.post('/api/sheets', sheetBody({ title: '  ' }))
    expect(noTitle.status).toBe(400)
    expect(noTitle.body.fields).toContainEqual({ path: 'title', message: 'is required' })
  })

  it('answers 404 for a missing or malformed id', async () => {
    expect((await viewer.get('/api/sheets/00000000-0000-4000-8000-000000000000')).status).toBe(404)
    expect((await viewer.get('/api/sheets/not-an-id')).status).toBe(404)
  })
})

describe('saving: revisions and optimistic concurrency', () => {
  it('makes a revision per save and lists, opens and compares them', async () => {
    const sheet = await createSheet(designer)
    const saved = await designer.put(`/api/sheets/${sheet.id}`, { ...sheetBody({ title: 'Renamed' }), inputs: { ...PACK_INPUTS, duration: '1 h' }, version: 1 })
    expect(saved.status, JSON.stringify(saved.body)).toBe(200)
    expect(saved.body.version).toBe(2)
    expect(saved.body.currentRevision).toBe(2)
    expect(saved.body.results.requiredCapacityAh).toBeLessThan(sheet.results.requiredCapacityAh)

    const list = await viewer.get(`/api/sheets/${sheet.id}/revisions`)
    expect(list.body.revisions.map((r: { number: number }) => r.number)).toEqual([2, 1])
    const one = await viewer.get(`/api/sheets/${sheet.id}/revisions/1`)
    expect(one.body.title).toBe('Stair core B, level 2')
    expect(one.body.inputs.duration).toBe('3 h')
    expect(one.body.author.name).toBe('designer person')
    expect((await viewer.get(`/api/sheets/${sheet.id}/revisions/9`)).status).toBe(404)
  })

  it('answers a stale save with 409 and the fields that changed', async () => {
    const sheet = await createSheet(designer)
    const first = await designer.put(`/api/sheets/${sheet.id}`, { ...sheetBody({ client: 'Someone else' }), version: 1 })
    expect(first.status).toBe(200)
    const stale = await designer.put(`/api/sheets/${sheet.id}`, { ...sheetBody({ title: 'My edit' }), version: 1 })
    expect(stale.status).toBe(409)
    expect(stale.body.code).toBe('conflict')
    expect(stale.body.currentVersion).toBe(2)
    expect(stale.body.yourVersion).toBe(1)
    expect(stale.body.changes).toEqual([{ field: 'client', before: 'Invented client', after: 'Someone else' }])
    expect(stale.body.changedBy.name).toBe('designer person')
    // Nothing was written by the stale save.
    const now = await viewer.get(`/api/sheets/${sheet.id}`)
    expect(now.body.title).toBe('Stair core B, level 2')
    expect(now.body.currentRevision).toBe(2)
  })

  it('requires the version', async () => {
    const sheet = await createSheet(designer)
    const res = await designer.put(`/api/sheets/${sheet.id}`, sheetBody())
    expect(res.status).toBe(400)
    expect(res.body.fields).toContainEqual({ path: 'version', message: 'is required' })
  })
})

describe('issuing', () => {
  it('freezes the issued revision; a later save is a new draft; the next issue supersedes', async () => {
    const sheet = await createSheet(designer)
    const issued = await designer.post(`/api/sheets/${sheet.id}/issue`, { version: 1 })
    expect(issued.status).toBe(200)
    expect(issued.body).toMatchObject({ status: 'issued', issuedRevision: 1, version: 2 })
    expect((await designer.post(`/api/sheets/${sheet.id}/issue`, { version: 2 })).status).toBe(409)

    const edited = await designer.put(`/api/sheets/${sheet.id}`, { ...sheetBody({ title: 'After issue' }), version: 2 })
    expect(edited.body).toMatchObject({ status: 'draft', currentRevision: 2, issuedRevision: 1, version: 3 })
    const frozen = await viewer.get(`/api/sheets/${sheet.id}/revisions/1`)
    expect(frozen.body).toMatchObject({ status: 'issued', title: 'Stair core B, level 2' })
    expect(frozen.body.issuedBy.name).toBe('designer person')

    const second = await designer.post(`/api/sheets/${sheet.id}/issue`, { version: 3 })
    expect(second.body).toMatchObject({ status: 'issued', issuedRevision: 2 })
    const revs = (await viewer.get(`/api/sheets/${sheet.id}/revisions`)).body.revisions
    expect(revs.map((r: { number: number; status: string }) => [r.number, r.status])).toEqual([
      [2, 'issued'],
      [1, 'superseded'],
    ])
    const audit = await dataSource.getRepository(AuditEvent).find({ where: { entityId: sheet.id, action: 'sheet.issued' } })
    expect(audit).toHaveLength(2)
  })

  it('refuses to issue from a stale version', async () => {
    const sheet = await createSheet(designer)
    await designer.put(`/api/sheets/${sheet.id}`, { ...sheetBody(), version: 1 })
    expect((await designer.post(`/api/sheets/${sheet.id}/issue`, { version: 1 })).status).toBe(409)
  })
})

describe('the list', () => {
  it('paginates, sorts, searches and filters by chemistry, status and author', async () => {
    const own = await makeTeam('List team')
    const d = await signIn(built.app, own.users.designer.email)
    const o = await signIn(built.app, own.users.owner.email)
    for (let i = 1; i <= 5; i++) await createSheet(d, { title: `Corridor ${i}`, reference: `LST-${i}` })
    const lead = await createSheet(o, { title: 'Plant room', inputs: { ...PACK_INPUTS, chemistry: 'lead-acid' } })
    await o.post(`/api/sheets/${lead.id}/issue`, { version: 1 })

    const page1 = await d.get('/api/sheets?page=1&pageSize=2&sort=title&order=asc')
    expect(page1.body.total).toBe(6)
    expect(page1.body.items.map((s: { title: string }) => s.title)).toEqual(['Corridor 1', 'Corridor 2'])
    const page3 = await d.get('/api/sheets?page=3&pageSize=2&sort=title&order=asc')
    expect(page3.body.items.map((s: { title: string }) => s.title)).toEqual(['Corridor 5', 'Plant room'])
    // Each row carries its author and the two pack figures, read from the stored results.
    const plant = page3.body.items[1]
    expect(plant.author.name).toBe('owner person')
    const full = await d.get(`/api/sheets/${lead.id}`)
    expect(plant.selectedCapacityAh).toBe(full.body.results.selectedCapacityAh)
    expect(plant.requiredCapacityAh).toBe(full.body.results.requiredCapacityAh)
    // Past the last page: no rows, and still the total.
    const beyond = await d.get('/api/sheets?page=9&pageSize=2')
    expect(beyond.body.items).toEqual([])
    expect(beyond.body.total).toBe(6)
    const desc = await d.get('/api/sheets?pageSize=1&sort=title&order=desc')
    expect(desc.body.items[0].title).toBe('Plant room')

    expect((await d.get('/api/sheets?q=lst-3')).body.items.map((s: { title: string }) => s.title)).toEqual(['Corridor 3'])
    expect((await d.get('/api/sheets?q=100%25')).body.total).toBe(0)
    expect((await d.get('/api/sheets?chemistry=lead-acid')).body.items.map((s: { title: string }) => s.title)).toEqual(['Plant room'])
    expect((await d.get('/api/sheets?status=issued')).body.total).toBe(1)
    expect((await d.get('/api/sheets?status=draft')).body.total).toBe(5)
    expect((await d.get(`/api/sheets?author=${own.users.owner.id}`)).body.items.map((s: { title: string }) => s.title)).toEqual(['Plant room'])
    const authors = (await d.get('/api/sheets/authors')).body.authors.map((a: { id: string }) => a.id).sort()
    expect(authors).toEqual([own.users.designer.id, own.users.owner.id].sort())

    const bad = await d.get('/api/sheets?pageSize=500&sort=colour')
    expect(bad.status).toBe(400)
    expect(bad.body.fields.map((f: { path: string }) => f.path).sort()).toEqual(['pageSize', 'sort'])
  })

  it('orders every sort key both ways, pages without gaps or repeats, and combines filters', async () => {
    const own = await makeTeam('Order team')
    const d = await signIn(built.app, own.users.designer.email)
    const titles = ['b corridor', 'A stair', 'c plant', 'B lobby', 'a exit']
    for (const [i, title] of titles.entries()) {
      await createSheet(d, { title, reference: `ORD-${5 - i}`, client: `Client ${i % 2}`, inputs: { ...PACK_INPUTS, chemistry: i % 2 ? 'nimh' : 'nicd' } })
    }
    type Row = { id: string; title: string; reference: string; client: string; status: string; chemistry: string; createdAt: string; updatedAt: string }
    const all: Row[] = (await d.get('/api/sheets?pageSize=100')).body.items
    expect(all).toHaveLength(5)
    const keyOf: Record<string, (r: Row) => string> = {
      title: (r) => r.title.toLowerCase(),
      reference: (r) => r.reference.toLowerCase(),
      client: (r) => r.client.toLowerCase(),
      status: (r) => r.status,
      chemistry: (r) => r.chemistry,
      createdAt: (r) => r.createdAt,
      updatedAt: (r) => r.updatedAt,
    }
    for (const [sort, key] of Object.entries(keyOf)) {
      for (const order of ['asc', 'desc']) {
        const pages: Row[] = []
        for (let page = 1; page <= 3; page++) pages.push(...(await d.get(`/api/sheets?pageSize=2&page=${page}&sort=${sort}&order=${order}`)).body.items)
        // Every sheet exactly once across the pages, in the asked order of the key (ties broken by id).
        expect(pages.map((r) => r.id).sort()).toEqual(all.map((r) => r.id).sort())
        const keys = pages.map(key)
        // PostgreSQL's C collation compares bytes, as a plain string comparison does here.
        expect(keys).toEqual([...keys].sort((x, y) => (order === 'asc' ? (x < y ? -1 : x > y ? 1 : 0) : x < y ? 1 : x > y ? -1 : 0)))
      }
    }
    const both = await d.get('/api/sheets?q=ord&chemistry=nimh&status=draft&sort=title&order=asc')
    expect(both.body.items.map((r: Row) => r.title)).toEqual(['A stair', 'B lobby'])
    expect(both.body.total).toBe(2)
    expect((await d.get(`/api/sheets?q=ord&chemistry=nicd&author=${own.users.designer.id}&page=5`)).body).toMatchObject({ items: [], total: 3 })
  })

  it("never lists another workspace's sheets", async () => {
    const elsewhere = await makeTeam('Elsewhere')
    const stranger = await signIn(built.app, elsewhere.users.designer.email)
    await createSheet(stranger, { title: 'Stranger sheet' })
    const res = await designer.get('/api/sheets?q=Stranger&pageSize=100')
    expect(res.body.total).toBe(0)
  })

  it('clones, archives and restores', async () => {
    const sheet = await createSheet(designer, { title: 'To archive' })
    const copy = await designer.post(`/api/sheets/${sheet.id}/clone`)
    expect(copy.status).toBe(201)
    expect(copy.body).toMatchObject({ title: 'Copy of To archive', currentRevision: 1, status: 'draft' })
    expect(copy.body.id).not.toBe(sheet.id)

    expect((await designer.post(`/api/sheets/${sheet.id}/archive`)).body.archivedAt).not.toBeNull()
    const active = (await viewer.get('/api/sheets?q=To archive&pageSize=100')).body.items.map((s: { id: string }) => s.id)
    expect(active).not.toContain(sheet.id)
    const archived = (await viewer.get('/api/sheets?q=To archive&archived=true')).body.items.map((s: { id: string }) => s.id)
    expect(archived).toContain(sheet.id)
    expect((await designer.put(`/api/sheets/${sheet.id}`, { ...sheetBody(), version: 2 })).status).toBe(409)
    expect((await designer.post(`/api/sheets/${sheet.id}/restore`)).body.archivedAt).toBeNull()
    expect((await viewer.get('/api/sheets?q=To archive&pageSize=100')).body.items.map((s: { id: string }) => s.id)).toContain(sheet.id)
  })
})

describe('sharing', () => {
  async function issuedSheet(title = 'Shared stair') {
    const sheet = await createSheet(designer, { title })
    return (await designer.post(`/api/sheets/${sheet.id}/issue`, { version: 1 })).body
  }

  it('needs an issued revision', async () => {
    const sheet = await createSheet(designer)
    const res = await designer.post(`/api/sheets/${sheet.id}/shares`, {})
    expect(res.status).toBe(409)
  })

  it('gives a 128-bit-or-more token stored only as its SHA-256, readable without sign-in', async () => {
    const sheet = await issuedSheet()
    const made = await designer.post(`/api/sheets/${sheet.id}/shares`, {})
    expect(made.status).toBe(201)
    const token: string = made.body.token
    expect(Buffer.from(token, 'base64url').length * 8).toBeGreaterThanOrEqual(128)
    expect(made.body.url).toMatch(new RegExp(`/s/${token}$`))
    const row = await dataSource.getRepository(ShareLink).findOneByOrFail({ id: made.body.id })
    expect(row.tokenHash).toBe(hashToken(token))
    expect(JSON.stringify(row)).not.toContain(token)

    const pub = await anonymous(built.app).get(`/api/shared/${token}`)
    expect(pub.status).toBe(200)
    expect(pub.body).toMatchObject({ title: 'Shared stair', number: 1, status: 'issued' })
    expect(pub.body.issuedAt).toBeTruthy()
    expect(pub.body.cautions.length).toBeGreaterThan(3)
    expect(pub.body).not.toHaveProperty('id')

    const listed = await viewer.get(`/api/sheets/${sheet.id}/shares`)
    expect(listed.body.shares).toEqual([expect.objectContaining({ id: made.body.id, state: 'active' })])
    expect(JSON.stringify(listed.body)).not.toContain(token)
  })

  it('keeps showing the issued revision while a newer draft is open', async () => {
    const sheet = await issuedSheet('Issued title')
    const { token } = (await designer.post(`/api/sheets/${sheet.id}/shares`, {})).body
    await designer.put(`/api/sheets/${sheet.id}`, { ...sheetBody({ title: 'Draft title' }), version: sheet.version })
    const pub = await anonymous(built.app).get(`/api/shared/${token}`)
    expect(pub.body).toMatchObject({ title: 'Issued title', number: 1 })
  })

  it('stops working after its expiry', async () => {
    const sheet = await issuedSheet()
    const past = await designer.post(`/api/sheets/${sheet.id}/shares`, { expiresAt: '2001-01-01T00:00:00Z' })
    expect(past.status).toBe(400)
    expect(past.body.fields).toContainEqual({ path: 'expiresAt', message: 'must be in the future' })
    const made = await designer.post(`/api/sheets/${sheet.id}/shares`, { expiresAt: new Date(Date.now() + 86_400_000).toISOString() })
    expect(made.status).toBe(201)
    expect((await anonymous(built.app).get(`/api/shared/${made.body.token}`)).status).toBe(200)
    // Move the expiry into the past rather than waiting for it.
    await dataSource.getRepository(ShareLink).update({ id: made.body.id }, { expiresAt: new Date(Date.now() - 1000) })
    const gone = await anonymous(built.app).get(`/api/shared/${made.body.token}`)
    expect(gone.status).toBe(410)
    expect(gone.body.error).toMatch(/expired/)
    expect((await anonymous(built.app).get(`/api/shared/${made.body.token}/pdf`)).status).toBe(410)
  })

  it('fails once revoked, and records share and revoke in the audit trail', async () => {
    const sheet = await issuedSheet()
    const made = await designer.post(`/api/sheets/${sheet.id}/shares`, {})
    expect((await designer.delete(`/api/sheets/${sheet.id}/shares/${made.body.id}`)).status).toBe(204)
    const gone = await anonymous(built.app).get(`/api/shared/${made.body.token}`)
    expect(gone.status).toBe(410)
    expect(gone.body.error).toMatch(/withdrawn/)
    expect((await anonymous(built.app).get(`/api/shared/${'x'.repeat(43)}`)).status).toBe(404)
    const actions = (await dataSource.getRepository(AuditEvent).find({ where: { entityId: sheet.id } })).map((a) => a.action)
    expect(actions).toEqual(expect.arrayContaining(['sheet.shared', 'sheet.share-revoked', 'sheet.issued']))
  })

  it('e-mails the link with a message through the mail layer', async () => {
    const sheet = await issuedSheet('Mailed sheet')
    const made = await designer.post(`/api/sheets/${sheet.id}/shares`, {})
    const to = uniqueEmail('client')
    const wrong = await designer.post(`/api/sheets/${sheet.id}/shares/${made.body.id}/email`, { to, message: 'Hi', token: 'y'.repeat(43) })
    expect(wrong.status).toBe(400)
    const res = await designer.post(`/api/sheets/${sheet.id}/shares/${made.body.id}/email`, {
      to,
      message: 'Please check the stair cores.',
      token: made.body.token,
    })
    expect(res.status).toBe(202)
    await expect.poll(() => mailTo(to).length).toBe(1)
    const mail = mailTo(to)[0]
    expect(mail.subject).toContain('Mailed sheet')
    expect(mail.text).toContain('Please check the stair cores.')
    expect(mail.text).toContain(`/s/${made.body.token}`)
  })

  it("writes the link's last day in the e-mail with the month as a word, never as 2031-03-04", async () => {
    const sheet = await issuedSheet('Mailed sheet with an expiry')
    const made = await designer.post(`/api/sheets/${sheet.id}/shares`, { expiresAt: '2031-03-04T12:00:00.000Z' })
    expect(made.status).toBe(201)
    const to = uniqueEmail('client')
    const res = await designer
      .post(`/api/sheets/${sheet.id}/shares/${made.body.id}/email`, { to, message: '', token: made.body.token })
      .set('Accept-Language', 'en-GB')
    expect(res.status).toBe(202)
    await expect.poll(() => mailTo(to).length).toBe(1)
    const mail = mailTo(to)[0]
    expect(mail.text).toContain('4 Mar 2031')
    expect(mail.text).not.toMatch(/\d{4}-\d{2}-\d{2}/)
  })
})

describe('the PDF', () => {
  it('holds the title, the inputs, the required capacity, the working and the cautions', async () => {
    const sheet = await createSheet(designer, { title: 'PDF check sheet' })
    const res = await viewer.get(`/api/sheets/${sheet.id}/pdf`).buffer(true).parse(binary)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toBe('application/pdf')
    expect(res.headers['content-disposition']).toMatch(/PDF-check-sheet-rev1\.pdf/)
    const text = pdfText(res.body as Buffer).replace(/\s+/g, ' ')
    expect(text).toContain('PDF check sheet')
    const required = Number((sheet.results.requiredCapacityAh as number).toPrecision(3))
    expect(text).toContain(`Required rated capacity: ${required} Ah`)
    expect(text).toContain('LED power in emergency mode: 2.5 W')
    expect(text).toContain('C_req = C_P · (1 + m) / (DoD · f_EoL · f_T)')
    expect(text).toContain('Isolate the mains first')
    expect(text).toContain('draft, not issued')
    expect(text).toContain('IEC 60598-2-22, Annex A')
  })

  it('shows the pack to order (voltage, format) and the charger check when the sheet carries the charger', async () => {
    const inputs = {
      chemistry: 'nicd-ht',
      cellsInSeries: 4,
      capacity: '1.6 Ah',
      cellFormat: 'sub-C',
      duration: '3 h',
      mode: 'non-maintained',
      dischargeCurrent: '0.4 A',
      charger: { type: 'nickel-constant-current', chargeCurrent: '120 mA' },
    }
    const sheet = await createSheet(designer, { title: 'Pack and charger sheet', inputs })
    expect(sheet.results.chargerCheck.compatible).toBe('yes')
    const res = await viewer.get(`/api/sheets/${sheet.id}/pdf`).buffer(true).parse(binary)
    const text = pdfText(res.body as Buffer).replace(/\s+/g, ' ')
    expect(text).toContain('Pack to order')
    expect(text).toContain('Nominal pack voltage: 4.8 V')
    expect(text).toContain('Cell format: sub-C')
    expect(text).toContain('Charger check')
    expect(text).toContain('Charger: Nickel charger (constant current, left on)')
    expect(text).toContain('Recharge after a full test')
    expect(text).not.toContain('nickel-constant-current')
  })

  it('is served for a shared link without sign-in', async () => {
    const sheet = await createSheet(designer, { title: 'Public PDF sheet' })
    await designer.post(`/api/sheets/${sheet.id}/issue`, { version: 1 })
    const { token } = (await designer.post(`/api/sheets/${sheet.id}/shares`, {})).body
    const res = await anonymous(built.app).get(`/api/shared/${token}/pdf`).buffer(true).parse(binary)
    expect(res.status).toBe(200)
    const text = pdfText(res.body as Buffer).replace(/\s+/g, ' ')
    expect(text).toContain('Public PDF sheet')
    // The date as people write it, month in words (shared/format), never 2026-12-02 or 12/2/2026.
    expect(text).toMatch(/Revision 1 · issued \d{1,2} [A-Z][a-z]{2} \d{4}/)
  })
})

describe('roles', () => {
  it('lets viewers and technicians read but not create, save, issue or share', async () => {
    const sheet = await createSheet(designer)
    for (const reader of [viewer, technician]) {
      expect((await reader.get('/api/sheets')).status).toBe(200)
      expect((await reader.get(`/api/sheets/${sheet.id}`)).status).toBe(200)
      expect((await reader.post('/api/sheets', sheetBody())).status).toBe(403)
      expect((await reader.put(`/api/sheets/${sheet.id}`, { ...sheetBody(), version: 1 })).status).toBe(403)
      expect((await reader.post(`/api/sheets/${sheet.id}/issue`, { version: 1 })).status).toBe(403)
      expect((await reader.post(`/api/sheets/${sheet.id}/shares`, {})).status).toBe(403)
      expect((await reader.post(`/api/sheets/${sheet.id}/archive`)).status).toBe(403)
    }
    const owner = await signIn(built.app, team.users.owner.email)
    expect((await owner.put(`/api/sheets/${sheet.id}`, { ...sheetBody(), version: 1 })).status).toBe(200)
    expect((await anonymous(built.app).get('/api/sheets')).status).toBe(401)
  })
})

describe('demo sheets', () => {
  it('seeds issued sheets with revisions once, however often it runs', async () => {
    const demo = await makeTeam('Demo copy')
    const ctx = {
      workspaceId: demo.workspaceId,
      users: { owner: demo.users.owner.id, designer: demo.users.designer.id, technician: demo.users.technician.id, viewer: demo.users.viewer.id },
    }
    await dataSource.transaction((m) => seedSheets(m, ctx))
    await dataSource.transaction((m) => seedSheets(m, ctx))
    const rows = await dataSource.getRepository(SpecSheet).find({ where: { workspaceId: demo.workspaceId }, order: { reference: 'ASC' } })
    expect(rows.map((r) => [r.reference, r.status, r.currentRevision, r.issuedRevision])).toEqual([
      ['QTL-EM-03', 'issued', 2, 2],
      ['SDS-EM-02', 'issued', 1, 1],
      ['WCR-EM-11', 'draft', 2, 1],
    ])
    expect(rows.every((r) => r.createdBy === demo.users.designer.id)).toBe(true)
    const library = await dataSource.getRepository(SpecRevision).find({ where: { sheetId: rows[0].id }, order: { number: 'ASC' } })
    expect(library.map((r) => r.status)).toEqual(['superseded', 'issued'])
    // The cold warehouse is sized with less than full capacity available at −15 °C.
    const cold = (rows[1].results.working as Array<{ id: string; result: { value: number } }>).find((w) => w.id === 'coldCapacityFactor')
    expect(cold?.result.value).toBeLessThan(1)
  })
})
