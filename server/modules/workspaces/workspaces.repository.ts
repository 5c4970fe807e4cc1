import { dataSource } from '../../data-source'
import { hotCache } from '../../lib/hot-cache'
import { Membership } from './membership.entity'

const memberships = () => dataSource.getRepository(Membership)

const membershipCache = hotCache<{ m: Membership | null }>()

/** A user's membership of a workspace (cached for two seconds; changes here clear it). */
export async function findMembership(workspaceId: string, userId: string) {
  const key = `${workspaceId}:${userId}`
  const hit = membershipCache.get(key)
  if (hit) return hit.m
  const m = await memberships().findOne({ where: { workspaceId, userId } })
  membershipCache.set(key, { m })
  return m
}

/** Forget cached memberships after a role change, a removal or a join. */
export function forgetMemberships() {
  membershipCache.clear()
}

export function firstMembership(userId: string) {
  return memberships().findOne({ where: { userId }, order: { createdAt: 'ASC' } })
}

export function listUserMemberships(userId: string) {
  return memberships().find({ where: { userId }, relations: { workspace: true }, order: { createdAt: 'ASC' } })
}

export function listWorkspaceMembers(workspaceId: string) {
  return memberships().find({ where: { workspaceId }, relations: { user: true }, order: { createdAt: 'ASC' } })
}
