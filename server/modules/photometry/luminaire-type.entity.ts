import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import type { ChemistryId } from '../../../shared/engine/chemistries/types'

/** A luminaire type in a workspace's own catalogue: its photometry, emergency output and battery. */
@Entity('luminaire_types')
export class LuminaireType {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'varchar', length: 120 })
  name!: string

  @Column({ type: 'uuid', name: 'photometric_file_id', nullable: true })
  photometricFileId!: string | null

  @Column({ type: 'double precision', name: 'emergency_output_factor' })
  emergencyOutputFactor!: number

  @Column({ type: 'double precision', name: 'rated_duration_s' })
  ratedDurationS!: number

  @Column({ type: 'jsonb' })
  modes!: Array<'maintained' | 'non-maintained'>

  @Column({ type: 'varchar', length: 16 })
  chemistry!: ChemistryId

  @Column({ type: 'integer', name: 'cells_in_series' })
  cellsInSeries!: number

  @Column({ type: 'double precision', name: 'capacity_ah', nullable: true })
  capacityAh!: number | null

  @Column({ type: 'double precision', name: 'emergency_power_w' })
  emergencyPowerW!: number

  @Column({ type: 'double precision', name: 'input_power_w' })
  inputPowerW!: number

  @Column({ type: 'text', default: '' })
  notes!: string

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date
}
