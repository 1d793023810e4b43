import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { ACCOUNT_OF_ROLE, ALL_ROLES, startTestApp, type TestApp } from '../support/test-app'
import { approachResult, timeSpaceResult } from '../../shared/schemas/model'
import { evaluateApproach } from '../../shared/model'
import { approachBody } from '../../shared/schemas/model'

let t: TestApp
beforeAll(async () => { t = await startTestApp() })
afterAll(async () => { await t.close() })

const body = {
  diagram: { kind: 'triangular', freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 },
  approach: { lengthM: 400, downstreamLengthM: 150, lanes: 1, arrivalFlowVehPerHour: 600 },
  signal: { cycleS: 60, effectiveGreenS: 30 },
  bus: { cruiseSpeedKmh: 50, accelMps2: 1.2, decelMps2: 1.2, stop: { position: 'far-side', distanceM: 30, dwellS: 20 }, passengers: 30 },
  priority: { strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10, lockoutCycles: 1, checkInDistanceM: 150 },
  crossStreet: { arrivalFlowVehPerHour: 500, saturationFlowVehPerHourPerLane: 1800, lanes: 1, minGreenS: 10, pedWalkS: 7, pedClearanceS: 12, carOccupancy: 1.3 },
}

describe('POST /api/model/approach', () => {
  it.each(ALL_ROLES)('evaluates the approach for a signed-in %s', async (role) => {
    const agent = await t.as(ACCOUNT_OF_ROLE[role])
    const res = await agent.post('/api/model/approach').send(body).expect(200)
    const result = approachResult.parse(res.body)
    expect(result.traffic.maxQueueM).toBeCloseTo(62.5, 6)
    expect(result.traffic.queueClearS).toBeCloseTo(15, 6)
    expect(result.delayByArrivalPhase).toHaveLength(60)
    expect(result.bus.meanSavingS).toBeGreaterThan(0)
    // the same code as the browser
    expect(res.body).toEqual(JSON.parse(JSON.stringify(evaluateApproach(approachBody.parse(body)))))
  })

  it('fills a partial body with the defaults', async () => {
    const agent = await t.as('planner')
    const res = await agent.post('/api/model/approach').send({ approach: { arrivalFlowVehPerHour: 450 } }).expect(200)
    expect(res.body.traffic.degreeOfSaturation).toBeCloseTo(0.5, 9)
  })

  it('is 401 without a session', async () => {
    await request(t.app).post('/api/model/approach').send(body).expect(401)
  })

  it('refuses unknown and invalid fields with their paths', async () => {
    const agent = await t.as('engineer')
    const res = await agent.post('/api/model/approach')
      .send({ ...body, signal: { cycleS: 'long', effectiveGreenS: 30, offsetS: 3 } }).expect(422)
    const paths = res.body.issues.map((i: { path: string[] }) => i.path.join('.'))
    expect(paths).toEqual(expect.arrayContaining(['signal.cycleS', 'signal']))
    expect(JSON.stringify(res.body.issues)).toContain('offsetS')
  })

  it('refuses settings that break a constraint, naming the field and the reason', async () => {
    const agent = await t.as('engineer')
    const res = await agent.post('/api/model/approach').send({ ...body, priority: { ...body.priority, maxExtensionS: 15 } }).expect(422)
    expect(res.body.error).toBe('invalid')
    expect(res.body.issues).toEqual([
      { path: ['priority', 'maxExtensionS'], message: expect.stringMatching(/11 s can be taken/) },
    ])
    const ped = await agent.post('/api/model/approach')
      .send({ ...body, signal: { cycleS: 60, effectiveGreenS: 45 }, priority: { ...body.priority, strategy: 'none' } }).expect(422)
    expect(ped.body.issues.map((i: { path: string[] }) => i.path.join('.'))).toEqual(['signal.effectiveGreenS'])
    expect(ped.body.issues[0].message).toMatch(/walk \+ clearance of 19 s/)
  })
})

describe('POST /api/model/time-space', () => {
  it('returns the Godunov field, the signal and both bus paths', async () => {
    const agent = await t.as('manager')
    const res = await agent.post('/api/model/time-space').send({ ...body, cycles: 2, dxM: 5, busArrivalPhaseS: 3 }).expect(200)
    const ts = timeSpaceResult.parse(res.body)
    expect(ts.xM.filter((x) => x < 0)).toHaveLength(80)
    expect(ts.densityVehPerKm[0]).toHaveLength(ts.xM.length)
    expect(ts.signal[0]).toEqual({ startS: 0, endS: 30, state: 'red' })
    expect(ts.bus.action).toBe('green-extension')
    expect(ts.bus.baseline.length).toBeGreaterThan(2)
    expect(ts.bus.priority.length).toBeGreaterThan(2)
  })

  it('refuses a grid too fine to compute', async () => {
    const agent = await t.as('planner')
    const res = await agent.post('/api/model/time-space')
      .send({ ...body, approach: { ...body.approach, lengthM: 5000 }, signal: { cycleS: 300, effectiveGreenS: 150 }, cycles: 6, dxM: 1 }).expect(422)
    expect(res.body.issues.map((i: { path: string[] }) => i.path)).toContainEqual(['dxM'])
  })

  it('is 401 without a session', async () => {
    await request(t.app).post('/api/model/time-space').send({}).expect(401)
  })
})
