/**
 * Ids inside request bodies, generated from the route table: for every id field of every route's
 * body schema, another workspace's id and a random id must both answer 404 naming the field, and
 * store nothing. A new UUID field must say which record it refers to (or why it refers to none).
 */
import crypto from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { z } from 'zod'
import type { BuiltApp } from '../../server/app'
import { dataSource } from '../../server/data-source'
import type { RouteSpec } from '../../server/policy/access'
import { idFieldsOf, type ReferenceKind } from '../../shared/schemas/reference'
import { auditIn } from '../helpers/audits'
import { savedLogIn, stagedIn } from '../helpers/discharge-fixtures'
import { photometryIn, typeIn } from '../helpers/photometry'
import { areaIn, siteIn, siteWithLuminaire, testIn } from '../helpers/register-fixtures'
import { sheetIn } from '../helpers/sheets'
import { closeTestApp, getTestApp, makeTeam, signIn, type Client, type TestTeam } from '../helpers/test-app'
import { routeExamples } from './route-examples'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

/** UUID fields that name no record of a workspace, and why. */
const NOT_REFERENCES: Record<string, string> = {
  clientId: 'made by the client so a retried send is recognised',
  workspaceId: 'switching workspace checks membership itself (403/404 in workspaces.test.ts)',
  roundClientId: 'a round is named by the id its client made, like clientId',
}

/** A record of each kind in a workspace: the id another workspace must not be able to use. */
const RECORD_IN: Record<ReferenceKind, (team: TestTeam) => Promise<string>> = {
  site: async (t) => (await siteIn(t.workspaceId)).id,
  area: async (t) => (await areaIn(t.workspaceId, (await siteIn(t.workspaceId)).id)).id,
  luminaire: async (t) => (await siteWithLuminaire(t.workspaceId)).luminaire.id,
  testRecord: async (t) =>
    testIn(t.workspaceId, (await siteWithLuminaire(t.workspaceId)).luminaire.id, { kind: 'duration', testedOn: '2025-01-10', achievedDurationH: 3 }),
  specSheet: async (t) => (await sheetIn(t)).id,
  luminaireType: async (t) => (await typeIn(t, false)).id,
  photometricFile: async (t) => (await photometryIn(t)).id,
  dischargeLog: async (t) => (await savedLogIn(t)).id,
  dischargeFile: async (t) => (await savedLogIn(t)).fileId,
  stagedUpload: async (t) => (await stagedIn(t)).uploadId,
  wattageAudit: async (t) => (await auditIn(t)).id,
}

/** Fields that only make sense together with another (set or removed) when this id is given. */
const COMPANIONS: Record<string, Record<string, Record<string, unknown>>> = {
  'post /api/discharge/logs': { fileId: { uploadId: undefined } },
  'post /api/route-spacing/pick': { sheetId: { version: 1 } },
}

function call(client: Client, route: RouteSpec, path: string, body: unknown) {
  if (route.method === 'post') return client.post(path, body)
  if (route.method === 'put') return client.put(path, body)
  if (route.method === 'patch') return client.patch(path, body)
  throw new Error(`${route.method} with a body`)
}

/** The body with the id field at `path` ("[]" = the first item) set to `id`. */
function withId(body: unknown, path: string[], id: string, companions: Record<string, unknown> = {}): { body: unknown; zodPath: string } {
  const copy = structuredClone(body) as Record<string, unknown>
  const zodPath: Array<string | number> = []
  let node: unknown = copy
  let parent: Record<string, unknown> | null = null
  path.forEach((key, i) => {
    const last = i === path.length - 1
    if (key === '[]') {
      const arr = node as unknown[]
      if (!Array.isArray(arr) || arr.length === 0) throw new Error(`example has no item at ${path.slice(0, i).join('.')}`)
      zodPath.push(0)
      node = arr[0]
      return
    }
    zodPath.push(key)
    const obj = node as Record<string, unknown>
    if (last) {
      obj[key] = id
      parent = obj
    } else node = obj[key]
  })
  for (const [k, v] of Object.entries(companions)) {
    if (v === undefined) delete (parent as unknown as Record<string, unknown>)[k]
    else (parent as unknown as Record<string, unknown>)[k] = v
  }
  return { body: copy, zodPath: zodPath.join('.') }
}

async function rowCounts(): Promise<string> {
  const rows: Array<{ n: string }> = await dataSource.query(
    `SELECT (SELECT count(*) FROM luminaires) + (SELECT count(*) FROM test_records) + (SELECT count(*) FROM discharge_logs)
       + (SELECT count(*) FROM luminaire_types) + (SELECT count(*) FROM wattage_audits) + (SELECT count(*) FROM spec_sheets) AS n`,
  )
  return rows[0].n
}

describe('ids in request bodies, generated from the route schemas', async () => {
  const table = (await getTestApp()).routeTable
  const withBodies = table.filter((r): r is RouteSpec & { body: z.ZodTypeAny } => !!r.body)

  it('every UUID field of every body says which record it names', () => {
    const unexplained = withBodies.flatMap((r) =>
      idFieldsOf(r.body)
        .filter((f) => f.kind === null && !NOT_REFERENCES[f.path[f.path.length - 1]])
        .map((f) => `${r.method} ${r.path}: ${f.path.join('.')}`),
    )
    expect(unexplained).toEqual([])
  })

  it('every route whose example sends an id in its body declares its body schema', async () => {
    const team = await makeTeam('Declared bodies')
    const other = await makeTeam('Declared bodies, other')
    const undeclared: string[] = []
    for (const route of table.filter((r) => r.method !== 'get' && r.method !== 'delete' && !r.body && !r.upload)) {
      const ex = await routeExamples[`${route.method} ${route.path}`]({ team, other, role: 'owner', callerEmail: team.users.owner.email })
      if (JSON.stringify(ex.body ?? {}).match(/"\w+Ids?":/)) undeclared.push(`${route.method} ${route.path}`)
    }
    expect(undeclared).toEqual([])
  })

  for (const route of withBodies) {
    const fields = idFieldsOf(route.body).filter((f) => f.kind !== null)
    const key = `${route.method} ${route.path}`
    for (const field of fields) {
      it(`${key}: ${field.path.join('.')} from another workspace or made up answers 404 naming the field`, async () => {
        const team = await makeTeam('Referring team')
        const other = await makeTeam('Other team')
        const owner = await signIn(built.app, team.users.owner.email)
        const companions = COMPANIONS[key]?.[field.path[field.path.length - 1]]
        const candidates = { foreign: await RECORD_IN[field.kind as ReferenceKind](other), random: crypto.randomUUID() }
        for (const [which, id] of Object.entries(candidates)) {
          const ex = await routeExamples[key]({ team, other, role: 'owner', callerEmail: team.users.owner.email })
          const { body, zodPath } = withId(ex.body, field.path, id, companions)
          const parsed = route.body.safeParse(body)
          expect(parsed.success, `${which}: the example with ${zodPath} set must be valid input: ${JSON.stringify(parsed.error?.issues)}`).toBe(true)
          const before = await rowCounts()
          const res = await call(owner, route, ex.path, body)
          expect(res.status, `${which} ${zodPath}: ${JSON.stringify(res.body)}`).toBe(404)
          expect(res.body.code, which).toBe('not_found')
          expect(res.body.fields, which).toEqual([expect.objectContaining({ path: zodPath })])
          expect(await rowCounts(), `${which}: nothing stored`).toBe(before)
        }
      })
    }
  }
})
