import { afterEach, describe, expect, it } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import PrimeVue from 'primevue/config'
import TimingPlanEditor from '@/components/TimingPlanEditor.vue'
import type { TimingPlanDto } from '@shared/schemas/signals'

const plan = (over: Partial<TimingPlanDto> = {}): TimingPlanDto => ({
  id: 'p1', intersectionId: 'i1', name: 'AM peak', dayTypes: ['weekday'], startTime: '07:00', endTime: '09:00', cycleS: 100, busGreenS: 52,
  yellowS: 4, redClearanceS: 2, crossMinGreenS: 10, pedWalkS: 7, pedClearanceS: 15, offsetS: 0, pedConcurrent: true, version: 3,
  updatedAt: '2026-01-01T00:00:00Z', ...over,
})

let wrapper: VueWrapper | null = null
afterEach(() => { wrapper?.unmount(); wrapper = null })

async function open(p: TimingPlanDto, otherPlans: TimingPlanDto[] = []) {
  wrapper = mount(TimingPlanEditor, {
    props: { visible: true, plan: p, otherPlans, signal: { crossingDistanceM: 16, minPedWalkS: 7 }, error: '', issues: [] },
    global: { plugins: [[PrimeVue, { theme: 'none' }]] },
    attachTo: document.body,
  })
  await flushPromises()
  return wrapper
}
const saveButton = () => [...document.querySelectorAll('button')].find((b) => b.textContent?.includes('Save plan'))!

describe('TimingPlanEditor', () => {
  it('shows the derived cross-street green and lets a passing plan be saved', async () => {
    const w = await open(plan())
    // 100 - 52 - 2 x (4 + 2) = 36 s.
    expect(document.body.textContent).toContain('36 s')
    expect(document.body.textContent).toContain('Passes every timing check')
    expect(saveButton().disabled).toBe(false)
    document.querySelector('form')!.dispatchEvent(new Event('submit'))
    await flushPromises()
    expect(w.emitted('submit')?.[0]?.[0]).toMatchObject({ name: 'AM peak', cycleS: 100, busGreenS: 52, pedConcurrent: true })
  })

  // Yellow 3-6 s [P: MUTCD 2009 sec. 4D.26]; 16 m / 1.0668 m/s = 15.0 s of clearance [P: MUTCD 2009 sec. 4E.06].
  it('refuses a short yellow and a short clearance live, with their sources, and blocks the save', async () => {
    await open(plan({ yellowS: 2.5, pedClearanceS: 12 }))
    const text = document.body.textContent ?? ''
    expect(text).toContain('Yellow change of 2.5 s is outside the usual 3-6 s range')
    expect(text).toContain('MUTCD 2009 sec. 4D.26')
    expect(text).toContain('shorter than the 15 s needed to cross 16 m')
    expect(saveButton().disabled).toBe(true)
  })

  it('refuses a window that overlaps another plan of the intersection', async () => {
    await open(plan({ startTime: '08:00', endTime: '10:00' }), [plan({ id: 'p2', name: 'Midday', startTime: '09:00', endTime: '15:00' })])
    expect(document.body.textContent).toContain('overlaps plan "Midday"')
    expect(saveButton().disabled).toBe(true)
  })
})
