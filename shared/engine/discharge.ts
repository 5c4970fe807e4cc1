/**
 * The `discharge` tool: a logged full-duration discharge test as JSON in, the analysis out. The
 * analysis itself works on typed arrays (`analyseDischarge`, discharge-analysis.ts); the decision
 * rules (cut-off hold, drop-out from current or voltage, evidence of load) are in discharge-events.ts.
 */
import { z } from 'zod'
import { chemistryIdSchema } from './battery-inputs'
import { analyseDischarge } from './discharge-analysis'
import type { DischargeResult } from './discharge-types'
import { finiteNumber, quantity } from './fields'
import { defineTool } from './tool'

export { analyseDischarge } from './discharge-analysis'
export type * from './discharge-types'

// ---------------------------------------------------------------------------------------------
// The tool: JSON samples in, the same analysis out.

// Bounds that no logger reading reaches: t up to 1e11 s (a date-time in seconds since 1970 fits),
// pack voltage and current within ±10 kV and ±10 kA.
const sampleSchema = z.object({
  t: finiteNumber({ min: -1e11, max: 1e11 }),
  v: finiteNumber({ min: -1e4, max: 1e4 }),
  i: finiteNumber({ min: -1e4, max: 1e4 }).optional(),
})

export const dischargeInput = z
  .object({
    samples: z.array(sampleSchema).min(2, 'needs at least two samples'),
    chemistry: chemistryIdSchema,
    cellsInSeries: finiteNumber({ int: true, min: 1, max: 400 }),
    cutoffPerCell: quantity('voltage', { positive: true, max: 5 }).optional(),
    ratedDuration: quantity('time', { positive: true, max: 7 * 24 * 3600, display: { unit: 'h', factor: 1 / 3600 } }),
    ratedCapacity: quantity('charge', { positive: true }).optional(),
    thresholdsPerCell: z
      .array(quantity('voltage', { positive: true, max: 5 }))
      .max(20, 'at most 20 thresholds')
      .optional(),
    assumedPower: quantity('power', { positive: true }).optional(),
    assumedResistance: quantity('resistance', { positive: true }).optional(),
  })
  .superRefine((input, ctx) => {
    if (input.assumedPower !== undefined && input.assumedResistance !== undefined) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['assumedResistance'], message: 'give an assumed power or an assumed resistance, not both' })
    }
    const withCurrent = input.samples.filter((s) => s.i !== undefined).length
    if (withCurrent > 0 && withCurrent < input.samples.length) {
      const k = input.samples.findIndex((s) => s.i === undefined)
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['samples', k, 'i'], message: 'give the current on every sample or on none' })
    }
  })

export type DischargeInput = z.output<typeof dischargeInput>

export function runDischarge(input: DischargeInput): DischargeResult {
  const n = input.samples.length
  const t = new Float64Array(n)
  const v = new Float64Array(n)
  const hasCurrent = input.samples[0].i !== undefined
  const i = hasCurrent ? new Float64Array(n) : undefined
  input.samples.forEach((s, k) => {
    t[k] = s.t
    v[k] = s.v
    if (i) i[k] = s.i ?? 0
  })
  const outcome = analyseDischarge({ t, v, i }, input)
  // The schema has already checked everything analyseDischarge checks.
  if (!outcome.ok) throw new Error(`discharge: ${outcome.fields.map((f) => `${f.path} ${f.message}`).join('; ')}`)
  return outcome.result
}

export const dischargeTool = defineTool({
  name: 'discharge',
  summary: 'Analyse a logged full-duration discharge test: runtime to cut-off or dropout, delivered Ah and Wh, pass or fail.',
  input: dischargeInput,
  run: runDischarge,
})
