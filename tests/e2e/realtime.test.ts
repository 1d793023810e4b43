import { afterEach, describe, expect, it } from 'vitest'
import { readFileSync } from 'node:fs'
import { screenshot } from './support/browser'
import { AppShell, signInAs } from './support/pages'
import { ObservedPage } from './support/observed-page'
import { openBrowserSession } from './support/session'

const { server, browser, page } = await openBrowserSession()

// A failed test must not leave the next one signed in.
afterEach(async () => { await browser.clearCookies() })

const snapshots = (name: string) => ({ name, buffer: readFileSync(`sample-feeds/realtime/${name}`) })
// A signed change with its interval, as the table writes it: "−12 s (−30 s to −3 s)".
const CHANGE = /[−+]?\d+ s \([−+]?\d+ s to [−+]?\d+ s\)/

describe('the Observed page', () => {
  it('lets a planner upload the demo snapshots and read the before/after run times', async () => {
    await signInAs(page, server.url, 'planner@fanlight.test')
    const shell = new AppShell(page)
    expect(await shell.navLabels()).toContain('Observed')
    await shell.go('Observed')
    const observed = new ObservedPage(page)
    await observed.waitForCorridor('Kestrel Avenue eastbound')

    // 450 + 450 snapshots: a job, followed to the end.
    await observed.upload([snapshots('before.zip'), snapshots('after.zip')])
    await expect.poll(() => observed.uploadSummary().innerText().catch(() => ''), { timeout: 90_000 }).toMatch(/900 file\(s\): 900 stored/)
    expect(await observed.uploadSummary().innerText()).toMatch(/0 refused/)
    await screenshot(page, 'observed-upload-planner')

    await observed.tab('Before / after').click()
    // The observed days split where the two periods meet: before 15-17 September, after 13-15 October.
    const summary = page.getByTestId('ba-summary')
    await summary.waitFor({ timeout: 60_000 })
    expect(await summary.innerText()).toMatch(/Before 2026-09-15 to 2026-09-17, after 2026-10-13 to 2026-10-15/)
    const corridorRow = await observed.beforeAfterRow('Corridor run')
    expect(corridorRow).toMatch(CHANGE)
    expect(corridorRow).toMatch(/\d+:\d\d/) // medians as minutes:seconds
    // Every corridor intersection has its row.
    for (const name of ['Kestrel Avenue & Foundry Road', 'Harbour Road & Ropewalk Lane']) expect(await observed.beforeAfterRow(name)).toMatch(CHANGE)
    await page.getByRole('img', { name: /Median and 85th percentile segment times/ }).waitFor()
    await page.getByRole('note', { name: 'Safety caution' }).first().waitFor()
    await screenshot(page, 'observed-before-after-planner')

    await observed.tab('Calibration').click()
    const calibration = page.getByRole('table', { name: 'Observed and modelled signal delay' })
    await calibration.getByRole('cell', { name: 'Kestrel Avenue & Tanner Street' }).first().waitFor()
    expect(await calibration.innerText()).toMatch(/AM peak, weekday/)
    expect(await page.getByTestId('late-share').innerText()).toMatch(/observed stop-line crossings/)
    await screenshot(page, 'observed-calibration-planner')
    await shell.signOut()
  })

  it('shows the manager the same before/after figures, without the upload', async () => {
    await signInAs(page, server.url, 'manager@fanlight.test')
    const shell = new AppShell(page)
    await shell.go('Observed')
    const observed = new ObservedPage(page)
    await observed.waitForCorridor('Kestrel Avenue eastbound')
    await observed.tab('Before / after').click()
    await page.getByTestId('ba-summary').waitFor({ timeout: 60_000 })
    expect(await observed.beforeAfterRow('Corridor run')).toMatch(CHANGE)
    expect(await page.locator('input[type="file"]').count()).toBe(0)
    await screenshot(page, 'observed-before-after-manager')
    await shell.signOut()
  })

  it('lets the planner poll the local demo feed the server started', async () => {
    await signInAs(page, server.url, 'planner@fanlight.test')
    await new AppShell(page).go('Observed')
    await page.getByRole('button', { name: 'Use the local demo feed' }).click()
    await page.getByRole('button', { name: 'Poll this feed' }).click()
    const table = page.getByRole('table', { name: 'Polled feeds' })
    await table.getByRole('cell', { name: 'Local demo feed', exact: true }).waitFor()
    await table.getByRole('button', { name: 'Poll now' }).click()
    await expect.poll(() => table.innerText(), { timeout: 30_000 }).toMatch(/stored|duplicate|error/)
    await screenshot(page, 'observed-sources-planner')
    // At any hour the feed answers (buses on the street or an empty FULL_DATASET): the snapshot is
    // stored, or is a duplicate when the server's own poller took the same second's feed just before.
    const text = await table.innerText()
    expect(text).toMatch(/stored|duplicate/)
    expect(text).not.toMatch(/Polling failed/)
  })
})
