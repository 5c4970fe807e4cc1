import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import type { ChemistryId } from '../../../shared/engine/chemistries'

/** One emergency luminaire or exit sign in a site's register, with the battery pack it carries. */
@Entity('luminaires')
export class LuminaireEntity {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'uuid', name: 'site_id' })
  siteId!: string

  @Column({ type: 'uuid', name: 'area_id', nullable: true })
  areaId!: string | null

  @Column({ type: 'varchar', length: 40 })
  tag!: string

  @Column({ type: 'varchar', length: 200, default: '' })
  location!: string

  /** The type as written on the schedule (free text). */
  @Column({ type: 'varchar', length: 80, name: 'type_label', default: '' })
  typeLabel!: string

  @Column({ type: 'varchar', length: 16 })
  purpose!: 'escape-route' | 'open-area' | 'high-risk' | 'exit-sign'

  @Column({ type: 'varchar', length: 16 })
  mode!: 'maintained' | 'non-maintained'

  @Column({ type: 'double precision', name: 'rated_duration_h' })
  ratedDurationH!: number

  @Column({ type: 'varchar', length: 16 })
  chemistry!: ChemistryId

  @Column({ type: 'integer', name: 'cells_in_series' })
  cellsInSeries!: number

  @Column({ type: 'double precision', name: 'capacity_ah' })
  capacityAh!: number

  /** "YYYY-MM-DD" */
  @Column({ type: 'date', name: 'pack_fitted_on' })
  packFittedOn!: string

  @Column({ type: 'uuid', name: 'spec_sheet_id', nullable: true })
  specSheetId!: string | null

  @Column({ type: 'uuid', name: 'luminaire_type_id', nullable: true })
  luminaireTypeId!: string | null

  /** Place in the site's walking order for a round (lower first); null walks after the numbered ones, by area and tag. */
  @Column({ type: 'integer', name: 'walk_order', nullable: true })
  walkOrder!: number | null

  /** The final circuit feeding it, as the designer labels it (the test planner can group by it). */
  @Column({ type: 'varchar', length: 40, default: '' })
  circuit!: string

  /** Hours its charger takes to restore full duration after a full discharge, when the charger check has shown it. */
  @Column({ type: 'double precision', name: 'recharge_h', nullable: true })
  rechargeH!: number | null

  /** The key an outside schedule knows it by; a schedule imported again updates the luminaire with the same key. */
  @Column({ type: 'varchar', length: 80, name: 'external_id', nullable: true })
  externalId!: string | null

  /** The last functional test done before this register kept its log book ("YYYY-MM-DD"), as a schedule carried it. */
  @Column({ type: 'date', name: 'last_functional_test_on', nullable: true })
  lastFunctionalTestOn!: string | null

  /** The last full-duration test done before this register kept its log book ("YYYY-MM-DD"). */
  @Column({ type: 'date', name: 'last_duration_test_on', nullable: true })
  lastDurationTestOn!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date
}
