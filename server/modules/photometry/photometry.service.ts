/**
 * Photometric files (LM-63 text kept with its parsed table), the luminaire-type catalogue, and
 * choosing a type for a route. Every calculation is the engine's; this module stores and scopes.
 */
import crypto from 'node:crypto'
import type { EntityManager } from 'typeorm'
import { In, QueryFailedError } from 'typeorm'
import { parsePhotometricFile, PHOTOMETRIC_FORMAT_NAMES } from '../../../shared/engine/photometric-file'
import { assessType, selectTypesForRoute, type RouteNeed, type TypeCandidate } from '../../../shared/engine/route-select'
import { MODE_LABELS } from '../../../shared/labels'
import {
  CRITERIA_LABELS,
  type LuminaireTypeInput,
  type LuminaireTypePatch,
  type PickInput,
  type RouteNeedInput,
} from '../../../shared/schemas/photometry.schema'
import { dataSource } from '../../data-source'
import { BadRequestError, ConflictError, NotFoundError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { admitBytes } from '../storage/storage.service'
import { contentOf, createSheet, getSheet, saveSheet } from '../sheets/sheets.service'
import { User } from '../users/user.entity'
import { LuminaireType } from './luminaire-type.entity'
import { PhotometricFile, type ParsedPhotometry } from './photometric-file.entity'

const files = (m: EntityManager = dataSource.manager) => m.getRepository(PhotometricFile)
const types = (m: EntityManager = dataSource.manager) => m.getRepository(LuminaireType)

const isUniqueViolation = (err: unknown) =>
  err instanceof QueryFailedError && (err as QueryFailedError & { driverError?: { code?: string } }).driverError?.code === '23505'

/** Parses LM-63 or EULUMDAT text; a malformed file is a 400 naming the format and the line, and nothing is stored. */
export function parseUpload(text: string, field = 'text'): ParsedPhotometry {
  // Control characters other than tab and line ends never belong in a photometric file.
  const control = /[\u0000-\u0008\u000b\u000c\u000e-\u001f]/.exec(text)
  if (control) {
    const line = text.slice(0, control.index).split(/\r\n|\r|\n/).length
    throw new BadRequestError(
      `LM-63 file, line ${line}: a control character (code ${control[0].charCodeAt(0)}) is not allowed in an LM-63 file`,
      [{ path: field, message: `line ${line}: a control character is not allowed in an LM-63 file` }],
      { line },
    )
  }
  const result = parsePhotometricFile(text)
  if (!result.ok) {
    const { line, message } = result.error
    const what = PHOTOMETRIC_FORMAT_NAMES[result.format]
    throw new BadRequestError(`${what}, line ${line}: ${message}`, [{ path: field, message: `line ${line}: ${message}` }], { line })
  }
  const p = result.value
  return {
    verticalAngles: p.verticalAngles,
    horizontalAngles: p.horizontalAngles,
    candela: p.candela,
    header: {
      edition: p.edition,
      keywords: p.keywords,
      tilt: p.tilt,
      lamps: p.lamps,
      lumensPerLamp: p.lumensPerLamp,
      candelaMultiplier: p.candelaMultiplier,
      unitsType: p.unitsType,
      width: p.width,
      length: p.length,
      height: p.height,
      ballastFactor: p.ballastFactor,
      inputWatts: p.inputWatts,
      absolute: p.absolute,
    },
  }
}

async function namesOf(ids: Array<string | null>): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))]
  if (!wanted.length) return new Map()
  const rows = await dataSource.getRepository(User).find({ where: { id: In(wanted) }, select: { id: true, name: true } })
  return new Map(rows.map((u) => [u.id, u.name]))
}

function fileSummary(f: PhotometricFile, names: Map<string, string>) {
  const p = f.parsed
  return {
    id: f.id,
    name: f.name,
    sha256: f.sha256,
    edition: p.header.edition,
    luminaire: p.header.keywords.LUMINAIRE ?? null,
    verticalCount: p.verticalAngles.length,
    horizontalCount: p.horizontalAngles.length,
    absolute: p.header.absolute,
    inputWatts: p.header.inputWatts,
    createdBy: f.createdBy ? { id: f.createdBy, name: names.get(f.createdBy) ?? 'Former member' } : null,
    createdAt: f.createdAt,
  }
}

async function findFile(workspaceId: string, id: string, m?: EntityManager): Promise<PhotometricFile> {
  const f = await files(m).findOne({ where: { id, workspaceId } })
  if (!f) throw new NotFoundError('That photometric file')
  return f
}

export async function listFiles(workspaceId: string) {
  const rows = await files().find({
    where: { workspaceId },
    order: { createdAt: 'DESC', id: 'ASC' },
    select: { id: true, workspaceId: true, name: true, sha256: true, parsed: true, createdBy: true, createdAt: true },
  })
  const names = await namesOf(rows.map((r) => r.createdBy))
  return rows.map((r) => fileSummary(r, names))
}

export async function getFile(workspaceId: string, id: string) {
  const f = await findFile(workspaceId, id)
  const names = await namesOf([f.createdBy])
  const used = await types().find({ where: { workspaceId, photometricFileId: f.id }, select: { id: true, name: true }, order: { name: 'ASC' } })
  return { ...fileSummary(f, names), parsed: f.parsed, rawText: f.rawText, usedBy: used.map((t) => ({ id: t.id, name: t.name })) }
}

export async function createFile(workspaceId: string, userId: string, name: string | undefined, text: string, field = 'text') {
  const parsed = parseUpload(text, field)
  const sha256 = crypto.createHash('sha256').update(text, 'utf8').digest('hex')
  const existing = await files().findOne({ where: { workspaceId, sha256 }, select: { id: true, name: true } })
  if (existing) throw new ConflictError(`This file is already stored as "${existing.name}".`, { existingId: existing.id })
  const fallback = parsed.header.keywords.LUMINAIRE?.split('\n')[0] || parsed.header.keywords.LUMCAT || 'Photometric file'
  const finalName = (name?.trim() || fallback).slice(0, 120)
  try {
    return await dataSource.transaction(async (m) => {
      await admitBytes(m, workspaceId, Buffer.byteLength(text, 'utf8'))
      const f = await files(m).save(files(m).create({ workspaceId, name: finalName, rawText: text, sha256, parsed, createdBy: userId }))
      await recordAudit(
        { workspaceId, actorId: userId, action: 'photometry.uploaded', entityType: 'photometric_file', entityId: f.id, data: { name: f.name, sha256 } },
        m,
      )
      return getFileIn(m, f)
    })
  } catch (err) {
    if (isUniqueViolation(err)) throw new ConflictError('This file is already stored in the workspace.')
    throw err
  }
}

async function getFileIn(_m: EntityManager, f: PhotometricFile) {
  const names = await namesOf([f.createdBy])
  return { ...fileSummary(f, names), parsed: f.parsed, rawText: f.rawText, usedBy: [] as Array<{ id: string; name: string }> }
}

export async function deleteFile(workspaceId: string, userId: string, id: string) {
  await dataSource.transaction(async (m) => {
    const f = await findFile(workspaceId, id, m)
    await files(m).delete({ id: f.id, workspaceId })
    await recordAudit(
      { workspaceId, actorId: userId, action: 'photometry.deleted', entityType: 'photometric_file', entityId: f.id, data: { name: f.name, sha256: f.sha256 } },
      m,
    )
  })
}

// ---------------------------------------------------------------------------------------------
// Luminaire types

function typeView(t: LuminaireType, fileNames: Map<string, string>) {
  return {
    id: t.id,
    name: t.name,
    photometricFileId: t.photometricFileId,
    photometricFileName: t.photometricFileId ? (fileNames.get(t.photometricFileId) ?? null) : null,
    emergencyOutputFactor: t.emergencyOutputFactor,
    ratedDurationS: t.ratedDurationS,
    /** The same rated duration in hours, under the name and unit the register uses. */
    ratedDurationH: t.ratedDurationS / 3600,
    modes: t.modes,
    chemistry: t.chemistry,
    cellsInSeries: t.cellsInSeries,
    capacityAh: t.capacityAh,
    emergencyPowerW: t.emergencyPowerW,
    inputPowerW: t.inputPowerW,
    notes: t.notes,
    createdAt: t.createdAt,
    updatedAt: t.updatedAt,
  }
}
export type LuminaireTypeView = ReturnType<typeof typeView>

async function fileNamesOf(workspaceId: string, ids: Array<string | null>, m?: EntityManager) {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))]
  if (!wanted.length) return new Map<string, string>()
  const rows = await files(m).find({ where: { workspaceId, id: In(wanted) }, select: { id: true, name: true } })
  return new Map(rows.map((r) => [r.id, r.name]))
}

async function findType(workspaceId: string, id: string, m?: EntityManager): Promise<LuminaireType> {
  const t = await types(m).findOne({ where: { id, workspaceId } })
  if (!t) throw new NotFoundError('That luminaire type')
  return t
}

function applyType(t: LuminaireType, v: Partial<LuminaireTypeInput>) {
  if (v.name !== undefined) t.name = v.name
  if (v.photometricFileId !== undefined) t.photometricFileId = v.photometricFileId
  if (v.emergencyOutputFactor !== undefined) t.emergencyOutputFactor = v.emergencyOutputFactor
  if (v.ratedDuration !== undefined) t.ratedDurationS = v.ratedDuration
  if (v.modes !== undefined) t.modes = v.modes
  if (v.chemistry !== undefined) t.chemistry = v.chemistry
  if (v.cellsInSeries !== undefined) t.cellsInSeries = v.cellsInSeries
  if (v.capacityAh !== undefined) t.capacityAh = v.capacityAh
  if (v.emergencyPower !== undefined) t.emergencyPowerW = v.emergencyPower
  if (v.inputPower !== undefined) t.inputPowerW = v.inputPower
  if (v.notes !== undefined) t.notes = v.notes
}

const duplicateName = (name: string) => new ConflictError(`A luminaire type called "${name}" already exists in this workspace.`)

export async function listTypes(workspaceId: string) {
  const rows = await types().find({ where: { workspaceId }, order: { name: 'ASC', id: 'ASC' } })
  const names = await fileNamesOf(
    workspaceId,
    rows.map((r) => r.photometricFileId),
  )
  return rows.map((r) => typeView(r, names))
}

export async function getType(workspaceId: string, id: string) {
  const t = await findType(workspaceId, id)
  return typeView(t, await fileNamesOf(workspaceId, [t.photometricFileId]))
}

export async function createType(workspaceId: string, userId: string, input: LuminaireTypeInput) {
  try {
    return await dataSource.transaction(async (m) => {
      const t = types(m).create({ workspaceId, createdBy: userId })
      applyType(t, input)
      await types(m).save(t)
      await recordAudit(
        { workspaceId, actorId: userId, action: 'luminaire-type.created', entityType: 'luminaire_type', entityId: t.id, data: { name: t.name } },
        m,
      )
      return typeView(t, await fileNamesOf(workspaceId, [t.photometricFileId], m))
    })
  } catch (err) {
    if (isUniqueViolation(err)) throw duplicateName(input.name)
    throw err
  }
}

export async function updateType(workspaceId: string, userId: string, id: string, patch: LuminaireTypePatch) {
  try {
    return await dataSource.transaction(async (m) => {
      const t = await findType(workspaceId, id, m)
      applyType(t, patch)
      await types(m).save(t)
      await recordAudit(
        { workspaceId, actorId: userId, action: 'luminaire-type.changed', entityType: 'luminaire_type', entityId: t.id, data: { fields: Object.keys(patch) } },
        m,
      )
      return typeView(t, await fileNamesOf(workspaceId, [t.photometricFileId], m))
    })
  } catch (err) {
    if (isUniqueViolation(err)) throw duplicateName(patch.name ?? '')
    throw err
  }
}

export async function deleteType(workspaceId: string, userId: string, id: string) {
  await dataSource.transaction(async (m) => {
    const t = await findType(workspaceId, id, m)
    await types(m).delete({ id: t.id, workspaceId })
    await recordAudit(
      { workspaceId, actorId: userId, action: 'luminaire-type.deleted', entityType: 'luminaire_type', entityId: t.id, data: { name: t.name } },
      m,
    )
  })
}

// ---------------------------------------------------------------------------------------------
// Choosing a type for a route

export const routeNeed = (r: RouteNeedInput): RouteNeed => ({
  routeLengthM: r.routeLength,
  routeWidthM: r.routeWidth,
  mountingHeightM: r.mountingHeight,
  criteria: r.criteria,
  ratedDurationS: r.ratedDuration,
  maintenanceFactor: r.maintenanceFactor,
  ...(r.normalIlluminance !== undefined ? { normalIlluminanceLx: r.normalIlluminance } : {}),
  ...(r.emergencyOutputFactor !== undefined ? { emergencyOutputFactor: r.emergencyOutputFactor } : {}),
  ...(r.endOfDurationFactor !== undefined ? { endOfDurationFactor: r.endOfDurationFactor } : {}),
})

export async function candidatesOf(workspaceId: string, rows: LuminaireType[]): Promise<TypeCandidate[]> {
  const ids = [...new Set(rows.map((r) => r.photometricFileId).filter((x): x is string => !!x))]
  const tables = ids.length ? await files().find({ where: { workspaceId, id: In(ids) }, select: { id: true, parsed: true } }) : []
  const byId = new Map(tables.map((f) => [f.id, f.parsed]))
  return rows.map((t) => {
    const p = t.photometricFileId ? byId.get(t.photometricFileId) : undefined
    return {
      id: t.id,
      name: t.name,
      table: p ? { verticalAngles: p.verticalAngles, horizontalAngles: p.horizontalAngles, candela: p.candela } : null,
      emergencyOutputFactor: t.emergencyOutputFactor,
      ratedDurationS: t.ratedDurationS,
      chemistry: t.chemistry,
      cellsInSeries: t.cellsInSeries,
      capacityAh: t.capacityAh,
      emergencyPowerW: t.emergencyPowerW,
      inputPowerW: t.inputPowerW,
    }
  })
}

export async function selectTypes(workspaceId: string, route: RouteNeedInput) {
  const rows = await types().find({ where: { workspaceId }, order: { name: 'ASC' } })
  return { route: routeNeed(route), results: selectTypesForRoute(routeNeed(route), await candidatesOf(workspaceId, rows)) }
}

const hoursText = (s: number) => `${Number((s / 3600).toFixed(3))} h`
const fig = (v: number | null, unit: string, digits = 3) => (v === null ? '—' : `${Number(v.toPrecision(digits))} ${unit}`)

/** Puts a type that meets the route on a specification sheet: a new draft, or a new revision of one. */
export async function pickIntoSheet(workspaceId: string, userId: string, input: PickInput) {
  const t = await findType(workspaceId, input.typeId)
  const [candidate] = await candidatesOf(workspaceId, [t])
  const need = routeNeed(input.route)
  const a = assessType(need, candidate)
  if (!a.meets) {
    throw new BadRequestError(`"${t.name}" does not meet this route: ${a.reasons.join('; ')}.`, [
      { path: 'typeId', message: `does not meet the route: ${a.reasons.join('; ')}` },
    ])
  }
  const fileName = t.photometricFileId ? (await fileNamesOf(workspaceId, [t.photometricFileId])).get(t.photometricFileId) : undefined
  const description = [
    `${t.name} (${t.modes.map((m) => MODE_LABELS[m].toLowerCase()).join(' / ')}, rated ${hoursText(t.ratedDurationS)}; the pack on this sheet is sized for the route's ${hoursText(need.ratedDurationS)}), emergency output factor ${a.emergencyOutputFactor.value} (${a.emergencyOutputFactor.from === 'type' ? 'taken from the type' : `typed by the designer over the type's ${a.emergencyOutputFactor.typeValue}`}).`,
    `Route ${fig(need.routeLengthM, 'm')} long, ${fig(need.routeWidthM, 'm')} wide, mounted at ${fig(need.mountingHeightM, 'm')}; ${CRITERIA_LABELS[need.criteria]}, maintenance factor ${need.maintenanceFactor}.`,
    a.layout
      ? `${a.layout.count} luminaires evenly spaced ${fig(a.layout.spacingM, 'm')} apart, ${fig(a.layout.endDistanceM, 'm')} from each end; over the route minimum ${fig(a.layout.minLx, 'lx')}, average ${fig(a.layout.averageLx, 'lx')}, max:min ${fig(a.layout.maxToMin, '')}.`.replace(
          ' .',
          '.',
        )
      : '',
    a.layout?.endOfDuration
      ? `At the end of the rated duration (output × ${a.layout.endOfDuration.factor}): minimum ${fig(a.layout.endOfDuration.minLx, 'lx')}, average ${fig(a.layout.endOfDuration.averageLx, 'lx')}.`
      : '',
    `Standby power of the row ${fig(a.totalStandbyPowerW, 'W')}.`,
    fileName ? `Photometry: ${fileName}.` : '',
  ]
    .filter(Boolean)
    .join('\n')
  // The sheet carries the duration the pack was sized for (the route's) and the type's mode; the
  // maintained-mode mains power belongs only on a luminaire that is lit from the mains.
  const mode = t.modes.includes('maintained') ? 'maintained' : 'non-maintained'
  const inputs: Record<string, unknown> = {
    chemistry: t.chemistry,
    cellsInSeries: t.cellsInSeries,
    duration: hoursText(need.ratedDurationS),
    mode,
    driver: 'converter',
    load: { power: `${t.emergencyPowerW} W`, ...(mode === 'maintained' && t.inputPowerW > 0 ? { mainsPower: `${t.inputPowerW} W` } : {}) },
  }
  const title = input.title?.trim() || `${t.name}: ${CRITERIA_LABELS[need.criteria]}, ${fig(need.routeLengthM, 'm')}`
  let sheet
  if (input.sheetId) {
    const current = await getSheet(workspaceId, input.sheetId)
    const content = contentOf({
      title: input.title?.trim() || current.title,
      reference: current.reference,
      client: current.client,
      site: current.site,
      luminaire: description,
      inputs,
    })
    sheet = await saveSheet(workspaceId, userId, input.sheetId, { ...content, version: input.version as number })
  } else {
    sheet = await createSheet(workspaceId, userId, contentOf({ title, luminaire: description, inputs }))
  }
  await recordAudit({
    workspaceId,
    actorId: userId,
    action: 'luminaire-type.picked',
    entityType: 'luminaire_type',
    entityId: t.id,
    data: { sheetId: sheet.id, luminaires: a.luminairesNeeded },
  })
  return { sheet, selection: a }
}
