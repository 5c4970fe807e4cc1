/** The spacing tool's input (zod) and result shapes. */
import { z } from 'zod'
import { finiteNumber, fraction, quantity } from '../fields'
import { checkIntensityTable, type IntensityTable } from '../lm63'
import { parsePhotometricFile, PHOTOMETRIC_FORMAT_NAMES } from '../photometric-file'
import type { EngineWarning, WorkingStep } from '../types'
import type { Requirement } from './criteria'
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
    heights: z.array(quantity('length', { positive: true, min: 0.1, max: 30 })).max(20, 'at most 20 heights').optional(),
    /** NFPA 101 only: share of the initial emergency output left at the end of the rated duration. */
    endOfDurationFactor: fraction().default(1),
  })
  .superRefine((input, ctx) => {
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
