import { Entity } from 'typeorm'
import { SingleUseLink } from './single-use-link.entity'

/** A single-use password reset link. */
@Entity('password_resets')
export class PasswordReset extends SingleUseLink {}
