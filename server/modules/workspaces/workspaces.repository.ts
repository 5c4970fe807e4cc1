import { dataSource } from '../../data-source'
import { Membership } from './membership.entity'

const memberships = () => dataSource.getRepository(Membership)

export function findMembership(workspaceId: string, userId: string) {
  return memberships().findOne({ where: { workspaceId, userId } })
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

export function countOwners(workspaceId: string) {
  return memberships().count({ where: { workspaceId, role: 'owner' } })
}
