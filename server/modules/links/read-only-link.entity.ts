import { Column, CreateDateColumn, PrimaryGeneratedColumn } from 'typeorm'

/**
 * The columns of a read-only link handed to someone without an account (a handover pack, a site's
 * log book): the workspace it opens into, the SHA-256 of its token (the token itself is never
 * stored), its last day, and when it was withdrawn. Each kind of link has its own table naming what
 * it opens; the entities extend this class.
 */
export abstract class ReadOnlyLink {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'varchar', length: 64, name: 'token_hash', unique: true })
  tokenHash!: string

  /** Last day the link opens ("YYYY-MM-DD"); null until withdrawn. */
  @Column({ type: 'date', name: 'expires_on', nullable: true })
  expiresOn!: string | null

  @Column({ type: 'timestamptz', name: 'revoked_at', nullable: true })
  revokedAt!: Date | null

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy!: string | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date
}
