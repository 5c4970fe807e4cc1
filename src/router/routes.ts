/**
 * Every client route, by name. Views load lazily so the first page stays small.
 * `meta.role` is the least role a page needs; `meta.public` pages need no sign-in.
 */
import type { RouteRecordRaw } from 'vue-router'
import type { Role } from '@shared/schemas/roles'

declare module 'vue-router' {
  interface RouteMeta {
    public?: boolean
    /** Only for signed-out visitors (sign-in, sign-up). */
    guestOnly?: boolean
    role?: Role
    title?: string
    /** Pages drawn without the workspace shell. */
    bare?: boolean
  }
}

export const routes: RouteRecordRaw[] = [
  { path: '/', name: 'landing', component: () => import('@/views/LandingView.vue'), meta: { public: true, bare: true, title: 'Lampwright' } },
  { path: '/sign-in', name: 'sign-in', component: () => import('@/views/SignInView.vue'), meta: { public: true, guestOnly: true, bare: true, title: 'Sign in' } },
  { path: '/sign-up', name: 'sign-up', component: () => import('@/views/SignUpView.vue'), meta: { public: true, guestOnly: true, bare: true, title: 'Create an account' } },
  { path: '/forgot-password', name: 'forgot-password', component: () => import('@/views/ForgotPasswordView.vue'), meta: { public: true, bare: true, title: 'Forgotten password' } },
  { path: '/reset-password', name: 'reset-password', component: () => import('@/views/ResetPasswordView.vue'), meta: { public: true, bare: true, title: 'Choose a new password' } },
  { path: '/invitation', name: 'invitation', component: () => import('@/views/InvitationView.vue'), meta: { public: true, bare: true, title: 'Invitation' } },
  { path: '/home', name: 'home', component: () => import('@/views/HomeView.vue'), meta: { role: 'viewer', title: 'Home' } },
  { path: '/team', name: 'team', component: () => import('@/views/TeamView.vue'), meta: { role: 'viewer', title: 'Team' } },
  { path: '/outbox', name: 'outbox', component: () => import('@/views/OutboxView.vue'), meta: { role: 'owner', title: 'Outbox' } },
  { path: '/account', name: 'account', component: () => import('@/views/AccountView.vue'), meta: { title: 'Your account' } },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/views/NotFoundView.vue'), meta: { public: true, bare: true, title: 'Not found' } },
]
