/** The trickle retrofit's input: one zod schema for the API, the CLI and the planner form. */
import { z } from 'zod'
import { CHEMISTRY_IDS, getChemistry } from './chemistries'
import { finiteNumber, quantity } from './fields'
import { fitChargerThevenin } from './retrofit-model'

// ---------------------------------------------------------------------------------------------
// Input
// ---------------------------------------------------------------------------------------------

const secondReadingInput = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('test-resistor'),
      /** Known resistance added in series for the reading, Ω. */
      resistance: quantity('resistance', { positive: true }),
      /** Charge current measured with it in place, A. */
      current: quantity('current', { positive: true }),
    }),
    z.object({
      kind: z.literal('open-circuit'),
      /** Charger output voltage with the battery disconnected, V. */
      voltage: quantity('voltage', { positive: true }),
    }),
  ],
  { errorMap: () => ({ message: 'must be { kind: "test-resistor", resistance, current } or { kind: "open-circuit", voltage }' }) },
)

export const retrofitInput = z
  .object({
    chemistry: z.enum(CHEMISTRY_IDS, { errorMap: () => ({ message: `must be one of ${CHEMISTRY_IDS.join(', ')}` }) }),
    cellsInSeries: finiteNumber({ int: true, min: 1, max: 60 }),
    /** Rated capacity (e.g. "4 Ah"); a bare number is read in coulombs (A·s). */
    capacity: quantity('charge', { positive: true }),
    /** Present trickle current, measured with the pack at full charge. */
    trickleCurrent: quantity('current', { positive: true }),
    /** Pack voltage at full charge with the present trickle current flowing. */
    batteryVoltage: quantity('voltage', { positive: true }),
    secondReading: secondReadingInput,
    targetTrickleRateC: finiteNumber({ positive: true, max: 1 }).optional(),
    targetTrickleCurrent: quantity('current', { positive: true }).optional(),
    /** When true (default) the plan must lower the current. */
    reduce: z.boolean({ invalid_type_error: 'must be true or false' }).default(true),
    diodeForwardVoltage: quantity('voltage', { positive: true, max: 2 }).optional(),
    diodeType: z.enum(['silicon', 'schottky'], { errorMap: () => ({ message: 'must be "silicon" or "schottky"' }) }).optional(),
    /** Battery current in emergency operation. */
    dischargeCurrent: quantity('current', { positive: true }),
    /** Rated duration (e.g. "3 h"); a bare number is read in seconds. */
    duration: quantity('time', { positive: true }),
    /** Current below which the charge indicator goes out, if known. */
    chargeIndicatorThreshold: quantity('current', { positive: true }).optional(),
  })
  .superRefine((input, ctx) => {
    // Fields that failed their own checks already carry an error; cross-checks need them all sound.
    const numbers = [input.cellsInSeries, input.capacity, input.trickleCurrent, input.batteryVoltage, ...Object.values(input.secondReading)]
    if (numbers.some((v) => typeof v !== 'string' && !(typeof v === 'number' && Number.isFinite(v)))) return
    const chemistry = getChemistry(input.chemistry)
    const emptyV = chemistry.cutoffCellVoltage.value * input.cellsInSeries
    if (input.batteryVoltage <= emptyV) {
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: ['batteryVoltage'],
        message: `is at or below the cut-off voltage of ${input.cellsInSeries} ${chemistry.name} cells (${Number(emptyV.toPrecision(4))} V), so it cannot be a full-charge reading; check cellsInSeries and chemistry`,
      })
    }
    const fit = fitChargerThevenin(input.trickleCurrent, input.batteryVoltage, input.secondReading)
    if (!fit.ok) ctx.addIssue({ code: z.ZodIssueCode.custom, path: fit.path, message: fit.message })

    const hasRate = input.targetTrickleRateC !== undefined
    const hasCurrent = input.targetTrickleCurrent !== undefined
    if (hasRate === hasCurrent) {
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: [hasRate ? 'targetTrickleRateC' : 'targetTrickleCurrent'],
        message: hasRate ? 'give either targetTrickleRateC or targetTrickleCurrent, not both' : 'give the target as targetTrickleCurrent or targetTrickleRateC',
      })
      return
    }
    const target = input.targetTrickleCurrent ?? (input.targetTrickleRateC as number) * (input.capacity / 3600)
    if (input.reduce && target > input.trickleCurrent) {
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: [hasRate ? 'targetTrickleRateC' : 'targetTrickleCurrent'],
        message: `asks for ${Number((target * 1000).toPrecision(4))} mA, above the present ${Number((input.trickleCurrent * 1000).toPrecision(4))} mA; a series resistor can only lower the current (set reduce to false to check a plan anyway)`,
      })
    }
  })

export type RetrofitInput = z.output<typeof retrofitInput>
