import type { ApiTokenAnswer, ApiTokenListAnswer, NewApiTokenAnswer } from '@shared/schemas/answers/accounts'
import type { Answer } from '@shared/schemas/answers/common'
import type { Role } from '@shared/schemas/roles'
import { http } from './http'

export type ApiTokenInfo = Answer<typeof ApiTokenAnswer>
export const fetchTokens = () => http.get<Answer<typeof ApiTokenListAnswer>>('/tokens')
export const createToken = (name: string, role: Role) => http.post<Answer<typeof NewApiTokenAnswer>>('/tokens', { name, role })
export const revokeToken = (id: string) => http.del<void>(`/tokens/${id}`)
