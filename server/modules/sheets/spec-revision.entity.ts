import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm'
import type { RevisionStatus } from '../../../shared/schemas/sheet.schema'

/** One save of a sheet, frozen: content, inputs, results and the engine version that computed them. */
@Entity('spec_revisions')
@Index(['sheetId', 'number'], { unique: true })
export class SpecRevision {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'uuid', name: 'sheet_id' })
  sheetId!: string

  /** 1, 2, 3… per sheet. */
  @Column({ type: 'integer' })
  number!: number

  /** The sheet's version right after this save (maps an editor's version to what it saw). */
  @Column({ type: 'integer', name: 'sheet_version' })
  sheetVersion!: number

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

  @Column({ type: 'jsonb' })
  inputs!: Record<string, unknown>

  @Column({ type: 'jsonb' })
  results!: Record<string, unknown>

  @Column({ type: 'varchar', length: 20, name: 'engine_version' })
  engineVersion!: string

  @Column({ type: 'varchar', length: 16, default: 'draft' })
  status!: RevisionStatus

  @Column({ type: 'uuid', name: 'author_id', nullable: true })
  authorId!: string | null

  @Column({ type: 'timestamptz', name: 'issued_at', nullable: true })
  issuedAt!: Date | null

  @Column({ type: 'uuid', name: 'issued_by', nullable: true })
  issuedBy!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date
}
