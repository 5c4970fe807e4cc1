import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm'
import { ReadOnlyLink } from '../links/read-only-link.entity'
import type { HandoverContent } from '../../../shared/schemas/handover.schema'

/** A handover pack as made on one day: the site frozen in `content`, numbered 1, 2, 3… per site. */
@Entity('handover_packs')
@Index(['siteId', 'number'], { unique: true })
export class HandoverPack {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'uuid', name: 'site_id' })
  siteId!: string

  @Column({ type: 'integer' })
  number!: number

  @Column({ type: 'varchar', length: 120, name: 'signed_by_name' })
  signedByName!: string

  /** "YYYY-MM-DD" */
  @Column({ type: 'date', name: 'signed_on' })
  signedOn!: string

  @Column({ type: 'jsonb' })
  content!: HandoverContent

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date
}

/** A read-only link to one pack. Only the token's SHA-256 is stored. */
@Entity('handover_links')
export class HandoverLink extends ReadOnlyLink {
  @Column({ type: 'uuid', name: 'pack_id' })
  packId!: string
}
