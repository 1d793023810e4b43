import { ref, watch, type Ref } from 'vue'
import * as realtimeApi from '@/api/realtime'
import type { BeforeAfterDto, CoverageDto } from '@shared/schemas/realtime'

export interface BeforeAfterRanges {
  beforeFrom: string
  beforeTo: string
  afterFrom: string
  afterTo: string
}

/**
 * Ranges from the observed days split at a go-live date (the first day of the after period):
 * before = the observed days before it, after = the observed days from it on. Without a date the
 * days are split at the widest gap between two observed days (where the demo's two weeks meet).
 */
export function rangesFromCoverage(days: CoverageDto['days'], goLive?: string): BeforeAfterRanges | null {
  const dates = days.map((d) => d.date).sort()
  if (dates.length < 2) return null
  let split = goLive ? dates.findIndex((d) => d >= goLive) : -1
  if (!goLive) {
    let widest = 0
    for (let i = 1; i < dates.length; i++) {
      const gap = Date.parse(dates[i]) - Date.parse(dates[i - 1])
      if (gap > widest) { widest = gap; split = i }
    }
  }
  if (split <= 0) return null
  return { beforeFrom: dates[0], beforeTo: dates[split - 1], afterFrom: dates[split], afterTo: dates[dates.length - 1] }
}

/** The before/after comparison of one corridor, refetched whenever the corridor or the ranges change. */
export function useBeforeAfter(corridorId: Ref<string>, filters: Ref<{ dayType?: string; periodId?: string }>) {
  const coverage = ref<CoverageDto | null>(null)
  const ranges = ref<BeforeAfterRanges | null>(null)
  const result = ref<BeforeAfterDto | null>(null)
  const loading = ref(false)
  const error = ref<unknown>(null)

  async function loadCoverage() {
    coverage.value = await realtimeApi.getCoverage(corridorId.value)
    ranges.value = rangesFromCoverage(coverage.value.days)
  }

  async function load() {
    if (!ranges.value) { result.value = null; return }
    loading.value = true
    error.value = null
    try {
      result.value = await realtimeApi.getBeforeAfter(corridorId.value, { ...ranges.value, ...filters.value })
    } catch (err) {
      error.value = err
      result.value = null
    } finally {
      loading.value = false
    }
  }

  // A new corridor brings new ranges, and the ranges watcher below fetches the comparison.
  watch(corridorId, async () => {
    result.value = null
    try { await loadCoverage() } catch (err) { error.value = err }
  }, { immediate: true })
  watch([ranges, filters], load, { deep: true })

  return { coverage, ranges, result, loading, error, reload: async () => { await loadCoverage(); await load() } }
}
