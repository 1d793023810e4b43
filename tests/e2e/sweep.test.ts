import { describe, expect, it } from 'vitest'
import { screenshot } from './support/browser'
import { AppShell, signInAs } from './support/pages'
import { ApprovalTablePage, ProposalPages } from './support/approval-pages'
import { openBrowserSession } from './support/session'

// Suggested settings and the trade-off curve on the demo scenario, in a real browser against the
// real server: the planner fills every row with the recommendation and submits; the Brackenford
// engineer opens the curve of a row in the approval table, picks a point and sends it as the
// city's counter.
const CORRIDOR = 'Kestrel Avenue eastbound'
const PROPOSAL = 'Kestrel Avenue, suggested settings'

const { server, page } = await openBrowserSession()
let proposalId: string
interface Row {
  id: string; intersectionName: string; jurisdictionId: string; version: number; status: string
  settings: { strategy: string; maxExtensionS: number; maxEarlyGreenS: number; lockoutCycles: number }
  counter: { maxExtensionS?: number; maxEarlyGreenS?: number; lockoutCycles?: number } | null
}

async function rows(): Promise<Row[]> {
  return (await page.evaluate(async (id) => (await fetch(`/api/proposals/${id}`)).json(), proposalId)).rows
}

describe('suggested settings and the trade-off curve', () => {
  let before: Row[]

  it('the planner fills every row with the suggestion; the rows stay drafts until submitted', async () => {
    await signInAs(page, server.url, 'planner@fanlight.test')
    const proposals = new ProposalPages(page, server.url)
    proposalId = await proposals.create(PROPOSAL, CORRIDOR)
    before = await rows()
    await page.getByRole('button', { name: 'Suggest all' }).click()
    await page.getByText('Suggested settings for the rows').waitFor({ timeout: 60_000 })
    const after = await rows()
    expect(after.every((r) => r.status === 'draft')).toBe(true)
    // at least one row now has settings other than the defaults, each a new version
    const changed = after.filter((r, i) => r.version > before[i].version)
    expect(changed.length).toBeGreaterThan(0)
    await screenshot(page, 'sweep-suggested')
    await proposals.evaluate()
    await page.getByRole('tab', { name: 'Rows' }).click()
    await proposals.submit()
    await new AppShell(page).signOut()
  })

  it('the engineer opens the curve of a row in the approval table and sends a counter picked on it', async () => {
    await signInAs(page, server.url, 'engineer@fanlight.test')
    const table = new ApprovalTablePage(page, server.url)
    await table.open(proposalId)
    const mine = (await rows()).find((r) => r.jurisdictionId === 'org-brackenford' && r.status === 'submitted' && r.settings.strategy !== 'none')!
    expect(mine).toBeDefined()
    await page.getByRole('button', { name: `Trade-off curve of ${mine.intersectionName}`, exact: true }).click()
    const dialog = page.getByRole('dialog', { name: `Trade-off curve: ${mine.intersectionName}` })
    await dialog.getByTestId('trade-off-chart').locator('canvas').first().waitFor({ timeout: 60_000 })
    await dialog.getByRole('note', { name: 'Safety caution' }).waitFor()
    await screenshot(page, 'sweep-curve')
    await dialog.getByTestId('sweep-recommendation').getByText(/^(Suggested: |No priority|No setting keeps every limit)/).waitFor()

    // pick the best trade-offs in turn until one differs from the proposal (a counter changes something)
    const send = dialog.getByRole('button', { name: 'Ask for this change' })
    await dialog.getByLabel('Comment to the agency').fill('Less green from the side street at this one, please.')
    const picks = dialog.getByTestId('sweep-front').getByRole('button', { name: /^Pick trade-off \d+$/ })
    const n = await picks.count()
    expect(n).toBeGreaterThan(1)
    let counterText = ''
    for (let i = 0; i < n && !counterText; i++) {
      await picks.nth(i).click()
      const text = await dialog.getByTestId('sweep-picked').innerText()
      if (await send.isEnabled()) counterText = /Counter: (.*)/.exec(text)?.[1]?.trim() ?? ''
    }
    expect(counterText).not.toBe('')
    await screenshot(page, 'sweep-curve-picked')
    await send.click()
    await dialog.waitFor({ state: 'hidden' })

    expect(await table.status(mine.intersectionName)).toBe('Change asked')
    const detail = await table.expand(mine.intersectionName)
    await detail.getByTestId('counter-card').getByText(counterText, { exact: true }).waitFor()
    await detail.getByTestId('periods-counter').waitFor()
    const now = (await rows()).find((r) => r.id === mine.id)!
    expect(now.counter).not.toBeNull()
    expect(now.version).toBeGreaterThan(mine.version)
    await screenshot(page, 'sweep-counter-sent')
  })
})
