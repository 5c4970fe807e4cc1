/**
 * The handover pack: what a firm gives the building owner at the end of a job. The request names
 * who signs the completion certificate and when, and the escape routes whose spacing the pack
 * shows; the stored pack is a frozen copy of the site as it was on that day, numbered per site
 * like a sheet's revisions, so a later change to the register never changes a pack handed over.
 */
import { z } from 'zod'
import { IsoDateSchema, ChemistrySchema, ModeSchema, PurposeSchema } from './luminaire.schema'
import { RouteNeedSchema, CriteriaSchema } from './photometry.schema'
import { ReadOnlyLinkRequestSchema } from './link.schema'
import { referenceId } from './reference'
import { TestRegimeSchema } from './site.schema'

const text = (max: number) => z.string({ invalid_type_error: 'must be text' }).trim().max(max, `must be at most ${max} characters`)

/** One escape route whose spacing the pack shows: a name, the luminaire type on it, and the route. */
export const HandoverRouteSchema = z.object({
  name: text(120).min(1, 'is required: a name for the route, e.g. "Ground floor corridor"'),
  typeId: referenceId('luminaireType', 'is not a luminaire type id', { required: 'is required' }),
  route: RouteNeedSchema,
})
export type HandoverRouteInput = z.output<typeof HandoverRouteSchema>

export const HandoverRequestSchema = z.object({
  /** The person signing the completion certificate. */
  signedByName: text(120).min(1, 'is required: the name of the person signing the certificate'),
  /** The day they sign it (not after today: a certificate is signed for work done). */
  signedOn: IsoDateSchema,
  /** What the certificate covers, in the firm's words ("the whole of the ground and first floors"). */
  extent: text(2000).default(''),
  /** Where the installation departs from the design or the standard, and why. */
  deviations: text(2000).default(''),
  routes: z.array(HandoverRouteSchema, { invalid_type_error: 'must be a list of routes' }).max(40, 'at most 40 routes in one pack').default([]),
})
export type HandoverRequest = z.output<typeof HandoverRequestSchema>

/** A read-only link to a pack: no expiry means it works until withdrawn. */
export const HandoverLinkRequestSchema = ReadOnlyLinkRequestSchema

// ------------------------------------------------------------------ the stored pack

const PhotometrySummary = z.object({
  fileName: z.string(),
  edition: z.string(),
  /** Lamp lumens of the file (lamps × lumens per lamp); null for absolute photometry. */
  lampLumens: z.number().nullable(),
  peakIntensityCd: z.number(),
  peakAtCDeg: z.number(),
  peakAtGammaDeg: z.number(),
  inputWatts: z.number(),
})

export const HandoverTypeSchema = z.object({
  name: z.string(),
  modes: z.array(ModeSchema),
  ratedDurationS: z.number(),
  chemistry: ChemistrySchema,
  cellsInSeries: z.number(),
  capacityAh: z.number().nullable(),
  emergencyPowerW: z.number(),
  emergencyOutputFactor: z.number(),
  /** How many of the site's luminaires are of this type. */
  luminaires: z.number().int(),
  photometry: PhotometrySummary.nullable(),
})

export const HandoverRouteResultSchema = z.object({
  name: z.string(),
  typeName: z.string(),
  criteria: CriteriaSchema,
  routeLengthM: z.number(),
  routeWidthM: z.number(),
  mountingHeightM: z.number(),
  ratedDurationS: z.number(),
  maintenanceFactor: z.number(),
  meets: z.boolean(),
  reasons: z.array(z.string()),
  count: z.number().int().nullable(),
  spacingM: z.number().nullable(),
  endDistanceM: z.number().nullable(),
  minLx: z.number().nullable(),
  averageLx: z.number().nullable(),
  maxToMin: z.number().nullable(),
})

export const HandoverLuminaireSchema = z.object({
  tag: z.string(),
  areaName: z.string().nullable(),
  location: z.string(),
  typeLabel: z.string(),
  purpose: PurposeSchema,
  mode: ModeSchema,
  ratedDurationH: z.number(),
  chemistry: ChemistrySchema,
  cellsInSeries: z.number(),
  capacityAh: z.number(),
  packFittedOn: z.string(),
})

export const HandoverDurationTestSchema = z.object({
  tag: z.string(),
  ratedDurationH: z.number(),
  /** Null when the luminaire has had no full-duration test since its pack was fitted. */
  testedOn: z.string().nullable(),
  passed: z.boolean().nullable(),
  achievedDurationH: z.number().nullable(),
  faults: z.string(),
  recordedByName: z.string().nullable(),
})

export const HandoverLogEntrySchema = z.object({
  testedOn: z.string(),
  tag: z.string(),
  kind: z.enum(['functional', 'duration']),
  passed: z.boolean(),
  achievedDurationH: z.number().nullable(),
  faults: z.string(),
  recordedByName: z.string().nullable(),
})

export const HandoverContentSchema = z.object({
  site: z.object({ name: z.string(), address: z.string(), responsibleName: z.string(), responsibleEmail: z.string(), regime: TestRegimeSchema }),
  /** The firm (workspace) handing the installation over. */
  firm: z.string(),
  certificate: z.object({ signedByName: z.string(), signedOn: z.string(), extent: z.string(), deviations: z.string() }),
  luminaires: z.array(HandoverLuminaireSchema),
  types: z.array(HandoverTypeSchema),
  routes: z.array(HandoverRouteResultSchema),
  firstDurationTests: z.array(HandoverDurationTestSchema),
  logBook: z.object({ repairWindowDays: z.number(), firstEntries: z.array(HandoverLogEntrySchema), totalEntries: z.number().int() }),
})
export type HandoverContent = z.output<typeof HandoverContentSchema>
