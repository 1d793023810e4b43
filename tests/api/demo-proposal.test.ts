import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { eq } from 'drizzle-orm'
import { startTestApp, type TestApp } from '../support/test-app'
import { buildProposalCorridor, type ProposalCorridor } from '../support/proposal-corridor'
import { corridors, outboxMessages, proposals } from '../../server/db/schema'
import { DEMO_CORRIDOR_NAME, DEMO_PROPOSAL_NAME, seedDemoProposal } from '../../server/seed/demo-proposal'
import type { ProposalDto } from '../../shared/schemas/proposals'

// The demo negotiation seeded on a corridor of the test feed renamed as the demo corridor.
let t: TestApp
let c: ProposalCorridor
beforeAll(async () => {
  t = await startTestApp()
  c = await buildProposalCorridor(t)
})
afterAll(async () => { await t.close() })

describe('the seeded demo proposal', () => {
  it('does nothing without the demo corridor', async () => {
    await seedDemoProposal(t.database.db)
    expect(await t.database.db.select().from(proposals)).toHaveLength(0)
  })

  it('is submitted and half-way through negotiation in each city, once however often it is seeded', async () => {
    await t.database.db.update(corridors).set({ name: DEMO_CORRIDOR_NAME }).where(eq(corridors.id, c.corridorId))
    await t.database.db.delete(outboxMessages)
    await seedDemoProposal(t.database.db)
    await seedDemoProposal(t.database.db)
    const list = await t.database.db.select().from(proposals)
    expect(list.map((x) => x.name)).toEqual([DEMO_PROPOSAL_NAME])
    expect(await t.database.db.select().from(outboxMessages)).toHaveLength(0)

    const p: ProposalDto = (await (await t.as('manager')).get(`/api/proposals/${list[0].id}`).expect(200)).body
    expect(p.status).toBe('submitted')
    const byCity = (id: string) => p.rows.filter((r) => r.jurisdictionId === id).map((r) => r.status)
    // Two rows per city on this corridor: the first decided, the second still waiting.
    expect(byCity('org-brackenford')).toEqual(['accepted', 'submitted'])
    expect(byCity('org-osterfield')).toEqual(['rejected', 'submitted'])
    const accepted = p.rows.find((r) => r.status === 'accepted')!
    expect(accepted.history.map((e) => [e.kind, e.actor?.name])).toEqual([
      ['created', 'Tova Rasmussen'], ['submitted', 'Tova Rasmussen'], ['accepted', 'Dario Fenwick'],
    ])
    expect(accepted.lastComment).toContain('spring timing update')
    // The history reads in order, over past days.
    const times = accepted.history.map((e) => Date.parse(e.at))
    expect([...times].sort((a, b) => a - b)).toEqual(times)
    expect(Date.now() - times[0]).toBeGreaterThan(8 * 86_400_000)
    expect(p.rows.every((r) => r.results && !r.results.stale)).toBe(true)
    expect(p.lastEvaluation?.proposalVersion).toBe(p.version)
    expect(p.rows.find((r) => r.status === 'rejected')!.history.at(-1)).toMatchObject({ kind: 'rejected', actor: { name: 'Ines Halloran' } })
  })

  it('offers a counter, evaluated beside the proposal, where a city has a third row', async () => {
    // A third Brackenford row: the corridor test feed has room for one more signal.
    await t.database.db.delete(proposals)
    const x = (await (await t.as('engineer')).post('/api/intersections').send({
      name: 'Main St & Fifth Ave', lat: 51.0, lon: -1.8775, jurisdictionId: 'org-brackenford', crossingDistanceM: 14,
      plans: [{ name: 'All day', dayTypes: ['weekday', 'saturday', 'sunday'], startTime: '00:00', endTime: '24:00', cycleS: 90, busGreenS: 46, yellowS: 4, redClearanceS: 2, crossMinGreenS: 8, pedWalkS: 7, pedClearanceS: 14, offsetS: 0 }],
    }).expect(201)).body
    await (await t.as('planner')).post(`/api/corridors/${c.corridorId}/approaches`)
      .send({ intersectionId: x.id, lanes: 2, speedLimitKmh: 50, crossLanes: 1, volumes: c.periods.map((q) => ({ periodId: q.id, volumeVehPerHour: 900, crossVolumeVehPerHour: 400 })) }).expect(201)
    await seedDemoProposal(t.database.db)
    const [row] = await t.database.db.select().from(proposals)
    const p: ProposalDto = (await (await t.as('engineer')).get(`/api/proposals/${row.id}`).expect(200)).body
    expect(p.rows.filter((r) => r.jurisdictionId === 'org-brackenford').map((r) => r.status)).toEqual(['accepted', 'change-requested', 'submitted'])
    const asked = p.rows.find((r) => r.status === 'change-requested')!
    expect(asked.counter).toEqual({ maxExtensionS: 6, lockoutCycles: 2 })
    expect(asked.counterResults).toMatchObject({ variant: 'counter', stale: false, settings: { maxExtensionS: 6, lockoutCycles: 2 } })
    expect(asked.lastComment).toContain('school entrance')
  })
})
