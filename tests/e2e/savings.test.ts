import { readFileSync } from 'node:fs'
import path from 'node:path'
import { describe, expect, it } from 'vitest'
import { screenshot, SCREENSHOT_DIR } from './support/browser'
import { AppShell, signInAs } from './support/pages'
import type { DashboardDto } from '../../shared/schemas/savings'
import { openBrowserSession } from './support/session'

// The manager's savings on the seeded demo corridor, in a real browser against the real server:
// key figures, the tables and their CSV, and the printable report.
const CORRIDOR = 'Kestrel Avenue eastbound'

const { server, page } = await openBrowserSession()

/** The dashboard as the signed-in person sees it, through the API with the page's session. */
async function figures(corridorId: string) {
  return page.evaluate(async (id) => (await fetch(`/api/dashboard?corridorId=${id}`)).json(), corridorId) as Promise<DashboardDto>
}

async function demoCorridorId(): Promise<string> {
  const all = await page.evaluate(async () => (await fetch('/api/dashboard')).json()) as DashboardDto
  return all.corridors.find((c) => c.corridorName === CORRIDOR)!.corridorId
}

/** Parses the CSV PrimeVue writes: quoted cells, comma-separated, one line per row. */
function parseCsv(text: string): string[][] {
  return text.replace(/^\uFEFF/, '').trim().split(/\r?\n/).map((line) => [...line.matchAll(/"((?:[^"]|"")*)"/g)].map((m) => m[1].replace(/""/g, '"')))
}

describe('the manager’s savings', () => {
  it('shows the demo corridor’s savings and exports a table as CSV', async () => {
    await signInAs(page, server.url, 'manager@fanlight.test')
    const shell = new AppShell(page)
    expect(await shell.navLabels()).toContain('Savings')
    await shell.go('Savings')
    await page.getByRole('heading', { name: 'Savings', level: 1 }).waitFor()
    await page.getByTestId('savings-kpis').waitFor()
    expect(await page.getByTestId('savings-meta').innerText()).toContain(CORRIDOR)

    const corridorId = await demoCorridorId()
    const api = (await figures(corridorId)).corridor!
    const weekday = api.days.find((d) => d.dayType === 'weekday')!
    expect(weekday.accepted.savingPerTripS).toBeGreaterThan(0)
    // The first key figure is the agreed minutes per weekday trip, as the API gives them.
    const perTrip = page.getByRole('group', { name: 'Minutes saved per trip' })
    expect(await perTrip.getByTestId('kpi-value').innerText()).toBe(`${(weekday.accepted.savingPerTripS / 60).toFixed(2)} min`)
    await page.getByRole('group', { name: /Peak buses/ }).waitFor()
    await page.getByTestId('row-status-shares').waitFor()
    await page.getByRole('img', { name: 'Run time through the day with and without priority' }).waitFor()
    await screenshot(page, 'savings-dashboard')

    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Export Savings by intersection as CSV' }).click(),
    ])
    expect(download.suggestedFilename()).toMatch(/by-intersection\.csv$/)
    const csv = parseCsv(readFileSync(await download.path(), 'utf8'))
    const [header, ...lines] = csv
    expect(header.slice(0, 5)).toEqual(['#', 'Intersection', 'City', 'Status', 'Along the corridor (km)'])
    const rows = api.intersections.weekday
    expect(lines.map((l) => l[1])).toEqual(rows.map((r) => r.intersectionName))
    const col = (name: string) => header.indexOf(name)
    for (const [i, r] of rows.entries()) {
      expect(Number(lines[i][col('Agreed vehicle-h a day')])).toBeCloseTo(r.acceptedVehicleHoursPerDay, 2)
      expect(lines[i][col('Status')]).toMatch(/Agreed|Awaiting city|Refused|Change asked|Draft/)
    }
    expect(lines.filter((l) => l[col('Status')] === 'Agreed')).toHaveLength(api.status.counts.accepted)
  })

  it('sets the corridors side by side and switches to every row as proposed', async () => {
    await page.getByTestId('corridor-comparison').getByRole('cell', { name: CORRIDOR }).waitFor()
    await page.getByRole('radio', { name: 'Every row as proposed' }).or(page.getByText('Every row as proposed', { exact: true })).first().click()
    const corridorId = await demoCorridorId()
    const weekday = (await figures(corridorId)).corridor!.days.find((d) => d.dayType === 'weekday')!
    await page.getByRole('group', { name: 'Minutes saved per trip' }).getByText(`${(weekday.proposed.savingPerTripS / 60).toFixed(2)} min`).waitFor()
  })

  it('prints a clean report with the inputs, assumptions, results and the caution', async () => {
    await page.getByRole('link', { name: 'Printable report' }).click()
    await page.getByRole('heading', { name: `Priority savings report: ${CORRIDOR}` }).waitFor()
    await page.getByRole('heading', { name: 'Inputs' }).waitFor()
    await page.getByRole('heading', { name: 'Assumptions' }).waitFor()
    await page.getByRole('heading', { name: 'Results: rows the cities agreed' }).waitFor()
    expect(await page.getByRole('note', { name: 'Safety caution' }).count()).toBeGreaterThan(0)
    // A manager reads the inputs but has no button to change them.
    expect(await page.getByRole('button', { name: 'Edit inputs' }).count()).toBe(0)
    await screenshot(page, 'savings-report')
    await page.emulateMedia({ media: 'print' })
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false)
    expect(await page.getByRole('button', { name: 'Print or save as PDF' }).isVisible()).toBe(false)
    await screenshot(page, 'savings-report-print')
    const pdf = await page.pdf({ path: path.join(SCREENSHOT_DIR, 'savings-report.pdf'), format: 'A4', printBackground: true, preferCSSPageSize: true })
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-')
    await page.emulateMedia({ media: 'screen' })
  })

  it('lets a planner change the inputs, and the figures follow', async () => {
    await new AppShell(page).signOut()
    await signInAs(page, server.url, 'planner@fanlight.test')
    await new AppShell(page).go('Savings')
    await page.getByTestId('savings-kpis').waitFor()
    await page.getByRole('button', { name: 'Edit inputs' }).click()
    await page.getByLabel('Cost per revenue-hour').fill('120')
    await page.getByLabel('Currency (ISO code)').fill('EUR')
    await page.getByRole('button', { name: 'Save inputs' }).click()
    await page.getByRole('group', { name: 'Operating cost a year' }).getByText('at €120 per revenue-hour', { exact: false }).waitFor()
    await screenshot(page, 'savings-inputs-planner')
  })
})
