import { z } from 'zod'

/** Workspace roles in rising order: each can do everything the one before can. */
export const ROLES = ['viewer', 'technician', 'designer', 'owner'] as const
export const RoleSchema = z.enum(ROLES)
export type Role = z.infer<typeof RoleSchema>

export function roleRank(role: Role): number {
  return ROLES.indexOf(role)
}

/** True when `role` is at least `least`. */
export function roleAtLeast(role: Role, least: Role): boolean {
  return roleRank(role) >= roleRank(least)
}

/** Words for each role live with every other enumeration's words. */
export { ROLE_LABELS, ROLE_NAMES } from '../labels'
