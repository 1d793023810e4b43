import { describe, expect, it } from 'vitest'
import { minimalFeed, zipFeed } from '../support/gtfs-fixtures'
import { screenshot } from './support/browser'
import { AppShell, signInAs } from './support/pages'
import { openBrowserSession } from './support/session'

const { server, page } = await openBrowserSession()

async function uploadFeed(name: string, body: Buffer) {
  await page.locator('input[type="file"]').setInputFiles({ name, mimeType: 'application/zip', buffer: body })
  await page.getByRole('button', { name: 'Import' }).click()
}

describe('the Feeds pages', () => {
  it('lets a planner upload a feed, follow the import and read its counts', async () => {
    await signInAs(page, server.url, 'planner@fanlight.test')
    const shell = new AppShell(page)
    expect(await shell.navLabels()).toContain('Feeds')
    await shell.go('Feeds')
    await page.getByRole('heading', { name: 'Feeds', level: 1 }).waitFor()
    // The seeded demo feed is listed.
    await page.getByRole('link', { name: 'Lindenmere Regional Transit (demo feed)' }).waitFor()
    await screenshot(page, 'feeds-planner')
    await uploadFeed('test-line.zip', zipFeed(minimalFeed()))
    await page.getByRole('heading', { name: /^test-line\.zip/, level: 1 }).waitFor({ timeout: 60_000 })
    const counts = page.getByRole('region', { name: 'Contents' })
    await expect.poll(() => counts.innerText()).toMatch(/Stop times\s+8/)
    expect(await counts.innerText()).toMatch(/2026-01-05 to 2026-01-16/)
    await page.getByRole('heading', { name: 'Report: 0 errors, 0 warnings' }).waitFor()
    await screenshot(page, 'feed-detail-planner')
  })

  it('shows a failed import with its message and the report, filterable', async () => {
    await page.goto(`${server.url}/feeds`)
    const broken = minimalFeed()
    broken['stops.txt'] = broken['stops.txt'].replace('S1,First Stop,47.6000', 'S1,First Stop,north')
    broken['stops.txt'] += 'S9,Spare,47.7,8.99\n'
    await uploadFeed('broken.zip', zipFeed(broken))
    const failure = page.getByText(/The feed was not imported: stops\.txt line 2, field stop_lat/)
    await failure.waitFor({ timeout: 60_000 })
    await page.getByRole('link', { name: 'See the report' }).click()
    const report = page.getByRole('region', { name: /^Report:/ })
    await report.waitFor()
    await page.getByRole('cell', { name: 'stop_lat', exact: true }).waitFor()
    expect(await report.getByRole('row').count()).toBeGreaterThan(2)
    await report.getByLabel('Search the report').fill('latitude')
    await expect.poll(async () => (await report.locator('tbody tr').allInnerTexts()).join('\n')).toMatch(/stops\.txt\s+2\s+stop_lat\s+north/)
    await screenshot(page, 'feed-report-failed')
    await new AppShell(page).signOut()
  })

  it('shows managers the feeds without upload or delete', async () => {
    await signInAs(page, server.url, 'manager@fanlight.test')
    await new AppShell(page).go('Feeds')
    await page.getByRole('link', { name: 'Lindenmere Regional Transit (demo feed)' }).click()
    await page.getByRole('region', { name: 'Contents' }).waitFor()
    expect(await page.getByRole('button', { name: 'Delete' }).count()).toBe(0)
    await page.goto(`${server.url}/feeds`)
    await page.getByRole('heading', { name: 'Feed versions' }).waitFor()
    expect(await page.getByRole('heading', { name: 'Upload a GTFS feed' }).count()).toBe(0)
    await screenshot(page, 'feeds-manager')
    await new AppShell(page).signOut()
  })
})
