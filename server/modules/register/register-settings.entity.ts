import { Column, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm'

/** A workspace's log-book rules; a workspace without a row uses the defaults. */
@Entity('register_settings')
export class RegisterSettingsEntity {
  @PrimaryColumn({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  /** Days from a failure (or a new pack) to its retest before the retest counts as overdue. */
  @Column({ type: 'integer', name: 'repair_window_days', default: 14 })
  repairWindowDays!: number

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date
}
