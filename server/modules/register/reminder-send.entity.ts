import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm'

/** A reminder mail claimed for one site on one day; the unique (site, day) key makes it once only. */
@Entity('reminder_sends')
export class ReminderSendEntity {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'uuid', name: 'site_id' })
  siteId!: string

  @Column({ type: 'date' })
  day!: string

  @Column({ type: 'jsonb', default: () => "'[]'" })
  recipients!: string[]

  @Column({ type: 'integer', name: 'luminaire_count', default: 0 })
  luminaireCount!: number

  @Column({ type: 'timestamptz', name: 'sent_at' })
  sentAt!: Date
}
