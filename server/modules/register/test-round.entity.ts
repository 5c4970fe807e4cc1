import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm'

/** A round signed off at the end of a visit: who signed, on which day; its records carry its client id. */
@Entity('test_rounds')
export class TestRoundEntity {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'uuid', name: 'site_id' })
  siteId!: string

  /** Made on the device, so a retried sign-off lands on the same row. */
  @Column({ type: 'uuid', name: 'client_id' })
  clientId!: string

  @Column({ type: 'varchar', length: 120, name: 'signed_off_by_name' })
  signedOffByName!: string

  /** "YYYY-MM-DD" */
  @Column({ type: 'date', name: 'signed_off_on' })
  signedOffOn!: string

  @Column({ type: 'text', default: '' })
  notes!: string

  @Column({ type: 'uuid', name: 'recorded_by', nullable: true })
  recordedBy!: string | null

  @Column({ type: 'timestamptz', name: 'recorded_at' })
  recordedAt!: Date
}
