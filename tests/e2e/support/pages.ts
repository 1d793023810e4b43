import { expect } from 'vitest'
import type { Page } from 'playwright-core'

export const DEMO_PASSWORD = 'fanlight-demo'

/** The sign-in page. */
export class SignInPage {
  constructor(private readonly page: Page, private readonly baseUrl: string) {}

  async open() {
    await this.page.goto(`${this.baseUrl}/sign-in`)
    await this.page.getByLabel('E-mail').waitFor()
  }

  async signIn(email: string, password = DEMO_PASSWORD) {
    await this.page.getByLabel('E-mail').fill(email)
    await this.page.locator('#password').fill(password)
    await this.page.getByRole('button', { name: 'Sign in' }).click()
  }

  error() {
    return this.page.getByTestId('sign-in-error')
  }
}

/** The layout shell around every signed-in page. */
export class AppShell {
  constructor(private readonly page: Page) {}

  async navLabels(): Promise<string[]> {
    const nav = this.page.getByRole('navigation', { name: 'Main' })
    await nav.waitFor()
    return (await nav.getByRole('link').allInnerTexts()).map((s) => s.trim())
  }

  async go(label: string) {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: label, exact: true }).click()
  }

  async currentUser(): Promise<string> {
    return (await this.page.getByTestId('current-user').innerText()).replace(/\s+/g, ' ').trim()
  }

  async signOut() {
    await this.page.getByRole('button', { name: 'Sign out' }).click()
    await this.page.getByLabel('E-mail').waitFor()
  }
}

export async function signInAs(page: Page, baseUrl: string, email: string) {
  const signIn = new SignInPage(page, baseUrl)
  await signIn.open()
  await signIn.signIn(email)
  await page.getByRole('navigation', { name: 'Main' }).waitFor()
  expect(page.url()).not.toContain('/sign-in')
}
