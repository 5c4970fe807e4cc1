import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm'

/** One routine test in the log book. `clientId` makes a retried send land on the same row. */
@Entity('test_records')
export class TestRecordEntity {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'uuid', name: 'luminaire_id' })
  luminaireId!: string

  @Column({ type: 'uuid', name: 'client_id' })
  clientId!: string

  @Column({ type: 'varchar', length: 16 })
  kind!: 'functional' | 'duration'

  @Column({ type: 'date', name: 'tested_on' })
  testedOn!: string

  @Column({ type: 'boolean' })
  passed!: boolean

  @Column({ type: 'double precision', name: 'achieved_duration_h', nullable: true })
  achievedDurationH!: number | null

  @Column({ type: 'text', default: '' })
  faults!: string

  @Column({ type: 'text', name: 'remedial_action', default: '' })
  remedialAction!: string

  @Column({ type: 'uuid', name: 'discharge_log_id', nullable: true })
  dischargeLogId!: string | null

  /** The per-kind checklist as ticked on the round: item id → true (checked and fine) or false (found wrong). */
  @Column({ type: 'jsonb', default: () => "'{}'" })
  checklist!: Record<string, boolean>

  /** Why the pass or fail differs from what the runtime against the rated duration says. */
  @Column({ type: 'text', name: 'verdict_override_reason', default: '' })
  verdictOverrideReason!: string

  /** Why a typed runtime differs from its discharge log. */
  @Column({ type: 'text', name: 'runtime_note', default: '' })
  runtimeNote!: string

  /** The round it was recorded on, by the round's client id. */
  @Column({ type: 'uuid', name: 'round_client_id', nullable: true })
  roundClientId!: string | null

  @Column({ type: 'uuid', name: 'recorded_by', nullable: true })
  recordedBy!: string | null

  @Column({ type: 'timestamptz', name: 'recorded_at' })
  recordedAt!: Date

  /** Marked as entered in error: kept in the log book, left out of the luminaire's state. */
  @Column({ type: 'timestamptz', name: 'recorded_in_error_at', nullable: true })
  recordedInErrorAt!: Date | null

  @Column({ type: 'uuid', name: 'recorded_in_error_by', nullable: true })
  recordedInErrorBy!: string | null

  @Column({ type: 'text', name: 'recorded_in_error_reason', default: '' })
  recordedInErrorReason!: string

  @Column({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date
}
