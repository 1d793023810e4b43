import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import PrimeVue from 'primevue/config'
import SavingsByIntersectionTable from '@/components/SavingsByIntersectionTable.vue'
import { useSessionStore } from '@/stores/session'
import { navFor } from '@/layout/nav'
import type { IntersectionSavingsDto } from '@shared/schemas/savings'

const row: IntersectionSavingsDto = {
  rowId: 'r1', position: 1, intersectionId: 'x1', intersectionName: 'Kestrel Avenue & Tanner Street', jurisdictionName: 'City of Brackenford',
  status: 'accepted', distanceM: 8897, buses: 117.25, savingPerBusS: 3.61, acceptedVehicleHoursPerDay: 0.1176, proposedVehicleHoursPerDay: 0.1176,
  acceptedVehicleHoursPerYear: 36.9, proposedVehicleHoursPerYear: 36.9, crossExtraDelayPerVehS: 0.5, personHoursBalance: 3.89, periodsMissing: 1, stale: false,
}

function render(unitSystem: 'metric' | 'us') {
  const pinia = createPinia()
  setActivePinia(pinia)
  const session = useSessionStore()
  session.user = {
    id: 'u', email: 'm@x.test', name: 'M', role: 'manager', active: true,
    organisation: { id: 'o', name: 'Agency', kind: 'agency', unitSystem },
  }
  return mount(SavingsByIntersectionTable, { props: { rows: [row], exportName: 'x' }, global: { plugins: [pinia, [PrimeVue, { theme: 'none' }]] } })
}

describe('the savings tables in the organisation’s units', () => {
  it('shows the distance along the corridor in km or, for US customary, in miles', () => {
    const metric = render('metric')
    expect(metric.text()).toContain('Along the corridor (km)')
    expect(metric.text()).toContain('8.90')
    // 8 897 m / 1 609.344 m per mile = 5.53 mi.
    const us = render('us')
    expect(us.text()).toContain('Along the corridor (mi)')
    expect(us.text()).toContain('5.53')
    expect(us.text()).toContain('1 period without figures')
  })

  it('lists the savings page for managers and planners only', () => {
    expect(navFor('manager').map((i) => i.name)).toContain('savings')
    expect(navFor('planner').map((i) => i.name)).toContain('savings')
    expect(navFor('engineer').map((i) => i.name)).not.toContain('savings')
  })
})
