import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm'

/** What is kept of a parsed LM-63 file: the intensity table and the header values worth showing. */
export interface ParsedPhotometry {
  verticalAngles: number[]
  horizontalAngles: number[]
  /** cd, one row per horizontal angle, candela multiplier applied. */
  candela: number[][]
  header: {
    edition: string
    keywords: Record<string, string>
    tilt: string
    lamps: number
    lumensPerLamp: number
    candelaMultiplier: number
    unitsType: 1 | 2
    width: number
    length: number
    height: number
    ballastFactor: number
    inputWatts: number
    absolute: boolean
  }
}

/** An uploaded IES LM-63 photometric file: the text as sent and its parsed table. */
@Entity('photometric_files')
export class PhotometricFile {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'varchar', length: 120 })
  name!: string

  @Column({ type: 'text', name: 'raw_text' })
  rawText!: string

  @Column({ type: 'char', length: 64 })
  sha256!: string

  @Column({ type: 'jsonb' })
  parsed!: ParsedPhotometry

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date
}
