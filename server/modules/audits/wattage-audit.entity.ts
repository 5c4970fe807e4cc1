import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'

/** One wattage audit: the readings as typed, the engine's result, and where it is attached. */
@Entity('wattage_audits')
export class WattageAudit {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'varchar', length: 200 })
  title!: string

  /** The luminaire as the auditor describes it (model, marking, where it hangs). */
  @Column({ type: 'text', default: '' })
  luminaire!: string

  /** Readings as typed ("25 mA"), checked by the engine's audit schema. */
  @Column({ type: 'jsonb' })
  inputs!: Record<string, unknown>

  /** The engine's audit result for the readings, working included. */
  @Column({ type: 'jsonb' })
  results!: Record<string, unknown>

  /** The claimed power as the engine read it, W (the result itself only holds the deviation). */
  @Column({ type: 'double precision', name: 'claimed_power_w' })
  claimedPowerW!: number

  @Column({ type: 'varchar', length: 20, name: 'engine_version' })
  engineVersion!: string

  @Column({ type: 'uuid', name: 'author_id', nullable: true })
  authorId!: string | null

  @Column({ type: 'uuid', name: 'spec_sheet_id', nullable: true })
  specSheetId!: string | null

  @Column({ type: 'uuid', name: 'luminaire_id', nullable: true })
  luminaireId!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date
}
