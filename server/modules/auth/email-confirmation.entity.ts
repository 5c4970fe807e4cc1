import { Entity } from 'typeorm'
import { SingleUseLink } from './single-use-link.entity'

/** A single-use link that confirms an e-mail address. */
@Entity('email_confirmations')
export class EmailConfirmation extends SingleUseLink {}
