import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { MeResponse } from '@shared/schemas/auth.schema'
import { roleAtLeast, type Role } from '@shared/schemas/roles'
import * as api from '@/api/auth'
import { ApiError, setCsrfToken } from '@/api/http'

export const useAuthStore = defineStore('auth', () => {
  /** Who is signed in, their workspace and role; null when signed out. */
  const me = ref<MeResponse | null>(null)
  /** Whether the first "who am I" call has finished. */
  const loaded = ref(false)

  /** True when someone is signed in. */
  const signedIn = computed(() => me.value !== null)
  /** The role in the current workspace. */
  const role = computed<Role | null>(() => me.value?.role ?? null)

  /** True when the current role is at least `least`. */
  function can(least: Role): boolean {
    return role.value !== null && roleAtLeast(role.value, least)
  }

  function apply(next: MeResponse | null) {
    me.value = next
    if (next?.csrfToken) setCsrfToken(next.csrfToken)
  }

  /** Loads the session once (the router guard awaits it). */
  async function load(force = false) {
    if (loaded.value && !force) return
    try {
      apply((await api.fetchSession()).me)
    } catch (err) {
      if (!(err instanceof ApiError) || err.status !== 401) throw err
      apply(null)
    } finally {
      loaded.value = true
    }
  }

  async function signIn(email: string, password: string) {
    apply(await api.signIn({ email, password }))
  }

  /** Signs in when an invitation came with the sign-up; otherwise returns the message asking to confirm the e-mail. */
  async function signUp(input: Parameters<typeof api.signUp>[0]): Promise<string | null> {
    const answer = await api.signUp(input)
    if ('message' in answer) return answer.message
    apply(answer)
    return null
  }

  async function signOut() {
    try {
      await api.signOut()
    } finally {
      setCsrfToken('')
      apply(null)
    }
  }

  async function switchWorkspace(id: string) {
    apply(await api.switchWorkspace(id))
  }

  async function updateProfile(input: { name?: string; units?: 'si' | 'us' }) {
    apply(await api.updateProfile(input))
  }

  /** Forget the session locally (after a 401). */
  function clear() {
    apply(null)
  }

  function $reset() {
    me.value = null
    loaded.value = false
  }

  return { me, loaded, signedIn, role, can, load, signIn, signUp, signOut, switchWorkspace, updateProfile, clear, apply, $reset }
})
