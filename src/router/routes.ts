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
  {
    path: '/sign-in',
    name: 'sign-in',
    component: () => import('@/views/SignInView.vue'),
    meta: { public: true, guestOnly: true, bare: true, title: 'Sign in' },
  },
  {
    path: '/sign-up',
    name: 'sign-up',
    component: () => import('@/views/SignUpView.vue'),
    meta: { public: true, guestOnly: true, bare: true, title: 'Create an account' },
  },
  {
    path: '/forgot-password',
    name: 'forgot-password',
    component: () => import('@/views/ForgotPasswordView.vue'),
    meta: { public: true, bare: true, title: 'Forgotten password' },
  },
  {
    path: '/confirm-email',
    name: 'confirm-email',
    component: () => import('@/views/ConfirmEmailView.vue'),
    meta: { public: true, bare: true, title: 'Confirm your e-mail address' },
  },
  {
    path: '/reset-password',
    name: 'reset-password',
    component: () => import('@/views/ResetPasswordView.vue'),
    meta: { public: true, bare: true, title: 'Choose a new password' },
  },
  { path: '/invitation', name: 'invitation', component: () => import('@/views/InvitationView.vue'), meta: { public: true, bare: true, title: 'Invitation' } },
  { path: '/home', name: 'home', component: () => import('@/views/HomeView.vue'), meta: { role: 'viewer', title: 'Home' } },
  { path: '/team', name: 'team', component: () => import('@/views/TeamView.vue'), meta: { role: 'viewer', title: 'Team' } },
  { path: '/sites', name: 'sites', component: () => import('@/views/SitesView.vue'), meta: { role: 'viewer', title: 'Sites' } },
  { path: '/portfolio', name: 'portfolio', component: () => import('@/views/PortfolioView.vue'), meta: { role: 'viewer', title: 'Portfolio' } },
  {
    path: '/rounds',
    name: 'rounds',
    component: () => import('@/views/SitesView.vue'),
    props: { rounds: true },
    meta: { role: 'technician', title: 'Test rounds' },
  },
  { path: '/sites/:id', name: 'site', component: () => import('@/views/SiteView.vue'), meta: { role: 'viewer', title: 'Site' } },
  { path: '/sites/:id/round', name: 'round', component: () => import('@/views/RoundView.vue'), meta: { role: 'technician', title: 'Test round' } },
  {
    path: '/sites/:id/test-plan',
    name: 'site-test-plan',
    component: () => import('@/views/TestPlanView.vue'),
    meta: { role: 'viewer', title: 'Plan the full-duration tests' },
  },
  {
    path: '/sites/:id/handover',
    name: 'site-handover',
    component: () => import('@/views/HandoverView.vue'),
    meta: { role: 'viewer', title: 'Handover packs' },
  },
  { path: '/sites/:id/import', name: 'site-import', component: () => import('@/views/ImportView.vue'), meta: { role: 'designer', title: 'Import a schedule' } },
  { path: '/luminaires/:id', name: 'luminaire', component: () => import('@/views/LuminaireView.vue'), meta: { role: 'viewer', title: 'Luminaire' } },
  { path: '/outbox', name: 'outbox', component: () => import('@/views/OutboxView.vue'), meta: { role: 'owner', title: 'Outbox' } },
  { path: '/pack-bench', name: 'pack-bench', component: () => import('@/views/PackBenchView.vue'), meta: { role: 'viewer', title: 'Pack bench' } },
  { path: '/replace-pack', name: 'replace-pack', component: () => import('@/views/ReplacePackView.vue'), meta: { role: 'viewer', title: 'Replace a pack' } },
  { path: '/charger-check', name: 'charger-check', component: () => import('@/views/ChargerCheckView.vue'), meta: { role: 'viewer', title: 'Charger check' } },
  {
    path: '/charger-check/retrofit',
    name: 'retrofit-planner',
    component: () => import('@/views/RetrofitPlannerView.vue'),
    meta: { role: 'viewer', title: 'Retrofit planner' },
  },
  {
    path: '/route-spacing',
    name: 'route-spacing',
    component: () => import('@/views/RouteSpacingView.vue'),
    meta: { role: 'viewer', title: 'Spacing calculator' },
  },
  {
    path: '/route-spacing/selector',
    name: 'type-selector',
    component: () => import('@/views/TypeSelectorView.vue'),
    meta: { role: 'viewer', title: 'Type selector' },
  },
  {
    path: '/route-spacing/types',
    name: 'luminaire-types',
    component: () => import('@/views/LuminaireTypesView.vue'),
    meta: { role: 'viewer', title: 'Luminaire types' },
  },
  {
    path: '/route-spacing/photometry',
    name: 'photometry',
    component: () => import('@/views/PhotometryView.vue'),
    meta: { role: 'viewer', title: 'Photometric files' },
  },
  { path: '/claim-check', name: 'claim-check', component: () => import('@/views/ClaimCheckView.vue'), meta: { role: 'viewer', title: 'Claim check' } },
  { path: '/discharge', name: 'discharge-logs', component: () => import('@/views/DischargeLogsView.vue'), meta: { role: 'viewer', title: 'Discharge logs' } },
  {
    path: '/discharge/new',
    name: 'discharge-new',
    component: () => import('@/views/DischargeUploadView.vue'),
    meta: { role: 'technician', title: 'New discharge log' },
  },
  {
    path: '/discharge/compare',
    name: 'discharge-compare',
    component: () => import('@/views/DischargeCompareView.vue'),
    meta: { role: 'viewer', title: 'Compare discharge logs' },
  },
  { path: '/discharge/:id', name: 'discharge-log', component: () => import('@/views/DischargeLogView.vue'), meta: { role: 'viewer', title: 'Discharge log' } },
  { path: '/sheets', name: 'sheets', component: () => import('@/views/SheetsView.vue'), meta: { role: 'viewer', title: 'Spec sheets' } },
  { path: '/sheets/:id', name: 'sheet', component: () => import('@/views/SheetView.vue'), meta: { role: 'viewer', title: 'Spec sheet' } },
  {
    path: '/h/:token',
    name: 'shared-handover',
    component: () => import('@/views/SharedHandoverView.vue'),
    meta: { public: true, bare: true, title: 'Handover pack' },
  },
  {
    path: '/l/:token',
    name: 'shared-logbook',
    component: () => import('@/views/SharedLogBookView.vue'),
    meta: { public: true, bare: true, title: 'Log book' },
  },
  {
    path: '/s/:token',
    name: 'shared-sheet',
    component: () => import('@/views/SharedSheetView.vue'),
    meta: { public: true, bare: true, title: 'Shared specification sheet' },
  },
  { path: '/account', name: 'account', component: () => import('@/views/AccountView.vue'), meta: { title: 'Your account' } },
  { path: '/glossary', name: 'glossary', component: () => import('@/views/GlossaryView.vue'), meta: { title: 'Glossary' } },
  { path: '/cautions', name: 'cautions', component: () => import('@/views/CautionsView.vue'), meta: { title: 'Cautions' } },
  { path: '/api-docs', name: 'api-docs', component: () => import('@/views/ApiDocsView.vue'), meta: { title: 'API' } },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/views/NotFoundView.vue'), meta: { public: true, bare: true, title: 'Not found' } },
]
