import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { eq } from 'drizzle-orm'
import { startTestApp, type TestApp } from '../support/test-app'
import { buildProposalCorridor, type ProposalCorridor } from '../support/proposal-corridor'
import { corridors, proposals, savingsScheduleDigests } from '../../server/db/schema'
import { DEMO_CORRIDOR_NAME, DEMO_PROPOSAL_NAME } from '../../server/seed/demo-proposal'
import { ROW_STATUSES, type ProposalDto, type ProposalRowDto } from '../../shared/schemas/proposals'
import type { DashboardDto, ProposalReportDto, SavingsInputsDto } from '../../shared/schemas/savings'

// The seeded demo: the Kestrel Avenue corridor with its negotiation half-way (some rows agreed,
// refused or countered, some waiting). A second corridor on the corridor test feed stands beside it.
let t: TestApp
let demo: { corridorId: string; feedId: number }
let other: ProposalCorridor
let proposal: ProposalDto
beforeAll(async () => {
  t = await startTestApp()
  other = await buildProposalCorridor(t)
  const [corridor] = await t.database.db.select().from(corridors).where(eq(corridors.name, DEMO_CORRIDOR_NAME))
  demo = { corridorId: corridor.id, feedId: corridor.feedVersionId }
  const [p] = await t.database.db.select().from(proposals).where(eq(proposals.name, DEMO_PROPOSAL_NAME))
  proposal = (await (await t.as('manager')).get(`/api/proposals/${p.id}`).expect(200)).body
})
afterAll(async () => { await t.close() })

const paths = (res: request.Response) => (res.body.issues as { path: (string | number)[] }[]).map((i) => i.path.join('.'))
const inputsBody = { defaultLoad: 25, loads: [{ routeId: '7', periodName: 'AM peak', passengers: 45 }], costPerRevenueHour: 150, currency: 'EUR', costYear: 2026, layoverShare: 0.12 }
const weekdaySummary = (r: ProposalRowDto) => r.results!.summaries.find((s) => s.dayType === 'weekday')!
/** Rows with figures in every weekday period: the evaluation's per-row summaries skip the others. */
const fullyEvaluated = (r: ProposalRowDto) => r.results!.periods.filter((p) => p.dayType === 'weekday').every((p) => !p.error)

async function corridorDashboard(who: 'manager' | 'planner' | 'admin' = 'manager', query = '', corridorId = demo.corridorId) {
  const res = await (await t.as(who)).get(`/api/dashboard?corridorId=${corridorId}${query}`).expect(200)
  return (res.body as DashboardDto).corridor!
}

describe('GET /api/dashboard for a corridor', () => {
  it('shows the manager the corridor’s savings, agreed rows apart from rows as proposed', async () => {
    const f = await corridorDashboard()
    expect(f.corridor.name).toBe(DEMO_CORRIDOR_NAME)
    expect(f.proposal).toMatchObject({ id: proposal.id, status: 'submitted' })
    const count = (s: string) => proposal.rows.filter((r) => r.status === s).length
    expect(f.status.counts).toEqual(Object.fromEntries(ROW_STATUSES.map((s) => [s, count(s)])))
    expect(f.status.accepted).toBeCloseTo(count('accepted') / proposal.rows.length, 12)
    expect(f.status.refused).toBeCloseTo(count('rejected') / proposal.rows.length, 12)
    expect(count('accepted')).toBeGreaterThan(0)

    // The evaluation counted buses at each stop line and bus-hours per day its own way
    // (server/services/proposals); the dashboard adds the same up trip by trip from the schedule.
    const weekday = f.days.find((d) => d.dayType === 'weekday')!
    const sum = (rows: ProposalRowDto[]) => rows.reduce((s, r) => s + weekdaySummary(r).dailyBusHoursSaved, 0)
    expect(weekday.accepted.vehicleHours).toBeCloseTo(sum(proposal.rows.filter((r) => r.status === 'accepted')), 9)
    expect(weekday.proposed.vehicleHours).toBeCloseTo(sum(proposal.rows), 9)
    expect(weekday.proposed.vehicleHours).toBeGreaterThan(weekday.accepted.vehicleHours)
    const checked = proposal.rows.filter(fullyEvaluated)
    expect(checked.length).toBeGreaterThan(0)
    for (const r of checked) {
      const x = f.intersections.weekday.find((y) => y.rowId === r.id)!
      expect(x.buses).toBeCloseTo(weekdaySummary(r).tripsPerDay, 9)
      expect(x.savingPerBusS).toBeCloseTo(weekdaySummary(r).savingPerTripS, 9)
    }
    // The corridor page counts the same runs per average weekday.
    const corridor = (await (await t.as('manager')).get(`/api/corridors/${demo.corridorId}`).expect(200)).body
    expect(weekday.trips).toBeCloseTo(corridor.tripsPerDay.weekday, 9)
    expect(weekday.accepted.savingPerTripS).toBeCloseTo((weekday.accepted.vehicleHours * 3600) / weekday.trips, 9)
    expect(f.fleet.find((x) => x.dayType === 'weekday')!.routes.map((r) => r.routeId).sort()).toEqual([...corridor.routes.map((r: { routeId: string }) => r.routeId)].sort())
    expect(f.reliability.some((r) => r.dayType === 'weekday' && r.proposed.p95S < r.without.p95S)).toBe(true)
  })

  it('annualises by scaling the feed’s range when it covers less than the 12 months, and says so', async () => {
    const f = await corridorDashboard('manager', '&from=2026-12-01')
    // The demo feed runs from Monday 2026-09-07 to Sunday 2027-09-05: 52 whole weeks, so 260
    // weekdays, 52 Saturdays and 52 Sundays (counted by hand); the 12 months end 2027-11-30.
    expect(f.annualisation).toMatchObject({ basis: 'scaled', from: '2026-12-01', to: '2027-11-30', feedStart: '2026-09-07', feedEnd: '2027-09-05' })
    const { weekday, saturday, sunday } = f.annualisation.daysOfType
    expect(weekday + saturday + sunday).toBe(365)
    expect(f.annualisation.scale!.weekday).toBeCloseTo(weekday / 260, 12)
    expect(f.annualisation.scale!.sunday).toBeCloseTo(sunday / 52, 12)
    expect(f.annualisation.note).toMatch(/scaled by day type/)
    // Every weekday run counts on each of the year's weekdays (scaled), and so on.
    const perDay = (d: string) => f.days.find((x) => x.dayType === d)!.accepted.vehicleHours
    expect(f.annual.accepted.vehicleHours).toBeCloseTo(weekday * perDay('weekday') + saturday * perDay('saturday') + sunday * perDay('sunday'), 8)
  })

  it('uses the agency’s inputs, which a planner changes, and the corridor’s own over them', async () => {
    const planner = await t.as('planner')
    // The demo seeds the agency's defaults: a write must name the version it read.
    const seeded: SavingsInputsDto = (await (await t.as('manager')).get('/api/dashboard/inputs').expect(200)).body
    expect(seeded).toMatchObject({ source: 'agency', corridorId: null, version: 1, mayEdit: false })
    await planner.put('/api/dashboard/inputs').send(inputsBody).expect(409)
    const agency: SavingsInputsDto = (await planner.put('/api/dashboard/inputs').send({ ...inputsBody, version: 1 }).expect(200)).body
    expect(agency).toMatchObject({ source: 'agency', corridorId: null, version: 2, mayEdit: true })
    let f = await corridorDashboard()
    expect(f.inputs).toMatchObject({ source: 'agency', costPerRevenueHour: 150, mayEdit: false })
    expect(f.annual.accepted.cost).toBeCloseTo(f.annual.accepted.vehicleHours * 150, 8)
    expect(f.assumptions.join(' ')).toContain('150 EUR per revenue-hour (2026 prices)')

    const own = (await planner.put('/api/dashboard/inputs').send({ ...inputsBody, corridorId: demo.corridorId, costPerRevenueHour: 180 }).expect(200)).body
    expect(own).toMatchObject({ source: 'corridor', corridorId: demo.corridorId, version: 1 })
    f = await corridorDashboard()
    expect(f.inputs.costPerRevenueHour).toBe(180)
    // Writing again must name the version read: an old one is refused with the current values.
    const stale = await planner.put('/api/dashboard/inputs').send({ ...inputsBody, corridorId: demo.corridorId }).expect(409)
    expect(stale.body.current).toMatchObject({ version: 1, costPerRevenueHour: 180 })
    await planner.put('/api/dashboard/inputs').send({ ...inputsBody, corridorId: demo.corridorId, costPerRevenueHour: 170, version: 1 }).expect(200)
    await (await t.as('admin')).put('/api/dashboard/inputs').send({ ...inputsBody, corridorId: demo.corridorId, version: 2 }).expect(200)
    expect((await (await t.as('manager')).get(`/api/dashboard/inputs?corridorId=${demo.corridorId}`).expect(200)).body).toMatchObject({ version: 3, mayEdit: false })
  })

  it('keeps the schedule digest until the approaches move', async () => {
    const digestOf = async () => (await t.database.db.select().from(savingsScheduleDigests).where(eq(savingsScheduleDigests.corridorId, other.corridorId)))[0]
    const first = await corridorDashboard('planner', '', other.corridorId)
    expect(first.proposal).toBeNull()
    expect(first.warnings.join(' ')).toMatch(/No proposal/)
    const before = await digestOf()
    await corridorDashboard('planner', '', other.corridorId)
    expect((await digestOf()).builtAt.getTime()).toBe(before.builtAt.getTime())
    const planner = await t.as('planner')
    const a = (await planner.get(`/api/corridors/${other.corridorId}/approaches`).expect(200)).body[0]
    await planner.patch(`/api/corridors/${other.corridorId}/approaches/${a.id}`).send({ version: a.version, distanceM: a.distanceM + 5 }).expect(200)
    await corridorDashboard('planner', '', other.corridorId)
    expect((await digestOf()).fingerprint).not.toBe(before.fingerprint)
  })
})

describe('GET /api/dashboard without a corridor', () => {
  it('sets every corridor side by side', async () => {
    const res = await (await t.as('planner')).get('/api/dashboard?from=2026-03-02').expect(200)
    const body = res.body as DashboardDto
    expect(body.corridor).toBeNull()
    expect(body.corridors.map((x) => x.corridorName)).toEqual([DEMO_CORRIDOR_NAME, 'Main St eastbound'])
    expect(body.corridors[0]).toMatchObject({ intersections: proposal.rows.length, proposalName: proposal.name })
    expect(body.corridors[0].peakBuses.without).toBeGreaterThan(0)
    expect(body.corridors[1]).toMatchObject({ proposalName: null, acceptedVehicleHoursPerYear: 0 })
    const byFeed = (await (await t.as('admin')).get(`/api/dashboard?feedId=${other.feedId}`).expect(200)).body as DashboardDto
    expect(byFeed.corridors.map((x) => x.corridorName)).toEqual(['Main St eastbound'])
  })
})

describe('GET /api/proposals/:id/report', () => {
  it('gives one proposal’s figures to the agency and to the engineers of its cities', async () => {
    const r: ProposalReportDto = (await (await t.as('manager')).get(`/api/proposals/${proposal.id}/report?from=2026-03-02`).expect(200)).body
    expect(r.figures.proposal?.id).toBe(proposal.id)
    expect(r.figures.annualisation.from).toBe('2026-03-02')
    await (await t.as('engineer')).get(`/api/proposals/${proposal.id}/report`).expect(200)
    // The proposals router still answers its own paths.
    await (await t.as('manager')).get(`/api/proposals/${proposal.id}`).expect(200)
  })

  it('hides a draft from the cities and answers 404 for an unknown proposal', async () => {
    const planner = await t.as('planner')
    const draft = (await planner.post('/api/proposals').send({ corridorId: demo.corridorId, name: 'Second round' }).expect(201)).body
    await (await t.as('engineer')).get(`/api/proposals/${draft.id}/report`).expect(404)
    const r: ProposalReportDto = (await planner.get(`/api/proposals/${draft.id}/report`).expect(200)).body
    expect(r.figures.warnings.join(' ')).toMatch(/not been evaluated/)
    expect(r.figures.days.every((d) => d.proposed.vehicleHours === 0)).toBe(true)
    await planner.get('/api/proposals/nope/report').expect(404)
    // The dashboard keeps showing the submitted proposal, not the newer draft.
    expect((await corridorDashboard()).proposal?.id).toBe(proposal.id)
  })
})

describe('who may read and write', () => {
  it('lets the manager read but not write, the engineers neither, and nobody signed out', async () => {
    const manager = await t.as('manager')
    await manager.get('/api/dashboard/inputs').expect(200)
    await manager.put('/api/dashboard/inputs').send(inputsBody).expect(403)
    const engineer = await t.as('engineer')
    await engineer.get(`/api/dashboard?corridorId=${demo.corridorId}`).expect(403)
    await engineer.get('/api/dashboard/inputs').expect(403)
    await engineer.put('/api/dashboard/inputs').send(inputsBody).expect(403)
    await request(t.app).get('/api/dashboard').expect(401)
    await request(t.app).get(`/api/proposals/${proposal.id}/report`).expect(401)
  })
})

describe('invalid requests', () => {
  it('names the field of a bad query', async () => {
    const planner = await t.as('planner')
    expect(paths(await planner.get('/api/dashboard?feedId=abc').expect(422))).toEqual(['feedId'])
    expect(paths(await planner.get(`/api/dashboard?corridorId=${demo.corridorId}&from=2026-02-30`).expect(422))).toEqual(['from'])
    expect(paths(await planner.get('/api/dashboard?colour=red').expect(422))).toEqual([''])
    expect(paths(await planner.get(`/api/dashboard?corridorId=${demo.corridorId}&feedId=999`).expect(422))).toEqual(['feedId'])
    expect(paths(await planner.get(`/api/proposals/${proposal.id}/report?from=soon`).expect(422))).toEqual(['from'])
  })

  it('names the field of bad inputs', async () => {
    const planner = await t.as('planner')
    const bad = await planner.put('/api/dashboard/inputs').send({ ...inputsBody, layoverShare: 2, currency: 'euro' }).expect(422)
    expect(paths(bad).sort()).toEqual(['currency', 'layoverShare'])
    const twice = { ...inputsBody, loads: [...inputsBody.loads, { routeId: '7', periodName: 'AM peak', passengers: 10 }] }
    expect(paths(await planner.put('/api/dashboard/inputs').send(twice).expect(422))).toEqual(['loads.1'])
  })

  it('answers 404 for an unknown corridor', async () => {
    await (await t.as('manager')).get('/api/dashboard?corridorId=nope').expect(404)
    await (await t.as('planner')).put('/api/dashboard/inputs').send({ ...inputsBody, corridorId: 'nope' }).expect(404)
  })
})
