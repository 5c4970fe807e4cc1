/**
 * Handover packs: a site frozen on the day it is handed to its owner (completion certificate,
 * register, luminaire types with their photometry, spacing per route, first full-duration tests,
 * the log book's opening page), numbered per site like a sheet's revisions, with read-only links.
 * Every figure comes from the engine; this module gathers, freezes and scopes.
 */
import { In, type EntityManager } from 'typeorm'
import { assessType } from '../../../shared/engine/route-select'
import { lampLumens, peakIntensity } from '../../../shared/engine/photometry-summary'
import { HandoverContentSchema, type HandoverContent, type HandoverRequest } from '../../../shared/schemas/handover.schema'
import { config } from '../../config'
import { dataSource } from '../../data-source'
import { BadRequestError, NotFoundError } from '../../errors/app-error'
import { newToken } from '../../lib/tokens'
import { checkLastDay, openLink } from '../links/read-only-links'
import { recordAudit } from '../audit/audit.service'
import { LuminaireType } from '../photometry/luminaire-type.entity'
import { PhotometricFile } from '../photometry/photometric-file.entity'
import { candidatesOf, routeNeed } from '../photometry/photometry.service'
import { siteStatus, todayIso } from '../register/register.service'
import { siteLogBook, type LogBookEntry } from '../register/tests.service'
import { User } from '../users/user.entity'
import { Workspace } from '../workspaces/workspace.entity'
import { HandoverLink, HandoverPack } from './handover-pack.entity'

const packs = (m: EntityManager = dataSource.manager) => m.getRepository(HandoverPack)
const links = (m: EntityManager = dataSource.manager) => m.getRepository(HandoverLink)

/** How many log-book entries the opening page shows (the rest are in the log book itself). */
const OPENING_ENTRIES = 12

async function typesOf(workspaceId: string, ids: string[]): Promise<LuminaireType[]> {
  const wanted = [...new Set(ids)]
  return wanted.length ? dataSource.getRepository(LuminaireType).find({ where: { workspaceId, id: In(wanted) }, order: { name: 'ASC' } }) : []
}

/** When an entry was recorded (the driver hands a timestamp over as a Date). */
const recordedTime = (e: LogBookEntry) => new Date(e.recordedAt).getTime()

/** The earliest full-duration test of each luminaire since its pack was fitted (its commissioning test). */
function firstDurationTests(luminaires: HandoverContent['luminaires'], log: LogBookEntry[]): HandoverContent['firstDurationTests'] {
  const byTag = new Map<string, LogBookEntry>()
  const fittedOn = new Map(luminaires.map((l) => [l.tag, l.packFittedOn]))
  const chronological = [...log].sort((a, b) => a.testedOn.localeCompare(b.testedOn) || recordedTime(a) - recordedTime(b))
  for (const e of chronological) {
    if (e.kind !== 'duration' || byTag.has(e.tag)) continue
    if (e.testedOn >= (fittedOn.get(e.tag) ?? '')) byTag.set(e.tag, e)
  }
  return luminaires.map((l) => {
    const t = byTag.get(l.tag)
    return {
      tag: l.tag,
      ratedDurationH: l.ratedDurationH,
      testedOn: t?.testedOn ?? null,
      passed: t ? t.passed : null,
      achievedDurationH: t?.achievedDurationH ?? null,
      faults: t?.faults ?? '',
      recordedByName: t?.recordedByName ?? null,
    }
  })
}

/** Gathers the site as it stands today into the pack's frozen content. */
async function gather(workspaceId: string, siteId: string, request: HandoverRequest, today: string): Promise<HandoverContent> {
  const status = await siteStatus(workspaceId, siteId, today)
  // A test recorded in error proves nothing: the pack hands over only valid records.
  const log = (await siteLogBook(workspaceId, siteId, 100_000)).filter((e) => !e.recordedInErrorAt)
  const workspace = await dataSource.getRepository(Workspace).findOneOrFail({ where: { id: workspaceId } })
  const luminaires = status.luminaires.map((l) => ({
    tag: l.tag,
    areaName: l.areaName,
    location: l.location,
    typeLabel: l.typeLabel,
    purpose: l.purpose,
    mode: l.mode,
    ratedDurationH: l.ratedDurationH,
    chemistry: l.chemistry,
    cellsInSeries: l.cellsInSeries,
    capacityAh: l.capacityAh,
    packFittedOn: l.packFittedOn,
  }))
  const typeRows = await typesOf(workspaceId, [
    ...status.luminaires.map((l) => l.luminaireTypeId).filter((x): x is string => !!x),
    ...request.routes.map((r) => r.typeId),
  ])
  const fileIds = typeRows.map((t) => t.photometricFileId).filter((x): x is string => !!x)
  const fileRows = fileIds.length ? await dataSource.getRepository(PhotometricFile).find({ where: { workspaceId, id: In(fileIds) } }) : []
  const filesById = new Map(fileRows.map((f) => [f.id, f]))
  const types = typeRows.map((t) => {
    const f = t.photometricFileId ? filesById.get(t.photometricFileId) : undefined
    const peak = f ? peakIntensity(f.parsed) : null
    return {
      name: t.name,
      modes: t.modes,
      ratedDurationS: t.ratedDurationS,
      chemistry: t.chemistry,
      cellsInSeries: t.cellsInSeries,
      capacityAh: t.capacityAh,
      emergencyPowerW: t.emergencyPowerW,
      emergencyOutputFactor: t.emergencyOutputFactor,
      luminaires: status.luminaires.filter((l) => l.luminaireTypeId === t.id).length,
      photometry:
        f && peak
          ? {
              fileName: f.name,
              edition: f.parsed.header.edition,
              lampLumens: lampLumens(f.parsed.header),
              peakIntensityCd: peak.cd,
              peakAtCDeg: peak.cDeg,
              peakAtGammaDeg: peak.gammaDeg,
              inputWatts: f.parsed.header.inputWatts,
            }
          : null,
    }
  })
  const candidates = new Map((await candidatesOf(workspaceId, typeRows)).map((c) => [c.id, c]))
  const routes = request.routes.map((r) => {
    const need = routeNeed(r.route)
    const a = assessType(need, candidates.get(r.typeId)!)
    return {
      name: r.name,
      typeName: a.name,
      criteria: need.criteria,
      routeLengthM: need.routeLengthM,
      routeWidthM: need.routeWidthM,
      mountingHeightM: need.mountingHeightM,
      ratedDurationS: need.ratedDurationS,
      maintenanceFactor: need.maintenanceFactor,
      meets: a.meets,
      reasons: a.reasons,
      count: a.layout?.count ?? null,
      spacingM: a.layout?.spacingM ?? null,
      endDistanceM: a.layout?.endDistanceM ?? null,
      minLx: a.layout?.minLx ?? null,
      averageLx: a.layout?.averageLx ?? null,
      maxToMin: a.layout?.maxToMin ?? null,
    }
  })
  const opening = [...log].sort((a, b) => a.testedOn.localeCompare(b.testedOn) || recordedTime(a) - recordedTime(b)).slice(0, OPENING_ENTRIES)
  return HandoverContentSchema.parse({
    site: {
      name: status.site.name,
      address: status.site.address,
      responsibleName: status.site.responsibleName,
      responsibleEmail: status.site.responsibleEmail,
      regime: status.site.regime,
    },
    firm: workspace.name,
    certificate: { signedByName: request.signedByName, signedOn: request.signedOn, extent: request.extent, deviations: request.deviations },
    luminaires,
    types,
    routes,
    firstDurationTests: firstDurationTests(luminaires, log),
    logBook: {
      repairWindowDays: status.settings.repairWindowDays,
      totalEntries: log.length,
      firstEntries: opening.map((e) => ({
        testedOn: e.testedOn,
        tag: e.tag,
        kind: e.kind,
        passed: e.passed,
        achievedDurationH: e.achievedDurationH,
        faults: e.faults,
        recordedByName: e.recordedByName,
      })),
    },
  })
}

async function madeBy(ids: Array<string | null>): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))]
  if (!wanted.length) return new Map()
  const rows = await dataSource.getRepository(User).find({ where: { id: In(wanted) }, select: { id: true, name: true } })
  return new Map(rows.map((u) => [u.id, u.name]))
}

function summary(p: HandoverPack, names: Map<string, string>) {
  return {
    id: p.id,
    siteId: p.siteId,
    number: p.number,
    signedByName: p.signedByName,
    signedOn: p.signedOn,
    madeBy: p.createdBy ? { id: p.createdBy, name: names.get(p.createdBy) ?? 'Former member' } : null,
    createdAt: p.createdAt,
  }
}

/** Makes the next pack of a site: the site as it stands today, signed by the named person. */
export async function makePack(workspaceId: string, userId: string, siteId: string, request: HandoverRequest, today = todayIso()) {
  if (request.signedOn > today)
    throw new BadRequestError('The certificate cannot be signed on a day still to come.', [
      { path: 'signedOn', message: `must be today or earlier (today is ${today})` },
    ])
  const content = await gather(workspaceId, siteId, request, today)
  const pack = await dataSource.transaction(async (m) => {
    // One pack number at a time per site: the site row is the lock.
    await m.query('SELECT id FROM sites WHERE id = $1 AND workspace_id = $2 FOR UPDATE', [siteId, workspaceId])
    const [{ next }] = await m.query('SELECT coalesce(max(number), 0) + 1 AS next FROM handover_packs WHERE site_id = $1', [siteId])
    const saved = await packs(m).save(
      packs(m).create({
        workspaceId,
        siteId,
        number: Number(next),
        signedByName: request.signedByName,
        signedOn: request.signedOn,
        content,
        createdBy: userId,
      }),
    )
    await recordAudit(
      { workspaceId, actorId: userId, action: 'handover.made', entityType: 'site', entityId: siteId, data: { packId: saved.id, number: saved.number } },
      m,
    )
    return saved
  })
  return { ...summary(pack, await madeBy([userId])), content }
}

export async function listPacks(workspaceId: string, siteId: string) {
  await siteStatusExists(workspaceId, siteId)
  const rows = await packs().find({
    where: { workspaceId, siteId },
    order: { number: 'DESC' },
    select: { id: true, siteId: true, number: true, signedByName: true, signedOn: true, createdBy: true, createdAt: true },
  })
  const names = await madeBy(rows.map((r) => r.createdBy))
  return { packs: rows.map((r) => summary(r, names)) }
}

async function siteStatusExists(workspaceId: string, siteId: string) {
  const [row] = await dataSource.query('SELECT 1 FROM sites WHERE id = $1 AND workspace_id = $2', [siteId, workspaceId])
  if (!row) throw new NotFoundError('That site')
}

async function findPack(workspaceId: string, siteId: string, number: number): Promise<HandoverPack> {
  const p = await packs().findOne({ where: { workspaceId, siteId, number } })
  if (!p) throw new NotFoundError('That handover pack')
  return p
}

export async function getPack(workspaceId: string, siteId: string, number: number) {
  const p = await findPack(workspaceId, siteId, number)
  return { ...summary(p, await madeBy([p.createdBy])), content: HandoverContentSchema.parse(p.content) }
}

export const handoverUrl = (token: string) => `${config().origin}/h/${encodeURIComponent(token)}`

/** A read-only link to a pack, open until its last day (or until withdrawn). */
export async function createLink(workspaceId: string, userId: string, siteId: string, number: number, expiresOn: string | null, today = todayIso()) {
  const p = await findPack(workspaceId, siteId, number)
  checkLastDay(expiresOn, today)
  const { token, hash } = newToken()
  const link = await links().save(links().create({ workspaceId, packId: p.id, tokenHash: hash, expiresOn, revokedAt: null, createdBy: userId }))
  await recordAudit({
    workspaceId,
    actorId: userId,
    action: 'handover.shared',
    entityType: 'site',
    entityId: siteId,
    data: { packId: p.id, linkId: link.id, expiresOn },
  })
  return { id: link.id, url: handoverUrl(token), token, expiresOn }
}

/** The pack behind a link, for anyone holding the token. */
export async function sharedPack(token: string, today = todayIso()) {
  const link = await openLink(links(), token, today, 'That handover pack')
  const p = await packs().findOne({ where: { id: link.packId, workspaceId: link.workspaceId } })
  if (!p) throw new NotFoundError('That handover pack')
  return {
    number: p.number,
    signedByName: p.signedByName,
    signedOn: p.signedOn,
    createdAt: p.createdAt,
    expiresOn: link.expiresOn,
    content: HandoverContentSchema.parse(p.content),
  }
}
