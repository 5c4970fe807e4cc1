import { dataSource } from '../../data-source'
import { hotCache } from '../../lib/hot-cache'
import { User } from './user.entity'

export const users = () => dataSource.getRepository(User)

export function findUserByEmail(email: string) {
  return users().findOne({ where: { email: email.toLowerCase() } })
}

const userCache = hotCache<{ u: User | null }>()

/** A user by id (cached for two seconds, as every request loads its user). */
export async function findUserById(id: string) {
  const hit = userCache.get(id)
  // A copy each time, so a caller's change never reaches the cache.
  if (hit) return hit.u ? Object.assign(new User(), hit.u) : null
  const u = await users().findOne({ where: { id } })
  userCache.set(id, { u })
  return u ? Object.assign(new User(), u) : null
}

/** Forget a cached user after a change to it. */
export function forgetUser(id: string) {
  userCache.delete(id)
}
