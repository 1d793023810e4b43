import { defineStore } from 'pinia'
import { ref } from 'vue'
import * as corridorsApi from '@/api/corridors'
import type {
  ApproachCreateBody, ApproachPatchBody, CorridorCreateBody, CorridorDetailDto, CorridorPatchBody, CorridorSummaryDto,
} from '@shared/schemas/corridors'

/** Corridors: the list and the one open on the detail page (with its approaches). */
export const useCorridorsStore = defineStore('corridors', () => {
  const items = ref<CorridorSummaryDto[]>([])
  const current = ref<CorridorDetailDto | null>(null)
  const loading = ref(false)

  async function load() {
    loading.value = true
    try { items.value = await corridorsApi.listCorridors() } finally { loading.value = false }
  }

  async function open(id: string) {
    loading.value = true
    try { current.value = await corridorsApi.getCorridor(id) } finally { loading.value = false }
  }

  async function reload() {
    if (current.value) current.value = await corridorsApi.getCorridor(current.value.id)
  }

  async function create(body: CorridorCreateBody) {
    const dto = await corridorsApi.createCorridor(body)
    items.value = [...items.value, dto]
    return dto
  }

  async function patch(id: string, body: CorridorPatchBody) {
    current.value = await corridorsApi.patchCorridor(id, body)
  }

  async function remove(id: string, version: number) {
    await corridorsApi.deleteCorridor(id, version)
    items.value = items.value.filter((c) => c.id !== id)
  }

  async function saveApproach(aid: string | null, body: ApproachCreateBody | ApproachPatchBody) {
    if (!current.value) return
    if (aid) await corridorsApi.patchApproach(current.value.id, aid, body as ApproachPatchBody)
    else await corridorsApi.createApproach(current.value.id, body as ApproachCreateBody)
    await reload()
  }

  async function removeApproach(aid: string, version: number) {
    if (!current.value) return
    await corridorsApi.deleteApproach(current.value.id, aid, version)
    await reload()
  }

  return { items, current, loading, load, open, reload, create, patch, remove, saveApproach, removeApproach }
})
