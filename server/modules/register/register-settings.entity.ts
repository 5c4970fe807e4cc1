import { Column, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm'

/** A workspace's log-book rules; a workspace without a row uses the defaults. */
@Entity('register_settings')
export class RegisterSettingsEntity {
  @PrimaryColumn({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  /** Days from a failure (or a new pack) to its retest before the retest counts as overdue. */
  @Column({ type: 'integer', name: 'repair_window_days', default: 14 })
  repairWindowDays!: number

  /** The daily reminder lists tests falling due within this many days. */
  @Column({ type: 'integer', name: 'reminder_days_ahead', default: 14 })
  reminderDaysAhead!: number

  /** Whether the site's responsible person gets the reminder. */
  @Column({ type: 'boolean', name: 'remind_site_contact', default: true })
  remindSiteContact!: boolean

  /** Members with these roles get the reminder. */
  @Column({ type: 'text', array: true, name: 'remind_roles', default: () => "'{owner,technician}'" })
  remindRoles!: string[]

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date
}
