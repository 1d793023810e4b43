import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import request from 'supertest'
import { eq } from 'drizzle-orm'
import { startTestApp, waitForJob, DEMO_PASSWORD, type TestApp } from '../support/test-app'
import { buildProposalCorridor, SPARE_CROSS_GREEN_S, type ProposalCorridor } from '../support/proposal-corridor'
import { outboxMessages, proposalRowEvents, users } from '../../server/db/schema'
import { hashPassword } from '../../server/auth/password'
import { evaluateApproach } from '../../shared/model'
import { approachBody } from '../../shared/schemas/model'
import type { ProposalDto, ProposalRowDto, StoredResultDto } from '../../shared/schemas/proposals'

// One database and one corridor for the whole file (PGlite start and the feed import cost
// seconds); each test drafts its own proposals on it.
let t: TestApp
let c: ProposalCorridor
beforeAll(async () => {
  t = await startTestApp()
  c = await buildProposalCorridor(t)
  // A second Brackenford engineer, to decide at the same time as the first.
  await t.database.db.insert(users).values({
    id: 'user-engineer-b2', email: 'engineer-b2@fanlight.test', name: 'Pell Odegaard', role: 'engineer',
    organisationId: 'org-brackenford', passwordHash: await hashPassword(DEMO_PASSWORD),
  })
})
afterAll(async () => { await t.close() })
beforeEach(async () => { await t.database.db.delete(outboxMessages) })

const paths = (res: request.Response) => (res.body.issues as { path: (string | number)[] }[]).map((i) => i.path.join('.'))
type Agent = ReturnType<typeof request.agent>

async function draft(name = 'Kestrel test proposal', extra: object = {}): Promise<ProposalDto> {
  return (await (await t.as('planner')).post('/api/proposals').send({ corridorId: c.corridorId, name, ...extra }).expect(201)).body
}
async function evaluate(id: string) {
  const agent = await t.as('planner')
  const res = await agent.post(`/api/proposals/${id}/evaluate`).expect(202)
  const job = await waitForJob(agent, res.body.jobId)
  expect(job.state).toBe('succeeded')
  return job
}
async function submitted(name?: string): Promise<ProposalDto> {
  const p = await draft(name)
  await evaluate(p.id)
  return (await (await t.as('planner')).post(`/api/proposals/${p.id}/submit`).send({ comment: 'Please review.' }).expect(200)).body
}
const get = async (agent: Agent, id: string): Promise<ProposalDto> => (await agent.get(`/api/proposals/${id}`).expect(200)).body
const rowOf = (p: ProposalDto, i: number) => p.rows[i]
const decide = (agent: Agent, p: { id: string }, row: ProposalRowDto, body: object) =>
  agent.post(`/api/proposals/${p.id}/rows/${row.id}/decision`).send({ version: row.version, ...body })
async function outbox() {
  return (await (await t.as('admin')).get('/api/outbox').expect(200)).body as { to: string; subject: string; text: string }[]
}

describe('POST /api/proposals', () => {
  it('drafts one row per corridor approach, in order along the corridor, with the default settings and a history', async () => {
    const p = await draft()
    expect(p).toMatchObject({ corridorId: c.corridorId, corridorName: 'Main St eastbound', name: 'Kestrel test proposal', status: 'draft', version: 1 })
    expect(p.rows.map((r) => [r.position, r.intersectionName, r.jurisdiction.name, r.status, r.version])).toEqual([
      [1, 'Main St & First Ave', 'City of Brackenford', 'draft', 1],
      [2, 'Main St & Second Ave', 'City of Osterfield', 'draft', 1],
      [3, 'Main St & Third Ave', 'City of Brackenford', 'draft', 1],
      [4, 'Main St & Fourth Ave', 'City of Osterfield', 'draft', 1],
    ])
    expect(p.rows[0]).toMatchObject({
      intersectionId: c.intersections[0].id, jurisdictionId: 'org-brackenford',
      settings: { strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10, lockoutCycles: 1, conditional: { onlyLateBuses: false } },
      counter: null, results: null, lastComment: '', may: { edit: true, decide: false, answer: false },
    })
    expect(p.rows[0].approachId).toBeTruthy()
    expect(p.rows[0].history.map((e) => [e.kind, e.actor?.name, e.statusTo])).toEqual([['created', 'Tova Rasmussen', 'draft']])
    expect(p.rowCounts).toMatchObject({ draft: 4, submitted: 0 })
    expect(p.jurisdictions.map((j) => j.name)).toEqual(['City of Brackenford', 'City of Osterfield'])
    expect(p.periods.map((x) => x.name)).toEqual(c.periods.map((x) => x.name))
  })

  it('takes default settings for every row', async () => {
    const p = await draft('Extension only', { defaults: { strategy: 'green-extension', maxExtensionS: 8, maxEarlyGreenS: 0, lockoutCycles: 2, conditional: { onlyLateBuses: true, lateThresholdS: 90, lateShare: 0.4 } } })
    expect(new Set(p.rows.map((r) => JSON.stringify(r.settings))).size).toBe(1)
    expect(p.rows[0].settings).toMatchObject({ strategy: 'green-extension', maxExtensionS: 8, lockoutCycles: 2, conditional: { onlyLateBuses: true } })
  })

  it('lowers each row’s limits to what its timing plans can spare, and says so in the history', async () => {
    const big = { strategy: 'green-extension', maxExtensionS: 20, maxEarlyGreenS: 0, lockoutCycles: 1, conditional: { onlyLateBuses: false, lateThresholdS: 60, lateShare: 0.3 } }
    const p = await draft('Too long', { defaults: big })
    expect(p.rows.map((r) => r.settings.maxExtensionS)).toEqual([SPARE_CROSS_GREEN_S, SPARE_CROSS_GREEN_S, SPARE_CROSS_GREEN_S, SPARE_CROSS_GREEN_S])
    expect(p.rows[0].history[0]).toMatchObject({ kind: 'created', changes: [{ field: 'maxExtensionS', from: 20, to: SPARE_CROSS_GREEN_S }] })
    expect(p.rows.every((r) => r.checks.every((c) => c.severity !== 'error'))).toBe(true)
    // Asked not to: the rows keep 20 s, break the limit, and cannot be submitted.
    const raw = await draft('Too long, as asked', { defaults: big, fitToPlans: false })
    expect(raw.rows[0].settings.maxExtensionS).toBe(20)
    expect(raw.rows[0].checks.filter((c) => c.severity === 'error').map((c) => c.path)).toEqual([['maxExtensionS']])
    await evaluate(raw.id)
    const res = await (await t.as('planner')).post(`/api/proposals/${raw.id}/submit`).send({}).expect(422)
    expect(paths(res)).toEqual(['rows.0.maxExtensionS', 'rows.1.maxExtensionS', 'rows.2.maxExtensionS', 'rows.3.maxExtensionS'])
    // The model refuses the same settings, and each period says why.
    const stored = (await get(await t.as('planner'), raw.id)).rows[0].results!.periods
    expect(stored.every((x) => x.error?.startsWith('priority.maxExtensionS:'))).toBe(true)
  })

  it('rejects invalid input with its paths', async () => {
    const agent = await t.as('planner')
    const res = await agent.post('/api/proposals').send({ corridorId: c.corridorId, name: 'x', extra: 1, defaults: { strategy: 'all', maxExtensionS: 99, maxEarlyGreenS: 5, lockoutCycles: 1, conditional: { onlyLateBuses: false, lateThresholdS: 60, lateShare: 2 } } }).expect(422)
    expect(paths(res)).toEqual(expect.arrayContaining(['name', '', 'defaults.strategy', 'defaults.maxExtensionS', 'defaults.conditional.lateShare']))
    expect(paths(await agent.post('/api/proposals').send({ corridorId: 'nope', name: 'Some name' }).expect(422))).toEqual(['corridorId'])
  })

  it('refuses a corridor without approaches', async () => {
    const planner = await t.as('planner')
    const bare = (await planner.post('/api/corridors').send({ feedId: c.feedId, name: 'Bare', routeIds: ['7'], directionId: 0 }).expect(201)).body
    const res = await planner.post('/api/proposals').send({ corridorId: bare.id, name: 'Nothing to do' }).expect(422)
    expect(paths(res)).toEqual(['corridorId'])
  })

  it('is for planners only', async () => {
    const body = { corridorId: c.corridorId, name: 'Not mine' }
    await request(t.app).post('/api/proposals').send(body).expect(401)
    for (const who of ['engineer', 'manager', 'admin'] as const) await (await t.as(who)).post('/api/proposals').send(body).expect(403)
  })
})

describe('GET /api/proposals and /api/proposals/:id', () => {
  it('shows drafts to the agency only; a submitted proposal also to the engineers of the cities it touches', async () => {
    const d = await draft('Still a draft')
    const s = await submitted('Sent to the cities')
    const ids = async (who: 'planner' | 'manager' | 'admin' | 'engineer' | 'engineer2', q = '') =>
      ((await (await t.as(who)).get(`/api/proposals${q}`).expect(200)).body as { id: string }[]).map((x) => x.id)
    for (const who of ['planner', 'manager', 'admin'] as const) expect(await ids(who)).toEqual(expect.arrayContaining([d.id, s.id]))
    for (const who of ['engineer', 'engineer2'] as const) {
      expect(await ids(who)).toContain(s.id)
      expect(await ids(who)).not.toContain(d.id)
      await (await t.as(who)).get(`/api/proposals/${d.id}`).expect(404)
      expect((await get(await t.as(who), s.id)).rows).toHaveLength(4)
    }
    expect(await ids('planner', `?corridorId=${c.corridorId}`)).toEqual(expect.arrayContaining([d.id, s.id]))
    expect(await ids('planner', '?corridorId=none')).toEqual([])
    const summary = ((await (await t.as('manager')).get('/api/proposals').expect(200)).body as { id: string; rowCounts: object; status: string }[]).find((x) => x.id === s.id)
    expect(summary).toMatchObject({ status: 'submitted', rowCounts: { submitted: 4, draft: 0 } })
  })

  it('answers 404 for an unknown proposal and 422 for a bad query', async () => {
    await (await t.as('planner')).get('/api/proposals/nope').expect(404)
    expect(paths(await (await t.as('planner')).get('/api/proposals?extra=1').expect(422))).toEqual([''])
    await request(t.app).get('/api/proposals').expect(401)
  })
})

describe('PATCH /api/proposals/:id/rows/:rowId', () => {
  it('changes a draft row, records what changed and moves the row and proposal versions on', async () => {
    const p = await draft()
    const row = rowOf(p, 0)
    const res = await (await t.as('planner')).patch(`/api/proposals/${p.id}/rows/${row.id}`)
      .send({ maxExtensionS: 8, conditional: { onlyLateBuses: true }, version: 1 }).expect(200)
    expect(res.body).toMatchObject({ version: 2, status: 'draft', settings: { maxExtensionS: 8, maxEarlyGreenS: 10, conditional: { onlyLateBuses: true, lateShare: 0.3 } } })
    expect(res.body.history.at(-1)).toMatchObject({
      kind: 'edited', rowVersion: 2, actor: { name: 'Tova Rasmussen', organisationName: 'Lindenmere Regional Transit' },
      changes: [{ field: 'maxExtensionS', from: 10, to: 8 }, { field: 'conditional.onlyLateBuses', from: false, to: true }],
    })
    expect((await get(await t.as('planner'), p.id)).version).toBe(2)
  })

  it('answers a stale version with 409 and the row as it now is', async () => {
    const p = await draft()
    const row = rowOf(p, 1)
    const agent = await t.as('planner')
    await agent.patch(`/api/proposals/${p.id}/rows/${row.id}`).send({ lockoutCycles: 2, version: 1 }).expect(200)
    const res = await agent.patch(`/api/proposals/${p.id}/rows/${row.id}`).send({ maxEarlyGreenS: 5, version: 1 }).expect(409)
    expect(res.body.row).toMatchObject({ id: row.id, version: 2, settings: { lockoutCycles: 2, maxEarlyGreenS: 10 } })
  })

  it('refuses a limit the timing plan cannot give, naming the field', async () => {
    const p = await draft()
    const url = `/api/proposals/${p.id}/rows/${rowOf(p, 0).id}`
    const agent = await t.as('planner')
    await agent.patch(url).send({ maxExtensionS: SPARE_CROSS_GREEN_S, version: 1 }).expect(200)
    const res = await agent.patch(url).send({ maxExtensionS: SPARE_CROSS_GREEN_S + 1, version: 2 }).expect(422)
    expect(paths(res)).toEqual(['maxExtensionS'])
    expect(res.body.issues[0].message).toContain('at most 11 s')
    expect(paths(await agent.patch(url).send({ maxEarlyGreenS: -1, strategy: 'sometimes', version: 2 }).expect(422))).toEqual(['strategy', 'maxEarlyGreenS'])
    expect(paths(await agent.patch(url).send({ maxEarlyGreenS: 4 }).expect(422))).toEqual(['version'])
  })

  it('is for planners only, and only while the row is a draft or sent back', async () => {
    const p = await submitted()
    const url = `/api/proposals/${p.id}/rows/${rowOf(p, 0).id}`
    for (const who of ['engineer', 'manager', 'admin'] as const) await (await t.as(who)).patch(url).send({ lockoutCycles: 2, version: 2 }).expect(403)
    const res = await (await t.as('planner')).patch(url).send({ lockoutCycles: 2, version: 2 }).expect(409)
    expect(res.body.message).toContain('waiting for the city')
    await (await t.as('planner')).patch(`/api/proposals/${p.id}/rows/nope`).send({ lockoutCycles: 2, version: 1 }).expect(404)
    await (await t.as('planner')).patch(`/api/proposals/nope/rows/nope`).send({ lockoutCycles: 2, version: 1 }).expect(404)
  })
})

describe('POST /api/proposals/:id/evaluate', () => {
  let p: ProposalDto
  beforeAll(async () => {
    p = await draft('Evaluated')
    await evaluate(p.id)
    p = await get(await t.as('planner'), p.id)
  })

  it('stores results for every row, period and day type, with the buses of the schedule', () => {
    expect(p.lastEvaluation).toMatchObject({ proposalVersion: 1, feedId: String(c.feedId) })
    const first = rowOf(p, 0).results!
    expect(first.periods).toHaveLength(c.periods.length * 3)
    expect(first.stale).toBe(false)
    const am = first.periods.find((x) => x.periodName === 'AM peak' && x.dayType === 'weekday')!
    // frequencies.txt 07:00-09:00 every 600 s gives 12 runs (end excluded, GTFS Schedule reference),
    // on all 10 weekdays of the feed: 12 buses an average weekday, all in the AM peak.
    expect(am.tripsPerDay).toBeCloseTo(12, 9)
    expect(am).toMatchObject({ timingPlanName: 'All day', cycleS: 90, error: null })
    expect(am.busDelayBaselineS!).toBeGreaterThan(0)
    expect(am.savingPerTripS!).toBeCloseTo(am.busDelayBaselineS! - am.busDelayPriorityS!, 6)
    expect(am.dailyBusHoursSaved!).toBeCloseTo((am.savingPerTripS! * 12) / 3600, 9)
    // Midday on Saturdays: the one 10:00 trip, on both Saturdays of the feed.
    expect(first.periods.find((x) => x.periodName === 'Midday' && x.dayType === 'saturday')!.tripsPerDay).toBeCloseTo(1, 9)
    expect(first.summaries.map((s) => s.dayType)).toEqual(['weekday', 'saturday', 'sunday'])
  })

  it('says why a period could not be evaluated and keeps the others', () => {
    const fourth = rowOf(p, 3).results!
    const sat = fourth.periods.filter((x) => x.dayType === 'saturday')
    expect(sat.every((x) => x.error === `No timing plan covers ${x.periodName} on Saturdays.`)).toBe(true)
    expect(fourth.periods.filter((x) => x.dayType === 'weekday').every((x) => x.error === null)).toBe(true)
    expect(fourth.summaries.map((s) => s.dayType)).toEqual(['weekday'])
  })

  it('keeps the exact model input with every figure, so each can be recomputed', async () => {
    const row = rowOf(p, 1)
    const stored: StoredResultDto[] = (await (await t.as('planner')).get(`/api/proposals/${p.id}/rows/${row.id}/results`).expect(200)).body
    const am = stored.find((x) => x.periodName === 'AM peak' && x.dayType === 'weekday')!
    expect(am).toMatchObject({ variant: 'proposed', rowVersion: 1, proposalVersion: 1, inputs: { timingPlanVersion: 1, approachVersion: 1, intersectionVersion: 1, feedId: String(c.feedId) } })
    const input = approachBody.parse(am.inputs.model)
    // Effective green = displayed green; both intergreens (2 x (4 + 2) s) are lost time.
    expect(input.signal).toEqual({ cycleS: 90, effectiveGreenS: 46, lostTimeS: 12 })
    // Triangle through 1800 veh/h/lane, 50 km/h and 133 veh/km: w = s vf / (vf kj - s) = 90000 / 4850 km/h.
    expect(input.diagram).toMatchObject({ kind: 'triangular', freeFlowSpeedKmh: 50, jamDensityVehPerKmPerLane: 133 })
    expect((input.diagram as { backwardWaveSpeedKmh: number }).backwardWaveSpeedKmh).toBeCloseTo(90000 / 4850, 9)
    expect(input.bus.stop.position).toBe('near-side')
    expect(input.bus.busesPerHour).toBeCloseTo(6, 9) // 12 buses over the two-hour AM peak
    expect(input.crossStreet).toMatchObject({ arrivalFlowVehPerHour: 400, minGreenS: 8, pedWalkS: 7, pedClearanceS: 14 })
    expect(input.priority).toMatchObject({ strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10, lockoutCycles: 1 })
    const again = evaluateApproach(input)
    expect(again.bus.meanSavingS).toBe(am.savingPerTripS)
    expect(again.crossStreet.vcAfter).toBe(am.vcAfter)
  })

  it('marks the figures stale when the settings change, until evaluated again', async () => {
    const q = await draft('Stale check')
    await evaluate(q.id)
    const agent = await t.as('planner')
    await agent.patch(`/api/proposals/${q.id}/rows/${rowOf(q, 0).id}`).send({ maxEarlyGreenS: 6, version: 1 }).expect(200)
    let now = await get(agent, q.id)
    expect(rowOf(now, 0).results!.stale).toBe(true)
    expect(rowOf(now, 1).results!.stale).toBe(false)
    await evaluate(q.id)
    now = await get(agent, q.id)
    expect(rowOf(now, 0).results).toMatchObject({ stale: false, settings: { maxEarlyGreenS: 6 } })
    expect(now.lastEvaluation!.proposalVersion).toBe(2)
  })

  it('is for planners only; 404 for an unknown proposal', async () => {
    for (const who of ['engineer', 'manager', 'admin'] as const) await (await t.as(who)).post(`/api/proposals/${p.id}/evaluate`).expect(403)
    await (await t.as('planner')).post('/api/proposals/nope/evaluate').expect(404)
  })
})

describe('POST /api/proposals/:id/submit', () => {
  it('refuses a proposal whose current settings have not been evaluated', async () => {
    const p = await draft()
    const agent = await t.as('planner')
    expect((await agent.post(`/api/proposals/${p.id}/submit`).send({}).expect(409)).body.message).toContain('Evaluate')
    await evaluate(p.id)
    await agent.patch(`/api/proposals/${p.id}/rows/${rowOf(p, 2).id}`).send({ lockoutCycles: 2, version: 1 }).expect(200)
    await agent.post(`/api/proposals/${p.id}/submit`).send({}).expect(409)
  })

  it('sends every row to its city and e-mails each city’s engineers about their own rows', async () => {
    const p = await submitted('Mail check')
    expect(p.status).toBe('submitted')
    expect(p.rows.every((r) => r.status === 'submitted' && r.version === 2 && r.lastComment === 'Please review.')).toBe(true)
    expect(p.rows[0].history.map((e) => e.kind)).toEqual(['created', 'submitted'])
    const mail = await outbox()
    const to = (email: string) => mail.filter((m) => m.to === email && m.subject === 'Priority proposal "Mail check" awaits your decision')
    expect(to('engineer@fanlight.test')).toHaveLength(1)
    expect(to('engineer-b2@fanlight.test')).toHaveLength(1)
    expect(to('engineer2@fanlight.test')).toHaveLength(1)
    expect(to('engineer@fanlight.test')[0].text).toContain('Main St & First Ave')
    expect(to('engineer@fanlight.test')[0].text).toContain('Main St & Third Ave')
    expect(to('engineer@fanlight.test')[0].text).not.toContain('Second Ave')
    expect(to('engineer2@fanlight.test')[0].text).toContain('/agreement?proposal=')
    expect(mail.filter((m) => m.to === 'planner@fanlight.test')).toHaveLength(0)
    expect((await (await t.as('planner')).post(`/api/proposals/${p.id}/submit`).send({}).expect(409)).body.message).toContain('no row')
  })

  it('is for planners only; bad input and unknown proposals', async () => {
    const p = await draft()
    for (const who of ['engineer', 'manager', 'admin'] as const) await (await t.as(who)).post(`/api/proposals/${p.id}/submit`).send({}).expect(403)
    expect(paths(await (await t.as('planner')).post(`/api/proposals/${p.id}/submit`).send({ comment: 5 }).expect(422))).toEqual(['comment'])
    await (await t.as('planner')).post('/api/proposals/nope/submit').send({}).expect(404)
  })
})

describe('POST /api/proposals/:id/rows/:rowId/decision', () => {
  it('lets an engineer of the row’s city accept it; the history and the planner’s mail say so', async () => {
    const p = await submitted('Decisions')
    const row = rowOf(p, 0)
    const res = await decide(await t.as('engineer'), p, row, { decision: 'accept', comment: 'Fine at this signal.' }).expect(200)
    expect(res.body).toMatchObject({ status: 'accepted', version: 3, lastComment: 'Fine at this signal.', may: { decide: false } })
    expect(res.body.history.at(-1)).toMatchObject({ kind: 'accepted', statusFrom: 'submitted', statusTo: 'accepted', actor: { name: 'Dario Fenwick', organisationName: 'City of Brackenford' }, comment: 'Fine at this signal.' })
    const mail = (await outbox()).filter((m) => m.to === 'planner@fanlight.test')
    expect(mail).toHaveLength(1)
    expect(mail[0].subject).toBe('City of Brackenford agreed: Main St & First Ave')
    expect(mail[0].text).toContain('Fine at this signal.')
  })

  it('evaluates a counter at once and shows it beside the proposal', async () => {
    const p = await submitted('Counter')
    const row = rowOf(p, 2)
    const res = await decide(await t.as('engineer'), p, row, { decision: 'request-change', comment: 'Shorter, please.', counter: { maxExtensionS: 5, lockoutCycles: 2 } }).expect(200)
    const r: ProposalRowDto = res.body
    expect(r).toMatchObject({ status: 'change-requested', counter: { maxExtensionS: 5, lockoutCycles: 2 }, settings: { maxExtensionS: 10, lockoutCycles: 1 } })
    expect(r.counterResults).toMatchObject({ variant: 'counter', rowVersion: 3, stale: false, settings: { maxExtensionS: 5, maxEarlyGreenS: 10, lockoutCycles: 2 } })
    expect(r.results!.settings).toMatchObject({ maxExtensionS: 10 })
    const am = (x: ProposalRowDto['results']) => x!.periods.find((q) => q.periodName === 'AM peak' && q.dayType === 'weekday')!
    expect(am(r.counterResults).savingPerTripS).not.toBe(am(r.results).savingPerTripS)
    expect(r.history.at(-1)).toMatchObject({ kind: 'change-requested', counter: { maxExtensionS: 5, lockoutCycles: 2 } })
    expect((await outbox()).find((m) => m.to === 'planner@fanlight.test')!.text).toContain('Counter values: Extension up to 5 s, lockout 2 cycles')
  })

  it('refuses engineers of another city (403), other roles (403), and a counter the plan cannot give (422)', async () => {
    const p = await submitted('Wrong city')
    const row = rowOf(p, 0)
    const res = await decide(await t.as('engineer2'), p, row, { decision: 'accept' }).expect(403)
    expect(res.body.message).toContain('City of Brackenford')
    for (const who of ['planner', 'manager', 'admin'] as const) await decide(await t.as(who), p, row, { decision: 'accept' }).expect(403)
    const bad = await decide(await t.as('engineer'), p, row, { decision: 'request-change', comment: 'More?', counter: { maxEarlyGreenS: SPARE_CROSS_GREEN_S + 4 } }).expect(422)
    expect(paths(bad)).toEqual(['counter.maxEarlyGreenS'])
    expect((await get(await t.as('engineer'), p.id)).rows[0]).toMatchObject({ status: 'submitted', version: 2 })
  })

  it('rejects invalid input with its paths', async () => {
    const p = await submitted('Invalid decisions')
    const agent = await t.as('engineer')
    const row = rowOf(p, 0)
    expect(paths(await decide(agent, p, row, { decision: 'reject', comment: '' }).expect(422))).toEqual(['comment'])
    expect(paths(await decide(agent, p, row, { decision: 'accept', counter: { maxExtensionS: 4 } }).expect(422))).toEqual(['counter'])
    expect(paths(await decide(agent, p, row, { decision: 'maybe' }).expect(422))).toEqual(['decision'])
    expect(paths(await agent.post(`/api/proposals/${p.id}/rows/${row.id}/decision`).send({ decision: 'accept' }).expect(422))).toEqual(['version'])
    await agent.post(`/api/proposals/${p.id}/rows/nope/decision`).send({ decision: 'accept', version: 1 }).expect(404)
    await agent.post(`/api/proposals/nope/rows/${row.id}/decision`).send({ decision: 'accept', version: 1 }).expect(404)
  })

  it('answers a stale version with 409 and the current row, so the client can show what changed', async () => {
    const p = await submitted('Stale decision')
    const row = rowOf(p, 1)
    await decide(await t.as('engineer2'), p, row, { decision: 'reject', comment: 'Too much for the cross street.' }).expect(200)
    const res = await decide(await t.as('engineer2'), p, row, { decision: 'accept' }).expect(409)
    expect(res.body.row).toMatchObject({ id: row.id, status: 'rejected', version: 3, lastComment: 'Too much for the cross street.' })
    // Right version, wrong state: the row is no longer waiting for a decision.
    const again = await decide(await t.as('engineer2'), p, { ...row, version: 3 }, { decision: 'accept' }).expect(409)
    expect(again.body.message).toContain('refused')
  })

  it('never lets two engineers deciding the same version at once both win', async () => {
    const p = await submitted('Race')
    const other = request.agent(t.app)
    await other.post('/api/auth/login').send({ email: 'engineer-b2@fanlight.test', password: DEMO_PASSWORD }).expect(200)
    for (const index of [0, 2]) {
      const target = rowOf(p, index)
      const [a, b] = await Promise.all([
        decide(await t.as('engineer'), p, target, { decision: 'accept' }),
        decide(other, p, target, { decision: 'reject', comment: 'No.' }),
      ])
      expect([a.status, b.status].sort()).toEqual([200, 409])
      const events = await t.database.db.select().from(proposalRowEvents).where(eq(proposalRowEvents.rowId, target.id))
      expect(events.filter((e) => e.kind === 'accepted' || e.kind === 'rejected')).toHaveLength(1)
      const winner = a.status === 200 ? a.body : b.body
      const loser = a.status === 200 ? b.body : a.body
      expect(loser.row).toMatchObject({ status: winner.status, version: winner.version })
    }
  })
})

describe('POST /api/proposals/:id/rows/:rowId/answer', () => {
  it('takes the city’s counter: the row is agreed with the counter values, re-evaluated, and the city told', async () => {
    const p = await submitted('Answer counter')
    const row = rowOf(p, 2)
    const asked: ProposalRowDto = (await decide(await t.as('engineer'), p, row, { decision: 'request-change', comment: 'Shorter.', counter: { maxExtensionS: 6 } }).expect(200)).body
    await t.database.db.delete(outboxMessages)
    const res = await (await t.as('planner')).post(`/api/proposals/${p.id}/rows/${row.id}/answer`).send({ action: 'accept-counter', comment: 'Agreed.', version: asked.version }).expect(200)
    expect(res.body).toMatchObject({ status: 'accepted', counter: null, settings: { maxExtensionS: 6, maxEarlyGreenS: 10 }, lastComment: 'Agreed.' })
    expect(res.body.results).toMatchObject({ stale: false, settings: { maxExtensionS: 6 } })
    expect(res.body.history.at(-1)).toMatchObject({ kind: 'counter-accepted', changes: [{ field: 'maxExtensionS', from: 10, to: 6 }] })
    const mail = await outbox()
    expect(mail.map((m) => m.to).sort()).toEqual(['engineer-b2@fanlight.test', 'engineer@fanlight.test'])
    expect(mail[0].subject).toBe('Main St & Third Ave: counter accepted')
    expect((await get(await t.as('planner'), p.id)).version).toBe(2)
  })

  it('revises a refused row and sends it back for a decision', async () => {
    const p = await submitted('Answer revise')
    const row = rowOf(p, 1)
    const refused: ProposalRowDto = (await decide(await t.as('engineer2'), p, row, { decision: 'reject', comment: 'Too long.' }).expect(200)).body
    const agent = await t.as('planner')
    const url = `/api/proposals/${p.id}/rows/${row.id}/answer`
    expect(paths(await agent.post(url).send({ action: 'resubmit', settings: { maxExtensionS: 30 }, version: refused.version }).expect(422))).toEqual(['settings.maxExtensionS'])
    expect((await agent.post(url).send({ action: 'accept-counter', version: refused.version }).expect(409)).body.message).toContain('refused')
    const res = await agent.post(url).send({ action: 'resubmit', settings: { maxExtensionS: 6, maxEarlyGreenS: 6 }, comment: 'Halved.', version: refused.version }).expect(200)
    expect(res.body).toMatchObject({ status: 'submitted', version: refused.version + 1, settings: { maxExtensionS: 6, maxEarlyGreenS: 6 }, may: { decide: false } })
    expect(res.body.results).toMatchObject({ stale: false, settings: { maxExtensionS: 6 } })
    expect((await outbox()).filter((m) => m.to === 'engineer2@fanlight.test').map((m) => m.subject)).toContain('Main St & Second Ave: revised for your decision')
    expect((await get(await t.as('engineer2'), p.id)).rows[1].may.decide).toBe(true)
    await agent.post(url).send({ action: 'resubmit', version: refused.version }).expect(409)
  })

  it('refuses a counter acceptance without a counter, other roles, bad input and unknown rows', async () => {
    const p = await submitted('Answer refusals')
    const row = rowOf(p, 0)
    const asked: ProposalRowDto = (await decide(await t.as('engineer'), p, row, { decision: 'request-change', comment: 'Talk to us first.' }).expect(200)).body
    const url = `/api/proposals/${p.id}/rows/${row.id}/answer`
    expect((await (await t.as('planner')).post(url).send({ action: 'accept-counter', version: asked.version }).expect(409)).body.message).toContain('without counter values')
    for (const who of ['engineer', 'manager', 'admin'] as const) await (await t.as(who)).post(url).send({ action: 'resubmit', version: asked.version }).expect(403)
    expect(paths(await (await t.as('planner')).post(url).send({ action: 'accept-counter', settings: { lockoutCycles: 2 }, version: asked.version }).expect(422))).toEqual(['settings'])
    expect(paths(await (await t.as('planner')).post(url).send({ action: 'later', version: asked.version }).expect(422))).toEqual(['action'])
    await (await t.as('planner')).post(`/api/proposals/${p.id}/rows/nope/answer`).send({ action: 'resubmit', version: 1 }).expect(404)
  })
})

describe('GET /api/proposals/:id/rows/:rowId/results', () => {
  it('is readable by whoever sees the proposal, 404 otherwise', async () => {
    const p = await draft('Results visibility')
    await evaluate(p.id)
    const url = `/api/proposals/${p.id}/rows/${rowOf(p, 0).id}/results`
    expect((await (await t.as('manager')).get(url).expect(200)).body).toHaveLength(c.periods.length * 3)
    await (await t.as('engineer')).get(url).expect(404)
    await (await t.as('planner')).get(`/api/proposals/${p.id}/rows/nope/results`).expect(404)
  })
})

describe('a corridor with proposals', () => {
  it('cannot be deleted (409), so its negotiation is never lost', async () => {
    await draft('Keeps the corridor')
    const planner = await t.as('planner')
    const corridor = (await planner.get(`/api/corridors/${c.corridorId}`).expect(200)).body
    const res = await planner.delete(`/api/corridors/${c.corridorId}?version=${corridor.version}`).expect(409)
    expect(res.body.message).toContain('priority proposal')
  })
})
