/** Answers of the routes about the service itself: health, the engine tools, the API document. */
import { z } from 'zod'

export const HealthAnswer = z.object({
  /** ok; busy when every database connection is in use; degraded when the database does not answer. */
  status: z.enum(['ok', 'busy', 'degraded']),
  version: z.string(),
  engineVersion: z.string(),
  database: z.enum(['reachable', 'unreachable', 'busy']),
})

export const ToolListAnswer = z.object({
  engineVersion: z.string(),
  tools: z.array(z.object({ name: z.string(), summary: z.string() })),
})

/** A tool's result: which tool and engine version, then the tool's own figures, working and warnings. */
export const ToolRunAnswer = z.object({ tool: z.string(), engineVersion: z.string() }).passthrough()

/** This API described in OpenAPI 3.1. */
export const OpenApiAnswer = z.record(z.unknown()).describe('An OpenAPI 3.1 document')
