import type { EntityManager } from 'typeorm'
import { dataSource } from '../../data-source'
import { AuditEvent } from './audit-event.entity'
import { requestToken } from '../../lib/request-token'

export interface AuditInput {
  workspaceId: string | null
  actorId: string | null
  action: string
  entityType: string
  entityId?: string | null
  data?: Record<string, unknown>
}

/**
 * Records an audit event, inside the caller's transaction when one is given. A change made with an
 * API token names the token (id and name), so the trail tells a script's writes from its owner's.
 */
export async function recordAudit(input: AuditInput, manager: EntityManager = dataSource.manager): Promise<void> {
  const token = requestToken()
  const event = manager.getRepository(AuditEvent).create({
    ...input,
    entityId: input.entityId ?? null,
    data: input.data ?? {},
    apiTokenId: token?.id ?? null,
    apiTokenName: token?.name ?? null,
  })
  await manager.getRepository(AuditEvent).save(event)
}
