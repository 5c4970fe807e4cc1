/** The workspace's log-book settings: the repair window and who gets the daily reminder, how far ahead. */
import type { EntityManager } from 'typeorm'
import { DEFAULT_REPAIR_WINDOW_DAYS } from '../../../shared/engine/due'
import { dataSource } from '../../data-source'
import { recordAudit } from '../audit/audit.service'
import { RegisterSettingsEntity } from './register-settings.entity'

export type ReminderRole = 'owner' | 'designer' | 'technician' | 'viewer'

export interface RegisterSettings {
  repairWindowDays: number
  /** The daily reminder lists tests falling due within this many days. */
  reminderDaysAhead: number
  /** Whether each site's responsible person gets the reminder. */
  remindSiteContact: boolean
  /** Members with these roles get it. */
  remindRoles: ReminderRole[]
}

/** Reminders by default: 14 days ahead, to the site contact, the technicians and the owners (the person answerable). */
export const DEFAULT_REMINDERS = { reminderDaysAhead: 14, remindSiteContact: true, remindRoles: ['owner', 'technician'] as ReminderRole[] }

export async function registerSettings(workspaceId: string, m: EntityManager = dataSource.manager): Promise<RegisterSettings> {
  const row = await m.getRepository(RegisterSettingsEntity).findOne({ where: { workspaceId } })
  return {
    repairWindowDays: row?.repairWindowDays ?? DEFAULT_REPAIR_WINDOW_DAYS,
    reminderDaysAhead: row?.reminderDaysAhead ?? DEFAULT_REMINDERS.reminderDaysAhead,
    remindSiteContact: row?.remindSiteContact ?? DEFAULT_REMINDERS.remindSiteContact,
    remindRoles: (row?.remindRoles as ReminderRole[] | undefined) ?? DEFAULT_REMINDERS.remindRoles,
  }
}

export async function updateRegisterSettings(workspaceId: string, actorId: string, patch: Partial<RegisterSettings>) {
  return dataSource.transaction(async (m) => {
    const before = await registerSettings(workspaceId, m)
    const after = { ...before, ...Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) }
    await m.getRepository(RegisterSettingsEntity).upsert({ workspaceId, ...after }, ['workspaceId'])
    await recordAudit({ workspaceId, actorId, action: 'register-settings.updated', entityType: 'workspace', entityId: workspaceId, data: { before, after } }, m)
    return after
  })
}
