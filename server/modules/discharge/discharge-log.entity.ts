import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm'

/** One analysed discharge log: how its file was read, the options, the engine's summary and a down-sampled curve. */
@Entity('discharge_logs')
export class DischargeLog {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'uuid', name: 'file_id' })
  fileId!: string

  @Column({ type: 'varchar', length: 200 })
  title!: string

  @Column({ type: 'text', default: '' })
  notes!: string

  /** The column mapping as sent (delimiter, decimal mark, columns and their units). */
  @Column({ type: 'jsonb' })
  mapping!: Record<string, unknown>

  /** The analysis options as typed ("3 h", "1.0 V"). */
  @Column({ type: 'jsonb' })
  options!: Record<string, unknown>

  /** The engine's result plus the read counts (rows, bad rows). */
  @Column({ type: 'jsonb' })
  summary!: Record<string, unknown>

  /** At most CURVE_POINTS points: hours from the start, pack volts, amps. */
  @Column({ type: 'jsonb' })
  curve!: { tH: number[]; v: number[]; i: number[] | null }

  @Column({ type: 'varchar', length: 20, name: 'engine_version' })
  engineVersion!: string

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date

  @Column({ type: 'uuid', name: 'spec_sheet_id', nullable: true })
  specSheetId!: string | null

  @Column({ type: 'uuid', name: 'test_record_id', nullable: true })
  testRecordId!: string | null

  /** The luminaire whose pack the log is of. */
  @Column({ type: 'uuid', name: 'luminaire_id', nullable: true })
  luminaireId!: string | null
}
