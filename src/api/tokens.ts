import type { Role } from '@shared/schemas/roles'
import { http } from './http'

export interface ApiTokenInfo {
  id: string
  name: string
  role: Role
  prefix: string
  createdAt: string
  lastUsedAt: string | null
  revokedAt: string | null
}
export const fetchTokens = () => http.get<{ tokens: ApiTokenInfo[] }>('/tokens')
export const createToken = (name: string, role: Role) => http.post<ApiTokenInfo & { token: string }>('/tokens', { name, role })
export const revokeToken = (id: string) => http.del<void>(`/tokens/${id}`)

/** A member's token as its workspace's owners see it (never the secret). */
export interface MemberTokenInfo extends ApiTokenInfo {
  userId: string
  userName: string
  userEmail: string
}
export const fetchMemberTokens = () => http.get<{ tokens: MemberTokenInfo[] }>('/workspace/tokens')
export const revokeMemberToken = (id: string) => http.del<void>(`/workspace/tokens/${id}`)
