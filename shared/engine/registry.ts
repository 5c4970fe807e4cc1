/**
 * Every engine tool by name. The CLI (`npm run -s calc -- <tool>`) and `POST /api/calc/<tool>`
 * both look tools up here, so adding a tool here is all it takes to expose it.
 */
import type { EngineTool, ToolResultBase } from './tool'
import type { z } from 'zod'
import { sizeTool } from './size'
import { chargeTool } from './charge'
import { compareTool } from './compare'
import { auditTool } from './audit'
import { retrofitTool } from './retrofit'
import { dischargeTool } from './discharge'
import { spacingTool } from './spacing'
import { replaceTool } from './replace'

/** A tool with its own schema and result types, widened for the by-name table (run's input type makes EngineTool invariant in S). */
const asTool = <S extends z.ZodTypeAny, R extends ToolResultBase>(tool: EngineTool<S, R>): EngineTool => tool as unknown as EngineTool

// Each tool module registers itself on a line below.
export const tools = {
  size: asTool(sizeTool),
  charge: asTool(chargeTool),
  compare: asTool(compareTool),
  audit: asTool(auditTool),
  retrofit: asTool(retrofitTool),
  discharge: asTool(dischargeTool),
  spacing: asTool(spacingTool),
  replace: asTool(replaceTool),
} satisfies Record<string, EngineTool>

/** The name of an engine tool: "size", "charge", … (a typo is a type error). */
export type ToolName = keyof typeof tools

export const TOOL_NAMES = Object.keys(tools) as ToolName[]

/** True for the name of a tool (own keys only, so "constructor" is no tool). */
export function isToolName(name: string): name is ToolName {
  return Object.prototype.hasOwnProperty.call(tools, name)
}
