import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startTestApp, type TestApp } from '../support/test-app'
import { outboxMessages, proposals } from '../../server/db/schema'
import { DEMO_PROPOSAL_NAME, seedDemoProposal } from '../../server/seed/demo-proposal'
import type { ProposalDto } from '../../shared/schemas/proposals'

// The demo negotiation as the seed leaves it on the demo corridor (sample-feeds/).
let t: TestApp
let p: ProposalDto
beforeAll(async () => {
  t = await startTestApp()
  const [row] = await t.database.db.select().from(proposals)
  p = (await (await t.as('manager')).get(`/api/proposals/${row.id}`).expect(200)).body
})
afterAll(async () => { await t.close() })

describe('the seeded demo proposal', () => {
  it('is one submitted proposal, however often the seed runs, and mails nobody', async () => {
    await seedDemoProposal(t.database.db)
    const list = await t.database.db.select().from(proposals)
    expect(list.map((x) => x.name)).toEqual([DEMO_PROPOSAL_NAME])
    expect(await t.database.db.select().from(outboxMessages)).toHaveLength(0)
    expect(p).toMatchObject({ name: DEMO_PROPOSAL_NAME, corridorName: 'Kestrel Avenue eastbound', status: 'submitted' })
  })

  it('is half-way in each city: some rows decided, some still waiting for that city’s engineer', () => {
    for (const city of ['org-brackenford', 'org-osterfield']) {
      const statuses = p.rows.filter((r) => r.jurisdictionId === city).map((r) => r.status)
      expect(statuses.filter((s) => s === 'submitted').length).toBeGreaterThan(0)
      expect(statuses.filter((s) => s !== 'submitted').length).toBeGreaterThan(0)
    }
    const statuses = new Set(p.rows.map((r) => r.status))
    for (const s of ['accepted', 'rejected', 'change-requested', 'submitted']) expect(statuses).toContain(s)
  })

  it('carries the comments and history of the invented engineers, over past days', () => {
    const decided = p.rows.filter((r) => r.status !== 'submitted')
    for (const r of decided) {
      const last = r.history.at(-1)!
      expect(last.actor?.name).toBe(r.jurisdictionId === 'org-brackenford' ? 'Dario Fenwick' : 'Ines Halloran')
      expect(last.comment.length).toBeGreaterThan(10)
      expect(r.lastComment).toBe(last.comment)
      const times = r.history.map((e) => Date.parse(e.at))
      expect([...times].sort((a, b) => a - b)).toEqual(times)
      expect(Date.now() - times[0]).toBeGreaterThan(8 * 86_400_000)
    }
  })

  it('has its figures stored, and the counter evaluated beside the proposal', () => {
    expect(p.lastEvaluation?.proposalVersion).toBe(p.version)
    expect(p.rows.every((r) => r.results && !r.results.stale && r.checks.every((c) => c.severity !== 'error'))).toBe(true)
    expect(p.totals.find((x) => x.dayType === 'weekday')!.savingPerTripS).toBeGreaterThan(0)
    const asked = p.rows.find((r) => r.status === 'change-requested')!
    expect(asked.counter).toMatchObject({ lockoutCycles: 2 })
    expect(asked.counterResults).toMatchObject({ variant: 'counter', stale: false, settings: { lockoutCycles: 2 } })
    // The counter lowers the limit the row's strategy uses.
    const key = asked.settings.strategy === 'early-green' ? 'maxEarlyGreenS' : 'maxExtensionS'
    expect(asked.counter![key]).toBeLessThan(asked.settings[key])
  })
})
