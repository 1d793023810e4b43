import { describe, expect, it } from 'vitest'
import {
  capacity, cellTransmission, evaluateApproach, exactApproach, fixedTimePlan, kmhToMps, mpsToKmh, newStepFlows,
  queueField, redQueue, step, triangularFromWaveSpeed, uniformDelayS,
} from '../../shared/model'
import { approachBody } from '../../shared/schemas/model'

const triangle = triangularFromWaveSpeed({ freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 })

describe('queue at a pretimed signal, triangular diagram', () => {
  // Stephanopoulos & Michalopoulos 1979, TR-A 13:295-307 (consistent with): arrivals 600 veh/h
  // (10 veh/km), red 30 s, vf = 60, w = 20 km/h, kj = 120 veh/km. Stopping shock back at
  // 5.45 km/h; maximum queue 62.5 m (7.5 vehicles) 41.25 s after the start of red; the
  // dissipation shock forward at 60 km/h; clears the line 15 s into green = q_a r / (s - q_a).
  const ex = exactApproach(triangle, 600 / 3600)
  const plan = fixedTimePlan(60, 30, 0, 1)
  const q = redQueue(ex, queueField(ex, plan), 0)

  it('has the stopping shock at 5.45 km/h', () => {
    expect(ex.ka * 1000).toBeCloseTo(10, 9)
    expect(mpsToKmh(ex.u)).toBeCloseTo(5.45, 2)
  })

  it('reaches 62.5 m (7.5 vehicles) at 41.25 s', () => {
    expect(q.maxQueueM).toBeCloseTo(62.5, 9)
    expect(q.maxQueueVeh).toBeCloseTo(7.5, 9)
    expect(q.maxQueueTimeS).toBeCloseTo(41.25, 9)
  })

  it('dissipates forward at 60 km/h and clears the line 15 s into green', () => {
    // from the farthest point back to the line at the dissipation shock speed
    const dissipation = (capacity(triangle) - ex.qa) / (30 / 1000 - ex.ka)
    expect(mpsToKmh(dissipation)).toBeCloseTo(60, 9)
    expect(q.clearAfterGreenS).toBeCloseTo(15, 9)
    expect(q.maxQueueTimeS + q.maxQueueM / dissipation - 30).toBeCloseTo(15, 9)
    expect(q.clearAfterGreenS).toBeCloseTo((ex.qa * 30) / (ex.s - ex.qa), 12)
  })

  it('gives the same figures through the approach evaluation', () => {
    const r = evaluateApproach(approachBody.parse({ signal: { cycleS: 60, effectiveGreenS: 30 }, approach: { arrivalFlowVehPerHour: 600 } }))
    expect(r.traffic.maxQueueM).toBeCloseTo(62.5, 9)
    expect(r.traffic.maxQueueVeh).toBeCloseTo(7.5, 9)
    expect(r.traffic.maxQueueTimeS).toBeCloseTo(41.25, 9)
    expect(r.traffic.queueClearS).toBeCloseTo(15, 9)
  })
})

describe('cell transmission sequence', () => {
  // Daganzo 1994, TR-B 28(4):269-287: y_i = min{n_(i-1), Q, (w/vf)(N - n_i)}, cells of length
  // vf dt; dt = 1 s with the diagram above: dx = 16.67 m, N = 2.0, Q = 0.5; from a full jam at
  // green the stop-line cell goes 2 -> 1.5 -> 1.1667 -> 0.9444 ... towards 0.5.
  it('is the Godunov step with dt = dx / vf', () => {
    const ctm = cellTransmission(triangle, 1)
    expect(ctm.dx).toBeCloseTo(16.67, 2)
    expect(ctm.N).toBeCloseTo(2.0, 9)
    expect(ctm.Q).toBeCloseTo(0.5, 9)
    const up = 12
    const k = new Float64Array(2 * up)
    k.fill(triangle.kj, 0, up)
    const counts: number[] = [k[up - 1] * ctm.dx]
    const flows = newStepFlows()
    for (let m = 0; m < 40; m++) {
      step(triangle, k, 1, ctm.dx, { inflowDemand: 0, outflowSupply: capacity(triangle), signalInterface: up, signalOpen: 1 }, flows)
      counts.push(k[up - 1] * ctm.dx)
    }
    expect(counts[0]).toBeCloseTo(2, 12)
    expect(counts[1]).toBeCloseTo(1.5, 12)
    expect(counts[2]).toBeCloseTo(1.1667, 4)
    expect(counts[3]).toBeCloseTo(0.9444, 4)
    expect(counts[40]).toBeCloseTo(0.5, 2)
    expect(kmhToMps(60) * 1).toBeCloseTo(ctm.dx, 12)
  })
})

describe('mean vehicle delay and the HCM uniform delay', () => {
  // HCM 2000 eq. 16-11 and later editions (from memory): d1 = 0.5 C (1 - g/C)^2 / (1 - min(1,X) g/C).
  // C = 90, g = 45, X = 0.5: 15.0 s; any X >= 1: 22.5 s. With deterministic arrivals the LWR
  // solution with a triangular diagram gives the same mean vehicle delay (REFERENCES.md, Signalised intersections).
  it('is 15.0 s at C = 90, g = 45, X = 0.5 and 22.5 s at X >= 1', () => {
    expect(uniformDelayS(90, 45, 0.5)).toBeCloseTo(15.0, 9)
    expect(uniformDelayS(90, 45, 1)).toBeCloseTo(22.5, 9)
    expect(uniformDelayS(90, 45, 1.3)).toBeCloseTo(22.5, 9)
  })

  it('equals the exact kinematic-wave delay and, within the grid error, the Godunov delay', () => {
    // capacity 1800 veh/h x 45/90 = 900 veh/h, so X = 0.5 at 450 veh/h
    const input = approachBody.parse({ signal: { cycleS: 90, effectiveGreenS: 45 }, approach: { arrivalFlowVehPerHour: 450 }, priority: { strategy: 'none' } })
    const exact = evaluateApproach(input)
    expect(exact.traffic.degreeOfSaturation).toBeCloseTo(0.5, 12)
    expect(exact.traffic.meanDelayS).toBeCloseTo(15.0, 9)
    const godunov = evaluateApproach(input, { solver: 'godunov', dxM: 2 })
    expect(Math.abs(godunov.traffic.meanDelayS - 15.0)).toBeLessThan(0.3)
  })
})
