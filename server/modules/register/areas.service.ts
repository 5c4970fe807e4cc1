/** Areas of a site (a floor, a wing): named once per site, each change in the audit trail. */
import type { EntityManager } from 'typeorm'
import type { z } from 'zod'
import type { AreaPatchSchema, AreaSchema } from '../../../shared/schemas/site.schema'
import { dataSource } from '../../data-source'
import { AppError, NotFoundError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { AreaEntity } from './area.entity'
import { changedFields, findSite, isUniqueViolation } from './register.service'

export function areaDto(a: AreaEntity) {
  return { id: a.id, siteId: a.siteId, name: a.name, notes: a.notes }
}

async function findArea(workspaceId: string, id: string, m: EntityManager = dataSource.manager) {
  const area = await m.getRepository(AreaEntity).findOne({ where: { id, workspaceId } })
  if (!area) throw new NotFoundError('That area')
  return area
}

const areaNameTaken = (name: string) =>
  new AppError(409, 'conflict', `An area called "${name}" already exists on this site.`, [{ path: 'name', message: 'is already used on this site' }])

export async function createArea(workspaceId: string, actorId: string, siteId: string, input: z.output<typeof AreaSchema>) {
  return dataSource
    .transaction(async (m) => {
      await findSite(workspaceId, siteId, m)
      const area = await m.getRepository(AreaEntity).save(m.getRepository(AreaEntity).create({ ...input, siteId, workspaceId }))
      await recordAudit({ workspaceId, actorId, action: 'area.created', entityType: 'area', entityId: area.id, data: { siteId, name: area.name } }, m)
      return areaDto(area)
    })
    .catch((err) => {
      throw isUniqueViolation(err) ? areaNameTaken(input.name) : err
    })
}

export async function updateArea(workspaceId: string, actorId: string, id: string, patch: z.output<typeof AreaPatchSchema>) {
  return dataSource
    .transaction(async (m) => {
      const area = await findArea(workspaceId, id, m)
      const changes = changedFields(area as unknown as Record<string, unknown>, patch)
      Object.assign(area, patch)
      await m.getRepository(AreaEntity).save(area)
      await recordAudit({ workspaceId, actorId, action: 'area.updated', entityType: 'area', entityId: id, data: { changes } }, m)
      return areaDto(area)
    })
    .catch((err) => {
      throw isUniqueViolation(err) ? areaNameTaken(patch.name ?? '') : err
    })
}

export async function deleteArea(workspaceId: string, actorId: string, id: string) {
  await dataSource.transaction(async (m) => {
    const area = await findArea(workspaceId, id, m)
    await m.getRepository(AreaEntity).delete({ id, workspaceId })
    await recordAudit({ workspaceId, actorId, action: 'area.deleted', entityType: 'area', entityId: id, data: { siteId: area.siteId, name: area.name } }, m)
  })
}

export async function listAreas(workspaceId: string, siteId: string) {
  const rows = await dataSource.getRepository(AreaEntity).find({ where: { workspaceId, siteId }, order: { name: 'ASC' } })
  return rows.map(areaDto)
}
