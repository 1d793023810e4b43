// Page objects of the proposal pages and the approval table.
import type { Download, Locator, Page } from 'playwright-core'

export class ProposalPages {
  constructor(private readonly page: Page, private readonly baseUrl: string) {}

  async create(name: string, corridorName: string) {
    await this.page.goto(`${this.baseUrl}/proposals`)
    await this.page.getByRole('button', { name: 'New proposal' }).click()
    const dialog = this.page.getByRole('dialog', { name: 'New proposal' })
    await dialog.getByLabel('Name').fill(name)
    await dialog.locator('#np-corridor').click()
    await this.page.getByRole('option', { name: corridorName, exact: true }).click()
    await dialog.getByRole('button', { name: 'Create proposal' }).click()
    await this.page.getByRole('heading', { level: 1, name }).waitFor()
    return this.page.url().split('/').pop()!
  }

  /** Changes the lockout of one row in the editor dialog. */
  async editLockout(intersection: string, cycles: number) {
    await this.page.getByRole('button', { name: `Edit ${intersection}`, exact: true }).click()
    const dialog = this.page.getByRole('dialog', { name: `Edit: ${intersection}` })
    const input = dialog.getByLabel('Lockout (cycles)')
    await input.fill(String(cycles))
    await input.press('Tab')
    await dialog.getByRole('button', { name: 'Save row' }).click()
    await dialog.waitFor({ state: 'hidden' })
  }

  async evaluate() {
    await this.page.getByRole('button', { name: 'Evaluate' }).click()
    await this.page.getByTestId('corridor-totals').waitFor({ timeout: 60_000 })
  }

  async submit() {
    await this.page.getByRole('button', { name: /^Submit \d+ rows? to the cities$/ }).click()
    await this.page.getByRole('link', { name: 'Open in the approval table' }).waitFor()
  }
}

export class ApprovalTablePage {
  constructor(private readonly page: Page, private readonly baseUrl: string) {}

  async open(proposalId: string) {
    await this.page.goto(`${this.baseUrl}/agreement?proposal=${proposalId}`)
    await this.table().locator('tbody tr').first().waitFor()
  }

  table(): Locator { return this.page.getByTestId('approval-table') }

  row(intersection: string): Locator {
    return this.table().locator('tbody tr').filter({ has: this.page.getByText(intersection, { exact: true }) })
  }

  async status(intersection: string): Promise<string> {
    return (await this.row(intersection).locator('[data-status]').innerText()).trim()
  }

  decideButton(intersection: string): Locator {
    return this.page.getByRole('button', { name: `Decide ${intersection}`, exact: true })
  }

  async openDecision(intersection: string) {
    await this.decideButton(intersection).click()
    const dialog = this.page.getByRole('dialog', { name: `Decide: ${intersection}` })
    await dialog.waitFor()
    return dialog
  }

  async decide(intersection: string, choice: 'Agree' | 'Ask for a change' | 'Refuse', comment: string, counter?: { maxExtensionS?: number }) {
    const dialog = await this.openDecision(intersection)
    await dialog.getByRole('button', { name: choice, exact: true }).click()
    await dialog.getByLabel(/^Comment/).fill(comment)
    if (counter) {
      await dialog.getByText('Offer counter values').click()
      if (counter.maxExtensionS !== undefined) {
        const input = dialog.getByLabel('Maximum extension (s)')
        await input.fill(String(counter.maxExtensionS))
        await input.press('Tab')
      }
    }
    await dialog.getByRole('button', { name: 'Send decision' }).click()
    await dialog.waitFor({ state: 'hidden' })
  }

  async expand(intersection: string) {
    await this.row(intersection).getByRole('button').first().click()
    await this.page.getByTestId(`row-detail-${intersection}`).waitFor()
    return this.page.getByTestId(`row-detail-${intersection}`)
  }

  async exportCsv(): Promise<Download> {
    const [download] = await Promise.all([
      this.page.waitForEvent('download'),
      this.page.getByRole('button', { name: 'Export CSV' }).click(),
    ])
    return download
  }
}
