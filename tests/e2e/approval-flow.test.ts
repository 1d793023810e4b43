import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { screenshot } from './support/browser'
import { AppShell, signInAs } from './support/pages'
import { ApprovalTablePage, ProposalPages } from './support/approval-pages'
import { openBrowserSession } from './support/session'

// The whole negotiation on the demo scenario, in a real browser against the real server: the
// planner drafts, evaluates and submits a proposal on the seeded demo corridor; the Brackenford
// engineer agrees one row and asks for a change on another; the Osterfield engineer cannot decide
// Brackenford's rows; the planner sees where it stands; the mails are in the admin's outbox.
const CORRIDOR = 'Kestrel Avenue eastbound'
const PROPOSAL = 'Kestrel Avenue, second round'

const { server, page } = await openBrowserSession()
let proposalId: string
interface Row { id: string; intersectionName: string; jurisdictionId: string; version: number; status: string }
let rows: Row[]

/** The proposal as the signed-in person of the page sees it (same session, through the API). */
async function current() {
  return page.evaluate(async (id) => (await fetch(`/api/proposals/${id}`)).json(), proposalId) as Promise<{ rows: Row[] }>
}
const brackenford = () => rows.filter((r) => r.jurisdictionId === 'org-brackenford')
const osterfield = () => rows.filter((r) => r.jurisdictionId === 'org-osterfield')

describe('negotiating a priority proposal across two cities', () => {
  it('the planner drafts a proposal on the demo corridor, evaluates it and submits it', async () => {
    await signInAs(page, server.url, 'planner@fanlight.test')
    const proposals = new ProposalPages(page, server.url)
    proposalId = await proposals.create(PROPOSAL, CORRIDOR)
    rows = (await current()).rows
    // The planner tunes one row before evaluating: two cycles of lockout at the first signal.
    await proposals.editLockout(rows[0].intersectionName, 2)
    const tuned = new ApprovalTablePage(page, server.url)
    expect(await tuned.row(rows[0].intersectionName).innerText()).toContain('lockout 2 cycles')
    await screenshot(page, 'proposal-draft')
    await proposals.evaluate()
    await page.getByTestId('results-table').waitFor()
    await page.getByRole('note', { name: 'Safety caution' }).waitFor()
    await screenshot(page, 'proposal-results')
    await page.getByRole('button', { name: /^Time-space 1\. .* AM peak$/ }).click()
    await page.getByTestId('row-time-space').locator('canvas').first().waitFor({ timeout: 30_000 })
    await screenshot(page, 'proposal-time-space')
    rows = (await current()).rows
    expect(brackenford().length).toBeGreaterThanOrEqual(2)
    expect(osterfield().length).toBeGreaterThanOrEqual(1)
    await page.getByRole('tab', { name: 'Rows' }).click()
    await proposals.submit()
    await screenshot(page, 'proposal-submitted')
    rows = (await current()).rows
    expect(rows.every((r) => r.status === 'submitted')).toBe(true)
    await new AppShell(page).signOut()
  })

  it('engineer 1 agrees one row and asks for a change with a counter on another', async () => {
    await signInAs(page, server.url, 'engineer@fanlight.test')
    const table = new ApprovalTablePage(page, server.url)
    await table.open(proposalId)
    const [first, second] = brackenford()
    await table.decide(first.intersectionName, 'Agree', 'Works with our peak plans.')
    expect(await table.status(first.intersectionName)).toBe('Agreed')
    await table.decide(second.intersectionName, 'Ask for a change', 'The side street queues back at school time; less extension, please.', { maxExtensionS: 4 })
    expect(await table.status(second.intersectionName)).toBe('Change asked')
    const detail = await table.expand(second.intersectionName)
    await detail.getByTestId('counter-card').getByText('Extension up to 4 s').waitFor()
    await detail.getByTestId('periods-counter').waitFor()
    await detail.getByTestId('row-history').getByText('asked for a change').waitFor()
    await screenshot(page, 'agreement-engineer-1')
    // Engineer 1 may not decide the other city's rows: no button, and the server says no.
    for (const r of osterfield()) expect(await table.decideButton(r.intersectionName).count()).toBe(0)
    await new AppShell(page).signOut()
  })

  it('engineer 2 cannot decide engineer 1’s rows, and a stale decision shows what changed', async () => {
    await signInAs(page, server.url, 'engineer2@fanlight.test')
    const table = new ApprovalTablePage(page, server.url)
    await table.open(proposalId)
    for (const r of brackenford()) expect(await table.decideButton(r.intersectionName).count()).toBe(0)
    const status = await page.evaluate(async ({ id, row }) => (await fetch(`/api/proposals/${id}/rows/${row.id}/decision`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ decision: 'reject', comment: 'Not ours to refuse.', version: 3 }),
    })).status, { id: proposalId, row: brackenford()[0] })
    expect(status).toBe(403)
    // The Osterfield row is decided elsewhere (another tab) while the dialog is open.
    const mine = osterfield()[0]
    const dialog = await table.openDecision(mine.intersectionName)
    await page.evaluate(async ({ id, row }) => fetch(`/api/proposals/${id}/rows/${row.id}/decision`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ decision: 'reject', comment: 'Heavy pedestrian flows all day.', version: row.version }),
    }), { id: proposalId, row: mine })
    await dialog.getByRole('button', { name: 'Send decision' }).click()
    const changed = dialog.getByTestId('row-changed')
    await changed.waitFor()
    expect(await changed.innerText()).toContain('Status: Awaiting city → Refused (by Ines Halloran)')
    await screenshot(page, 'agreement-stale-decision')
    await page.keyboard.press('Escape')
    expect(await table.status(mine.intersectionName)).toBe('Refused')
    await new AppShell(page).signOut()
  })

  it('the planner sees every status, takes the counter and exports the table', async () => {
    await signInAs(page, server.url, 'planner@fanlight.test')
    const table = new ApprovalTablePage(page, server.url)
    await table.open(proposalId)
    const [first, second] = brackenford()
    expect(await table.status(first.intersectionName)).toBe('Agreed')
    expect(await table.status(second.intersectionName)).toBe('Change asked')
    expect(await table.status(osterfield()[0].intersectionName)).toBe('Refused')
    await page.getByTestId('agreement-summary').getByLabel('1 Agreed').first().waitFor()
    await screenshot(page, 'agreement-planner')
    const csv = readFileSync(await (await table.exportCsv()).path(), 'utf8')
    expect(csv.split('\n')[0]).toContain('"Intersection","City","Proposed","Counter"')
    expect(csv).toContain(`"${second.intersectionName}","City of Brackenford"`)
    expect(csv).toContain('"Change asked"')
    await page.getByRole('button', { name: `Answer ${second.intersectionName}`, exact: true }).click()
    const dialog = page.getByRole('dialog', { name: `Answer the city: ${second.intersectionName}` })
    await dialog.getByRole('button', { name: 'Take the counter' }).click()
    await dialog.getByLabel('Comment to the city').fill('Agreed, 4 s it is.')
    await dialog.getByRole('button', { name: 'Send answer' }).click()
    await dialog.waitFor({ state: 'hidden' })
    expect(await table.status(second.intersectionName)).toBe('Agreed')
    await new AppShell(page).signOut()
  })

  it('the mails of the negotiation are in the outbox', async () => {
    await signInAs(page, server.url, 'admin@fanlight.test')
    await new AppShell(page).go('Outbox')
    const [first, second] = brackenford()
    for (const subject of [
      `Priority proposal "${PROPOSAL}" awaits your decision`,
      `City of Brackenford agreed: ${first.intersectionName}`,
      `City of Brackenford asks for a change: ${second.intersectionName}`,
      `City of Osterfield refused: ${osterfield()[0].intersectionName}`,
      `${second.intersectionName}: counter accepted`,
    ]) await page.getByRole('cell', { name: subject, exact: true }).first().waitFor()
    const to = await page.getByRole('row').filter({ hasText: `Priority proposal "${PROPOSAL}"` }).allInnerTexts()
    expect(to.some((t) => t.includes('engineer@fanlight.test'))).toBe(true)
    expect(to.some((t) => t.includes('engineer2@fanlight.test'))).toBe(true)
    await page.locator('.p-datatable-mask').waitFor({ state: 'detached' })
    await screenshot(page, 'outbox-negotiation')
  })
})
