import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm'

/** A stored plan of a site's full-duration tests: the input as given and the engine's groups. */
@Entity('test_plans')
export class TestPlanEntity {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'uuid', name: 'site_id' })
  siteId!: string

  @Column({ type: 'jsonb' })
  input!: Record<string, unknown>

  @Column({ type: 'jsonb' })
  plan!: Record<string, unknown>

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date
}
