import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm'

@Entity('users')
export class User {
  @PrimaryGeneratedColumn('uuid')
  id!: string

  /** Stored lower-cased; unique. */
  @Column({ type: 'varchar', length: 254, unique: true })
  email!: string

  @Column({ type: 'varchar', length: 120 })
  name!: string

  @Column({ type: 'varchar', length: 100, name: 'password_hash' })
  passwordHash!: string

  /** 'si' or 'us': how quantities are shown to this user; stored values stay SI. */
  @Column({ type: 'varchar', length: 8, default: 'si' })
  units!: string

  /** When the owner of the address confirmed it (a link by mail, an invitation, a reset); null: cannot sign in yet. */
  @Column({ type: 'timestamptz', name: 'email_confirmed_at', nullable: true })
  emailConfirmedAt!: Date | null

  /** Sessions signed in before this moment are no longer valid (set by a reset, a password change, a removal). */
  @Column({ type: 'timestamptz', name: 'sessions_valid_after', nullable: true })
  sessionsValidAfter!: Date | null

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date
}
