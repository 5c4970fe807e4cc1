/**
 * Every engine tool by name. The CLI (`npm run -s calc -- <tool>`) and `POST /api/calc/<tool>`
 * both look tools up here, so adding a tool here is all it takes to expose it.
 */
import type { EngineTool } from './tool'

// Each tool module registers itself on a line below.
export const tools: Record<string, EngineTool> = {
}

export type ToolName = keyof typeof tools
