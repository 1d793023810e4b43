import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { eq } from 'drizzle-orm'
import { ACCOUNT_OF_ROLE, ALL_ROLES, startTestApp, waitForJob, type TestApp } from '../support/test-app'
import { buildProposalCorridor, SPARE_CROSS_GREEN_S, type ProposalCorridor } from '../support/proposal-corridor'
import { cityLimits } from '../../server/db/schema'
import { DEMO_CITY_LIMITS } from '../../server/seed/demo-limits'
import { evaluateApproach } from '../../shared/model'
import { withSettings } from '../../shared/model/sweep'
import { approachBody } from '../../shared/schemas/model'
import { sweepPointCount, sweepRanges, type SuggestResponse, type SweepResponse } from '../../shared/schemas/sweep'
import type { ProposalDto } from '../../shared/schemas/proposals'

// One database and one corridor for the file: PGlite start-up and the feed import cost seconds.
let t: TestApp
let c: ProposalCorridor
beforeAll(async () => {
  t = await startTestApp()
  c = await buildProposalCorridor(t)
})
afterAll(async () => { await t.close() })

const paths = (res: request.Response) => (res.body.issues as { path: (string | number)[] }[]).map((i) => i.path.join('.'))

// An invented approach: 60 s cycle, 30 s bus green, cross street 30 s of green needing
// max(10, 7 + 12) = 19 s, so 11 s may be taken per grant.
const approach = {
  signal: { cycleS: 60, effectiveGreenS: 30 },
  bus: { stop: { position: 'far-side', distanceM: 30, dwellS: 20 }, busesPerHour: 8 },
  crossStreet: { arrivalFlowVehPerHour: 500, minGreenS: 10, pedWalkS: 7, pedClearanceS: 12 },
}

describe('POST /api/model/sweep', () => {
  it.each(ALL_ROLES)('sweeps the grid for a signed-in %s, every point the model’s own answer', async (role) => {
    const agent = await t.as(ACCOUNT_OF_ROLE[role])
    const res = await agent.post('/api/model/sweep').send(approach).expect(200)
    const body = res.body as SweepResponse
    expect(body.points).toHaveLength(sweepPointCount(sweepRanges.parse({})))
    expect(body.baseline).toMatchObject({ availableGreenS: 11, crossMinimumS: 19 })
    expect(body.caution).toMatch(/Planning estimates/)
    const input = approachBody.parse(approach)
    for (const pt of [body.points[0], body.points[100], body.points[2000], body.points.at(-1)!]) {
      const r = evaluateApproach(withSettings(input, pt.settings))
      expect(pt.busSavingPerTripS).toBeCloseTo(r.bus.meanSavingS, 8)
      expect(pt.personDelayBalanceS).toBeCloseTo(r.personDelayBalanceS, 6)
      expect(pt.vcAfter).toBeCloseTo(r.crossStreet.vcAfter, 10)
    }
    // without city limits only the timing's floors bind: 11 s each way
    expect(body.recommendation.feasible).toBe(true)
    expect(body.recommendation.settings.maxExtensionS).toBeLessThanOrEqual(11)
  })

  it('marks points against the city’s stored limits, and the body’s own over them', async () => {
    const agent = await t.as('planner')
    const res = await agent.post('/api/model/sweep')
      .send({ ...approach, cityId: 'org-osterfield', ranges: { strategies: ['green-extension'], lockoutCycles: [1, 2], conditional: [false] } }).expect(200)
    const body = res.body as SweepResponse
    expect(body.limits).toEqual(DEMO_CITY_LIMITS['org-osterfield'])
    const at = (e: number, l: number) => body.points.find((p) => p.settings.maxExtensionS === e && p.settings.lockoutCycles === l)!
    expect(at(10, 2).violations.map((v) => v.constraint)).not.toContain('max-extension')
    expect(at(11, 2).violations.map((v) => v.constraint)).toEqual(['max-extension'])
    expect(at(12, 2).violations.map((v) => v.constraint)).toEqual(['ped-walk-clearance', 'max-extension'])
    expect(at(5, 1).violations.map((v) => v.constraint)).toEqual(['min-lockout'])
    const rec = body.recommendation
    expect(rec.settings.lockoutCycles).toBe(2)
    expect(rec.settings.maxExtensionS).toBeLessThanOrEqual(10)

    const looser = (await agent.post('/api/model/sweep')
      .send({ ...approach, cityId: 'org-osterfield', limits: { minLockoutCycles: 0, maxExtensionS: null }, ranges: { strategies: ['green-extension'] } }).expect(200)).body as SweepResponse
    expect(looser.limits).toEqual({ ...DEMO_CITY_LIMITS['org-osterfield'], minLockoutCycles: 0, maxExtensionS: null })
    expect(looser.recommendation.objectiveValue).toBeGreaterThanOrEqual(rec.objectiveValue)
  })

  it('evaluates the marked settings exactly, off the grid too', async () => {
    const agent = await t.as('engineer')
    const marks = [
      { label: 'Proposed', settings: { strategy: 'both', maxExtensionS: 9.5, maxEarlyGreenS: 7, lockoutCycles: 1, lateOnly: false } },
      { label: 'Counter', settings: { strategy: 'both', maxExtensionS: 14, maxEarlyGreenS: 4, lockoutCycles: 2, lateOnly: false } },
    ]
    const body = (await agent.post('/api/model/sweep').send({ ...approach, marks, ranges: { stepS: 5 } }).expect(200)).body as SweepResponse
    expect(body.marked.map((m) => m.label)).toEqual(['Proposed', 'Counter'])
    const r = evaluateApproach(withSettings(approachBody.parse(approach), { strategy: 'both', maxExtensionS: 9.5, maxEarlyGreenS: 7, lockoutCycles: 1, lateOnly: false }))
    expect(body.marked[0].point.busSavingPerTripS).toBeCloseTo(r.bus.meanSavingS, 8)
    expect(body.marked[0].point.violations).toEqual([])
    // 14 s is more than the 11 s the cross street can give above walk + clearance
    expect(body.marked[1].point.violations.map((v) => v.constraint)).toEqual(['ped-walk-clearance'])
  })

  it('is 401 without a session', async () => {
    await request(t.app).post('/api/model/sweep').send(approach).expect(401)
  })

  it('refuses invalid input with the issue paths', async () => {
    const agent = await t.as('planner')
    expect(paths(await agent.post('/api/model/sweep').send({ ...approach, ranges: { stepS: 0.5, maxExtensionCapS: 60, maxEarlyGreenCapS: 60 } }).expect(422))).toEqual(['ranges.stepS'])
    expect(paths(await agent.post('/api/model/sweep').send({ ...approach, ranges: { lockout: [1] } }).expect(422))).toEqual(['ranges'])
    expect(paths(await agent.post('/api/model/sweep').send({ ...approach, ranges: { lockoutCycles: [9] } }).expect(422))).toEqual(['ranges.lockoutCycles.0'])
    expect(paths(await agent.post('/api/model/sweep').send({ ...approach, marks: [{ label: 'x', settings: { strategy: 'hold', maxExtensionS: 1, maxEarlyGreenS: 1, lockoutCycles: 1, lateOnly: false } }] }).expect(422)))
      .toEqual(['marks.0.settings.strategy'])
    expect(paths(await agent.post('/api/model/sweep').send({ ...approach, limits: { maxCrossVc: 4 } }).expect(422))).toEqual(['limits.maxCrossVc'])
    expect(paths(await agent.post('/api/model/sweep').send({ ...approach, objective: 'fastest' }).expect(422))).toEqual(['objective'])
    // the model's own checks, with the field at fault
    expect(paths(await agent.post('/api/model/sweep').send({ ...approach, diagram: { kind: 'greenshields' } }).expect(422))).toEqual(['diagram.kind'])
    const green = await agent.post('/api/model/sweep').send({ ...approach, signal: { cycleS: 60, effectiveGreenS: 45 } }).expect(422)
    expect(paths(green)).toContain('signal.effectiveGreenS')
    expect(green.body.issues[0].message).toMatch(/15 s of green, less than the pedestrian walk \+ clearance of 19 s/)
    // an organisation that is not a city
    expect(paths(await agent.post('/api/model/sweep').send({ ...approach, cityId: 'org-lindenmere' }).expect(422))).toEqual(['cityId'])
  })
})

describe('GET and PUT /api/cities/:orgId/limits', () => {
  it.each(ALL_ROLES)('a signed-in %s reads the seeded limits of each city', async (role) => {
    const agent = await t.as(ACCOUNT_OF_ROLE[role])
    const res = await agent.get('/api/cities/org-brackenford/limits').expect(200)
    expect(res.body).toMatchObject({ orgId: 'org-brackenford', cityName: 'City of Brackenford', ...DEMO_CITY_LIMITS['org-brackenford'] })
    expect(res.body.version).toBeGreaterThanOrEqual(1)
  })

  it('is 404 for an organisation that is not a city, or none', async () => {
    const agent = await t.as('manager')
    await agent.get('/api/cities/org-lindenmere/limits').expect(404)
    await agent.get('/api/cities/org-nowhere/limits').expect(404)
    await (await t.as('admin')).put('/api/cities/org-nowhere/limits').send({ ...DEMO_CITY_LIMITS['org-osterfield'], version: 1 }).expect(404)
    await request(t.app).get('/api/cities/org-brackenford/limits').expect(401)
  })

  it('lets the city’s own engineers and admins write, naming the version they read', async () => {
    const own = await t.as('engineer2')
    const before = (await own.get('/api/cities/org-osterfield/limits').expect(200)).body
    const next = { ...DEMO_CITY_LIMITS['org-osterfield'], maxCrossVc: 0.88, worstLos: 'D', version: before.version }
    const res = await own.put('/api/cities/org-osterfield/limits').send(next).expect(200)
    expect(res.body).toMatchObject({ maxCrossVc: 0.88, worstLos: 'D', version: before.version + 1, updatedBy: { name: 'Ines Halloran' } })
    // a second write on the old version loses, and sees the limits as they are
    const stale = await (await t.as('admin')).put('/api/cities/org-osterfield/limits').send({ ...next, maxCrossVc: 0.8 }).expect(409)
    expect(stale.body.limits).toMatchObject({ maxCrossVc: 0.88, version: before.version + 1 })
    const admin = await (await t.as('admin')).put('/api/cities/org-osterfield/limits')
      .send({ ...DEMO_CITY_LIMITS['org-osterfield'], version: before.version + 1 }).expect(200)
    expect(admin.body).toMatchObject({ ...DEMO_CITY_LIMITS['org-osterfield'], version: before.version + 2 })
  })

  it('refuses other cities’ engineers and the agency’s roles', async () => {
    const body = { ...DEMO_CITY_LIMITS['org-osterfield'], version: 1 }
    for (const who of ['engineer', 'planner', 'manager'] as const) {
      await (await t.as(who)).put('/api/cities/org-osterfield/limits').send(body).expect(403)
    }
  })

  it('creates the limits of a city that has none with version 0', async () => {
    await t.database.db.delete(cityLimits).where(eq(cityLimits.orgId, 'org-brackenford'))
    const agent = await t.as('engineer')
    expect((await agent.get('/api/cities/org-brackenford/limits').expect(200)).body).toMatchObject({ maxCrossVc: null, worstLos: null, minLockoutCycles: 0, version: 0 })
    const res = await agent.put('/api/cities/org-brackenford/limits').send({ ...DEMO_CITY_LIMITS['org-brackenford'], version: 0 }).expect(200)
    expect(res.body).toMatchObject({ ...DEMO_CITY_LIMITS['org-brackenford'], version: 1 })
    await agent.put('/api/cities/org-brackenford/limits').send({ ...DEMO_CITY_LIMITS['org-brackenford'], version: 0 }).expect(409)
  })

  it('refuses invalid limits with their paths', async () => {
    const agent = await t.as('engineer')
    const res = await agent.put('/api/cities/org-brackenford/limits').send({ ...DEMO_CITY_LIMITS['org-brackenford'], maxCrossVc: 3, worstLos: 'G', version: 1, extra: 1 }).expect(422)
    expect(paths(res)).toEqual(expect.arrayContaining(['maxCrossVc', 'worstLos', '']))
  })
})

describe('POST /api/proposals/:id/suggest', () => {
  async function draft(name: string): Promise<ProposalDto> {
    return (await (await t.as('planner')).post('/api/proposals').send({ corridorId: c.corridorId, name }).expect(201)).body
  }

  it('fills one row with the recommendation within its city’s limits; the row stays a draft', async () => {
    const p = await draft('Suggest one row')
    const planner = await t.as('planner')
    // start from modest settings, so that the suggestion changes them
    const row: ProposalDto['rows'][number] = (await planner.patch(`/api/proposals/${p.id}/rows/${p.rows[0].id}`)
      .send({ version: p.rows[0].version, strategy: 'green-extension', maxExtensionS: 3, lockoutCycles: 3 }).expect(200)).body
    const res = await planner.post(`/api/proposals/${p.id}/suggest`).send({ rowId: row.id, version: row.version }).expect(200)
    const out = (res.body as SuggestResponse).rows
    expect(out).toHaveLength(1)
    expect(out[0]).toMatchObject({ rowId: row.id, applied: true, version: row.version + 1, skipped: null })
    const rec = out[0].recommendation!
    const limits = DEMO_CITY_LIMITS['org-brackenford']
    expect(rec.feasible).toBe(true)
    expect(rec.settings.strategy).not.toBe('none')
    // the city allows 12 s of extension but the timing only 11 s above walk + clearance
    expect(rec.settings.maxExtensionS).toBeLessThanOrEqual(Math.min(limits.maxExtensionS!, SPARE_CROSS_GREEN_S))
    expect(rec.settings.maxEarlyGreenS).toBeLessThanOrEqual(limits.maxEarlyGreenS!)
    expect(rec.settings.lockoutCycles).toBeGreaterThanOrEqual(limits.minLockoutCycles)
    // one case per weekday period with its plan and volumes, each within every limit
    expect(rec.cases.map((x) => x.label)).toEqual(c.periods.map((x) => x.name))
    for (const x of rec.cases) expect(x.point.violations).toEqual([])
    expect(rec.summary).toMatch(/^Suggested: /)
    // early green stops at the city's 10 s, below the 11 s the timing would allow
    if (rec.settings.strategy !== 'green-extension') {
      expect(rec.binding).toContainEqual(expect.objectContaining({ setting: 'maxEarlyGreenS', constraint: 'max-early-green' }))
    }

    const after: ProposalDto = (await planner.get(`/api/proposals/${p.id}`).expect(200)).body
    const r = after.rows[0]
    expect(r).toMatchObject({ status: 'draft', version: row.version + 1 })
    expect(r.settings).toMatchObject({
      strategy: rec.settings.strategy, lockoutCycles: rec.settings.lockoutCycles,
      conditional: { onlyLateBuses: rec.settings.lateOnly, lateShare: row.settings.conditional.lateShare },
    })
    expect(r.history.at(-1)).toMatchObject({ kind: 'edited', actor: { name: 'Tova Rasmussen' } })
    // the other rows are untouched
    expect(after.rows.slice(1).map((x) => x.version)).toEqual(p.rows.slice(1).map((x) => x.version))

    // the evaluation of the new settings finds the figures the recommendation promised
    const job = await planner.post(`/api/proposals/${p.id}/evaluate`).expect(202)
    expect((await waitForJob(planner, job.body.jobId)).state).toBe('succeeded')
    const evaluated: ProposalDto = (await planner.get(`/api/proposals/${p.id}`).expect(200)).body
    const weekday = evaluated.rows[0].results!.periods.filter((x) => x.dayType === 'weekday')
    for (const x of rec.cases) {
      const stored = weekday.find((w) => w.periodName === x.label)!
      expect(stored.savingPerTripS!).toBeCloseTo(x.point.busSavingPerTripS, 8)
      expect(stored.vcAfter!).toBeCloseTo(x.point.vcAfter, 10)
    }
  })

  it('fills every row, each within its own city’s limits', async () => {
    const p = await draft('Suggest all rows')
    const res = await (await t.as('planner')).post(`/api/proposals/${p.id}/suggest`).send({ objective: 'bus-saving' }).expect(200)
    const out = (res.body as SuggestResponse).rows
    expect(out.map((r) => r.intersectionName)).toEqual(p.rows.map((r) => r.intersectionName))
    for (const [i, r] of out.entries()) {
      expect(r.applied).toBe(true)
      const limits = DEMO_CITY_LIMITS[p.rows[i].jurisdictionId as keyof typeof DEMO_CITY_LIMITS]
      const s = r.recommendation!.settings
      expect(r.recommendation!.objective).toBe('bus-saving')
      if (s.strategy === 'green-extension' || s.strategy === 'both') expect(s.maxExtensionS).toBeLessThanOrEqual(Math.min(limits.maxExtensionS!, SPARE_CROSS_GREEN_S))
      if (s.strategy === 'early-green' || s.strategy === 'both') expect(s.maxEarlyGreenS).toBeLessThanOrEqual(limits.maxEarlyGreenS!)
      expect(s.lockoutCycles).toBeGreaterThanOrEqual(limits.minLockoutCycles)
    }
  })

  it('leaves a row with no plan on the day type, saying why', async () => {
    const p = await draft('Suggest for Saturdays')
    const res = await (await t.as('planner')).post(`/api/proposals/${p.id}/suggest`).send({ dayType: 'saturday' }).expect(200)
    const fourth = (res.body as SuggestResponse).rows.find((r) => r.intersectionName === 'Main St & Fourth Ave')!
    expect(fourth).toMatchObject({ applied: false, version: null, recommendation: null })
    expect(fourth.skipped).toMatch(/No timing plan covers .* on Saturdays/)
  })

  it('refuses a stale row version with 409 and the row as it is', async () => {
    const p = await draft('Suggest stale')
    const row = p.rows[1]
    const planner = await t.as('planner')
    await planner.patch(`/api/proposals/${p.id}/rows/${row.id}`).send({ version: row.version, maxExtensionS: 6 }).expect(200)
    const res = await planner.post(`/api/proposals/${p.id}/suggest`).send({ rowId: row.id, version: row.version }).expect(409)
    expect(res.body.row).toMatchObject({ id: row.id, version: row.version + 1, settings: { maxExtensionS: 6 } })
  })

  it('leaves rows that are with the city', async () => {
    const p = await draft('Suggest submitted')
    const planner = await t.as('planner')
    const job = await planner.post(`/api/proposals/${p.id}/evaluate`).expect(202)
    await waitForJob(planner, job.body.jobId)
    const sent: ProposalDto = (await planner.post(`/api/proposals/${p.id}/submit`).send({ comment: 'Please review.' }).expect(200)).body
    const all = (await planner.post(`/api/proposals/${p.id}/suggest`).send({}).expect(200)).body as SuggestResponse
    expect(all.rows.every((r) => !r.applied && /waiting for the city/.test(r.skipped ?? ''))).toBe(true)
    await planner.post(`/api/proposals/${p.id}/suggest`).send({ rowId: sent.rows[0].id, version: sent.rows[0].version }).expect(409)
  })

  it('is for the agency’s planners only, and 404 for what does not exist', async () => {
    const p = await draft('Suggest roles')
    for (const who of ['engineer', 'manager', 'admin'] as const) {
      await (await t.as(who)).post(`/api/proposals/${p.id}/suggest`).send({}).expect(403)
    }
    const planner = await t.as('planner')
    await planner.post('/api/proposals/no-such-proposal/suggest').send({}).expect(404)
    await planner.post(`/api/proposals/${p.id}/suggest`).send({ rowId: 'no-such-row', version: 1 }).expect(404)
    await request(t.app).post(`/api/proposals/${p.id}/suggest`).send({}).expect(401)
  })

  it('refuses invalid bodies with the issue paths', async () => {
    const p = await draft('Suggest invalid')
    const planner = await t.as('planner')
    expect(paths(await planner.post(`/api/proposals/${p.id}/suggest`).send({ rowId: p.rows[0].id }).expect(422))).toEqual(['version'])
    expect(paths(await planner.post(`/api/proposals/${p.id}/suggest`).send({ objective: 'fastest', dayType: 'monday' }).expect(422))).toEqual(['objective', 'dayType'])
    expect(paths(await planner.post(`/api/proposals/${p.id}/suggest`).send({ all: true }).expect(422))).toEqual([''])
  })
})
