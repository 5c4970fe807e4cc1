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
export const tools: Record<string, EngineTool> = {
  size: asTool(sizeTool),
  charge: asTool(chargeTool),
  compare: asTool(compareTool),
  audit: asTool(auditTool),
  retrofit: asTool(retrofitTool),
  discharge: asTool(dischargeTool),
  spacing: asTool(spacingTool),
  replace: asTool(replaceTool),
}

export type ToolName = keyof typeof tools
