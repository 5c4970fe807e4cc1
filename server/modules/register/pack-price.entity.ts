import { Column, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm'

/** The price of one replacement pack for a luminaire type, as the register names the type. */
@Entity('pack_prices')
export class PackPriceEntity {
  @PrimaryColumn({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @PrimaryColumn({ type: 'varchar', length: 80, name: 'type_label' })
  typeLabel!: string

  @Column({ type: 'double precision' })
  price!: number

  /** ISO 4217 code. */
  @Column({ type: 'char', length: 3 })
  currency!: string

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date
}
