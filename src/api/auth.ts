import type { SignIn, SignUp } from '@shared/schemas/auth.schema'
import type {
  CaughtMailAnswer,
  InvitationAnswer,
  InvitationListAnswer,
  InvitationPreviewAnswer,
  MeAnswer,
  MemberAnswer,
  MemberListAnswer,
  MemberRoleAnswer,
  OutboxAnswer,
  WorkspaceAnswer,
  WorkspaceSettingsAnswer,
} from '@shared/schemas/answers/accounts'
import type { Answer, MessageSchema } from '@shared/schemas/answers/common'
import type { Role } from '@shared/schemas/roles'
import type { WorkspaceSettingsPatch } from '@shared/schemas/workspace-settings.schema'
import { http, request } from './http'

export type MeResponse = Answer<typeof MeAnswer>
type Message = Answer<typeof MessageSchema>

export const fetchMe = () => request<MeResponse>('/auth/me', { quiet401: true })
/** The session on load: 200 with no one when signed out, so a public page logs no failed request. */
export const fetchSession = () => request<{ me: MeResponse | null }>('/auth/session')
export const signIn = (body: SignIn) => http.post<MeResponse>('/auth/sign-in', body, { quiet401: true })
/** With an invitation: signed in at once (the user and workspace). Without: a message to confirm the e-mail address first. */
export const signUp = (body: SignUp) => http.post<MeResponse | { message: string }>('/auth/sign-up', body)
export const confirmEmail = (token: string) => http.post<{ message: string }>('/auth/confirm-email', { token })
export const signOut = () => http.post<void>('/auth/sign-out')
export const forgotPassword = (email: string) => http.post<Message>('/auth/forgot-password', { email })
export const resetPassword = (token: string, password: string) => http.post<Message>('/auth/reset-password', { token, password })
export const changePassword = (currentPassword: string, newPassword: string) => http.post<Message>('/auth/password', { currentPassword, newPassword })
export const updateProfile = (body: { name?: string; units?: 'si' | 'us' }) => http.patch<MeResponse>('/auth/me', body)
export const switchWorkspace = (workspaceId: string) => http.post<MeResponse>('/workspaces/switch', { workspaceId })
export const createWorkspace = (name: string) => http.post<Answer<typeof WorkspaceAnswer>>('/workspaces', { name })

export type Member = Answer<typeof MemberAnswer>
export type PendingInvitation = Answer<typeof InvitationAnswer>
export const fetchMembers = () => http.get<Answer<typeof MemberListAnswer>>('/workspace/members')
export const changeMemberRole = (id: string, role: Role) => http.patch<Answer<typeof MemberRoleAnswer>>(`/workspace/members/${id}`, { role })
export const removeMember = (id: string) => http.del<void>(`/workspace/members/${id}`)
export const fetchInvitations = () => http.get<Answer<typeof InvitationListAnswer>>('/workspace/invitations')
export const inviteMember = (email: string, role: Role) => http.post<PendingInvitation>('/workspace/invitations', { email, role })
export const revokeInvitation = (id: string) => http.del<void>(`/workspace/invitations/${id}`)
export const previewInvitation = (token: string) => http.get<Answer<typeof InvitationPreviewAnswer>>(`/invitations/${encodeURIComponent(token)}`)
export const acceptInvitation = (token: string) => http.post<MeResponse>(`/invitations/${encodeURIComponent(token)}/accept`)

export type CaughtMail = Answer<typeof CaughtMailAnswer>
export const fetchOutbox = () => http.get<Answer<typeof OutboxAnswer>>('/outbox')

export type WorkspaceSettings = Answer<typeof WorkspaceSettingsAnswer>
export const fetchWorkspaceSettings = () => http.get<WorkspaceSettings>('/workspace/settings')
export const saveWorkspaceSettings = (patch: WorkspaceSettingsPatch) => http.patch<WorkspaceSettings>('/workspace/settings', patch)
