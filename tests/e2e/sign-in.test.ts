import { describe, expect, it } from 'vitest'
import { screenshot } from './support/browser'
import { AppShell, SignInPage, signInAs } from './support/pages'
import { openBrowserSession } from './support/session'

const { server, page } = await openBrowserSession()

// Each role sees its own pages; everyone sees Home. Pages added by later features only extend these lists.
const cases = [
  { email: 'planner@fanlight.test', who: 'Tova Rasmussen Transit planner · Lindenmere Regional Transit', must: ['Home'], mustNot: ['People', 'Outbox'] },
  { email: 'engineer@fanlight.test', who: 'Dario Fenwick Traffic engineer · City of Brackenford', must: ['Home'], mustNot: ['People', 'Outbox'] },
  { email: 'engineer2@fanlight.test', who: 'Ines Halloran Traffic engineer · City of Osterfield', must: ['Home'], mustNot: ['People', 'Outbox'] },
  { email: 'manager@fanlight.test', who: 'Wendell Achterberg Manager · Lindenmere Regional Transit', must: ['Home'], mustNot: ['People', 'Outbox'] },
  { email: 'admin@fanlight.test', who: 'Sam Ortolan Administrator · Lindenmere Regional Transit', must: ['Home', 'People', 'Outbox'], mustNot: [] },
]

describe('signing in as each demo role', () => {
  for (const c of cases) {
    it(`${c.email} sees the navigation of the role and can sign out`, async () => {
      await signInAs(page, server.url, c.email)
      const shell = new AppShell(page)
      expect(await shell.currentUser()).toBe(c.who)
      const labels = await shell.navLabels()
      for (const l of c.must) expect(labels).toContain(l)
      for (const l of c.mustNot) expect(labels).not.toContain(l)
      await page.getByRole('heading', { level: 1 }).waitFor()
      await screenshot(page, `home-${c.email.split('@')[0]}`)
      await shell.signOut()
      expect(page.url()).toContain('/sign-in')
    })
  }

  it('shows an error for a wrong password and stays on the sign-in page', async () => {
    const signIn = new SignInPage(page, server.url)
    await signIn.open()
    await signIn.signIn('planner@fanlight.test', 'not-the-password')
    await signIn.error().waitFor()
    expect(await signIn.error().innerText()).toContain('E-mail or password is wrong')
    expect(page.url()).toContain('/sign-in')
    await screenshot(page, 'sign-in-error')
  })

  it('sends a signed-out visitor of a page to sign in, and a wrong role home', async () => {
    await page.goto(`${server.url}/outbox`)
    await page.getByLabel('E-mail').waitFor()
    expect(page.url()).toContain('/sign-in?next=/outbox')
    await signInAs(page, server.url, 'planner@fanlight.test')
    await page.goto(`${server.url}/outbox`)
    await page.getByRole('heading', { name: /Good to see you/ }).waitFor()
    await new AppShell(page).signOut()
  })

  it('lets the admin invite a person, whose mail lands in the outbox', async () => {
    await signInAs(page, server.url, 'admin@fanlight.test')
    const shell = new AppShell(page)
    await shell.go('People')
    await page.getByRole('button', { name: 'Invite a person' }).click()
    await page.getByLabel('Name').fill('Ola Brightwater')
    await page.getByLabel('E-mail').fill('ola@fanlight.test')
    await page.getByRole('button', { name: 'Send invitation' }).click()
    await page.getByRole('cell', { name: 'ola@fanlight.test' }).waitFor()
    await page.getByRole('dialog').waitFor({ state: 'hidden' })
    await screenshot(page, 'admin-people')
    await shell.go('Outbox')
    await page.getByRole('cell', { name: 'You are invited to Fanlight' }).first().waitFor()
    await screenshot(page, 'admin-outbox')
    await shell.signOut()
  })

  it('shows a page of its own for an unknown address', async () => {
    await page.goto(`${server.url}/no/such/page`)
    await page.getByRole('heading', { name: 'Nothing here' }).waitFor()
  })
})
