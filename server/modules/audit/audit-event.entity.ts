import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm'

/** Who did what, when: every change an auditor may ask about. */
@Entity('audit_events')
@Index(['workspaceId', 'at'])
export class AuditEvent {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id', nullable: true })
  workspaceId!: string | null

  @Column({ type: 'uuid', name: 'actor_id', nullable: true })
  actorId!: string | null

  /** e.g. "sheet.issued", "test.recorded", "member.role-changed" */
  @Column({ type: 'varchar', length: 64 })
  action!: string

  @Column({ type: 'varchar', length: 40, name: 'entity_type' })
  entityType!: string

  @Column({ type: 'varchar', length: 64, name: 'entity_id', nullable: true })
  entityId!: string | null

  @Column({ type: 'jsonb', default: () => "'{}'" })
  data!: Record<string, unknown>

  @CreateDateColumn({ type: 'timestamptz' })
  at!: Date
}
