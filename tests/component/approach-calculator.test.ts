import { afterEach, describe, expect, it, vi } from 'vitest'
import { effectScope, nextTick } from 'vue'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import PrimeVue from 'primevue/config'
import ApproachForm from '@/components/ApproachForm.vue'
import ApproachKeyFigures from '@/components/ApproachKeyFigures.vue'
import { useApproachCalculator } from '@/composables/useApproachCalculator'
import { checkApproach, evaluateApproach } from '@shared/model'
import { approachBody, type ApproachInput } from '@shared/schemas/model'

let wrapper: VueWrapper | null = null
afterEach(() => { wrapper?.unmount(); wrapper = null; vi.useRealTimers() })

const global = { plugins: [[PrimeVue, { theme: 'none' }]] as [typeof PrimeVue, object][] }

describe('ApproachForm', () => {
  it('emits new settings for a changed number and never touches its props', async () => {
    const settings = approachBody.parse({})
    const before = JSON.stringify(settings)
    wrapper = mount(ApproachForm, { props: { modelValue: settings, violations: [] }, global, attachTo: document.body })
    const cycle = document.querySelector<HTMLInputElement>('#calc-signal-cycleS')!
    cycle.value = '90'
    cycle.dispatchEvent(new Event('blur'))
    await flushPromises()
    const emitted = wrapper.emitted('update:modelValue') as ApproachInput[][]
    expect(emitted.at(-1)![0].signal.cycleS).toBe(90)
    expect(emitted.at(-1)![0].signal.effectiveGreenS).toBe(30)
    expect(JSON.stringify(settings)).toBe(before)
  })

  it('shows the model\'s objection under its field', async () => {
    const settings = approachBody.parse({ priority: { maxExtensionS: 15 } })
    wrapper = mount(ApproachForm, { props: { modelValue: settings, violations: checkApproach(settings) }, global, attachTo: document.body })
    const error = document.querySelector('#calc-priority-maxExtensionS-error')
    expect(error?.textContent).toMatch(/11 s can be taken/)
    expect(document.querySelector('#calc-priority-maxExtensionS')!.getAttribute('aria-describedby')).toBe('calc-priority-maxExtensionS-error')
  })

  it('shows only the fields the choices use', async () => {
    wrapper = mount(ApproachForm, { props: { modelValue: approachBody.parse({ priority: { strategy: 'none' } }), violations: [] }, global, attachTo: document.body })
    expect(document.querySelector('#calc-priority-maxExtensionS')).toBeNull()
    expect(document.querySelector('#calc-bus-stop-dwellS')).toBeNull()
    await wrapper.setProps({ modelValue: approachBody.parse({ priority: { strategy: 'early-green' }, bus: { stop: { position: 'near-side' } }, diagram: { kind: 'greenshields' } }) })
    expect(document.querySelector('#calc-priority-maxExtensionS')).toBeNull()
    expect(document.querySelector('#calc-priority-maxEarlyGreenS')).not.toBeNull()
    expect(document.querySelector('#calc-bus-stop-dwellS')).not.toBeNull()
    expect(document.querySelector('#calc-diagram-backwardWaveSpeedKmh')).toBeNull()
  })
})

describe('ApproachKeyFigures', () => {
  it('puts the baseline beside priority and states the warnings', () => {
    const result = evaluateApproach(approachBody.parse({ approach: { arrivalFlowVehPerHour: 1000 } }))
    wrapper = mount(ApproachKeyFigures, { props: { result } })
    const text = wrapper.text()
    expect(text).toContain(`${result.bus.baseline.meanDelayS.toFixed(1)} → ${result.bus.priority.meanDelayS.toFixed(1)} s`)
    expect(text).toContain('does not clear')
    expect(text).toMatch(/oversaturated/)
  })
})

describe('useApproachCalculator', () => {
  it('recomputes in the browser after a change, and refuses what the model refuses', async () => {
    vi.useFakeTimers()
    const scope = effectScope()
    const calc = scope.run(() => useApproachCalculator())!
    expect(calc.result.value?.traffic.maxQueueM).toBeCloseTo(62.5, 6)
    expect(calc.field.value?.xM.length).toBeGreaterThan(50)
    calc.settings.value = { ...calc.settings.value, approach: { ...calc.settings.value.approach, arrivalFlowVehPerHour: 450 } }
    await nextTick()
    expect(calc.computing.value).toBe(true)
    vi.advanceTimersByTime(200)
    expect(calc.result.value?.traffic.degreeOfSaturation).toBeCloseTo(0.5, 9)
    calc.settings.value = { ...calc.settings.value, priority: { ...calc.settings.value.priority, maxEarlyGreenS: 25 } }
    await nextTick()
    vi.advanceTimersByTime(200)
    expect(calc.violations.value.map((v) => v.field)).toEqual(['priority.maxEarlyGreenS'])
    expect(calc.result.value).toBeNull()
    calc.reset()
    await nextTick()
    vi.advanceTimersByTime(200)
    expect(calc.violations.value).toEqual([])
    expect(calc.result.value).not.toBeNull()
    scope.stop()
  })
})
