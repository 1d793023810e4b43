import { defineStore } from 'pinia'
import { ref } from 'vue'
import * as usersApi from '@/api/users'
import type { InviteBody, OrganisationDto, OrganisationPatchBody, UserDto, UserPatchBody } from '@shared/schemas/auth'

export const useUsersStore = defineStore('users', () => {
  const items = ref<UserDto[]>([])
  const organisations = ref<OrganisationDto[]>([])
  const loading = ref(false)

  async function load() {
    loading.value = true
    try {
      ;[items.value, organisations.value] = await Promise.all([usersApi.listUsers(), usersApi.listOrganisations()])
    } finally {
      loading.value = false
    }
  }

  async function invite(body: InviteBody) {
    const user = await usersApi.inviteUser(body)
    items.value = [...items.value, user]
    return user
  }

  async function patch(id: string, body: UserPatchBody) {
    const user = await usersApi.patchUser(id, body)
    items.value = items.value.map((u) => (u.id === id ? user : u))
  }

  async function patchOrganisation(id: string, body: OrganisationPatchBody) {
    const org = await usersApi.patchOrganisation(id, body)
    organisations.value = organisations.value.map((o) => (o.id === id ? org : o))
    items.value = items.value.map((u) => (u.organisation.id === id ? { ...u, organisation: org } : u))
  }

  return { items, organisations, loading, load, invite, patch, patchOrganisation }
})
