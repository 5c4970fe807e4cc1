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

/** The workspace's chosen currency (null when none) and the unit system of its first owner (the longest-standing). */
export async function currencyAndOwnerUnits(workspaceId: string): Promise<{ currency: string | null; ownerUnits: string | null } | null> {
  const [row] = await dataSource.query(
    `SELECT w.currency, (SELECT u.units FROM memberships m JOIN users u ON u.id = m.user_id
                           WHERE m.workspace_id = w.id AND m.role = 'owner' ORDER BY m.created_at, m.id LIMIT 1) AS "ownerUnits"
       FROM workspaces w WHERE w.id = $1`,
    [workspaceId],
  )
  return row ? { currency: row.currency === null ? null : String(row.currency).trim(), ownerUnits: row.ownerUnits ?? null } : null
}
