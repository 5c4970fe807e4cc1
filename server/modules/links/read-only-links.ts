/**
 * What every read-only link does the same way: a new random token (only its hash kept), a last day
 * that must not be past already, and opening by token: unknown answers 404, withdrawn or past its
 * last day 410, so the holder is told why rather than left guessing.
 */
import type { Repository } from 'typeorm'
import { AppError, BadRequestError, NotFoundError } from '../../errors/app-error'
import { hashToken } from '../../lib/tokens'
import type { ReadOnlyLink } from './read-only-link.entity'

export type LinkState = 'active' | 'expired' | 'revoked'

/** Whether a link opens on `today` (its last day included). */
export const linkState = (l: Pick<ReadOnlyLink, 'revokedAt' | 'expiresOn'>, today: string): LinkState =>
  l.revokedAt ? 'revoked' : l.expiresOn !== null && l.expiresOn < today ? 'expired' : 'active'

/** Refuses a last day already past (400 naming `expiresOn`). */
export function checkLastDay(expiresOn: string | null, today: string) {
  if (expiresOn !== null && expiresOn < today)
    throw new BadRequestError('The link would have expired already.', [{ path: 'expiresOn', message: `must be today or later (today is ${today})` }])
}

/** The link behind a token, if it opens today; `what` names the record in the 404 ("That log book"). */
export async function openLink<L extends ReadOnlyLink>(repo: Repository<L>, token: string, today: string, what: string): Promise<L> {
  const link = await repo.findOne({ where: { tokenHash: hashToken(token) } as never })
  if (!link) throw new NotFoundError(what)
  const state = linkState(link, today)
  if (state === 'revoked') throw new AppError(410, 'revoked', 'This link has been withdrawn by the people who shared it.')
  if (state === 'expired') throw new AppError(410, 'expired', 'This link has expired. Ask the sender for a new one.')
  return link
}
