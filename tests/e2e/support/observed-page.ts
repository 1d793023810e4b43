import type { Page } from 'playwright-core'

/** The Observed page: realtime uploads, polled feeds, before/after and calibration. */
export class ObservedPage {
  constructor(private readonly page: Page) {}

  async waitForCorridor(name: string) {
    await this.page.getByRole('heading', { name: 'Observed', level: 1 }).waitFor()
    await this.page.getByLabel('Corridor').filter({ hasText: name }).waitFor()
  }

  tab(name: 'Data' | 'Before / after' | 'Calibration') {
    return this.page.getByRole('tab', { name })
  }

  /** Chooses files in the upload box, which sends them at once. */
  async upload(files: { name: string; buffer: Buffer }[]) {
    await this.page.locator('input[type="file"]').setInputFiles(files.map((f) => ({ ...f, mimeType: 'application/zip' })))
  }

  uploadSummary() {
    return this.page.getByTestId('upload-summary')
  }

  beforeAfterTable() {
    return this.page.getByRole('table', { name: 'Run times before and after' })
  }

  /** The text of the before/after row of a stretch ("Corridor run" or an intersection). */
  async beforeAfterRow(label: string): Promise<string> {
    const row = this.beforeAfterTable().getByRole('row').filter({ has: this.page.getByRole('cell', { name: label, exact: true }) })
    return (await row.innerText()).replace(/\s+/g, ' ')
  }
}
