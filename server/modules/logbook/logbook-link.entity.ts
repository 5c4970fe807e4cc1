import { Column, Entity } from 'typeorm'
import { ReadOnlyLink } from '../links/read-only-link.entity'

/** A read-only link to a site's log book as it stands on the day it is opened. Only the token's SHA-256 is stored. */
@Entity('logbook_links')
export class LogBookLink extends ReadOnlyLink {
  @Column({ type: 'uuid', name: 'site_id' })
  siteId!: string

  @Column({ type: 'uuid', name: 'revoked_by', nullable: true })
  revokedBy!: string | null
}
