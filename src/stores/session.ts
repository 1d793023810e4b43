import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { fetchMe, signIn, signOut } from '@/api/auth'
import { ApiError } from '@/api/client'
import type { UserDto } from '@shared/schemas/auth'
import type { Role } from '@shared/roles'

export const useSessionStore = defineStore('session', () => {
  const user = ref<UserDto | null>(null)
  const checked = ref(false)
  const role = computed<Role | null>(() => user.value?.role ?? null)

  /** Asks the server once per page load who is signed in. */
  async function ensureChecked(): Promise<void> {
    if (checked.value) return
    try {
      user.value = (await fetchMe()).user
    } catch (err) {
      if (!(err instanceof ApiError && err.status === 401)) throw err
      user.value = null
    } finally {
      checked.value = true
    }
  }

  async function login(email: string, password: string) {
    user.value = (await signIn(email, password)).user
    checked.value = true
  }

  async function logout() {
    await signOut()
    user.value = null
  }

  return { user, role, checked, ensureChecked, login, logout }
})
