import type { EntityManager } from 'typeorm'
import { dataSource } from '../../data-source'
import { AuditEvent } from './audit-event.entity'

export interface AuditInput {
  workspaceId: string | null
  actorId: string | null
  action: string
  entityType: string
  entityId?: string | null
  data?: Record<string, unknown>
}

/** Records an audit event, inside the caller's transaction when one is given. */
export async function recordAudit(input: AuditInput, manager: EntityManager = dataSource.manager): Promise<void> {
  const event = manager.getRepository(AuditEvent).create({ ...input, entityId: input.entityId ?? null, data: input.data ?? {} })
  await manager.getRepository(AuditEvent).save(event)
}
