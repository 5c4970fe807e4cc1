import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import type { TestRegimeId } from '../../../shared/schemas/site.schema'

/** A building whose emergency lighting is tested and logged. */
@Entity('sites')
export class SiteEntity {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'varchar', length: 120 })
  name!: string

  @Column({ type: 'varchar', length: 400, default: '' })
  address!: string

  @Column({ type: 'varchar', length: 120, name: 'responsible_name', default: '' })
  responsibleName!: string

  @Column({ type: 'varchar', length: 254, name: 'responsible_email', default: '' })
  responsibleEmail!: string

  @Column({ type: 'varchar', length: 16 })
  regime!: TestRegimeId

  @Column({ type: 'double precision', name: 'ceiling_temperature_c', default: 25 })
  ceilingTemperatureC!: number

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date
}
