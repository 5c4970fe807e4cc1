/**
 * Saved wattage audits. The server never computes a figure itself: it runs the engine's audit tool
 * on the readings as typed and stores both. Every query is scoped by workspace; another workspace's
 * audit, sheet or luminaire is answered exactly like a missing one.
 */
import { In, type EntityManager } from 'typeorm'
import { auditInput, auditTool, type AuditResult } from '../../../shared/engine/audit'
import { runTool } from '../../../shared/engine/tool'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import type { AuditAttach, AuditCreate, AuditListQuery } from '../../../shared/schemas/wattage-audit.schema'
import { dataSource } from '../../data-source'
import { BadRequestError, NotFoundError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { User } from '../users/user.entity'
import { WattageAudit } from './wattage-audit.entity'

const audits = (m: EntityManager = dataSource.manager) => m.getRepository(WattageAudit)

export interface Person {
  id: string
  name: string
}

export interface AuditLinks {
  specSheet: { id: string; title: string } | null
  luminaire: { id: string; tag: string; siteId: string; siteName: string } | null
}

/** Runs the engine on readings already checked by its schema; the claimed power is kept as read. */
export function evaluate(inputs: Record<string, unknown>): { results: AuditResult; claimedPowerW: number } {
  const parsed = auditInput.safeParse(inputs)
  const outcome = runTool(auditTool, inputs)
  if (!parsed.success || !outcome.ok) {
    const fields = outcome.ok ? [] : outcome.fields.map((f) => ({ path: `inputs.${f.path}`, message: f.message }))
    throw new BadRequestError('The readings could not be evaluated.', fields)
  }
  return { results: outcome.result, claimedPowerW: parsed.data.claimedPower }
}

async function names(ids: Array<string | null>, m: EntityManager = dataSource.manager): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))]
  if (!wanted.length) return new Map()
  const users = await m.getRepository(User).find({ where: { id: In(wanted) }, select: { id: true, name: true } })
  return new Map(users.map((u) => [u.id, u.name]))
}

async function linksOf(rows: WattageAudit[], m: EntityManager = dataSource.manager): Promise<Map<string, AuditLinks>> {
  const sheetIds = [...new Set(rows.map((r) => r.specSheetId).filter((x): x is string => !!x))]
  const lumIds = [...new Set(rows.map((r) => r.luminaireId).filter((x): x is string => !!x))]
  const sheets = new Map<string, { id: string; title: string }>()
  const lums = new Map<string, { id: string; tag: string; siteId: string; siteName: string }>()
  if (sheetIds.length) {
    const found: Array<{ id: string; title: string }> = await m.query('SELECT id, title FROM spec_sheets WHERE id = ANY($1::uuid[])', [sheetIds])
    for (const s of found) sheets.set(s.id, s)
  }
  if (lumIds.length) {
    const found: Array<{ id: string; tag: string; site_id: string; site_name: string }> = await m.query(
      'SELECT l.id, l.tag, l.site_id, s.name AS site_name FROM luminaires l JOIN sites s ON s.id = l.site_id WHERE l.id = ANY($1::uuid[])',
      [lumIds],
    )
    for (const l of found) lums.set(l.id, { id: l.id, tag: l.tag, siteId: l.site_id, siteName: l.site_name })
  }
  return new Map(
    rows.map((r) => [
      r.id,
      { specSheet: r.specSheetId ? (sheets.get(r.specSheetId) ?? null) : null, luminaire: r.luminaireId ? (lums.get(r.luminaireId) ?? null) : null },
    ]),
  )
}

function dto(a: WattageAudit, people: Map<string, string>, links: AuditLinks | undefined, full: boolean) {
  // Lists leave out the working (the longest part); one audit carries everything.
  const { working, ...rest } = a.results as Record<string, unknown>
  return {
    id: a.id,
    title: a.title,
    luminaire: a.luminaire,
    inputs: a.inputs,
    results: full ? { ...rest, working } : rest,
    claimedPowerW: a.claimedPowerW,
    engineVersion: a.engineVersion,
    author: a.authorId ? { id: a.authorId, name: people.get(a.authorId) ?? 'former member' } : null,
    specSheetId: a.specSheetId,
    luminaireId: a.luminaireId,
    specSheet: links?.specSheet ?? null,
    luminaireLink: links?.luminaire ?? null,
    createdAt: a.createdAt,
    updatedAt: a.updatedAt,
  }
}
export type AuditDto = ReturnType<typeof dto>

async function view(a: WattageAudit, full: boolean, m: EntityManager = dataSource.manager) {
  return dto(a, await names([a.authorId], m), (await linksOf([a], m)).get(a.id), full)
}

async function findAudit(workspaceId: string, id: string, m: EntityManager = dataSource.manager): Promise<WattageAudit> {
  const a = await audits(m).findOne({ where: { id, workspaceId } })
  if (!a) throw new NotFoundError('That wattage audit')
  return a
}

export async function createAudit(workspaceId: string, userId: string, input: AuditCreate) {
  const { results, claimedPowerW } = evaluate(input.inputs)
  return dataSource.transaction(async (m) => {
    const a = await audits(m).save(
      audits(m).create({
        workspaceId,
        title: input.title,
        luminaire: input.luminaire,
        inputs: input.inputs,
        results: results as unknown as Record<string, unknown>,
        claimedPowerW,
        engineVersion: ENGINE_VERSION,
        authorId: userId,
        specSheetId: input.specSheetId ?? null,
        luminaireId: input.luminaireId ?? null,
      }),
    )
    await recordAudit(
      {
        workspaceId,
        actorId: userId,
        action: 'wattage-audit.saved',
        entityType: 'wattage_audit',
        entityId: a.id,
        data: {
          title: a.title,
          claimedPowerW,
          measuredPowerW: results.measuredPowerW,
          verdict: results.claimVerdict,
          specSheetId: a.specSheetId,
          luminaireId: a.luminaireId,
        },
      },
      m,
    )
    return view(a, true, m)
  })
}

export async function getAudit(workspaceId: string, id: string) {
  return view(await findAudit(workspaceId, id), true)
}

export async function listAudits(workspaceId: string, q: AuditListQuery) {
  const qb = audits().createQueryBuilder('a').where('a.workspace_id = :workspaceId', { workspaceId })
  if (q.sheetId) qb.andWhere('a.spec_sheet_id = :sheetId', { sheetId: q.sheetId })
  if (q.luminaireId) qb.andWhere('a.luminaire_id = :luminaireId', { luminaireId: q.luminaireId })
  if (q.ids) qb.andWhere('a.id IN (:...ids)', { ids: q.ids.length ? q.ids : ['00000000-0000-0000-0000-000000000000'] })
  if (q.q) qb.andWhere('(a.title ILIKE :q OR a.luminaire ILIKE :q)', { q: `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` })
  qb.orderBy('a.created_at', 'DESC').addOrderBy('a.id', 'ASC').take(q.limit)
  const [rows, total] = await qb.getManyAndCount()
  // The side-by-side table keeps the order the ids were asked in.
  if (q.ids) rows.sort((x, y) => (q.ids as string[]).indexOf(x.id) - (q.ids as string[]).indexOf(y.id))
  const people = await names(rows.map((r) => r.authorId))
  const links = await linksOf(rows)
  return { items: rows.map((r) => dto(r, people, links.get(r.id), false)), total }
}

export async function attachAudit(workspaceId: string, userId: string, id: string, body: AuditAttach) {
  return dataSource.transaction(async (m) => {
    const a = await findAudit(workspaceId, id, m)
    const before = { specSheetId: a.specSheetId, luminaireId: a.luminaireId }
    if (body.specSheetId !== undefined) a.specSheetId = body.specSheetId
    if (body.luminaireId !== undefined) a.luminaireId = body.luminaireId
    await audits(m).save(a)
    await recordAudit(
      {
        workspaceId,
        actorId: userId,
        action: 'wattage-audit.attached',
        entityType: 'wattage_audit',
        entityId: a.id,
        data: { before, after: { specSheetId: a.specSheetId, luminaireId: a.luminaireId } },
      },
      m,
    )
    return view(a, true, m)
  })
}

export async function deleteAudit(workspaceId: string, userId: string, id: string) {
  await dataSource.transaction(async (m) => {
    const a = await findAudit(workspaceId, id, m)
    await audits(m).delete({ id: a.id, workspaceId })
    // The readings go into the trail, so a deleted audit can still be accounted for.
    await recordAudit(
      {
        workspaceId,
        actorId: userId,
        action: 'wattage-audit.deleted',
        entityType: 'wattage_audit',
        entityId: a.id,
        data: { title: a.title, inputs: a.inputs, specSheetId: a.specSheetId, luminaireId: a.luminaireId },
      },
      m,
    )
  })
}

/** The audits attached to one sheet, oldest first, for its PDF. */
export async function auditsForSheet(workspaceId: string, sheetId: string): Promise<AuditDto[]> {
  const rows = await audits().find({ where: { workspaceId, specSheetId: sheetId }, order: { createdAt: 'ASC', id: 'ASC' } })
  const people = await names(rows.map((r) => r.authorId))
  return rows.map((r) => dto(r, people, undefined, false))
}
