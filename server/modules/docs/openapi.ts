/**
 * The OpenAPI 3.1 description of every /api route, generated from the route table and the same
 * zod schemas that validate requests, so it cannot drift from what the server accepts.
 */
import { zodToJsonSchema } from 'zod-to-json-schema'
import type { ZodTypeAny } from 'zod'
import { tools } from '../../../shared/engine/registry'
import { APP_VERSION } from '../../config'
import type { RouteSpec } from '../../policy/access'

type Json = Record<string, unknown>

function schemaOf(schema: ZodTypeAny): Json {
  const json = zodToJsonSchema(schema, { target: 'openApi3', $refStrategy: 'none', effectStrategy: 'input' }) as Json
  delete json.$schema
  return json
}

const ACCESS_TEXT: Record<string, string> = {
  public: 'No sign-in needed.',
  'signed-in': 'Any signed-in user (session or API token).',
  viewer: 'Role viewer or higher in the current workspace.',
  technician: 'Role technician or higher in the current workspace.',
  designer: 'Role designer or higher in the current workspace.',
  owner: 'Role owner of the current workspace.',
}

const errorResponse = { description: 'Error', content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } }

export function buildOpenApi(routes: RouteSpec[]): Json {
  const paths: Record<string, Json> = {}
  for (const route of routes) {
    const oaPath = route.path.replace(/:(\w+)/g, '{$1}')
    const params = [...route.path.matchAll(/:(\w+)/g)].map((m) => ({
      name: m[1],
      in: 'path',
      required: true,
      schema: m[1] === 'tool' ? { type: 'string', enum: Object.keys(tools) } : { type: 'string' },
    }))
    let requestBody: Json | undefined
    if (route.upload) {
      requestBody = { required: true, content: { 'multipart/form-data': { schema: { type: 'object', properties: { file: { type: 'string', format: 'binary' } } } } } }
    } else if (route.path === '/api/calc/:tool' && route.method === 'post') {
      requestBody = { required: true, content: { 'application/json': { schema: { oneOf: Object.values(tools).map((t) => ({ title: t.name, ...schemaOf(t.input) })) } } } }
    } else if (route.body) {
      requestBody = { required: true, content: { 'application/json': { schema: schemaOf(route.body) } } }
    } else if (route.method !== 'get' && route.method !== 'delete') {
      requestBody = { required: false, content: { 'application/json': { schema: { type: 'object' } } } }
    }
    const query = route.query ? schemaOf(route.query) : null
    const queryParams = query && typeof query.properties === 'object' && query.properties
      ? Object.entries(query.properties as Record<string, Json>).map(([name, schema]) => ({ name, in: 'query', required: false, schema }))
      : []
    const operation: Json = {
      summary: route.summary,
      description: `${ACCESS_TEXT[route.access]} State-changing requests with a session cookie need the X-CSRF-Token header (or a same-origin Origin).`,
      operationId: `${route.method}${oaPath.replace(/[^A-Za-z0-9]+(\w)?/g, (_m, c: string | undefined) => (c ? c.toUpperCase() : ''))}`,
      tags: route.tags ?? [oaPath.split('/')[2] ?? 'api'],
      'x-access': route.access,
      parameters: [...params, ...queryParams],
      responses: {
        '200': { description: 'Success', content: { 'application/json': { schema: { type: 'object' } } } },
        '400': errorResponse,
        ...(route.access === 'public' ? {} : { '401': errorResponse, '403': errorResponse }),
        '404': errorResponse,
      },
      ...(route.access === 'public' ? { security: [] } : {}),
      ...(requestBody ? { requestBody } : {}),
    }
    paths[oaPath] = { ...(paths[oaPath] ?? {}), [route.method]: operation }
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Lampwright API',
      version: APP_VERSION,
      description:
        'Emergency-lighting calculations, specification sheets, site registers and test records. Quantities are numbers in SI base units (temperature in °C) or strings with units such as "120 mA". Results are engineering estimates; local codes and a competent person decide.',
    },
    servers: [{ url: '/' }],
    security: [{ session: [] }, { bearer: [] }],
    components: {
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'lw.sid' },
        bearer: { type: 'http', scheme: 'bearer', description: 'A personal API token (lw_…) made on the account page.' },
      },
      schemas: {
        Error: {
          type: 'object',
          required: ['error'],
          properties: {
            error: { type: 'string' },
            code: { type: 'string' },
            fields: { type: 'array', items: { type: 'object', properties: { path: { type: 'string' }, message: { type: 'string' } } } },
          },
        },
      },
    },
    paths,
  }
}
