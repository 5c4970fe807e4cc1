import type { ApiTokenAnswer, ApiTokenListAnswer, MemberTokenListAnswer, NewApiTokenAnswer } from '@shared/schemas/answers/accounts'
import type { Answer } from '@shared/schemas/answers/common'
import type { CreateApiToken } from '@shared/schemas/token.schema'
import { http } from './http'

export type ApiTokenInfo = Answer<typeof ApiTokenAnswer>
export const fetchTokens = () => http.get<Answer<typeof ApiTokenListAnswer>>('/tokens')
export const createToken = (body: CreateApiToken) => http.post<Answer<typeof NewApiTokenAnswer>>('/tokens', body)
export const revokeToken = (id: string) => http.del<void>(`/tokens/${id}`)

/** A member's token as its workspace's owners see it (never the secret). */
export type MemberTokenInfo = Answer<typeof MemberTokenListAnswer>['tokens'][number]
export const fetchMemberTokens = () => http.get<Answer<typeof MemberTokenListAnswer>>('/workspace/tokens')
export const revokeMemberToken = (id: string) => http.del<void>(`/workspace/tokens/${id}`)
