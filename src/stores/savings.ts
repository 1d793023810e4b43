import { defineStore } from 'pinia'
import { ref } from 'vue'
import * as savingsApi from '@/api/savings'
import type { CorridorComparisonDto, CorridorSavingsDto, SavingsInputsBody } from '@shared/schemas/savings'

export const useSavingsStore = defineStore('savings', () => {
  const corridors = ref<CorridorComparisonDto[]>([])
  const current = ref<CorridorSavingsDto | null>(null)
  const loading = ref(false)

  /** Every corridor side by side. */
  async function loadOverview() {
    loading.value = true
    try { corridors.value = (await savingsApi.getDashboard()).corridors } finally { loading.value = false }
  }

  async function loadCorridor(corridorId: string) {
    loading.value = true
    try { current.value = (await savingsApi.getDashboard({ corridorId })).corridor } finally { loading.value = false }
  }

  /** Saves the inputs, then the figures they change. */
  async function saveInputs(body: SavingsInputsBody) {
    await savingsApi.putSavingsInputs(body)
    await Promise.all([current.value ? loadCorridor(current.value.corridor.id) : Promise.resolve(), loadOverview()])
  }

  return { corridors, current, loading, loadOverview, loadCorridor, saveInputs }
})
