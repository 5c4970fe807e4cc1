/** POST /api/calc/:tool runs an engine tool on JSON input, exactly as the CLI does. */
import { ToolListAnswer, ToolRunAnswer } from '../../../shared/schemas/answers/system'
import { z } from 'zod'
import { isToolName, tools } from '../../../shared/engine/registry'
import { assertFinite } from '../../../shared/engine/tool'
import { strictSchema } from '../../../shared/lib/strict-schema'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import { CalcQuerySchema } from '../../../shared/schemas/calc.schema'
import { InvalidInputError } from '../../errors/problem'
import { defineRoute, type RouteSpec } from '../../policy/access'

const ToolParams = z.object({ tool: z.string().refine(isToolName) })

/**
 * Which input schema applies depends on the tool in the path, so the body is checked by that
 * tool's own schema, strictly (its 400 names the tool); the OpenAPI document lists every
 * tool's input schema for this route.
 */
export const ToolInputBody = z.unknown()

// Calculations touch no account or workspace data: API tokens may use them.
export const calcRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get',
    path: '/api/calc',
    response: ToolListAnswer,
    access: 'signed-in',
    tokens: true,
    scope: 'calc',
    summary: 'The engine tools',
    handler: () => ({ engineVersion: ENGINE_VERSION, tools: Object.values(tools).map((t) => ({ name: t.name, summary: t.summary })) }),
  }),
  defineRoute({
    method: 'post',
    path: '/api/calc/:tool',
    response: ToolRunAnswer,
    access: 'signed-in',
    tokens: true,
    scope: 'calc',
    summary: 'Run an engine tool (size, charge, compare, …); ?working=false leaves out the working steps',
    params: ToolParams,
    notFound: (raw) => `The engine tool "${raw.tool}"`,
    query: CalcQuerySchema,
    body: ToolInputBody,
    handler: ({ params, query, body }) => {
      const name = params.tool
      const tool = tools[name]
      // The tool's schema, refusing fields it does not declare (a misspelt input is an error, not ignored).
      const parsed = strictSchema(tool.input).safeParse(body)
      if (!parsed.success) throw new InvalidInputError(parsed.error, 'body', `Invalid input for ${name}`)
      const result = tool.run(parsed.data, { explain: query.working === 'true' })
      assertFinite(result)
      return { tool: name, engineVersion: ENGINE_VERSION, ...result }
    },
  }),
]
