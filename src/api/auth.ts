import type { MeResponse, SignIn, SignUp } from '@shared/schemas/auth.schema'
import type { Role } from '@shared/schemas/roles'
import { http, request } from './http'

export const fetchMe = () => request<MeResponse>('/auth/me', { quiet401: true })
export const signIn = (body: SignIn) => http.post<MeResponse>('/auth/sign-in', body, { quiet401: true })
/** With an invitation: signed in at once (the user and workspace). Without: a message to confirm the e-mail address first. */
export const signUp = (body: SignUp) => http.post<MeResponse | { message: string }>('/auth/sign-up', body)
export const confirmEmail = (token: string) => http.post<{ message: string }>('/auth/confirm-email', { token })
export const signOut = () => http.post<void>('/auth/sign-out')
export const forgotPassword = (email: string) => http.post<{ message: string }>('/auth/forgot-password', { email })
export const resetPassword = (token: string, password: string) => http.post<{ message: string }>('/auth/reset-password', { token, password })
export const changePassword = (currentPassword: string, newPassword: string) => http.post<{ message: string }>('/auth/password', { currentPassword, newPassword })
export const updateProfile = (body: { name?: string; units?: 'si' | 'us' }) => http.patch<MeResponse>('/auth/me', body)
export const switchWorkspace = (workspaceId: string) => http.post<MeResponse>('/workspaces/switch', { workspaceId })
export const createWorkspace = (name: string) => http.post<{ id: string; name: string; role: Role }>('/workspaces', { name })

export interface Member {
  id: string
  userId: string
  name: string
  email: string
  role: Role
  since: string
}
export interface PendingInvitation {
  id: string
  email: string
  role: Role
  expiresAt: string
}
export const fetchMembers = () => http.get<{ members: Member[] }>('/workspace/members')
export const changeMemberRole = (id: string, role: Role) => http.patch<{ id: string; role: Role }>(`/workspace/members/${id}`, { role })
export const removeMember = (id: string) => http.del<void>(`/workspace/members/${id}`)
export const fetchInvitations = () => http.get<{ invitations: PendingInvitation[] }>('/workspace/invitations')
export const inviteMember = (email: string, role: Role) => http.post<PendingInvitation>('/workspace/invitations', { email, role })
export const revokeInvitation = (id: string) => http.del<void>(`/workspace/invitations/${id}`)
export const previewInvitation = (token: string) => http.get<{ workspace: string; email: string; role: Role; expiresAt: string }>(`/invitations/${encodeURIComponent(token)}`)
export const acceptInvitation = (token: string) => http.post<MeResponse>(`/invitations/${encodeURIComponent(token)}/accept`)

export interface CaughtMail {
  id: string
  receivedAt: string
  to: string[]
  subject: string
  text: string
}
export const fetchOutbox = () => http.get<{ messages: CaughtMail[] }>('/outbox')
