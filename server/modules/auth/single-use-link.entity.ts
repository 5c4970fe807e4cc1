import { Column, CreateDateColumn, PrimaryGeneratedColumn } from 'typeorm'

/**
 * The columns of a single-use link sent by e-mail (confirm an address, reset a password): whose it
 * is, the SHA-256 of its token (the token itself is never stored), when it expires and when it was
 * spent. Each kind of link has its own table; the entities extend this class.
 */
export abstract class SingleUseLink {
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
