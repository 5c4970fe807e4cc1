/** The spacing tool's input (zod) and result shapes. */
import { z } from 'zod'
import { finiteNumber, fraction, quantity } from '../fields'
import { checkIntensityTable, type IntensityTable } from '../lm63'
import { parsePhotometricFile, PHOTOMETRIC_FORMAT_NAMES } from '../photometric-file'
import type { EngineWarning, WorkingStep } from '../types'
import type { Requirement } from './criteria'
import { EMPHASIS_KINDS } from './emphasis-points'
import type { RouteLayout } from './layout'

const intensityTableInput = z.object({
  verticalAngles: z.array(finiteNumber()).min(1, 'needs at least one vertical angle'),
  horizontalAngles: z.array(finiteNumber()).min(1, 'needs at least one horizontal angle'),
  candela: z.array(z.array(finiteNumber({ min: 0 }))).min(1, 'needs at least one row of candela values'),
})

const photometryInput = z
  .union([z.string(), intensityTableInput], {
    errorMap: () => ({ message: 'must be the text of an LM-63 (.ies) or EULUMDAT (.ldt) file, or { verticalAngles, horizontalAngles, candela }' }),
  })
  .transform((raw, ctx): { table: IntensityTable; absolute: boolean | null; name: string | null } => {
    if (typeof raw === 'string') {
      const parsed = parsePhotometricFile(raw)
      if (!parsed.ok) {
        ctx.addIssue({ code: z.ZodIssueCode.custom, message: `${PHOTOMETRIC_FORMAT_NAMES[parsed.format]}, line ${parsed.error.line}: ${parsed.error.message}` })
        return z.NEVER
      }
      return { table: parsed.value, absolute: parsed.value.absolute, name: parsed.value.keywords.LUMINAIRE ?? null }
    }
    const problem = checkIntensityTable(raw)
    if (problem) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, message: problem.message, path: problem.path })
      return z.NEVER
    }
    return { table: raw, absolute: null, name: null }
  })

const emphasisPointInput = z
  .object({
    kind: z.enum(EMPHASIS_KINDS, { errorMap: () => ({ message: `must be one of ${EMPHASIS_KINDS.map((k) => `'${k}'`).join(', ')}` }) }),
    at: quantity('length', { min: 0, max: 2000 }),
    name: z.string().trim().max(80, 'at most 80 characters').optional(),
  })
  .strict()

export const spacingInput = z
  .object({
    photometry: photometryInput,
    // Lower bounds keep the solver's grids finite (a vanishing height or width has no meaning here).
    mountingHeight: quantity('length', { positive: true, min: 0.1, max: 30 }),
    emergencyOutputFactor: fraction(),
    maintenanceFactor: fraction().default(0.8),
    criteria: z.enum(['en1838-route', 'en1838-open-area', 'en1838-high-risk', 'nfpa101'], {
      errorMap: () => ({ message: "must be one of 'en1838-route', 'en1838-open-area', 'en1838-high-risk', 'nfpa101'" }),
    }),
    routeWidth: quantity('length', { positive: true, min: 0.1, max: 100 }),
    normalIlluminance: quantity('illuminance', { positive: true, max: 100000 }).optional(),
    routeLength: quantity('length', { positive: true, min: 0.1, max: 2000 }).optional(),
    cPlane: finiteNumber({ min: 0, max: 360 }).default(0),
    heights: z
      .array(quantity('length', { positive: true, min: 0.1, max: 30 }))
      .max(20, 'at most 20 heights')
      .optional(),
    /** NFPA 101 only: share of the initial emergency output left at the end of the rated duration. */
    endOfDurationFactor: fraction().default(1),
    /** Points along the route that need a luminaire within 2 m (exit doors, stairs, call points, …). */
    points: z.array(emphasisPointInput).max(100, 'at most 100 points').optional(),
  })
  .superRefine((input, ctx) => {
    if (input.points?.length && input.routeLength === undefined) {
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: ['routeLength'],
        message: 'is required when points along the route are marked (they are placed by their distance from its start)',
      })
    }
    input.points?.forEach((p, i) => {
      if (input.routeLength !== undefined && p.at > input.routeLength + 1e-9) {
        ctx.addIssue({
          code: z.ZodIssueCode.custom,
          path: ['points', i, 'at'],
          message: `is beyond the end of the route (${Number(input.routeLength.toPrecision(6))} m long)`,
        })
      }
    })
    if (input.criteria === 'en1838-high-risk' && input.normalIlluminance === undefined) {
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: ['normalIlluminance'],
        message: 'is required for a high-risk task area (the emergency level is 10 % of it, at least 15 lx)',
      })
    }
  })

export type SpacingInput = z.output<typeof spacingInput>

export interface SpacingTableRow {
  mountingHeightM: number
  maxSpacingM: number | null
  maxEndSpacingM: number | null
  minIlluminanceLx: number | null
  uniformityRatio: number | null
  luminairesNeeded?: number | null
}

export interface SpacingResult {
  maxSpacingM: number | null
  maxEndSpacingM: number | null
  minIlluminanceLx: number | null
  maxIlluminanceLx: number | null
  averageIlluminanceLx: number | null
  uniformityRatio: number | null
  requirement: Requirement
  profile: Array<{ x: number; lux: number }>
  spacingTable: SpacingTableRow[]
  luminairesNeeded?: number | null
  /** With a route length: the fewest luminaires evenly spaced along it (null when no even row passes). */
  layout?: RouteLayout | null
  warnings: EngineWarning[]
  working: WorkingStep[]
}
