import { z } from 'zod'

/** Query of `POST /api/calc/<tool>`. `?working=false`: numbers and warnings without the working steps, for callers that run many cases. */
export const CalcQuerySchema = z.object({ working: z.enum(['true', 'false'], { message: "must be 'true' or 'false'" }).default('true') })
