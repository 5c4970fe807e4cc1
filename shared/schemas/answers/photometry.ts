/** Answers of /api/photometry (LM-63 files), /api/luminaire-types and /api/route-spacing. */
import { z } from 'zod'
import type { RouteNeed, TypeSelection } from '../../engine/route-select'
import { MODES } from '../luminaire.schema'
import { engineShape, PersonSchema, Timestamp } from './common'
import { SheetAnswer } from './sheets'

export const PhotometryFileSummaryAnswer = z.object({
  id: z.string(),
  name: z.string(),
  sha256: z.string(),
  edition: z.string(),
  luminaire: z.string().nullable(),
  verticalCount: z.number().int(),
  horizontalCount: z.number().int(),
  absolute: z.boolean(),
  inputWatts: z.number(),
  createdBy: PersonSchema.nullable(),
  createdAt: Timestamp,
})

/** What is kept of a parsed LM-63 file: the intensity table (cd, multiplier applied) and the header. */
export const ParsedPhotometryAnswer = z.object({
  verticalAngles: z.array(z.number()),
  horizontalAngles: z.array(z.number()),
  /** One row per horizontal angle. */
  candela: z.array(z.array(z.number())),
  header: z.object({
    edition: z.string(),
    keywords: z.record(z.string()),
    tilt: z.string(),
    lamps: z.number(),
    lumensPerLamp: z.number(),
    candelaMultiplier: z.number(),
    unitsType: z.union([z.literal(1), z.literal(2)]),
    width: z.number(),
    length: z.number(),
    height: z.number(),
    ballastFactor: z.number(),
    inputWatts: z.number(),
    absolute: z.boolean(),
  }),
})

export const PhotometryFileAnswer = PhotometryFileSummaryAnswer.extend({
  parsed: ParsedPhotometryAnswer,
  rawText: z.string(),
  /** Luminaire types that use this file. */
  usedBy: z.array(z.object({ id: z.string(), name: z.string() })),
})

export const PhotometryFileListAnswer = z.object({ files: z.array(PhotometryFileSummaryAnswer) })

export const LuminaireTypeAnswer = z.object({
  id: z.string(),
  name: z.string(),
  photometricFileId: z.string().nullable(),
  photometricFileName: z.string().nullable(),
  emergencyOutputFactor: z.number(),
  ratedDurationS: z.number(),
  /** The same rated duration in hours, as the register and the type's request take it. */
  ratedDurationH: z.number(),
  modes: z.array(z.enum(MODES)),
  chemistry: z.string(),
  cellsInSeries: z.number().int(),
  capacityAh: z.number().nullable(),
  emergencyPowerW: z.number(),
  inputPowerW: z.number(),
  notes: z.string(),
  createdAt: Timestamp,
  updatedAt: Timestamp,
})

export const LuminaireTypeListAnswer = z.object({ types: z.array(LuminaireTypeAnswer) })

const Selection = engineShape<TypeSelection>('One luminaire type assessed against the route: verdict, layout, pack and warnings (shared/engine/route-select)')

export const TypeSelectionAnswer = z.object({
  route: engineShape<RouteNeed>('The route as the engine read it, in SI units'),
  results: z.array(Selection),
})

export const PickAnswer = z.object({ sheet: SheetAnswer, selection: Selection })
