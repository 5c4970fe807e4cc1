/**
 * The route contract: every route declares its path parameters, query and body as zod schemas, one
 * middleware checks them before the handler, and a handler that reads a body it did not declare
 * is caught. The first block walks the real route table; the second drives the middleware on
 * small made-up routes, so each rule is seen failing and passing.
 */
import express from 'express'
import supertest from 'supertest'
import { z } from 'zod'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BuiltApp } from '../../server/app'
import { errorHandler } from '../../server/middleware/error-handler'
import { defineRoute, routeChain, takesBody, type RouteSpec } from '../../server/policy/route'
import { sheetBody } from '../helpers/sheets'
import { closeTestApp, getTestApp, makeTeam, signIn } from '../helpers/test-app'

let built: BuiltApp
beforeAll(async () => {
  built = await getTestApp()
})
afterAll(closeTestApp)

const key = (r: RouteSpec) => `${r.method} ${r.path}`

describe('the route table', () => {
  it('declares a body (a schema, or false for none) on every POST, PUT and PATCH route', () => {
    const undeclared = built.routeTable.filter((r) => takesBody(r) && r.body === undefined).map(key)
    expect(undeclared).toEqual([])
  })

  it('declares a params schema naming exactly the path parameters of every route that has some', () => {
    const wrong: string[] = []
    for (const r of built.routeTable) {
      const names = [...r.path.matchAll(/:(\w+)/g)].map((m) => m[1]).sort()
      const declared = r.params ? Object.keys((r.params as z.AnyZodObject).shape ?? {}).sort() : []
      if (names.join(',') !== declared.join(',')) wrong.push(`${key(r)}: path has [${names}], params declare [${declared}]`)
    }
    expect(wrong).toEqual([])
  })

  it('answers a bad query with 400 naming the field (the sheet PDF refuses a revision it cannot read)', async () => {
    const team = await makeTeam('Contract team')
    const designer = await signIn(built.app, team.users.designer.email)
    const made = await designer.post('/api/sheets', sheetBody({ title: 'Contract sheet' }))
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    const res = await designer.get(`/api/sheets/${made.body.id}/pdf?revision=first`)
    expect(res.status).toBe(400)
    expect(res.body.fields).toEqual([expect.objectContaining({ path: 'revision' })])
  })
})

/** A small app with the real middleware and error handler around one made-up route. */
function appWith(route: RouteSpec) {
  const app = express()
  app.use(express.json())
  app[route.method](route.path, ...routeChain(route))
  app.use(errorHandler)
  return supertest(app)
}

describe('the validation middleware', () => {
  const seen: unknown[] = []
  const route = defineRoute({
    method: 'post',
    path: '/api/things/:id',
    access: 'public',
    summary: 'test route',
    params: z.object({ id: z.string().uuid() }),
    query: z.object({ days: z.coerce.number().int().min(1).default(60) }),
    body: z.object({ name: z.string().trim().min(1) }),
    notFound: 'That thing',
    status: 201,
    handler: ({ params, query, body }) => {
      // Typed and parsed: days is a number, name is trimmed.
      seen.push({ id: params.id, days: query.days + 0, name: body.name.toUpperCase() })
      return { ok: true }
    },
  })
  const id = '3f1a2c9e-8d7b-4a6f-9e5d-1c2b3a4d5e6f'

  it('hands the handler parsed values and sends its answer with the declared status', async () => {
    const res = await appWith(route).post(`/api/things/${id}?days=7`).send({ name: '  lamp ' })
    expect(res.status).toBe(201)
    expect(res.body).toEqual({ ok: true })
    expect(seen.at(-1)).toEqual({ id, days: 7, name: 'LAMP' })
  })

  it('answers a malformed id with 404 naming the record, before looking at the body', async () => {
    const res = await appWith(route).post('/api/things/not-an-id').send({})
    expect(res.status).toBe(404)
    expect(res.body.error).toBe('That thing was not found.')
  })

  it('answers a bad query or body with 400 and the fields', async () => {
    const q = await appWith(route).post(`/api/things/${id}?days=0`).send({ name: 'x' })
    expect(q.status).toBe(400)
    expect(q.body.fields).toEqual([expect.objectContaining({ path: 'days' })])
    const b = await appWith(route).post(`/api/things/${id}`).send({ name: '   ' })
    expect(b.status).toBe(400)
    expect(b.body.fields).toEqual([expect.objectContaining({ path: 'name' })])
  })

  it('fails a route whose handler reads a body it did not declare', async () => {
    const sneaky = defineRoute({
      method: 'post',
      path: '/api/sneaky',
      access: 'public',
      summary: 'reads req.body without a schema',
      body: false,
      handler: (_input, req) => ({ got: (req.body as { x?: unknown }).x }),
    })
    const res = await appWith(sneaky).post('/api/sneaky').send({ x: 1 })
    expect(res.status).toBe(500)
  })
})
