import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm'

/** A raw discharge log file, kept once per workspace and SHA-256 however many logs read it. */
@Entity('discharge_files')
export class DischargeFile {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'varchar', length: 64 })
  sha256!: string

  @Column({ type: 'varchar', length: 200, name: 'original_name', default: '' })
  originalName!: string

  /** Not selected by default: a file may be tens of megabytes. */
  @Column({ type: 'bytea', select: false })
  bytes!: Buffer

  @Column({ type: 'integer' })
  size!: number

  @Column({ type: 'uuid', name: 'uploaded_by', nullable: true })
  uploadedBy!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date
}
