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
