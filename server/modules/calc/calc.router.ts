/** POST /api/calc/:tool runs an engine tool on JSON input, exactly as the CLI does. */
import { ToolListAnswer, ToolRunAnswer } from '../../../shared/schemas/answers/system'
import { z } from 'zod'
import { isToolName, tools } from '../../../shared/engine/registry'
import { runTool } from '../../../shared/engine/tool'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import { CalcQuerySchema } from '../../../shared/schemas/calc.schema'
import { AppError } from '../../errors/app-error'
import { defineRoute, type RouteSpec } from '../../policy/access'

const ToolParams = z.object({ tool: z.string().refine(isToolName) })

/**
 * Which input schema applies depends on the tool in the path, so the body is checked by that
 * tool's own schema inside `runTool` (its 400 names the tool); the OpenAPI document lists every
 * tool's input schema for this route.
 */
export const ToolInputBody = z.unknown()

// Calculations touch no account or workspace data: API tokens may use them.
export const calcRoutes: RouteSpec[] = [
  defineRoute({
    method: 'get', path: '/api/calc', response: ToolListAnswer, access: 'signed-in', tokens: true, summary: 'The engine tools',
    handler: () => ({ engineVersion: ENGINE_VERSION, tools: Object.values(tools).map((t) => ({ name: t.name, summary: t.summary })) }),
  }),
  defineRoute({
    method: 'post', path: '/api/calc/:tool', response: ToolRunAnswer, access: 'signed-in', tokens: true, summary: 'Run an engine tool (size, charge, compare, …); ?working=false leaves out the working steps',
    params: ToolParams, notFound: (raw) => `The engine tool "${raw.tool}"`, query: CalcQuerySchema, body: ToolInputBody,
    handler: ({ params, query, body }) => {
      const name = params.tool
      const outcome = runTool(tools[name], body, { explain: query.working === 'true' })
      if (!outcome.ok) {
        throw new AppError(400, 'invalid_input', `Invalid input for ${name}: ${outcome.fields.slice(0, 3).map((f) => `${f.path} ${f.message}`).join('; ')}`, outcome.fields)
      }
      return { tool: name, engineVersion: ENGINE_VERSION, ...outcome.result }
    },
  }),
]
