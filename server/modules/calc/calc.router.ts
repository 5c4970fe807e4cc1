/** POST /api/calc/:tool runs an engine tool on JSON input, exactly as the CLI does. */
import type { Request, Response } from 'express'
import { tools } from '../../../shared/engine/registry'
import { runTool } from '../../../shared/engine/tool'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import { CalcQuerySchema } from '../../../shared/schemas/calc.schema'
import { AppError, NotFoundError } from '../../errors/app-error'
import { parse } from '../../lib/parse'
import type { RouteSpec } from '../../policy/access'

async function calc(req: Request, res: Response) {
  const query = parse(CalcQuerySchema, req.query)
  const name = String(req.params.tool)
  const tool = Object.prototype.hasOwnProperty.call(tools, name) ? tools[name] : undefined
  if (!tool) throw new NotFoundError(`The engine tool "${name}"`)
  const outcome = runTool(tool, req.body, { explain: query.working === 'true' })
  if (!outcome.ok) {
    throw new AppError(400, 'invalid_input', `Invalid input for ${name}: ${outcome.fields.slice(0, 3).map((f) => `${f.path} ${f.message}`).join('; ')}`, outcome.fields)
  }
  res.json({ tool: name, engineVersion: ENGINE_VERSION, ...outcome.result })
}

async function listTools(_req: Request, res: Response) {
  res.json({ engineVersion: ENGINE_VERSION, tools: Object.values(tools).map((t) => ({ name: t.name, summary: t.summary })) })
}

export const calcRoutes: RouteSpec[] = [
  { method: 'get', path: '/api/calc', access: 'signed-in', summary: 'The engine tools', handler: listTools },
  { method: 'post', path: '/api/calc/:tool', access: 'signed-in', query: CalcQuerySchema, summary: 'Run an engine tool (size, charge, compare, …); ?working=false leaves out the working steps', handler: calc },
]
