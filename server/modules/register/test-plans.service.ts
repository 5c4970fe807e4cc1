/**
 * Plans of a site's full-duration tests: made by the engine from the register and the designer's
 * choices, stored so the rounds of the following days and the work order read the same plan.
 */
import { planDurationTests, type TestPlan } from '../../../shared/engine/test-plan'
import type { TestPlanRequest } from '../../../shared/schemas/test-plan.schema'
import { dataSource } from '../../data-source'
import { NotFoundError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { AreaEntity } from './area.entity'
import { LuminaireEntity } from './luminaire.entity'
import { findSite } from './register.service'
import { TestPlanEntity } from './test-plan.entity'

export interface StoredPlan {
  id: string
  siteId: string
  input: TestPlanRequest
  plan: TestPlan
  createdAt: string
}

const toStored = (e: TestPlanEntity): StoredPlan => ({
  id: e.id,
  siteId: e.siteId,
  input: e.input as unknown as TestPlanRequest,
  plan: e.plan as unknown as TestPlan,
  createdAt: e.createdAt.toISOString(),
})

export async function makePlan(workspaceId: string, actorId: string, siteId: string, input: TestPlanRequest): Promise<StoredPlan> {
  const site = await findSite(workspaceId, siteId)
  const luminaires = await dataSource.getRepository(LuminaireEntity).find({ where: { workspaceId, siteId } })
  const areas = new Map((await dataSource.getRepository(AreaEntity).find({ where: { workspaceId, siteId } })).map((a) => [a.id, a.name]))
  const plan = planDurationTests({
    ...input,
    regime: site.regime,
    luminaires: luminaires.map((l) => ({
      id: l.id,
      tag: l.tag,
      areaId: l.areaId,
      areaName: l.areaId ? (areas.get(l.areaId) ?? null) : null,
      circuit: l.circuit,
      walkOrder: l.walkOrder,
      ratedDurationH: l.ratedDurationH,
      rechargeH: l.rechargeH,
    })),
  })
  const repo = dataSource.getRepository(TestPlanEntity)
  const saved = await repo.save(repo.create({ workspaceId, siteId, input: { ...input }, plan: plan as unknown as Record<string, unknown>, createdBy: actorId }))
  await recordAudit({
    workspaceId,
    actorId,
    action: 'test-plan.made',
    entityType: 'site',
    entityId: siteId,
    data: { planId: saved.id, ...input, groups: plan.groups.length },
  })
  return toStored(saved)
}

export async function listPlans(workspaceId: string, siteId: string): Promise<StoredPlan[]> {
  await findSite(workspaceId, siteId)
  const rows = await dataSource.getRepository(TestPlanEntity).find({ where: { workspaceId, siteId }, order: { createdAt: 'DESC' }, take: 20 })
  return rows.map(toStored)
}

export async function findPlan(workspaceId: string, siteId: string, planId: string): Promise<StoredPlan> {
  const row = await dataSource.getRepository(TestPlanEntity).findOne({ where: { workspaceId, siteId, id: planId } })
  if (!row) throw new NotFoundError('That test plan')
  return toStored(row)
}
