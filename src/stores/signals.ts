import { defineStore } from 'pinia'
import { ref } from 'vue'
import * as signalsApi from '@/api/intersections'
import type {
  IntersectionBody, IntersectionDto, IntersectionPatchBody, TimingPlanBody, TimingPlanPatchBody,
} from '@shared/schemas/signals'

/** Signal assets: the list and the one open on the detail page. */
export const useSignalsStore = defineStore('signals', () => {
  const items = ref<IntersectionDto[]>([])
  const current = ref<IntersectionDto | null>(null)
  const loading = ref(false)

  async function load() {
    loading.value = true
    try { items.value = await signalsApi.listIntersections() } finally { loading.value = false }
  }

  async function open(id: string) {
    loading.value = true
    try { current.value = await signalsApi.getIntersection(id) } finally { loading.value = false }
  }

  function replace(dto: IntersectionDto) {
    if (current.value?.id === dto.id) current.value = dto
    items.value = items.value.some((i) => i.id === dto.id) ? items.value.map((i) => (i.id === dto.id ? dto : i)) : [...items.value, dto]
  }

  async function create(body: IntersectionBody) {
    const dto = await signalsApi.createIntersection(body)
    replace(dto)
    return dto
  }

  async function patch(id: string, body: IntersectionPatchBody) {
    replace(await signalsApi.patchIntersection(id, body))
  }

  async function remove(id: string, version: number) {
    await signalsApi.deleteIntersection(id, version)
    items.value = items.value.filter((i) => i.id !== id)
    if (current.value?.id === id) current.value = null
  }

  /** Plan writes reload the intersection, so its version and plan list stay in step. */
  async function savePlan(id: string, planId: string | null, body: TimingPlanBody | TimingPlanPatchBody) {
    if (planId) await signalsApi.patchTimingPlan(id, planId, body as TimingPlanPatchBody)
    else await signalsApi.createTimingPlan(id, body as TimingPlanBody)
    replace(await signalsApi.getIntersection(id))
  }

  async function removePlan(id: string, planId: string, version: number) {
    await signalsApi.deleteTimingPlan(id, planId, version)
    replace(await signalsApi.getIntersection(id))
  }

  return { items, current, loading, load, open, create, patch, remove, savePlan, removePlan }
})
