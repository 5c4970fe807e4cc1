/**
 * Sites and luminaires of the register, and what is due on them (areas: areas.service.ts; the
 * workspace's log-book settings: register-settings.service.ts). Every query is scoped by
 * workspace; another workspace's id answers "not found". The due rules and the battery forecast
 * come from the engine (shared/engine/due.ts); nothing is computed here.
 */
import type { EntityManager } from 'typeorm'
import { z } from 'zod'
import {
  countDue,
  dueWithin,
  forecastPack,
  luminaireDue,
  needingAttention,
  REGIMES,
  type DueItem,
  type LuminaireDue,
  type PackForecast,
  type TestEvent,
} from '../../../shared/engine/due'
import type { SitePatchSchema, SiteSchema } from '../../../shared/schemas/site.schema'
import type { LuminairePatchSchema, LuminaireSchema, PackReplacementSchema } from '../../../shared/schemas/luminaire.schema'
import { regimeProfile } from '../../../shared/engine/regimes'
import { dataSource } from '../../data-source'
import { AppError, BadRequestError, NotFoundError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { AreaEntity } from './area.entity'
import { LuminaireEntity } from './luminaire.entity'
import { SiteEntity } from './site.entity'
import { recordRegimeChange, regimeHistory } from './regime-history.service'
import { registerSettings, type RegisterSettings } from './register-settings.service'

export { DEFAULT_REMINDERS, registerSettings, updateRegisterSettings, type RegisterSettings, type ReminderRole } from './register-settings.service'

/** Today's calendar day in UTC, the day the due rules are evaluated on. */
export const todayIso = (): string => new Date().toISOString().slice(0, 10)

export const isUniqueViolation = (err: unknown) =>
  (err as { driverError?: { code?: string }; code?: string })?.driverError?.code === '23505' || (err as { code?: string })?.code === '23505'

// ---------------------------------------------------------------- sites

export function siteDto(s: SiteEntity) {
  return {
    id: s.id,
    name: s.name,
    address: s.address,
    responsibleName: s.responsibleName,
    responsibleEmail: s.responsibleEmail,
    regime: s.regime,
    ceilingTemperatureC: s.ceilingTemperatureC,
    createdAt: s.createdAt,
    updatedAt: s.updatedAt,
  }
}
export type SiteDto = ReturnType<typeof siteDto>

export async function findSite(workspaceId: string, id: string, m: EntityManager = dataSource.manager): Promise<SiteEntity> {
  const site = await m.getRepository(SiteEntity).findOne({ where: { id, workspaceId } })
  if (!site) throw new NotFoundError('That site')
  return site
}

export async function createSite(workspaceId: string, actorId: string, input: z.output<typeof SiteSchema>) {
  return dataSource.transaction(async (m) => {
    const site = await m.getRepository(SiteEntity).save(m.getRepository(SiteEntity).create({ ...input, workspaceId }))
    await recordRegimeChange(m, workspaceId, site.id, actorId, null, site.regime)
    await recordAudit(
      { workspaceId, actorId, action: 'site.created', entityType: 'site', entityId: site.id, data: { name: site.name, regime: site.regime } },
      m,
    )
    return siteDto(site)
  })
}

export async function updateSite(workspaceId: string, actorId: string, id: string, patch: z.output<typeof SitePatchSchema>) {
  return dataSource.transaction(async (m) => {
    const site = await findSite(workspaceId, id, m)
    const { regimeChangeReason, ...fields } = patch
    const changes = changedFields(site as unknown as Record<string, unknown>, fields)
    const fromRegime = site.regime
    Object.assign(site, fields)
    await m.getRepository(SiteEntity).save(site)
    if (changes.regime) await recordRegimeChange(m, workspaceId, id, actorId, fromRegime, site.regime, regimeChangeReason ?? '')
    await recordAudit({ workspaceId, actorId, action: 'site.updated', entityType: 'site', entityId: id, data: { changes } }, m)
    return siteDto(site)
  })
}

export async function deleteSite(workspaceId: string, actorId: string, id: string) {
  await dataSource.transaction(async (m) => {
    const site = await findSite(workspaceId, id, m)
    const count = await m.getRepository(LuminaireEntity).count({ where: { siteId: id, workspaceId } })
    await m.getRepository(SiteEntity).delete({ id, workspaceId })
    await recordAudit({ workspaceId, actorId, action: 'site.deleted', entityType: 'site', entityId: id, data: { name: site.name, luminaires: count } }, m)
  })
}

/** { field: { from, to } } for the fields a patch really changes. */
export function changedFields(before: Record<string, unknown>, patch: Record<string, unknown>) {
  const out: Record<string, { from: unknown; to: unknown }> = {}
  for (const [k, v] of Object.entries(patch)) if (v !== undefined && before[k] !== v) out[k] = { from: before[k] ?? null, to: v }
  return out
}

// ---------------------------------------------------------------- luminaires

export function luminaireDto(l: LuminaireEntity, areaName: string | null = null) {
  return {
    id: l.id,
    siteId: l.siteId,
    areaId: l.areaId,
    areaName,
    tag: l.tag,
    location: l.location,
    typeLabel: l.typeLabel,
    purpose: l.purpose,
    mode: l.mode,
    ratedDurationH: l.ratedDurationH,
    chemistry: l.chemistry,
    cellsInSeries: l.cellsInSeries,
    capacityAh: l.capacityAh,
    packFittedOn: l.packFittedOn,
    walkOrder: l.walkOrder,
    circuit: l.circuit,
    rechargeH: l.rechargeH,
    specSheetId: l.specSheetId,
    luminaireTypeId: l.luminaireTypeId,
    externalId: l.externalId ?? null,
    lastFunctionalTestOn: l.lastFunctionalTestOn ?? null,
    lastDurationTestOn: l.lastDurationTestOn ?? null,
    createdAt: l.createdAt,
    updatedAt: l.updatedAt,
  }
}
export type LuminaireDto = ReturnType<typeof luminaireDto>

export async function findLuminaire(workspaceId: string, id: string, m: EntityManager = dataSource.manager) {
  const l = await m.getRepository(LuminaireEntity).findOne({ where: { id, workspaceId } })
  if (!l) throw new NotFoundError('That luminaire')
  return l
}

const externalIdClash = (err: unknown) => (err as { driverError?: { constraint?: string } })?.driverError?.constraint === 'luminaires_site_external_id'
const externalIdTaken = (id: string | null | undefined) =>
  new AppError(409, 'conflict', `A luminaire with the external id "${id ?? ''}" is already in this site's register.`, [
    { path: 'externalId', message: 'is already used on this site' },
  ])
const tagTaken = (tag: string) =>
  new AppError(409, 'conflict', `A luminaire tagged "${tag}" is already in this site's register.`, [{ path: 'tag', message: 'is already used on this site' }])

/** The area must lie in the luminaire's site (that every id is of this workspace is checked before the handler, server/lib/references.ts). */
async function checkArea(m: EntityManager, workspaceId: string, siteId: string, v: { areaId?: string | null }) {
  if (v.areaId) {
    const area = await m.getRepository(AreaEntity).findOne({ where: { id: v.areaId, workspaceId, siteId } })
    if (!area) throw new BadRequestError('The area is not part of this site.', [{ path: 'areaId', message: 'is not an area of this site' }])
  }
}

async function areaNameOf(m: EntityManager, areaId: string | null) {
  if (!areaId) return null
  return (await m.getRepository(AreaEntity).findOne({ where: { id: areaId } }))?.name ?? null
}

export async function createLuminaire(workspaceId: string, actorId: string, siteId: string, input: z.output<typeof LuminaireSchema>) {
  return dataSource
    .transaction(async (m) => {
      await findSite(workspaceId, siteId, m)
      await checkArea(m, workspaceId, siteId, input)
      const l = await m.getRepository(LuminaireEntity).save(m.getRepository(LuminaireEntity).create({ ...input, siteId, workspaceId }))
      await recordAudit({ workspaceId, actorId, action: 'luminaire.created', entityType: 'luminaire', entityId: l.id, data: { siteId, tag: l.tag } }, m)
      return luminaireDto(l, await areaNameOf(m, l.areaId))
    })
    .catch((err) => {
      throw isUniqueViolation(err) ? (externalIdClash(err) ? externalIdTaken(input.externalId) : tagTaken(input.tag)) : err
    })
}

const PACK_FIELDS = ['chemistry', 'cellsInSeries', 'capacityAh', 'packFittedOn'] as const

export async function updateLuminaire(workspaceId: string, actorId: string, id: string, patch: z.output<typeof LuminairePatchSchema>) {
  return dataSource
    .transaction(async (m) => {
      const l = await findLuminaire(workspaceId, id, m)
      await checkArea(m, workspaceId, l.siteId, patch)
      const changes = changedFields(l as unknown as Record<string, unknown>, patch)
      Object.assign(l, patch)
      await m.getRepository(LuminaireEntity).save(l)
      await recordAudit({ workspaceId, actorId, action: 'luminaire.updated', entityType: 'luminaire', entityId: id, data: { tag: l.tag, changes } }, m)
      if (PACK_FIELDS.some((f) => f in changes)) {
        await recordAudit(
          {
            workspaceId,
            actorId,
            action: 'pack.changed',
            entityType: 'luminaire',
            entityId: id,
            data: { tag: l.tag, changes: Object.fromEntries(PACK_FIELDS.filter((f) => f in changes).map((f) => [f, changes[f]])) },
          },
          m,
        )
      }
      return luminaireDto(l, await areaNameOf(m, l.areaId))
    })
    .catch((err) => {
      throw isUniqueViolation(err) ? (externalIdClash(err) ? externalIdTaken(patch.externalId) : tagTaken(patch.tag ?? '')) : err
    })
}

/** A new pack fitted in the field: the forecast and the duration trend start again from its date. */
export async function replacePack(workspaceId: string, actorId: string, id: string, input: z.output<typeof PackReplacementSchema>) {
  return dataSource.transaction(async (m) => {
    const l = await findLuminaire(workspaceId, id, m)
    const before = { chemistry: l.chemistry, cellsInSeries: l.cellsInSeries, capacityAh: l.capacityAh, packFittedOn: l.packFittedOn }
    l.chemistry = input.chemistry ?? l.chemistry
    l.cellsInSeries = input.cellsInSeries ?? l.cellsInSeries
    l.capacityAh = input.capacityAh ?? l.capacityAh
    l.packFittedOn = input.packFittedOn
    await m.getRepository(LuminaireEntity).save(l)
    const after = { chemistry: l.chemistry, cellsInSeries: l.cellsInSeries, capacityAh: l.capacityAh, packFittedOn: l.packFittedOn }
    await recordAudit(
      { workspaceId, actorId, action: 'pack.replaced', entityType: 'luminaire', entityId: id, data: { tag: l.tag, before, after, note: input.note } },
      m,
    )
    return luminaireDto(l, await areaNameOf(m, l.areaId))
  })
}

export async function deleteLuminaire(workspaceId: string, actorId: string, id: string) {
  await dataSource.transaction(async (m) => {
    const l = await findLuminaire(workspaceId, id, m)
    await m.getRepository(LuminaireEntity).delete({ id, workspaceId })
    await recordAudit({ workspaceId, actorId, action: 'luminaire.deleted', entityType: 'luminaire', entityId: id, data: { siteId: l.siteId, tag: l.tag } }, m)
  })
}

// ---------------------------------------------------------------- what is due

interface TestRow {
  luminaire_id: string
  kind: 'functional' | 'duration'
  tested_on: string
  passed: boolean
  achieved_duration_h: number | null
  faults: string
  remedial_action: string
}

/** Every test of the given luminaires, oldest first (dates as text: no time zone can shift them). */
async function testsOf(workspaceId: string, luminaireIds: string[], m: EntityManager = dataSource.manager): Promise<Map<string, TestRow[]>> {
  const byLuminaire = new Map<string, TestRow[]>()
  if (!luminaireIds.length) return byLuminaire
  const rows: TestRow[] = await m.query(
    `SELECT luminaire_id, kind, tested_on::text AS tested_on, passed, achieved_duration_h, faults, remedial_action
       FROM test_records WHERE workspace_id = $1 AND luminaire_id = ANY($2::uuid[]) AND recorded_in_error_at IS NULL ORDER BY tested_on, recorded_at`,
    [workspaceId, luminaireIds],
  )
  for (const r of rows) {
    const list = byLuminaire.get(r.luminaire_id) ?? []
    list.push(r)
    byLuminaire.set(r.luminaire_id, list)
  }
  return byLuminaire
}

/**
 * The last tests done before this register kept the log book (carried by an imported schedule)
 * count as passed tests on those days for the calendar, so a first import does not make every
 * luminaire overdue; they are not log-book entries and appear in no log book.
 */
export function testsBeforeRegister(l: Pick<LuminaireEntity, 'lastFunctionalTestOn' | 'lastDurationTestOn'>): TestEvent[] {
  return [
    ...(l.lastFunctionalTestOn ? [{ kind: 'functional' as const, testedOn: l.lastFunctionalTestOn, passed: true }] : []),
    ...(l.lastDurationTestOn ? [{ kind: 'duration' as const, testedOn: l.lastDurationTestOn, passed: true }] : []),
  ]
}

export interface LuminaireStatus extends LuminaireDto {
  due: LuminaireDue
  forecast: PackForecast
}

/** Due dates and pack forecast of each luminaire, from the engine. */
export function statusOf(
  site: Pick<SiteEntity, 'regime' | 'ceilingTemperatureC'>,
  l: LuminaireEntity,
  areaName: string | null,
  tests: TestRow[],
  today: string,
  settings: RegisterSettings,
): LuminaireStatus {
  const events: TestEvent[] = [
    ...testsBeforeRegister(l),
    ...tests.map((t) => ({ kind: t.kind, testedOn: t.tested_on, passed: t.passed, faults: t.faults, remedialAction: t.remedial_action })),
  ]
  const registeredOn = l.createdAt.toISOString().slice(0, 10)
  const since = l.packFittedOn < registeredOn ? l.packFittedOn : registeredOn
  const due = luminaireDue({ regime: site.regime, since, packFittedOn: l.packFittedOn, registeredOn, tests: events }, today, {
    repairWindowDays: settings.repairWindowDays,
  })
  const forecast = forecastPack(
    {
      chemistry: l.chemistry,
      fittedOn: l.packFittedOn,
      ambientC: site.ceilingTemperatureC,
      ratedDurationH: l.ratedDurationH,
      durations: tests
        .filter((t) => t.kind === 'duration' && t.achieved_duration_h !== null)
        .map((t) => ({ testedOn: t.tested_on, achievedH: t.achieved_duration_h! })),
    },
    today,
  )
  return { ...luminaireDto(l, areaName), due, forecast }
}

async function luminairesOf(workspaceId: string, where: { siteId?: string }, m: EntityManager = dataSource.manager) {
  const rows = await m.getRepository(LuminaireEntity).find({ where: { workspaceId, ...where }, order: { tag: 'ASC' } })
  const areas = await m.getRepository(AreaEntity).find({ where: { workspaceId, ...where } })
  const areaNames = new Map(areas.map((a) => [a.id, a.name]))
  return { rows, areaNames }
}

/** One site with its areas and every luminaire's due dates and forecast. */
export async function siteStatus(workspaceId: string, siteId: string, today = todayIso(), m: EntityManager = dataSource.manager) {
  const site = await findSite(workspaceId, siteId, m)
  const { rows, areaNames } = await luminairesOf(workspaceId, { siteId }, m)
  const tests = await testsOf(
    workspaceId,
    rows.map((l) => l.id),
    m,
  )
  const settings = await registerSettings(workspaceId, m)
  const luminaires = rows
    .map((l) => statusOf(site, l, l.areaId ? (areaNames.get(l.areaId) ?? null) : null, tests.get(l.id) ?? [], today, settings))
    .sort((a, b) => (a.areaName ?? '').localeCompare(b.areaName ?? '') || a.tag.localeCompare(b.tag, undefined, { numeric: true }))
  return {
    today,
    site: siteDto(site),
    regime: { label: REGIMES[site.regime].label, references: REGIMES[site.regime].references },
    profile: regimeProfile(site.regime),
    regimeHistory: await regimeHistory(workspaceId, siteId, m),
    settings,
    areas: [...areaNames.entries()].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name)),
    counts: countDue(luminaires.map((l) => l.due)),
    luminaires,
  }
}

export interface UpcomingTest {
  siteId: string
  siteName: string
  luminaireId: string
  tag: string
  kind: DueItem['kind']
  dueOn: string
  daysUntilDue: number
}

/** A test due now or overdue somewhere in the workspace (a retest after a failure, a commissioning test, a routine test past its day). */
export interface AttentionItem extends UpcomingTest {
  reason: DueItem['reason']
  state: 'overdue' | 'due-now'
  /** Last day before it is overdue. */
  overdueAfter: string
  /** For a retest: the failure it follows. */
  failedOn: string | null
  faults: string
  remedialAction: string
}

/** Every site with its counts, what is overdue or failed across sites, and the tests falling due in the next `days` days. */
export async function overview(workspaceId: string, days = 60, today = todayIso()) {
  const sites = await dataSource.getRepository(SiteEntity).find({ where: { workspaceId }, order: { name: 'ASC' } })
  const { rows } = await luminairesOf(workspaceId, {})
  const tests = await testsOf(
    workspaceId,
    rows.map((l) => l.id),
  )
  const settings = await registerSettings(workspaceId)
  const siteById = new Map(sites.map((s) => [s.id, s]))
  const statuses = rows.map((l) => ({ siteId: l.siteId, status: statusOf(siteById.get(l.siteId)!, l, null, tests.get(l.id) ?? [], today, settings) }))
  const perSite = sites.map((s) => {
    const mine = statuses.filter((x) => x.siteId === s.id).map((x) => x.status)
    return {
      ...siteDto(s),
      counts: countDue(mine.map((x) => x.due)),
      packsToReplace: mine.filter((x) => x.forecast.state !== 'ok').length,
    }
  })
  const upcoming: UpcomingTest[] = dueWithin(
    statuses.map((x) => ({ ...x, due: x.status.due })),
    today,
    days,
  ).map(({ item, test }) => ({
    siteId: item.siteId,
    siteName: siteById.get(item.siteId)!.name,
    luminaireId: item.status.id,
    tag: item.status.tag,
    kind: test.kind,
    dueOn: test.nextDueOn,
    daysUntilDue: test.daysUntilDue,
  }))
  const attention: AttentionItem[] = needingAttention(statuses.map((x) => ({ ...x, due: x.status.due }))).map(({ item, test }) => {
    const failure = test.reason === 'retest' ? item.status.due.openFailures.find((f) => f.kind === test.kind) : undefined
    return {
      siteId: item.siteId,
      siteName: siteById.get(item.siteId)!.name,
      luminaireId: item.status.id,
      tag: item.status.tag,
      kind: test.kind,
      dueOn: test.nextDueOn,
      daysUntilDue: test.daysUntilDue,
      reason: test.reason,
      state: test.state as AttentionItem['state'],
      overdueAfter: test.overdueAfter,
      failedOn: failure?.testedOn ?? null,
      faults: failure?.faults ?? '',
      remedialAction: failure?.remedialAction ?? '',
    }
  })
  return { today, days, settings, sites: perSite, attention, upcoming }
}

/**
 * Every site of the workspace and every luminaire's status (due dates, open failures, pack
 * forecast), with its area name: the one place the cross-site lists read from.
 */
export async function workspaceStatuses(workspaceId: string, today = todayIso()) {
  const sites = await dataSource.getRepository(SiteEntity).find({ where: { workspaceId }, order: { name: 'ASC' } })
  const { rows, areaNames } = await luminairesOf(workspaceId, {})
  const tests = await testsOf(
    workspaceId,
    rows.map((l) => l.id),
  )
  const settings = await registerSettings(workspaceId)
  const siteById = new Map(sites.map((s) => [s.id, s]))
  const statuses = rows.map((l) =>
    statusOf(siteById.get(l.siteId)!, l, l.areaId ? (areaNames.get(l.areaId) ?? null) : null, tests.get(l.id) ?? [], today, settings),
  )
  return { today, sites, statuses }
}

/** One luminaire with its site, full test history, due dates and pack forecast. */
export async function luminaireDetail(workspaceId: string, id: string, today = todayIso()) {
  const l = await findLuminaire(workspaceId, id)
  const site = await findSite(workspaceId, l.siteId)
  const tests = await testsOf(workspaceId, [l.id])
  const status = statusOf(site, l, await areaNameOf(dataSource.manager, l.areaId), tests.get(l.id) ?? [], today, await registerSettings(workspaceId))
  return { today, site: siteDto(site), luminaire: status }
}
