import { OpenApiAnswer } from '../../../shared/schemas/answers/system'
import { defineRoute, type RouteSpec } from '../../policy/access'
import { buildOpenApi } from './openapi'

/** GET /api/openapi.json: built once from the final route table (passed in by routes.ts). */
export function docsRoutes(table: () => RouteSpec[]): RouteSpec[] {
  let cached: Record<string, unknown> | null = null
  return [
    defineRoute({
      method: 'get',
      path: '/api/openapi.json',
      access: 'public',
      summary: 'This API described in OpenAPI 3.1',
      response: OpenApiAnswer,
      handler: () => (cached ??= buildOpenApi(table())),
    }),
  ]
}
