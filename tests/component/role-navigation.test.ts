import { describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import PrimeVue from 'primevue/config'
import UserInviteDialog from '@/components/UserInviteDialog.vue'
import { navFor } from '@/layout/nav'

describe('navFor', () => {
  it('gives admin pages to admins only', () => {
    const admin = navFor('admin').map((i) => i.name)
    expect(admin).toEqual(expect.arrayContaining(['home', 'users', 'outbox']))
    for (const role of ['planner', 'engineer', 'manager'] as const) {
      const names = navFor(role).map((i) => i.name)
      expect(names[0]).toBe('home')
      expect(names).not.toContain('users')
      expect(names).not.toContain('outbox')
    }
  })
})

describe('UserInviteDialog', () => {
  const organisations = [
    { id: 'a', name: 'Agency', kind: 'agency' as const, unitSystem: 'metric' as const },
    { id: 'c1', name: 'City One', kind: 'city' as const, unitSystem: 'metric' as const },
  ]

  it('emits the invitation with the first organisation that fits the role', async () => {
    const wrapper = mount(UserInviteDialog, {
      props: { visible: true, organisations, error: '' },
      global: { plugins: [[PrimeVue, { theme: 'none' }]] },
      attachTo: document.body,
    })
    await flushPromises()
    // The dialog renders into document.body through a teleport.
    const fill = (sel: string, value: string) => {
      const el = document.querySelector<HTMLInputElement>(sel)!
      el.value = value
      el.dispatchEvent(new Event('input'))
    }
    fill('#inv-name', 'Ola Brightwater')
    fill('#inv-email', 'ola@fanlight.test')
    document.querySelector('form')!.dispatchEvent(new Event('submit'))
    await flushPromises()
    expect(wrapper.emitted('submit')?.[0]?.[0]).toEqual({ name: 'Ola Brightwater', email: 'ola@fanlight.test', role: 'planner', organisationId: 'a' })
    wrapper.unmount()
  })
})
