import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import type { SheetStatus } from '../../../shared/schemas/sheet.schema'

/** A specification sheet: its current content, with every save kept as a SpecRevision. */
@Entity('spec_sheets')
export class SpecSheet {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'varchar', length: 200 })
  title!: string

  @Column({ type: 'varchar', length: 80, default: '' })
  reference!: string

  @Column({ type: 'varchar', length: 200, default: '' })
  client!: string

  @Column({ type: 'varchar', length: 200, default: '' })
  site!: string

  @Column({ type: 'text', default: '' })
  luminaire!: string

  /** Copied from the inputs so the list can filter on it. */
  @Column({ type: 'varchar', length: 16 })
  chemistry!: string

  /** Pack inputs as typed ("120 mA"), checked by the engine's size schema. */
  @Column({ type: 'jsonb' })
  inputs!: Record<string, unknown>

  /** The engine's size result for the inputs, working included. */
  @Column({ type: 'jsonb' })
  results!: Record<string, unknown>

  @Column({ type: 'varchar', length: 20, name: 'engine_version' })
  engineVersion!: string

  /** 'issued' while the latest revision is the issued one; a later save makes it 'draft' again. */
  @Column({ type: 'varchar', length: 16, default: 'draft' })
  status!: SheetStatus

  @Column({ type: 'integer', name: 'current_revision', default: 1 })
  currentRevision!: number

  @Column({ type: 'integer', name: 'issued_revision', nullable: true })
  issuedRevision!: number | null

  /** Bumped on every change; a save must name the version it started from. */
  @Column({ type: 'integer', default: 1 })
  version!: number

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy!: string | null

  @Column({ type: 'uuid', name: 'updated_by', nullable: true })
  updatedBy!: string | null

  @Column({ type: 'timestamptz', name: 'archived_at', nullable: true })
  archivedAt!: Date | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date
}
