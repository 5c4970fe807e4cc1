/**
 * A workspace's settings: the currency its prices and costs are written in. An owner chooses it
 * from a short list; until then it is the usual currency of the first owner's region (the unit
 * system they read in: US customary → US dollar, metric → euro; `regionDefaults`).
 */
import { regionDefaults } from '../../../shared/engine/units'
import type { WorkspaceSettingsPatch } from '../../../shared/schemas/workspace-settings.schema'
import { dataSource } from '../../data-source'
import { NotFoundError } from '../../errors/app-error'
import { recordAudit } from '../audit/audit.service'
import { Workspace } from './workspace.entity'
import { currencyAndOwnerUnits } from './workspaces.repository'

export async function workspaceSettings(workspaceId: string) {
  const row = await currencyAndOwnerUnits(workspaceId)
  if (!row) throw new NotFoundError('That workspace')
  const regionCurrency = regionDefaults(row.ownerUnits === 'us' ? 'us' : 'si').currency
  return { currency: row.currency ?? regionCurrency, currencyChosen: row.currency !== null, regionCurrency }
}

export async function updateWorkspaceSettings(workspaceId: string, actorId: string, patch: WorkspaceSettingsPatch) {
  const before = await workspaceSettings(workspaceId)
  await dataSource.transaction(async (m) => {
    await m.getRepository(Workspace).update({ id: workspaceId }, { currency: patch.currency })
    await recordAudit(
      {
        workspaceId,
        actorId,
        action: 'workspace.settings-updated',
        entityType: 'workspace',
        entityId: workspaceId,
        data: { currency: { from: before.currencyChosen ? before.currency : null, to: patch.currency } },
      },
      m,
    )
  })
  return workspaceSettings(workspaceId)
}
