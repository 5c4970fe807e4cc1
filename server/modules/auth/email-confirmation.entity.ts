import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm'

/** A single-use link that confirms an e-mail address. Only the token's SHA-256 is stored. */
@Entity('email_confirmations')
export class EmailConfirmation {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'user_id' })
  userId!: string

  @Column({ type: 'varchar', length: 64, name: 'token_hash', unique: true })
  tokenHash!: string

  @Column({ type: 'timestamptz', name: 'expires_at' })
  expiresAt!: Date

  @Column({ type: 'timestamptz', name: 'used_at', nullable: true })
  usedAt!: Date | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date
}
