import { describe, expect, it } from 'vitest'
import { evaluateApproach, phaseGrid, timeSpace } from '../../../shared/model'
import { approachBody, approachResult, timeSpaceBody, timeSpaceResult, type ApproachBody } from '../../../shared/schemas/model'

const evaluate = (body: ApproachBody) => evaluateApproach(approachBody.parse(body))

// the body of the issue, field by field
const issueBody = {
  diagram: { kind: 'triangular', freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 },
  approach: { lengthM: 400, downstreamLengthM: 150, lanes: 1, arrivalFlowVehPerHour: 600 },
  signal: { cycleS: 60, effectiveGreenS: 30 },
  bus: { cruiseSpeedKmh: 50, accelMps2: 1.2, decelMps2: 1.2, stop: { position: 'near-side', distanceM: 30, dwellS: 20 }, passengers: 30 },
  priority: { strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10, lockoutCycles: 1, checkInDistanceM: 150 },
  crossStreet: { arrivalFlowVehPerHour: 500, saturationFlowVehPerHourPerLane: 1800, lanes: 1, minGreenS: 10, pedWalkS: 7, pedClearanceS: 12, carOccupancy: 1.3 },
} as const

describe('the request body', () => {
  it('takes the body of the issue and fills the rest with defaults', () => {
    const input = approachBody.parse(issueBody)
    expect(input.approach.analysisPeriodMin).toBe(15)
    expect(input.bus.busesPerHour).toBe(6)
    expect(approachBody.parse({})).toMatchObject({ diagram: { kind: 'triangular', freeFlowSpeedKmh: 60 }, signal: { cycleS: 60, effectiveGreenS: 30 } })
    expect(approachBody.parse({ diagram: { kind: 'greenshields' } }).diagram).toEqual({ kind: 'greenshields', freeFlowSpeedKmh: 60, jamDensityVehPerKmPerLane: 120 })
  })

  it('refuses unknown fields, with their path', () => {
    const r = approachBody.safeParse({ bus: { stop: { position: 'near-side', dwell: 20 } } })
    expect(r.success).toBe(false)
    expect(r.error!.issues[0]).toMatchObject({ code: 'unrecognized_keys', path: ['bus', 'stop'], keys: ['dwell'] })
    expect(approachBody.safeParse({ diagram: { kind: 'greenshields', backwardWaveSpeedKmh: 20 } }).success).toBe(false)
    expect(approachBody.safeParse({ cycles: 2 }).success).toBe(false)
    expect(timeSpaceBody.safeParse({ cycles: 2, dxM: 5 }).success).toBe(true)
  })
})

describe('evaluating one approach', () => {
  const r = evaluateApproach(approachBody.parse(issueBody))

  it('answers in the documented shape', () => {
    expect(approachResult.parse(r)).toEqual(r)
    expect(r.delayByArrivalPhase.map((p) => p.phaseS)).toEqual(phaseGrid(60, 1))
  })

  it('summarises the phase table: uniform arrivals, baseline and priority', () => {
    const rows = r.delayByArrivalPhase
    const mean = rows.reduce((a, p) => a + p.baselineS, 0) / rows.length
    expect(r.bus.baseline.meanDelayS).toBeCloseTo(mean, 9)
    const sorted = rows.map((p) => p.baselineS).sort((a, b) => a - b)
    expect(r.bus.baseline.medianDelayS).toBe(sorted[29])
    expect(r.bus.baseline.p90DelayS).toBe(sorted[53])
    expect(r.bus.meanSavingS).toBeCloseTo(r.bus.baseline.meanDelayS - r.bus.priority.meanDelayS, 12)
    expect(r.bus.meanSavingS).toBeGreaterThan(0)
    for (const p of rows) {
      expect(p.priorityS).toBeLessThanOrEqual(p.baselineS + 1e-9)
      expect(p.granted).toBe(p.action !== 'none')
      if (!p.granted) expect(p.priorityS).toBeCloseTo(p.baselineS, 12)
      expect(p.greenTakenS).toBeLessThanOrEqual(10 + 1e-5)
    }
  })

  it('gives no saving and takes no green without a strategy', () => {
    const none = evaluate({ ...issueBody, priority: { ...issueBody.priority, strategy: 'none' } })
    expect(none.bus.meanSavingS).toBe(0)
    expect(none.bus.priority.grantShare).toBe(0)
    expect(none.crossStreet.extraDelayPerVehS).toBe(0)
    expect(none.crossStreet.vcAfter).toBeCloseTo(none.crossStreet.vcBefore, 12)
    expect(none.personDelayBalanceS).toBe(0)
  })

  it('weighs asking buses by the late share under conditional priority', () => {
    const all = evaluate({ ...issueBody, priority: { ...issueBody.priority, lockoutCycles: 0 } })
    const late = evaluate({ ...issueBody, priority: { ...issueBody.priority, lockoutCycles: 0, lateOnly: true, lateShare: 0.25 } })
    expect(late.bus.meanSavingS).toBeCloseTo(0.25 * all.bus.meanSavingS, 9)
    expect(late.crossStreet.grantsPerHour).toBeCloseTo(0.25 * all.crossStreet.grantsPerHour, 9)
  })

  it('prices the grants on the cross street and balances person delay', () => {
    const c = r.crossStreet
    expect(c.effectiveGreenS).toBe(30)
    expect(c.availableGreenS).toBe(11)
    expect(c.vcBefore).toBeCloseTo(500 / (1800 * 30 / 60), 12)
    expect(c.vcAfter).toBeGreaterThan(c.vcBefore)
    expect(c.extraDelayPerVehS).toBeCloseTo((c.grantsPerHour * c.extraDelayPerGrantVehS) / 500, 9)
    expect(c.delayAfterS).toBeCloseTo(c.delayBeforeS + c.extraDelayPerVehS, 12)
    expect(r.mainStreet.delayChangePerGrantVehS).toBeLessThan(0)
    const pd = r.personDelay
    expect(pd.busPassengersSavedS).toBeCloseTo(6 * 30 * r.bus.meanSavingS, 9)
    expect(pd.crossStreetOccupantsLostS).toBeCloseTo(c.grantsPerHour * c.extraDelayPerGrantVehS * 1.3, 9)
    expect(r.personDelayBalanceS).toBeCloseTo(pd.busPassengersSavedS + pd.mainStreetOccupantsSavedS - pd.crossStreetOccupantsLostS, 9)
  })

  it('saves less with a near-side stop than with a far-side one', () => {
    const far = evaluate({ ...issueBody, bus: { ...issueBody.bus, stop: { position: 'far-side', distanceM: 30, dwellS: 20 } } })
    expect(far.bus.meanSavingS).toBeGreaterThan(r.bus.meanSavingS)
  })
})

describe('oversaturated approaches', () => {
  const r = evaluate({ approach: { arrivalFlowVehPerHour: 1000 }, priority: { strategy: 'green-extension' } })

  it('carries the residual queue over the analysis period and says so', () => {
    expect(r.traffic.degreeOfSaturation).toBeCloseTo(1000 / 900, 12)
    expect(r.traffic.residualQueueVeh).toBeCloseTo(15 * (1000 / 60 - 15), 9)
    expect(r.traffic.queueClearS).toBeNull()
    expect(r.traffic.los).toBe('F')
    expect(r.warnings.join(' ')).toMatch(/oversaturated/)
    expect(r.warnings.join(' ')).toMatch(/beyond the 400 m modelled/)
    expect(r.bus.baseline.meanDelayS).toBeGreaterThan(evaluate({}).bus.baseline.meanDelayS)
  })
})

describe('other diagrams', () => {
  it('evaluates Greenshields with the Godunov field', () => {
    const g = evaluate({ diagram: { kind: 'greenshields' } })
    expect(g.solver).toBe('godunov')
    expect(g.traffic.capacityVehPerHour).toBeCloseTo(900, 9)
    // the fan discharges more slowly than the triangle's instant start
    expect(g.traffic.meanDelayS).toBeGreaterThan(evaluate({}).traffic.meanDelayS)
    expect(g.bus.meanSavingS).toBeGreaterThan(0)
  })

  it('refuses the exact solver for a diagram it does not solve', () => {
    expect(() => evaluateApproach(approachBody.parse({ diagram: { kind: 'greenshields' } }), { solver: 'exact' })).toThrow(RangeError)
  })
})

describe('the time-space field', () => {
  const input = timeSpaceBody.parse({ ...issueBody, cycles: 2, dxM: 5 })
  const ts = timeSpace(input)

  it('answers in the documented shape, with the stop line at 0 and upstream negative', () => {
    expect(timeSpaceResult.parse(ts)).toEqual(ts)
    expect(ts.xM[0]).toBeCloseTo(-397.5, 9)
    expect(ts.xM.filter((x) => x < 0)).toHaveLength(80)
    expect(ts.xM[80]).toBeCloseTo(2.5, 9)
    expect(ts.xM[ts.xM.length - 1]).toBeLessThanOrEqual(150)
    expect(ts.densityVehPerKm).toHaveLength(ts.tS.length)
    for (const row of ts.densityVehPerKm) expect(row).toHaveLength(ts.xM.length)
    expect(ts.tS[0]).toBe(0)
    expect(Math.abs(ts.tS[ts.tS.length - 1] - 120)).toBeLessThan(0.3)
  })

  it('starts from steady arrivals with red first in each cycle', () => {
    expect(new Set(ts.densityVehPerKm[0])).toEqual(new Set([10]))
    expect(ts.signal.slice(0, 4)).toEqual([
      { startS: 0, endS: 30, state: 'red' }, { startS: 30, endS: 60, state: 'green' },
      { startS: 60, endS: 90, state: 'red' }, { startS: 90, endS: 120, state: 'green' },
    ])
    // a queue at jam density stands behind the line in red
    const row = ts.densityVehPerKm[ts.tS.findIndex((t) => t >= 25)]
    expect(row[79]).toBeGreaterThan(110)
    expect(row[80]).toBeLessThan(1)
  })

  it('takes the cycles, cell size and bus from options over the body', () => {
    const one = timeSpace(input, { cycles: 1, dxM: 10, busArrivalPhaseS: 20 })
    expect(one.xM.filter((x) => x < 0)).toHaveLength(40)
    expect(one.signal.at(-1)!.endS).toBe(60)
    expect(one.bus.arrivalPhaseS).toBe(20)
  })

  it('with a near-side stop sends the request at door close, too late for the extension', () => {
    const near = timeSpace({ ...input, busArrivalPhaseS: 3 })
    expect(near.bus.action).toBe('early-green')
  })

  it('shows the bus without and with priority', () => {
    // no stop before the line, so the request comes at the check-in point while the green is on
    const pr = timeSpace({ ...input, bus: { ...input.bus, stop: { position: 'none', distanceM: 0, dwellS: 0 } }, busArrivalPhaseS: 3 })
    expect(pr.bus.action).toBe('green-extension')
    expect(pr.priorityDensityVehPerKm).not.toBeNull()
    expect(pr.prioritySignal[0]).toMatchObject({ state: 'red', startS: 0 })
    expect(pr.prioritySignal.find((s) => s.startS === 60)).toBeUndefined()
    const exitTime = (traj: { tS: number; xM: number }[]) => traj.find((p) => p.xM >= 0)!.tS
    expect(exitTime(pr.bus.priority)).toBeLessThan(exitTime(pr.bus.baseline) - 20)
    for (const traj of [pr.bus.baseline, pr.bus.priority]) {
      for (let i = 1; i < traj.length; i++) {
        expect(traj[i].tS).toBeGreaterThanOrEqual(traj[i - 1].tS)
        expect(traj[i].xM).toBeGreaterThanOrEqual(traj[i - 1].xM - 1e-9)
      }
    }
  })
})
