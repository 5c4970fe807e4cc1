import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm'
import type { Role } from '../../../shared/schemas/roles'
import type { TokenScope } from '../../../shared/schemas/token.schema'

/** A personal API token for scripts: one workspace, a role no higher than its owner's, stored hashed. */
@Entity('api_tokens')
export class ApiToken {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  @Column({ type: 'uuid', name: 'user_id' })
  userId!: string

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string

  @Column({ type: 'varchar', length: 16 })
  role!: Role

  @Column({ type: 'varchar', length: 80 })
  name!: string

  @Column({ type: 'varchar', length: 64, name: 'token_hash', unique: true })
  tokenHash!: string

  /** First characters of the token, to recognise it in a list. */
  @Column({ type: 'varchar', length: 16 })
  prefix!: string

  @Column({ type: 'timestamptz', name: 'last_used_at', nullable: true })
  lastUsedAt!: Date | null

  /** After this moment the token no longer works (null: until revoked). */
  @Column({ type: 'timestamptz', name: 'expires_at', nullable: true })
  expiresAt!: Date | null

  /** What the token may do: read (GET), write (changes), calc (engine tools). */
  @Column({ type: 'text', array: true, default: () => "'{read,write,calc}'" })
  scopes!: TokenScope[]

  @Column({ type: 'timestamptz', name: 'revoked_at', nullable: true })
  revokedAt!: Date | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date
}
