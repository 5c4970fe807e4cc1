import { createRouter, createWebHistory } from 'vue-router'
import { useAuthStore } from '@/stores/auth'
import { routes } from './routes'

export const router = createRouter({
  history: createWebHistory(),
  routes,
  scrollBehavior: () => ({ top: 0 }),
})

router.beforeEach(async (to) => {
  // Stores are used inside the guard, after Pinia is installed.
  const auth = useAuthStore()
  await auth.load()
  if (to.meta.guestOnly && auth.signedIn) return { name: 'home' }
  if (to.meta.public) return true
  if (!auth.signedIn) return { name: 'sign-in', query: { next: to.fullPath } }
  if (to.meta.role && !auth.can(to.meta.role)) return { name: 'home', query: { denied: String(to.name ?? '') } }
  return true
})

router.afterEach((to) => {
  document.title = to.meta.title && to.meta.title !== 'Lampwright' ? `${to.meta.title} · Lampwright` : 'Lampwright'
})
