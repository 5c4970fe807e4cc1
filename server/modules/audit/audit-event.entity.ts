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

  /** The API token the change was made with (null: a signed-in session or the system). */
  @Column({ type: 'uuid', name: 'api_token_id', nullable: true })
  apiTokenId!: string | null

  /** The token's name at the time, so the trail reads even after the token is revoked. */
  @Column({ type: 'varchar', length: 80, name: 'api_token_name', nullable: true })
  apiTokenName!: string | null

  @CreateDateColumn({ type: 'timestamptz' })
  at!: Date
}
