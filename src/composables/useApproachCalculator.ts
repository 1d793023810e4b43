import { computed, ref, shallowRef, watch } from 'vue'
import { checkApproach, checkTimeSpace, evaluateApproach, timeSpace } from '@shared/model'
import {
  approachBody, timeSpaceBody, type ApproachInput, type ApproachResult, type ConstraintViolation, type TimeSpaceResult,
} from '@shared/schemas/model'

/** Cells across the time-space chart at most, so that the browser keeps up while typing. */
const CHART_CELLS = 150
const RECOMPUTE_DELAY_MS = 150

/**
 * The calculator's state: the settings, what the model refuses, and the results, recomputed in
 * the browser by the same shared model the server runs (no request per keystroke).
 */
export function useApproachCalculator() {
  const settings = ref<ApproachInput>(approachBody.parse({}))
  /** the bus drawn in the time-space chart; null: where priority saves most */
  const chartPhaseS = ref<number | null>(null)
  const result = shallowRef<ApproachResult | null>(null)
  const field = shallowRef<TimeSpaceResult | null>(null)
  const computing = ref(false)
  const failure = ref('')

  const parsed = computed(() => approachBody.safeParse(settings.value))
  const violations = computed<ConstraintViolation[]>(() => {
    if (!parsed.value.success) {
      return parsed.value.error.issues.map((i) => ({ field: i.path.join('.'), reason: i.message }))
    }
    return checkApproach(parsed.value.data)
  })

  function recompute() {
    computing.value = false
    failure.value = ''
    if (!parsed.value.success || violations.value.length) {
      result.value = null
      field.value = null
      return
    }
    const input = parsed.value.data
    try {
      const evaluation = evaluateApproach(input)
      const { lengthM, downstreamLengthM } = input.approach
      const dxM = Math.max(5, Math.ceil((lengthM + downstreamLengthM) / CHART_CELLS))
      const phase = chartPhaseS.value !== null && chartPhaseS.value < input.signal.cycleS ? chartPhaseS.value : undefined
      const tsInput = timeSpaceBody.parse({ ...input, cycles: 2, dxM, busArrivalPhaseS: phase })
      result.value = evaluation
      field.value = checkTimeSpace(tsInput).length ? null : timeSpace(tsInput, { evaluation })
    } catch (e) {
      result.value = null
      field.value = null
      failure.value = e instanceof Error ? e.message : String(e)
    }
  }

  let timer: ReturnType<typeof setTimeout> | undefined
  watch([settings, chartPhaseS], () => {
    computing.value = true
    clearTimeout(timer)
    timer = setTimeout(recompute, RECOMPUTE_DELAY_MS)
  }, { deep: true })
  recompute()

  function reset() {
    settings.value = approachBody.parse({})
    chartPhaseS.value = null
  }

  return { settings, chartPhaseS, violations, result, field, computing, failure, reset }
}
